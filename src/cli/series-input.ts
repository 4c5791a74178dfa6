// Reading the file of a command (CSV or .xlsx) through the shared reader (src/io) as a table or as
// series, and fitting every series with the shared options (--method, --lambda, --period, …), each
// series keeping its own message when it cannot be used.
import * as path from "path";
import { EngineError, RawCell, isEngineError, cleanSeries, screenSeries, fitForecast, Forecaster, ZerosRule } from "../engine";
import { DecimalMark, labelAfter, LongColumns, LongSpec, parseDelimiterOption, parsePeriodLabel, readLongTable, readTable, SeriesTable } from "../io";
import { readCsvFile } from "./csv-file";
import { ParsedArgs, usageError } from "./options";
import { Io, oneLine } from "./output";
import { SeriesData, tableSeries } from "./table";

/**
 * The one file argument of a command; a usage error when there is none or more than one.
 * @example fileArgument(parsed, "fanwise screen sales.csv") // "sales.csv"
 */
export function fileArgument(p: ParsedArgs, example: string): string {
  if (p.positional.length !== 1) throw new EngineError("input", p.positional.length === 0 ? `Give the CSV or .xlsx file to read, e.g. ${example}` : `Give exactly one file; got ${p.positional.length} (${p.positional.slice(0, 3).join(", ")}).`);
  return p.positional[0];
}

/** A command's file as the shared reader read it, with the notes of how its cells were read. */
export interface InputTable {
  table: SeriesTable;
  /** The source's own notes (a workbook's merged cells, formulas without results). */
  notes: string[];
}

/**
 * Reads the command's file through the shared reader: .xlsx by --sheet and --range (numbers and
 * dates as the workbook stores them, text cells read like CSV fields), anything else as CSV
 * (--delimiter); --decimal for both. A workbook's own notes (merged cells, formulas without
 * results) are said on stderr. `calendar: false` reads the rows in the file's order (a forecast
 * log repeats periods).
 * @example (await readInputTable(parsed, io, "fanwise audit log.csv …")).table.header // ["month", "actual", …]
 */
export async function readInputTable(p: ParsedArgs, io: Io, example: string, options: { calendar?: boolean; keepLabels?: boolean } = {}): Promise<InputTable> {
  const file = fileArgument(p, example);
  const read = { calendar: options.calendar, decimal: p.choice("decimal") as DecimalMark | undefined };
  // --long: one row per series and period, turned into the wide table as it is read.
  const long = p.value<LongSpec>("long");
  if (path.extname(file).toLowerCase() === ".xlsx") {
    if (p.has("delimiter")) throw usageError(`--delimiter is for CSV files; ${file} is an .xlsx workbook, whose cells need no delimiter.`);
    const { readXlsxTable } = await import("./xlsx-read");
    const t = await readXlsxTable(file, { sheet: p.text("sheet"), range: p.text("range") });
    for (const n of t.notes) io.err(`fanwise: note: ${oneLine(n)}\n`);
    return { table: long ? readLongTable(LongColumns.fromColumns(t.columns, long), read) : readTable(t.columns, read), notes: t.notes };
  }
  for (const k of ["sheet", "range"]) {
    if (p.has(k)) throw usageError(`--${k} is for .xlsx workbooks; ${file} is read as CSV (its name does not end in .xlsx).`);
  }
  const d = p.text("delimiter");
  const cols = readCsvFile(file, { delimiter: d === undefined ? undefined : parseDelimiterOption(d), keepLabels: options.keepLabels, long });
  return { table: cols instanceof LongColumns ? readLongTable(cols, read) : readTable(cols, read), notes: [] };
}

/**
 * Reads the command's file as series (the period column read as the calendar, one series per
 * column of numbers), only those named by --series when it is given.
 * @example (await readSeriesFile(parsed, io)).names // ["Harbour Street", …]
 */
