// Prints one plain closing line ("jest: N passed, N failed") as the very last line of the run,
// after jest's own summary, so any reader of the log sees the count without parsing jest's format.
class SummaryReporter {
  onRunComplete(_contexts, results) {
    const skipped = results.numPendingTests + results.numTodoTests;
    const line = `jest: ${results.numPassedTests} passed, ${results.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ""}\n`;
    process.once("exit", () => process.stdout.write(line));
  }
}
module.exports = SummaryReporter;
