// Reading a table: which column holds the periods (and their calendar), which columns are series,
// each series' number format decided from the whole column, and rows that are not observations
// (a "Total" row) left out with a note. Every decision is reported (`reading`).
import { EngineError, RawCell } from "../engine";
import { Calendar, calendarFor, Frequency, LabelledRow } from "./calendar";
import { BLANK, Column, COMMA3, CsvColumns, LABEL, NUM, TEXT, VALUE } from "./columns";
import { delimiterName, DelimiterFrom, likelyDelimiter } from "./delimiter";
import { DecimalMark, looksNumeric, markEvidence, NegativeStyle, parseNumberText } from "./numbers";
import { LabelFamily, LabelParts, parsePeriodLabel } from "./period-labels";
import type { Delimiter } from "./records";

/** How one series column's numbers were read. */
export interface ColumnReading {
  decimal: DecimalMark;
  /** values: the column's own values; file: other columns of the file; delimiter: the file's delimiter; option: forced; none: no value has a decimal part. */
  decimalFrom: "values" | "file" | "delimiter" | "option" | "none";
  thousands: string[];
  currency: string[];
  percent: boolean;
  negatives: NegativeStyle[];
}

/** The period column and its calendar, as read. */
export interface DatesReading {
  column: string;
  format: string;
  frequency: Frequency;
  first: string;
  last: string;
  /** Periods with no row in the file: blank (missing) at their place. */
  skipped: string[];
  reversed: boolean;
  sorted: boolean;
}

/** Everything decided while reading a table (the CLI's `reading` object in --json). */
export interface Reading {
  delimiter: string;
  delimiterFrom: DelimiterFrom;
  dates: DatesReading | null;
  columns: Record<string, ColumnReading>;
  /** Rows left out because they are not observations (a label that is not a period). */
  leftOut: { line: number; label: string }[];
  /** Columns that are neither series nor the period column (text). */
  ignored: string[];
  /** What a user should know, in sentences. */
  notes: string[];
}

/** Options of {@link readTable}. */
export interface ReadOptions {
  /** Look for a period column and its calendar (default true; an audit's log repeats periods). */
  calendar?: boolean;
  /** Force the decimal mark of every series column. */
  decimal?: DecimalMark;
  /** How the face names its options in messages ("--decimal", "the decimal mark box"). */
  /** How the face says to force decimal mark m (default: "--decimal ,"). */
  decimalFix?: (mark: DecimalMark) => string;
  /** How the face says to use delimiter d (default: "--delimiter ;"). */
  delimiterFix?: (d: string) => string;
  /** The rows' order means nothing (a long file, one row per series and period): no note when they are not in time order. */
  rowsInAnyOrder?: boolean;
}

/** A table read for forecasting: its series in time order, blanks at skipped periods. */
export interface SeriesTable {
  names: string[];
  /** The cells of series j in time order (made on demand). Throws an `input` EngineError naming a value that cannot be read. */
  column: (j: number) => RawCell[];
  /** The period column's name and its labels (one per row, in time order), when there is one. */
  labelColumn: { name: string; values: string[] } | null;
  /** The file's line of row i, or null for a skipped period (no row in the file). */
  line: (i: number) => number | null;
  /**
   * Row i in words for messages: "line 12", or "2024-03 (no row in the file)". With series s (an
   * index into `names`), the place of that series' cell: in a long file each series' row of that
   * period has its own line.
   */
  where: (i: number, s?: number) => string;
  /** Number of rows (in time order, skipped periods included). */
  rows: number;
  /** The calendar of the period column, when its labels are dates. */
  calendar: Calendar | null;
  /** The label h periods after the last row (h ≥ 1), when there is a calendar. */
  next: ((h: number) => string) | null;
  /** The period the dates imply (1 without a calendar). */
  period: number;
  periodFrom: "dates" | "default";
  reading: Reading;
  /** The cells of any column by its header name (an audit's columns), in time order; null if none. */
  columnNamed: (name: string) => RawCell[] | null;
  header: string[];
}

const DATE_HEADER = /date|datum|fecha|data|day|tag|jour|time|period|month|monat|week/i;

