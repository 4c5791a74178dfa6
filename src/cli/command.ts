// What every command file exports: its name, its one-line summary, its arguments and its option
// table (the single declaration that parsing, usage errors and help come from), and its run.
import { Io } from "./output";
import { OptionSpec, OptionTable, ParsedArgs, switchOption } from "./options";

/** One `fanwise` command. */
export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** The positional arguments in usage lines, e.g. "FILE" (empty for none). */
  args: string;
  options: OptionTable;
  /** Paragraphs shown by `fanwise help NAME` after the options. */
  details?: string[];
  /** Command lines that work, shown in help. */
  examples: string[];
  /** Runs the command; resolves to the exit code. */
  run: (p: ParsedArgs, io: Io) => number | Promise<number>;
}

/** Options shared by several commands, declared once so they read the same everywhere. */
export const COMMON = {
  json: switchOption("print JSON (full precision) instead of CSV"),
  period: { type: { kind: "int", min: 1 }, value: "N", help: "seasonal period: 12 for monthly data, 4 for quarterly (default: from the dates, else 1)", example: "12", default: "from the dates" },
  delimiter: { type: { kind: "text" }, value: ",|;|tab", help: "the file's delimiter (default: detected; a sep= first line is honoured)", example: ";", default: "detected" },
  decimal: { type: { kind: "choice", values: [",", "."] }, value: ",|.", help: "the numbers' decimal mark (default: decided per column from its values)", example: ",", default: "decided per column" },
  horizon: { type: { kind: "int", min: 1 }, value: "H", help: "how many periods ahead to forecast", example: "12", required: "how many periods ahead to forecast, e.g. --horizon 12." },
  method: { type: { kind: "text" }, value: "M", help: "forecasting method, one of the Methods below", example: "holt-winters", default: "auto" },
  lambda: { type: { kind: "text" }, value: "L", help: "Box-Cox λ: a number, auto, guerrero, mle or none", example: "0", default: "auto" },
  level: { type: { kind: "number" }, value: "P", help: "interval level in percent", example: "95", default: "95" },
  mean: { type: { kind: "choice", values: ["taylor", "exact"] }, value: "taylor|exact", help: "how the mean is back-transformed", example: "exact", default: "taylor" },
  zeros: { type: { kind: "choice", values: ["keep", "missing"] }, value: "keep|missing", help: "missing: read each zero as a missing observation (a closed period)", example: "missing", default: "keep" },
} satisfies Record<string, OptionSpec>;
