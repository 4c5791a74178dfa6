// What every command file exports: its name, its one-line summary, its arguments and its option
// table (the single declaration that parsing, usage errors and help come from), and its run.
import { METHODS, isEngineError, parseMethod } from "../engine";
import { LongSpec, parseLongSpec } from "../io";
import { Io } from "./output";
import { OptionSpec, OptionTable, ParsedArgs, switchOption, usageError } from "./options";

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

/** λ written as a word (a number between -5 and 5 is also accepted). */
export const LAMBDA_WORDS = ["auto", "model", "guerrero", "mle", "none"] as const;

/**
 * Checks --lambda: a number between -5 and 5 or one of LAMBDA_WORDS; a usage error otherwise.
 * @example checkLambda("0.5", "lambda") // "0.5"
 */
export function checkLambda(v: string, name: string): string {
  const k = v.trim().toLowerCase();
  if ((LAMBDA_WORDS as readonly string[]).includes(k)) return k;
  const x = Number(k);
  if (k !== "" && Number.isFinite(x)) {
    if (x >= -5 && x <= 5) return k;
    throw usageError(`--${name} must be between -5 and 5; got ${v}. Most business series need a λ between -1 and 1, e.g. --${name} 0 for logs.`);
  }
  throw usageError(`--${name} must be a number, or ${LAMBDA_WORDS.join(", ")}; got "${v}".`);
}

/**
 * Checks --method against the engine's list; a usage error otherwise.
 * @example checkMethod("Holt-Winters", "method") // "holt-winters"
 */
export function checkMethod(v: string, name: string): string {
  try {
    return parseMethod(v);
  } catch (e) {
    if (isEngineError(e) && !/^Unknown method/.test(e.message)) throw usageError(`--${name}: ${e.message}`); // e.g. an ARIMA order out of bounds
    throw usageError(`--${name} must be one of ${METHODS.join(", ")}, or an ARIMA order such as arima:0,1,1; got "${v}".`);
  }
}

/**
 * Checks --long: three header names (series, period, value) separated by commas; a usage error otherwise.
 * @example checkLong("store,month,sales", "long") // { series: "store", period: "month", value: "sales" }
 */
export function checkLong(v: string, name: string): LongSpec {
  return parseLongSpec(v, `--${name}`);
}

/**
 * Checks --digits: a whole number of significant digits from 1 to 17 (17 shows any double exactly).
 * @example checkDigits("6", "digits") // 6
 */
export function checkDigits(v: string, name: string): number {
  const x = Number(v);
  if (v.trim() === "" || !Number.isInteger(x) || x < 1 || x > 17) throw usageError(`--${name} must be a whole number from 1 to 17 (significant digits), e.g. --${name} 6; got "${v}".`);
  return x;
}

/** Options shared by several commands, declared once so they read the same everywhere. */
export const COMMON = {
  json: switchOption("print JSON (full precision) instead of CSV"),
  period: { type: { kind: "int", min: 1 }, value: "N", help: "seasonal period: 12 for monthly data, 4 for quarterly (default: from the dates, else 1)", example: "12", default: "from the dates" },
  delimiter: { type: { kind: "text" }, value: ",|;|tab", help: "the file's delimiter (default: detected; a sep= first line is honoured)", example: ";", default: "detected" },
  decimal: { type: { kind: "choice", values: [",", "."] }, value: ",|.", help: "the numbers' decimal mark (default: decided per column from its values)", example: ",", default: "decided per column" },
  horizon: { type: { kind: "int", min: 1 }, value: "H", help: "how many periods ahead to forecast", example: "12", required: "how many periods ahead to forecast, e.g. --horizon 12." },
  method: { type: { kind: "custom", check: checkMethod }, value: "M", help: "forecasting method, one of the Methods below", example: "holt-winters", default: "auto" },
  lambda: { type: { kind: "custom", check: checkLambda }, value: "L", help: "λ: a number, auto (readable λ and form by AICc), model (the model's own maximum), guerrero, mle or none", example: "0", default: "auto" },
  transform: { type: { kind: "choice", values: ["box-cox", "yeo-johnson", "none"] }, value: "box-cox|yeo-johnson|none", help: "the transform: yeo-johnson accepts zeros and negatives", example: "yeo-johnson", default: "box-cox" },
  shift: { type: { kind: "text" }, value: "N|auto", help: "added to every value before Box-Cox (auto: −minimum + half the smallest step above it)", example: "auto", default: "0" },
  level: { type: { kind: "number" }, value: "P", help: "interval level in percent", example: "95", default: "95" },
  mean: { type: { kind: "choice", values: ["auto", "exact", "taylor"] }, value: "auto|exact|taylor", help: "which mean: auto is exact where it exists (λ ≥ 0), Taylor with its accuracy stated otherwise", example: "exact", default: "auto" },
  zeros: { type: { kind: "choice", values: ["keep", "missing"] }, value: "keep|missing", help: "missing: read each zero as a missing observation (a closed period)", example: "missing", default: "keep" },
  series: { type: { kind: "text" }, value: "NAME[,NAME]", help: "only these series (column names, comma-separated)", example: "\"Harbour Street\"" },
  digits: { type: { kind: "custom", check: checkDigits }, value: "N", help: "significant digits of printed numbers (JSON and workbooks keep full precision)", example: "6", default: "10" },
  out: { type: { kind: "text" }, value: "FILE", help: "write the table to FILE: .xlsx (with number formats, settings, cautions and charts), .csv or .json", example: "results.xlsx" },
  sheet: { type: { kind: "text" }, value: "NAME", help: "the worksheet to read when FILE is .xlsx (default: the first)", example: "Sales" },
  range: { type: { kind: "text" }, value: "A1:H74", help: "the cells to read when FILE is .xlsx, header row first (default: the used range)", example: "B2:H74" },
  long: { type: { kind: "custom", check: checkLong }, value: "SERIES_COL,PERIOD_COL,VALUE_COL", help: "read a long file: one row per series and period, the three columns named by their headers (series in order of first appearance)", example: "store,month,sales" },
} satisfies Record<string, OptionSpec>;

/** The options every command that reads a table takes for reading its file and writing its table. */
export const IO_OPTIONS = { series: COMMON.series, sheet: COMMON.sheet, range: COMMON.range, delimiter: COMMON.delimiter, decimal: COMMON.decimal, json: COMMON.json, digits: COMMON.digits, out: COMMON.out };

/** IO_OPTIONS plus --long, for the commands that read series (one per column, or one per name in a long file). */
export const SERIES_IO_OPTIONS = { ...IO_OPTIONS, long: COMMON.long };