/** How a column can be read as period labels. */
interface LabelReading {
  family: LabelFamily;
  /** Parts of each row (null: blank or not a label of this family). */
  parts: (LabelParts | null)[];
  parsed: number;
  /** Rows whose label is a period written another way. */
  other: number[];
}

/** Reads a column's cells as labels of its commonest family (numbers read as years, m.yyyy or serial dates where allowed). */
function labelReading(c: Column, rows: number, index: number): LabelReading | null {
  const counts = new Map<LabelFamily, number>();
  const asNumber = (i: number): LabelParts | null => {
    const v = c.nums[i];
    const shape = c.shape[i];
    const intDigits = shape >> 4;
    const frac = shape & 15;
    if (c.kinds[i] === VALUE) {
      // A workbook's number: a year under a period header (or in the first column), or a serial date under a date header.
      if (Number.isInteger(v) && v >= 1000 && v <= 2999 && (c.labelByName || index === 0)) return { family: "year", y: v, a: 0, b: 0, format: "yyyy" };
      if (Number.isInteger(v) && v >= 3000 && v < 2958466 && DATE_HEADER.test(c.name)) return { family: "serial", y: v, a: 0, b: 0, format: "spreadsheet serial date" };
      return null;
    }
    if (frac === 0 && intDigits === 4 && v >= 1000 && v <= 2999 && (c.labelByName || index === 0)) return { family: "year", y: v, a: 0, b: 0, format: "yyyy" };
    if (frac === 4 && intDigits <= 2 && v >= 1 && v < 13) {
      const p = parsePeriodLabel(c.text(i));
      if (p && p.family === "my") return p;
    }
    if (frac === 0 && v >= 3000 && v < 2958466 && DATE_HEADER.test(c.name)) return { family: "serial", y: v, a: 0, b: 0, format: "spreadsheet serial date" };
    return null;
  };
  const parts: (LabelParts | null)[] = new Array(rows);
  for (let i = 0; i < rows; i++) {
    const k = c.kinds[i];
    const p = k === LABEL ? c.label(i) : k === NUM || k === VALUE ? asNumber(i) : null;
    parts[i] = p;
    if (p) counts.set(p.family, (counts.get(p.family) ?? 0) + 1);
  }
  let family: LabelFamily | null = null;
  let best = 0;
  for (const [f, n] of counts) if (n > best) { best = n; family = f; }
  // Labels where nearly all cells are labels: at most 3 others (or a fifth), so a "Total" row is left
  // out but a column of text is not read as dates for a few values in it.
  if (!family || best < 2 || best * 2 <= c.nonBlank || c.nonBlank - best > Math.max(3, 0.2 * c.nonBlank)) return null;
  const other: number[] = [];
  for (let i = 0; i < rows; i++) {
    const p = parts[i];
    if (p && p.family !== family) { other.push(i); parts[i] = null; }
  }
  return { family, parts, parsed: best, other };
}

/** Evidence for a series column's decimal mark. */
interface MarkVotes { dot: number; comma: number; ambiguous: number; firstDot: number; firstComma: number; firstAmbiguous: number }

function votes(c: Column, keep: Int32Array): MarkVotes {
  const v: MarkVotes = { dot: 0, comma: 0, ambiguous: 0, firstDot: -1, firstComma: -1, firstAmbiguous: -1 };
  for (const i of keep) {
    if (i < 0) continue;
    const k = c.kinds[i];
    let e: string;
    if (k === NUM) {
      const frac = c.shape[i] & 15;
      const intDigits = c.shape[i] >> 4;
      const lead = Math.abs(c.nums[i]) < 1;
      e = frac === 0 ? "same" : frac === 3 && intDigits <= 3 && !lead ? "ambiguous" : ".";
    } else if (k === COMMA3) e = "ambiguous";
    else if (k === TEXT) e = markEvidence(c.texts.get(i) ?? "");
    else continue;
    if (e === ".") { v.dot++; if (v.firstDot < 0) v.firstDot = i; }
    else if (e === ",") { v.comma++; if (v.firstComma < 0) v.firstComma = i; }
    else if (e === "ambiguous") { v.ambiguous++; if (v.firstAmbiguous < 0) v.firstAmbiguous = i; }
  }
  return v;
}

