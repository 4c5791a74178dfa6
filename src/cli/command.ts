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
  period: { type: { kind: "int", min: 1 }, value: "N", help: "seasonal period: 12 for monthly data, 4 for quarterly", example: "12", default: "1" },
  horizon: { type: { kind: "int", min: 1 }, value: "H", help: "how many periods ahead to forecast", example: "12", required: "how many periods ahead to forecast, e.g. --horizon 12." },
  method: { type: { kind: "text" }, value: "M", help: "forecasting method, one of the Methods below", example: "holt-winters", default: "auto" },
  lambda: { type: { kind: "text" }, value: "L", help: "λ: a number, auto (readable λ and form by AICc), model (the model's own maximum), guerrero, mle or none", example: "0", default: "auto" },
  transform: { type: { kind: "choice", values: ["box-cox", "yeo-johnson", "none"] }, value: "box-cox|yeo-johnson|none", help: "the transform: yeo-johnson accepts zeros and negatives", example: "yeo-johnson", default: "box-cox" },
  shift: { type: { kind: "text" }, value: "N|auto", help: "added to every value before Box-Cox (auto: −minimum + half the smallest step above it)", example: "auto", default: "0" },
  level: { type: { kind: "number" }, value: "P", help: "interval level in percent", example: "95", default: "95" },
  mean: { type: { kind: "choice", values: ["auto", "exact", "taylor"] }, value: "auto|exact|taylor", help: "which mean: auto is exact where it exists (λ ≥ 0), Taylor with its accuracy stated otherwise", example: "exact", default: "auto" },
} satisfies Record<string, OptionSpec>;