export async function readSeriesFile(p: ParsedArgs, io: Io): Promise<SeriesData> {
  const t = await readInputTable(p, io, "fanwise screen sales.csv");
  return tableSeries(t.table, t.notes, p.text("series"));
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
export function periodOf(p: ParsedArgs, data: SeriesTable): PeriodChoice {
  const given = p.int("period");
  return given !== undefined ? { period: given, periodFrom: "option" } : { period: data.period, periodFrom: data.periodFrom };
}

/**
 * Reads every series' cells once, so the `reading` report (each column's number format) is complete
 * before any result is written; a series whose cells cannot be read is left for its own message.
 * @example readAllColumns(data); data.reading.columns["Harbour Street"].thousands // [","]
 */
export function readAllColumns(data: SeriesData): void {
  for (let j = 0; j < data.names.length; j++) {
    try {
      data.column(j);
    } catch (e) {
      if (!isEngineError(e)) throw e;
    }
  }
}

/**
 * Says how the file was read when it matters (rows left out, order changed, skipped periods): in
 * CSV mode one "fanwise: note: …" line each on stderr (with --json the `reading` object says it).
 * @example reportReading(io, false, data) // stderr: "fanwise: note: Line 146 ("Total") is not a period; left out."
 */
export function reportReading(io: Io, json: boolean, data: SeriesTable): void {
  if (json) return;
  for (const n of data.reading.notes) io.err(`fanwise: note: ${oneLine(n)}\n`);
}

/**
 * The period labels of series j's H forecast steps: the periods after its last observed value (a
 * series whose last rows are blank is forecast from its last value, so its steps start earlier
 * than the file's end). Null when the file has no calendar (no period column of dates).
 * @example stepLabels(data, 0, 2) // ["2026-01", "2026-02"]
 */
export function stepLabels(data: SeriesData, j: number, H: number): string[] | null {
  return labelsAfter(data, lastObserved(data, j), H);
}

/** The position of series j's last observed value (−1 when it has none). */
export function lastObserved(data: SeriesData, j: number): number {
  const cells = data.column(j);
  let last = cells.length - 1;
  while (last >= 0 && (cells[last] === null || cells[last] === undefined || String(cells[last]).trim() === "")) last--;
  return last;
}

/**
 * The labels of the H periods after position `last` of the file's calendar; null without a calendar.
 * @example labelsAfter(data, 71, 2) // ["2026-01", "2026-02"] for a monthly file starting 2020-01
 */
export function labelsAfter(data: SeriesData, last: number, H: number): string[] | null {
  const cal = data.calendar;
  if (!cal || !data.next) return null;
  const next = data.next;
  return Array.from({ length: H }, (_, k) => labelAfter(cal.labels, next, last, k + 1));
}

/**
 * A period typed by the user (--from 2026-01, "Jan 2026", "2026 Q1", "2026") written the way the
 * file's calendar writes its labels ("2026-01", "2026-Q1", "2026", or an ISO date), or null when
 * it cannot be read as a period of that frequency.
 * @example calendarLabel("Jan 2026", "monthly") // "2026-01"
 */
export function calendarLabel(text: string, frequency: string): string | null {
  const p = parsePeriodLabel(text);
  if (!p) return null;
  const two = (x: number): string => String(x).padStart(2, "0");
  const hasMonth = p.family === "ym" || p.family === "my" || p.family === "mon" || p.family === "ymd" || p.family === "dmy";
  if (frequency === "monthly") return hasMonth ? `${p.y}-${two(p.a)}` : null;
  if (frequency === "quarterly") return p.family === "q" ? `${p.y}-Q${p.a}` : null;
  if (frequency === "yearly") return p.family === "year" ? String(p.y) : null;
  return p.family === "ymd" || p.family === "dmy" ? `${p.y}-${two(p.a)}-${two(p.b)}` : null;
}

/**
 * Names a data row by where it is in the file; with series j, where that series' cell is (in a
 * long file each series' row of a period has its own line).
 * @example lineOf(data)(0) // "line 2"
 */
export function lineOf(data: SeriesData, j?: number): (i: number) => string {
  return (i) => data.where(i, j);
}

/**
 * Replaces "row N" and "rows N, M, …" (1-based data rows, as the engine names them) by where the
 * rows are in the file ("line 4", or "row 5 of sheet …" for a workbook).
 * @example atLines("zeros at rows 3, 5", data) // "zeros at lines 4, 6"
 */
export function atLines(message: string, data: SeriesData, j?: number): string {
  // (a workbook's place already reads "row N of sheet …", which is left as it is)
  // A place that carries its own parenthesis ("07.1951 (no row for Mühlweg)") inside the message's
  // parentheses is written "07.1951: no row for Mühlweg", so no parentheses are doubled.
  return message.replace(/\b(rows?) (\d+(?:, \d+)*)\b(?! of sheet)/g, (m: string, word: string, list: string, at: number) => {
    const places = list.split(", ").map((r) => data.where(Number(r) - 1, j));
    if (places.every((x) => x.startsWith("line "))) return `${word === "rows" ? "lines" : "line"} ${places.map((x) => x.slice(5)).join(", ")}`;
    const inParens = message[at - 1] === "(" && message[at + m.length] === ")";
    if (inParens && places.some((x) => / \(.*\)$/.test(x))) return places.map((x) => x.replace(/ \((.*)\)$/, ": $1")).join("; ");
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
    if (isEngineError(e)) throw new EngineError(e.code, atLines(e.message, data, j));
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
  return data.names.map((_, j) => fitOne(p, data, j));
}

/**
 * Fits series j of the file with --method, --lambda, --transform, --shift and --period; a series
 * that cannot be fitted keeps its message (what {@link fitAll} does for each series).
 * @example fitOne(parsed, data, 0).f?.method // "holt-winters"
 */
export function fitOne(p: ParsedArgs, data: SeriesData, j: number): SeriesFit {
  const { period } = periodOf(p, data);
  const method = p.value<string>("method") ?? "auto";
  const lambda = p.value<string>("lambda") ?? "auto";
  const transform = p.has("transform") ? p.choice("transform") : undefined;
  const shift = p.text("shift");
  const zeros = zerosOf(p);
  const name = data.names[j];
  {
    try {
      const cells = data.column(j);
      if (lambda !== "none" && (transform === undefined || transform === "box-cox") && shift === undefined && hasNonPositive(cells, zeros)) {
        // Say where the first value ≤ 0 is, by the file's line, and what works (the screen also
        // suggests a λ, a whole auto fit: only asked for when there is a value ≤ 0 to name).
        const screen = screenSeries(cells, { period, label: name, where: lineOf(data, j), zeros, zerosOption: ZEROS_OPTION_CLI });
        if (screen.nonPositive > 0) throw new EngineError("input", screen.message);
      }
      const f = fitForecast(cells, { method, lambda, transform, shift, period, label: name, zeros });
      return { name, f };
    } catch (e) {
      return { name, error: atLines(errorMessage(e), data, j) };
    }
  }
}

/** Whether a series has a value ≤ 0 that Box-Cox cannot take (what the screen counts as nonPositive). */
function hasNonPositive(cells: readonly RawCell[], zeros: ZerosRule): boolean {
  return cells.some((c) => typeof c === "number" && Number.isFinite(c) && c <= 0 && !(zeros === "missing" && c === 0));
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
