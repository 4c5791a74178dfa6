// Output of the command line: the streams (replaceable in tests), one-line messages, and the
// choice between a CSV table and JSON.
import { toCsv } from "../io";

/** Output streams, replaceable in tests. */
export interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
}

/** The process's stdout and stderr. */
export const defaultIo: Io = {
  out: (s) => void process.stdout.write(s),
  err: (s) => void process.stderr.write(s),
};

/**
 * A message on one line (a quoted CSV field may carry line breaks into it).
 * @example oneLine("a\r\n  b") // "a b"
 */
export function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, " ");
}

/**
 * A series that could not be used: its message on stderr, on one line, as "fanwise: name: …".
 * @example seriesError(io, "Old Quay", "Not Box-Cox ready") // stderr: "fanwise: Old Quay: Not Box-Cox ready"
 */
export function seriesError(io: Io, name: string, message: string | undefined): void {
  io.err(`fanwise: ${oneLine(`${name}: ${message ?? ""}`)}\n`);
}

/** A command's result in both forms: the JSON object and the CSV table. */
export interface CommandOutput {
  json: () => unknown;
  header: string[];
  rows: () => unknown[][];
}

/**
 * Writes a command's result: JSON (2-space indented) with --json, else CSV.
 * @example writeOutput(io, false, { json: () => ({}), header: ["a"], rows: () => [[1]] }) // stdout: "a\n1\n"
 */
export function writeOutput(io: Io, json: boolean, output: CommandOutput): void {
  if (json) io.out(JSON.stringify(output.json(), null, 2) + "\n");
  else io.out(toCsv(output.header, output.rows()));
}
