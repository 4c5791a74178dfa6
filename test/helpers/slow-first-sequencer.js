// Jest's test order: the files known to take longest (the fuzzers, the CLI and browser suites) go
// first, so on a fresh clone — where jest has no timings yet and orders by file size — the two
// workers do not end with one long file running alone (common practice: longest job first).
const Sequencer = require("@jest/test-sequencer").default;

const SLOW = [
  /fuzz-budget/, /fuzz-total/, /fuzz-audit/, /fuzz-transform/, /fuzz-fan/, /hostile-csv/, /cli\/cli\.test/,
  /forecast-cli/, /origin\.test/, /totals-cli/, /pane-excel/, /reading-cli/, /theme\.test/, /audit-cli/,
];

class SlowFirst extends Sequencer {
  sort(tests) {
    const rank = (t) => {
      const i = SLOW.findIndex((r) => r.test(t.path.split("\\").join("/")));
      return i < 0 ? SLOW.length : i;
    };
    return [...super.sort(tests)].sort((a, b) => rank(a) - rank(b));
  }
}

module.exports = SlowFirst;