/** Whether column c is a series: its non-blank cells are mostly numbers (or look like numbers). */
function isSeriesColumn(c: Column, rows: number): boolean {
  if (c.nonBlank === 0) return false;
  let numeric = 0;
  for (let i = 0; i < rows; i++) {
    const k = c.kinds[i];
    if (k === NUM || k === VALUE || k === COMMA3 || (k === TEXT && looksNumeric(c.texts.get(i) ?? ""))) numeric++;
  }
  return numeric * 2 >= c.nonBlank;
}

/**
 * Reads a table's columns for forecasting. The period column is the first whose values are period
 * labels of one written form (or the first column named period, date, month, year, … when its
 * values are plain labels); rows whose label is not a period where the others are (a "Total" row)
 * are left out with a note; the calendar (calendar.ts) puts rows in time order, blanks at skipped
 * periods. Every other column whose values are mostly numbers is a series; its decimal mark is
 * decided from the whole column (then other columns, then the delimiter: semicolon files use a
 * decimal comma, comma files a decimal point), and a value that looks like a number but cannot be
 * read is named, never dropped. Common practice (how spreadsheet importers read exports).
 * @example readTable(parseCsv("Monat;Umsatz\n01.1995;\"66.190,00\"\n02.1995;\"67.005,50\"\n")).column(0) // [66190, 67005.5]
 */
