// Reading the series of a file for a command, and fitting every series with the shared options
// (--method, --lambda, --period), each series keeping its own message when it cannot be used.
import { EngineError, RawCell, isEngineError, cleanSeries, screenSeries, fitForecast, Forecaster, ZerosRule } from "../engine";
import { DecimalMark, parseDelimiterOption, readTable, SeriesTable as CsvSeries } from "../io";
import { Io, oneLine } from "./output";
import { readCsvFile } from "./csv-file";
import { ParsedArgs } from "./options";

/**
 * The one file argument of a command; a usage error when there is none or more than one.
 * @example fileArgument(parsed, "fanwise screen sales.csv") // "sales.csv"
 */
export function fileArgument(p: ParsedArgs, example: string): string {
  if (p.positional.length !== 1) throw new EngineError("input", p.positional.length === 0 ? `Give the CSV file to read, e.g. ${example}` : `Give exactly one CSV file; got ${p.positional.length} (${p.positional.slice(0, 3).join(", ")}).`);
  return p.positional[0];
}

/**
 * Reads the command's file as series (label column skipped, one series per other column).
 * @example readSeriesFile(parsed).names // ["Harbour Street", …]
 */
export function readSeriesFile(p: ParsedArgs): CsvSeries {
  const d = p.text("delimiter");
  const file = readCsvFile(fileArgument(p, "fanwise screen sales.csv"), d === undefined ? undefined : parseDelimiterOption(d));
  return readTable(file, { decimal: p.choice("decimal") as DecimalMark | undefined });
}

/** The period a command uses for a file, and where it comes from. */
export interface PeriodChoice {
  period: number;
  /** option: --period; dates: the period column's frequency; default: 1 (no dates). */
  periodFrom: "option" | "dates" | "default";
}

/**
 * The period: --period when given, else the one the file's dates imply (monthly 12, quarterly 4,
 * yearly 1, weekly 52, daily 7), else 1.
 * @example periodOf(parsed, data) // { period: 12, periodFrom: "dates" }
 */
export function periodOf(p: ParsedArgs, data: CsvSeries): PeriodChoice {
  const given = p.int("period");
  return given !== undefined ? { period: given, periodFrom: "option" } : { period: data.period, periodFrom: data.periodFrom };
}

/**
 * Says how the file was read when it matters (rows left out, order changed, skipped periods): in
 * CSV mode one "fanwise: note: …" line each on stderr (with --json the `reading` object says it).
 * @example reportReading(io, false, data) // stderr: "fanwise: note: Line 146 ("Total") is not a period; left out."
 */
export function reportReading(io: Io, json: boolean, data: CsvSeries): void {
  if (json) return;
  for (const n of data.reading.notes) io.err(`fanwise: note: ${oneLine(n)}\n`);
}

/**
 * Names a data row by its line in the file.
 * @example lineOf(data)(0) // "line 2"
 */
export function lineOf(data: CsvSeries): (i: number) => string {
  return data.where;
}

/**
 * Replaces "row N" and "rows N, M, …" (1-based data rows, as the engine names them) by the file's lines.
 * @example atLines("zeros at rows 3, 5", data) // "zeros at lines 4, 6"
 */
export function atLines(message: string, data: CsvSeries): string {
  return message.replace(/\b(rows?) (\d+(?:, \d+)*)/g, (_m, word: string, list: string) => {
    const rows = list.split(", ").map((r) => Number(r) - 1);
    const lines = rows.map((i) => data.line(i));
    // A skipped period has no line: it is named by its date ("1950-06 (no row in the file)").
    if (lines.every((l) => l !== null)) return `${word === "rows" ? "lines" : "line"} ${lines.join(", ")}`;
    return rows.map((i) => data.where(i)).join(", ");
  });
}

/** How the command line names the zeros option in advice. */
export const ZEROS_OPTION_CLI = "add --zeros missing";

/**
 * The --zeros option: "missing" reads each zero as a missing observation.
 * @example zerosOf(parsed) // "keep"
 */
export function zerosOf(p: ParsedArgs): ZerosRule {
  return (p.choice("zeros") ?? "keep") as ZerosRule;
}

/**
 * An expected problem's message; anything else is rethrown (a bug, reported as such by main).
 * @example errorMessage(new EngineError("input", "x")) // "x"
 */
export function errorMessage(e: unknown): string {
  if (isEngineError(e)) return e.message;
  throw e;
}

/**
 * Cleans one series, naming the file's lines in any message.
 * @example cleanSeriesAtLines(data.column(0), data, 0).values // [112, 118, …]
 */
export function cleanSeriesAtLines(cells: RawCell[], data: CsvSeries, j: number, zeros: ZerosRule = "keep"): ReturnType<typeof cleanSeries> {
  try {
    return cleanSeries(cells, data.names[j], 1, { zeros });
  } catch (e) {
    // cleanSeries names rows from 1; say which line of the file instead.
    if (isEngineError(e)) throw new EngineError(e.code, atLines(e.message, data));
    throw e;
  }
}

/** One series' fit, or its message. */
export interface SeriesFit {
  name: string;
  f?: Forecaster;
  error?: string;
}

/**
 * Fits every series of the file with --method, --lambda and --period; a series that cannot be
 * fitted keeps its message.
 * @example fitAll(parsed, data)[0].f?.method // "holt-winters"
 */
export function fitAll(p: ParsedArgs, data: CsvSeries): SeriesFit[] {
  const { period } = periodOf(p, data);
  const method = p.text("method");
  const lambdaFlag = p.text("lambda");
  const zeros = zerosOf(p);
  return data.names.map((name, j) => {
    try {
      const cells = data.column(j);
      const lambda = lambdaFlag === undefined ? "auto" : lambdaFlag;
      if (lambda.toLowerCase() !== "none") {
        const screen = screenSeries(cells, { period, label: name, where: lineOf(data), zeros, zerosOption: ZEROS_OPTION_CLI });
        if (screen.nonPositive > 0) throw new EngineError("input", screen.message);
      }
      const f = fitForecast(cells, { method: method === undefined ? "auto" : method, lambda, period, label: name, zeros });
      return { name, f };
    } catch (e) {
      return { name, error: atLines(errorMessage(e), data) };
    }
  });
}
