// Reading the file of a command (CSV or .xlsx) as a table or as series, and fitting every series
// with the shared options (--method, --lambda, --period), each series keeping its own message when
// it cannot be used.
import * as path from "path";
import { EngineError, RawCell, isEngineError, cleanSeries, screenSeries, fitForecast, Forecaster, ZerosRule } from "../engine";
import { readCsvFile } from "./csv-file";
import { ParsedArgs, usageError } from "./options";
import { Io, oneLine } from "./output";
import { CellTable, SeriesData, csvTable, tableSeries } from "./table";

/**
 * The one file argument of a command; a usage error when there is none or more than one.
 * @example fileArgument(parsed, "fanwise screen sales.csv") // "sales.csv"
 */
export function fileArgument(p: ParsedArgs, example: string): string {
  if (p.positional.length !== 1) throw new EngineError("input", p.positional.length === 0 ? `Give the CSV or .xlsx file to read, e.g. ${example}` : `Give exactly one file; got ${p.positional.length} (${p.positional.slice(0, 3).join(", ")}).`);
  return p.positional[0];
}

/**
 * Reads the command's file as a table: .xlsx by --sheet and --range, anything else as CSV. How the
 * file was read (merged cells, formulas without results) is said on stderr as notes.
 * @example (await readTable(parsed, io, "fanwise audit log.csv …")).header // ["month", "actual", …]
 */
export async function readTable(p: ParsedArgs, io: Io, example: string): Promise<CellTable> {
  const file = fileArgument(p, example);
  if (path.extname(file).toLowerCase() === ".xlsx") {
    const { readXlsxTable } = await import("./xlsx-read");
    const t = await readXlsxTable(file, { sheet: p.text("sheet"), range: p.text("range") });
    for (const n of t.notes) io.err(`fanwise: note: ${oneLine(n)}\n`);
    return t;
  }
  for (const k of ["sheet", "range"]) {
    if (p.has(k)) throw usageError(`--${k} is for .xlsx workbooks; ${file} is read as CSV (its name does not end in .xlsx).`);
  }
  return csvTable(readCsvFile(file));
}

/**
 * Reads the command's file as series (label column skipped, one series per other column), only
 * those named by --series when it is given.
 * @example (await readSeriesFile(parsed, io)).names // ["Harbour Street", …]
 */
export async function readSeriesFile(p: ParsedArgs, io: Io): Promise<SeriesData> {
  return tableSeries(await readTable(p, io, "fanwise screen sales.csv"), p.text("series"));
}

/**
 * Names a data row by where it is in the file.
 * @example lineOf(data)(0) // "line 2"
 */
export function lineOf(data: SeriesData): (i: number) => string {
  return data.where;
}

/**
 * Replaces "row N" and "rows N, M, …" (1-based data rows, as the engine names them) by where the
 * rows are in the file ("line 4", or "row 5 of sheet …" for a workbook).
 * @example atLines("zeros at rows 3, 5", data) // "zeros at lines 4, 6"
 */
export function atLines(message: string, data: SeriesData): string {
  // (a workbook's place already reads "row N of sheet …", which is left as it is)
  return message.replace(/\b(rows?) (\d+(?:, \d+)*)\b(?! of sheet)/g, (_m, word: string, list: string) => {
    const places = list.split(", ").map((r) => data.where(Number(r) - 1));
    if (places.every((x) => x.startsWith("line "))) return `${word === "rows" ? "lines" : "line"} ${places.map((x) => x.slice(5)).join(", ")}`;
    return places.join(", ");
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
export function cleanSeriesAtLines(cells: RawCell[], data: SeriesData, j: number, zeros: ZerosRule = "keep"): ReturnType<typeof cleanSeries> {
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
 * Fits every series of the file with --method, --lambda, --transform, --shift and --period; a series that cannot be
 * fitted keeps its message.
 * @example fitAll(parsed, data)[0].f?.method // "holt-winters"
 */
export function fitAll(p: ParsedArgs, data: SeriesData): SeriesFit[] {
  const period = p.int("period") ?? 1;
  const method = p.value<string>("method") ?? "auto";
  const lambda = p.value<string>("lambda") ?? "auto";
  const transform = p.has("transform") ? p.choice("transform") : undefined;
  const shift = p.text("shift");
  const zeros = zerosOf(p);
  return data.names.map((name, j) => {
    try {
      const cells = data.column(j);
      if (lambda !== "none" && (transform === undefined || transform === "box-cox") && shift === undefined) {
        // Say where the first value ≤ 0 is, by the file's line, and what works.
        const screen = screenSeries(cells, { period, label: name, where: lineOf(data), zeros, zerosOption: ZEROS_OPTION_CLI });
        if (screen.nonPositive > 0) throw new EngineError("input", screen.message);
      }
      const f = fitForecast(cells, { method, lambda, transform, shift, period, label: name, zeros });
      return { name, f };
    } catch (e) {
      return { name, error: atLines(errorMessage(e), data) };
    }
  });
}

/**
 * The history of series j as drawn in a chart: its observed values (blanks dropped) with their
 * period labels, the last `keep` of them. Where the file has no label column the labels are empty.
 * @example chartHistory(data, 0, 36).values.length // 36
 */
export function chartHistory(data: SeriesData, j: number, keep: number): { values: number[]; labels: string[] } {
  const cells = data.column(j);
  const labels = data.labelColumn?.values ?? [];
  const values: number[] = [];
  const at: string[] = [];
  cells.forEach((c, i) => {
    if (typeof c === "number" && Number.isFinite(c)) {
      values.push(c);
      at.push(labels[i] ?? "");
    }
  });
  return { values: values.slice(-keep), labels: at.slice(-keep) };
}

/**
 * Labels of the H forecast periods after the history's last label. HOOK: the shared reader in
 * src/io (period labels and the calendar) replaces this once it lands; until then a label is
 * extended only when it is plainly monthly (YYYY-MM or a YYYY-MM-DD date on the same day of
 * consecutive months) or a year, and otherwise the steps are "+1" … "+H".
 * @example futureLabels(["2025-11", "2025-12"], 2) // ["2026-01", "2026-02"]
 */
export function futureLabels(labels: string[], H: number): string[] {
  const last = labels[labels.length - 1] ?? "";
  const prev = labels[labels.length - 2] ?? "";
  const month = /^(\d{4})-(\d{2})(-01)?$/;
  const a = month.exec(last);
  const b = month.exec(prev);
  if (a && b && Number(a[1]) * 12 + Number(a[2]) - (Number(b[1]) * 12 + Number(b[2])) === 1 && (a[3] ?? "") === (b[3] ?? "")) {
    const base = Number(a[1]) * 12 + Number(a[2]) - 1;
    return Array.from({ length: H }, (_, k) => {
      const m = base + k + 1;
      return `${Math.floor(m / 12)}-${String((m % 12) + 1).padStart(2, "0")}${a[3] ?? ""}`;
    });
  }
  if (/^\d{4}$/.test(last) && /^\d{4}$/.test(prev) && Number(last) - Number(prev) === 1) return Array.from({ length: H }, (_, k) => String(Number(last) + k + 1));
  return Array.from({ length: H }, (_, k) => `+${k + 1}`);
}