export function readTable(cols: CsvColumns, options: ReadOptions = {}): SeriesTable {
  const rows = cols.rows;
  const delimiter: Delimiter = cols.delimiter;
  const fix = options.decimalFix ?? ((m: DecimalMark) => `--decimal ${m}`);
  const notes: string[] = [];
  const fileLine = (i: number, j?: number): string => cols.where(i, j);
  // 1. The period column.
  let calCol = -1;
  let lr: LabelReading | null = null;
  for (let j = 0; j < cols.cols.length && calCol < 0 && options.calendar !== false; j++) {
    const r = labelReading(cols.cols[j], rows, j);
    if (r) { calCol = j; lr = r; }
  }
  let calendar: Calendar | null = null;
  const leftOut: { line: number; label: string }[] = [];
  let keep: Int32Array = Int32Array.from({ length: rows }, (_, i) => i);
  const seriesIdx: number[] = [];
  const ignored: string[] = [];
  let textLabelCol = -1;
  cols.cols.forEach((c, j) => {
    if (j === calCol) return;
    if (c.labelByName || !isSeriesColumn(c, rows)) {
      if (textLabelCol < 0 && calCol < 0) textLabelCol = j;
      else ignored.push(c.name);
      return;
    }
    seriesIdx.push(j);
  });
  if (calCol >= 0 && lr) {
    const c = cols.cols[calCol];
    if (lr.other.length) {
      const i = lr.other[0];
      throw new EngineError("input", `${fileLine(i)}: the period "${c.text(i)}" in "${c.name}" is written another way than the others (such as "${c.text(lr.parts.findIndex((p) => p !== null))}"). Write every period the same way.`);
    }
    const labelled: LabelledRow[] = [];
    for (let i = 0; i < rows; i++) {
      const p = lr.parts[i];
      if (p) { labelled.push({ row: i, parts: p }); continue; }
      const allBlank = c.kinds[i] === BLANK && seriesIdx.every((j) => cols.cols[j].kinds[i] === BLANK);
      if (allBlank) continue;
      const label = c.kinds[i] === BLANK ? "" : c.text(i);
      leftOut.push({ line: cols.line(i), label });
    }
    calendar = calendarFor(labelled, c.name, fileLine);
    keep = calendar.order;
    for (const l of leftOut) notes.push(`${cap(cols.place(l.line))} (${l.label === "" ? "no period label" : `"${l.label}"`}) is not a period; left out.`);
    if (calendar.reversed && !options.rowsInAnyOrder) notes.push(`The rows were newest first; they are read in time order.`);
    if (calendar.sorted && !options.rowsInAnyOrder) notes.push(`The rows were not in time order; they are read sorted by "${c.name}".`);
    if (calendar.skipped.length) notes.push(`No row for ${listOf(calendar.skipped)}: ${calendar.skipped.length === 1 ? "that period is" : "those periods are"} a missing observation (blank) at ${calendar.skipped.length === 1 ? "its" : "their"} place.`);
  }
  if (seriesIdx.length === 0) {
    const hint = cols.cols.length === 1 && cols.delimiterFrom !== "workbook" ? likelyDelimiter(cols.sample, delimiter) : null;
    if (hint) throw new EngineError("input", `The file reads as one column with ${delimiterName(delimiter)}s as the delimiter, but its lines hold ${delimiterName(hint)}s: read it with ${(options.delimiterFix ?? ((d: string) => `--delimiter ${d}`))(hint === "\t" ? "tab" : hint)}.`);
    throw new EngineError("input", "No column of numbers was found. Each series needs a column of numbers under its name.");
  }
  // 2. Decimal marks: from each column's values, then the file's other columns, then the delimiter.
  const v = seriesIdx.map((j) => votes(cols.cols[j], keep));
  const fileDot = v.some((x) => x.dot > x.comma);
  const fileComma = v.some((x) => x.comma > x.dot);
  const columns: Record<string, ColumnReading> = {};
  const marks: DecimalMark[] = [];
  const problems: (string | null)[] = [];
  seriesIdx.forEach((j, s) => {
    const c = cols.cols[j];
    const x = v[s];
    let mark: DecimalMark;
    let from: ColumnReading["decimalFrom"];
    let problem: string | null = null;
    if (options.decimal) { mark = options.decimal; from = "option"; }
    else if (x.dot || x.comma) {
      if (x.dot === x.comma) {
        problem = `${cap(c.title)} mixes decimal points and decimal commas (${fileLine(x.firstDot, j)}: "${c.text(x.firstDot)}", ${fileLine(x.firstComma, j)}: "${c.text(x.firstComma)}"). Write its numbers one way, or force the mark with ${fix(",")} or ${fix(".")}.`;
      }
      mark = x.dot >= x.comma ? "." : ",";
      from = "values";
    } else if (x.ambiguous === 0) { mark = "."; from = "none"; }
    else if (fileDot !== fileComma) { mark = fileDot ? "." : ","; from = "file"; }
    else if (cols.delimiterFrom !== "workbook" && (delimiter === ";" || delimiter === ",")) { mark = delimiter === ";" ? "," : "."; from = "delimiter"; }
    else {
      mark = ".";
      from = "values";
      const t = c.text(x.firstAmbiguous);
      problem = `${cap(c.title)} has numbers like "${t}" (${fileLine(x.firstAmbiguous, j)}) that read differently with a decimal point or a decimal comma, and nothing in the file decides it. Say which with ${fix(".")} or ${fix(",")}.`;
    }
    marks.push(mark);
    problems.push(problem);
    columns[c.name] = { decimal: mark, decimalFrom: from, thousands: [], currency: [], percent: false, negatives: [] };
  });
  // 3. The cells of each series in time order, read with its mark (made on demand; the report of
  // thousands, currency, percent and negatives is filled as each column is read).
  const read = (s: number): RawCell[] => {
    const j = seriesIdx[s];
    const c = cols.cols[j];
    const mark = marks[s];
    const rep = columns[c.name];
    if (problems[s]) throw new EngineError("input", problems[s] as string);
    const out: RawCell[] = [];
    const bad: number[] = [];
    const thousands = new Set<string>();
    const currency = new Set<string>();
    const negatives = new Set<NegativeStyle>();
    for (const i of keep) {
      if (i < 0) { out.push(null); continue; }
      const k = c.kinds[i];
      if (k === BLANK) out.push(null);
      else if (k === VALUE) {
        out.push(c.nums[i]);
        if (c.nums[i] < 0) negatives.add("minus");
      } else if (k === NUM) {
        const val = c.nums[i];
        if (mark === ".") out.push(val);
        else {
          const frac = c.shape[i] & 15;
          const intDigits = c.shape[i] >> 4;
          if (frac === 0) out.push(val);
          else if (frac === 3 && intDigits <= 3 && Math.abs(val) >= 1) { out.push(Math.round(val * 1000)); thousands.add("."); }
          else { bad.push(i); out.push(c.text(i)); }
        }
        if (val < 0) negatives.add("minus");
      } else if (k === COMMA3) {
        out.push(mark === "." ? c.nums[i] : c.nums[i] / 1000);
        if (mark === ".") thousands.add(",");
        if (c.nums[i] < 0) negatives.add("minus");
      } else {
        const t = k === TEXT ? c.texts.get(i) ?? "" : c.text(i);
        const p = k === TEXT ? parseNumberText(t, mark) : null;
        if (p) {
          out.push(p.value);
          if (p.thousands) thousands.add(p.thousands);
          if (p.currency) currency.add(p.currency);
          if (p.percent) rep.percent = true;
          if (p.negative) negatives.add(p.negative);
        } else {
          if (k === TEXT && looksNumeric(t)) bad.push(i);
          out.push(t);
        }
      }
    }
    if (bad.length) {
      const shown = bad.slice(0, 3).map((i) => `${fileLine(i, j)}: "${c.text(i)}"`).join(", ");
      const other: DecimalMark = mark === "." ? "," : ".";
      throw new EngineError("input", `${cap(c.title)} has ${bad.length === 1 ? "a value" : `${bad.length} values`} that cannot be read as ${bad.length === 1 ? "a number" : "numbers"} with the decimal mark "${mark}" (${shown}${bad.length > 3 ? ", …" : ""}). Correct ${bad.length === 1 ? "it" : "them"}, or ${rep.decimalFrom === "option" ? "give the other mark" : "force the mark"} with ${fix(other)}.`);
    }
    rep.thousands = Array.from(thousands);
    rep.currency = Array.from(currency);
    rep.negatives = Array.from(negatives);
    return out;
  };
  // 4. Labels, lines and the report.
  const n = keep.length;
  let labelColumn: SeriesTable["labelColumn"] = null;
  if (calendar && calCol >= 0) labelColumn = { name: cols.cols[calCol].name, values: calendar.labels };
  else if (textLabelCol >= 0) {
    const c = cols.cols[textLabelCol];
    labelColumn = { name: c.name, values: Array.from({ length: rows }, (_, i) => c.text(i)) };
  }
  const line = (i: number): number | null => (keep[i] === undefined ? null : keep[i] < 0 ? null : cols.line(keep[i]));
  const where = (i: number, s?: number): string => {
    const l = line(i);
    if (l === null) return `${calendar?.labels[i] ?? `row ${i + 1}`} (no row in the file)`;
    return s === undefined || seriesIdx[s] === undefined ? cols.place(l) : cols.where(keep[i], seriesIdx[s]);
  };
  const dates: DatesReading | null = calendar && calCol >= 0 ? {
    column: cols.cols[calCol].name, format: calendar.format, frequency: calendar.frequency,
    first: calendar.labels[0], last: calendar.labels[calendar.labels.length - 1],
    skipped: calendar.skipped, reversed: calendar.reversed && !options.rowsInAnyOrder, sorted: calendar.sorted && !options.rowsInAnyOrder,
  } : null;
  const reading: Reading = {
    delimiter: cols.delimiterFrom === "workbook" ? "none" : delimiter === "\t" ? "tab" : delimiter,
    delimiterFrom: cols.delimiterFrom,
    dates, columns, leftOut, ignored, notes,
  };
  const names = seriesIdx.map((j) => cols.cols[j].name);
  return {
    names,
    column: read,
    labelColumn,
    line,
    where,
    rows: n,
    calendar,
    next: calendar ? calendar.next : null,
    period: calendar ? calendar.period : 1,
    periodFrom: calendar ? "dates" : "default",
    reading,
    header: cols.header,
    columnNamed: (name) => {
      const s = names.indexOf(name);
      if (s >= 0) return read(s);
      const j = cols.header.indexOf(name);
      if (j < 0) return null;
      const c = cols.cols[j];
      return Array.from(keep, (i) => (i < 0 || c.kinds[i] === BLANK ? null : c.text(i)));
    },
  };
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function listOf(xs: string[]): string {
  return xs.length <= 4 ? xs.join(", ") : `${xs.slice(0, 4).join(", ")} and ${xs.length - 4} more`;
}
