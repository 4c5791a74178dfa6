// Reading the series of a file for a command, and fitting every series with the shared options
// (--method, --lambda, --period), each series keeping its own message when it cannot be used.
import { EngineError, RawCell, isEngineError, cleanSeries, screenSeries, fitForecast, Forecaster } from "../engine";
import { csvSeries, CsvSeries } from "./csv";
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
  return csvSeries(readCsvFile(fileArgument(p, "fanwise screen sales.csv")));
}

/**
 * Names a data row by its line in the file.
 * @example lineOf(data)(0) // "line 2"
 */
export function lineOf(data: CsvSeries): (i: number) => string {
  return (i) => `line ${data.line(i)}`;
}

/**
 * Replaces "row N" (1-based data rows, as the engine names them) by the file's line.
 * @example atLines("zero at row 3", data) // "zero at line 4"
 */
export function atLines(message: string, data: CsvSeries): string {
  return message.replace(/row (\d+)/, (_m, r) => `line ${data.line(Number(r) - 1)}`);
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
export function cleanSeriesAtLines(cells: RawCell[], data: CsvSeries, j: number): ReturnType<typeof cleanSeries> {
  try {
    return cleanSeries(cells, data.names[j], 1);
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
 * Fits every series of the file with --method, --lambda, --transform, --shift and --period; a series that cannot be
 * fitted keeps its message.
 * @example fitAll(parsed, data)[0].f?.method // "holt-winters"
 */
export function fitAll(p: ParsedArgs, data: CsvSeries): SeriesFit[] {
  const period = p.int("period") ?? 1;
  const method = p.text("method");
  const lambdaFlag = p.text("lambda");
  const transform = p.has("transform") ? p.choice("transform") : undefined;
  const shift = p.text("shift");
  return data.names.map((name, j) => {
    try {
      const cells = data.column(j);
      const lambda = lambdaFlag === undefined ? "auto" : lambdaFlag;
      if (lambda.toLowerCase() !== "none" && (transform === undefined || transform === "box-cox") && shift === undefined) {
        // Say where the first value ≤ 0 is, by the file's line, and what works.
        const screen = screenSeries(cells, { period, label: name, where: lineOf(data) });
        if (screen.nonPositive > 0) throw new EngineError("input", screen.message);
      }
      const f = fitForecast(cells, { method: method === undefined ? "auto" : method, lambda, transform, shift, period, label: name });
      return { name, f };
    } catch (e) {
      return { name, error: atLines(errorMessage(e), data) };
    }
  });
}
