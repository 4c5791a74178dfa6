// CSV reading for the command line and the pane's paste box: RFC 4180 quoting, CRLF, LF or CR, an
// optional UTF-8 BOM, and lines starting with "#" as comments. A column whose values are mostly not
// numbers is a label column (dates, periods); every other column is a series, with blank cells as
// gaps. Files are read in chunks and parsed as they arrive into compact columns (a Float64Array of
// numbers per column, text kept only where a cell is text), so a large file is never held as text
// and as a table at the same time.
// Pure (no file or DOM access): the pane bundles it too; reading files is csv-file.ts.
import { EngineError, RawCell } from "../engine";

/** Receives each record (its fields, and the 1-based line it starts on). */
export type RecordSink = (fields: string[], line: number) => void;

const SPECIAL = /[,\r\n"]/g;

/**
 * An incremental RFC 4180 reader: `push` text in pieces of any size (a record may span pieces),
 * then `end`. Empty lines are skipped; a line starting with "#" is a comment. Throws an `input`
 * EngineError for an unterminated quote.
 * @example const r = new CsvRecordReader((f) => out.push(f)); r.push("a,\"b,"); r.push("c\"\n"); r.end(); // out: [["a", "b,c"]]
 */
export class CsvRecordReader {
  private field = "";
  private fields: string[] = [];
  private inQuotes = false;
  private quoteSeen = false;
  private inComment = false;
  private afterCR = false;
  private atLineStart = true;
  private started = false;
  private line = 1;
  private recordLine = 1;

  constructor(private readonly sink: RecordSink) {}

  /** Feeds the next piece of text. */
  push(s: string): void {
    let i = 0;
    const n = s.length;
    if (!this.started && n > 0) {
      this.started = true;
      if (s.charCodeAt(0) === 0xfeff) i = 1; // UTF-8 byte order mark
    }
    while (i < n) {
      const ch = s[i];
      if (this.afterCR) {
        this.afterCR = false;
        if (ch === "\n") { i++; continue; }
      }
      if (this.inComment) {
        if (ch === "\n" || ch === "\r") this.newLine(ch);
        i++;
        continue;
      }
      if (this.inQuotes) {
        if (this.quoteSeen) {
          this.quoteSeen = false;
          if (ch === '"') { this.field += '"'; i++; continue; }
          this.inQuotes = false; // the closing quote; ch is read as unquoted text below
        } else {
          const q = s.indexOf('"', i);
          const end = q < 0 ? n : q;
          const chunk = s.slice(i, end);
          for (let k = chunk.indexOf("\n"); k >= 0; k = chunk.indexOf("\n", k + 1)) this.line++;
          this.field += chunk;
          if (q >= 0) this.quoteSeen = true;
          i = end + (q >= 0 ? 1 : 0);
          continue;
        }
      }
      if (this.atLineStart && ch === "#") { this.inComment = true; i++; continue; }
      this.atLineStart = false;
      if (ch === '"' && this.field.trim() === "") { this.field = ""; this.inQuotes = true; i++; continue; }
      if (ch === ",") { this.fields.push(this.field); this.field = ""; i++; continue; }
      if (ch === "\n" || ch === "\r") { this.endRecord(); this.newLine(ch); i++; continue; }
      // Plain text: take everything up to the next comma, quote or line break at once.
      SPECIAL.lastIndex = i + 1;
      const m = SPECIAL.exec(s);
      const end = m ? m.index : n;
      this.field += s.slice(i, end);
      i = end;
    }
  }

  /** Ends the input: flushes the last record; throws if a quoted field was never closed. */
  end(): void {
    if (this.inQuotes && !this.quoteSeen) throw new EngineError("input", `A quoted field starting on line ${this.recordLine} is never closed. Check the quotes in the file.`);
    if (this.field !== "" || this.fields.length > 0) this.endRecord();
  }

  private newLine(ch: string): void {
    this.inComment = false;
    this.line++;
    this.recordLine = this.line;
    this.atLineStart = true;
    if (ch === "\r") this.afterCR = true;
  }

  private endRecord(): void {
    this.fields.push(this.field);
    const blank = this.fields.length === 1 && this.fields[0].trim() === "";
    if (!blank) this.sink(this.fields, this.recordLine);
    this.fields = [];
    this.field = "";
  }
}

/**
 * Parses CSV text held in memory (the paste box) into columns, as {@link readCsvFile} does for a
 * file. Throws an `input` EngineError naming the line for unequal rows or an unterminated quote.
 * @example parseCsv("a,b\n1,2\n").rows // 1
 */
export function parseCsv(text: string): CsvColumns {
  if (text.indexOf("\u0000") >= 0) throw notText();
  const cols = new CsvColumns();
  const reader = new CsvRecordReader((fields, line) => cols.add(fields, line));
  reader.push(text);
  reader.end();
  return cols.finish();
}

/** The error for a file that is not text. */
export function notText(): EngineError {
  return new EngineError("input", "The file is not text (it contains NUL bytes). Export the sheet as CSV first.");
}
function noRows(): EngineError {
  return new EngineError("input", "The file has no rows. It needs a header row naming the columns, then the data.");
}
function headerOnly(): EngineError {
  return new EngineError("input", "The file has a header row but no data rows.");
}

function checkWidth(fields: string[], width: number, line: number): void {
  if (fields.length !== width) {
    throw new EngineError("input", `Line ${line} has ${fields.length} field${fields.length === 1 ? "" : "s"} but the header has ${width}. Every row needs one value (or an empty field) per column; a value with a comma needs quotes ("12,500").`);
  }
}

/**
 * Trims the header's names, refuses a first row that is all numbers (the file has no header), and
 * makes repeated names unique ("sales", "sales (2)") so no column is lost in the JSON output.
 * @example checkHeader([" month", "sales", "sales"]) // ["month", "sales", "sales (2)"]
 */
export function checkHeader(fields: string[]): string[] {
  const names = fields.map((h) => h.trim());
  if (names.every((h) => typeof fieldToCell(h) === "number")) {
    throw new EngineError("input", `The first row (${names.slice(0, 3).join(",")}${names.length > 3 ? ",…" : ""}) is numbers, not column names. Add a header row naming the columns, e.g. month,sales.`);
  }
  const seen = new Map<string, number>();
  return names.map((h) => {
    if (h === "") return h;
    const k = (seen.get(h) ?? 0) + 1;
    seen.set(h, k);
    return k === 1 ? h : `${h} (${k})`;
  });
}

/** Header names that mark the first column as period labels even when they are numbers (years). */
export const LABEL_NAMES = /^(period|date|month|year|quarter|week|day|time|t)$/i;

const GROUPED = /^[-+]?\d{1,3}(,\d{3})+(\.\d+)?$/;
const PLAIN_NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/**
 * Reads one CSV field as a cell: blank → null; a number (also with thousands separators such as
 * "12,500") → number; anything else → the text.
 * @example fieldToCell(" 12,500 ") // 12500
 */
export function fieldToCell(f: string): RawCell {
  const t = f.trim();
  if (t === "") return null;
  const plain = GROUPED.test(t) ? t.replace(/,/g, "") : t;
  if (PLAIN_NUMBER.test(plain)) {
    const v = Number(plain);
    if (Number.isFinite(v)) return v;
  }
  return t;
}

const BLANK = 0;
const NUMBER = 1;
const TEXT = 2;

/** One column stored compactly: numbers in a Float64Array, text only where a cell is text. */
class Column {
  nums = new Float64Array(0);
  kinds = new Uint8Array(0);
  texts = new Map<number, string>();
  numeric = 0;
  nonBlank = 0;

  /**
   * @param labelByName a period column by its name: never a series, its text kept only when
   *   `keepText` (the paste box shows labels; the command line does not need them).
   */
  constructor(readonly labelByName: boolean, private readonly keepText: boolean) {}

  add(i: number, field: string): void {
    if (i >= this.kinds.length) this.reserve(Math.max(1024, Math.ceil(this.kinds.length * 1.5)));
    if (this.labelByName) {
      const t = field.trim();
      this.kinds[i] = t === "" ? BLANK : TEXT;
      if (t !== "") {
        this.nonBlank++;
        if (this.keepText) this.texts.set(i, t);
      }
      return;
    }
    const c = fieldToCell(field);
    if (c === null) this.kinds[i] = BLANK;
    else if (typeof c === "number") { this.kinds[i] = NUMBER; this.nums[i] = c; this.numeric++; this.nonBlank++; }
    else { this.kinds[i] = TEXT; this.texts.set(i, c as string); this.nonBlank++; }
  }

  /** Makes room for n rows (a period column named as such keeps no numbers). */
  reserve(n: number): void {
    if (n <= this.kinds.length) return;
    const kinds = new Uint8Array(n);
    kinds.set(this.kinds);
    this.kinds = kinds;
    if (this.labelByName) return;
    const nums = new Float64Array(n);
    nums.set(this.nums);
    this.nums = nums;
  }

  cells(rows: number): RawCell[] {
    // push, not new Array(rows): a long preallocated array starts in V8's slow dictionary mode,
    // while a pushed one of numbers stays a packed array of unboxed doubles.
    const out: RawCell[] = [];
    for (let i = 0; i < rows; i++) {
      const k = this.kinds[i];
      out.push(k === NUMBER ? this.nums[i] : k === BLANK ? null : (this.texts.get(i) as string));
    }
    return out;
  }

  labels(rows: number): string[] {
    return Array.from({ length: rows }, (_, i) => (this.kinds[i] === NUMBER ? String(this.nums[i]) : this.texts.get(i) ?? ""));
  }
}

/** A CSV file's columns, collected record by record. */
export class CsvColumns {
  header: string[] = [];
  rows = 0;
  private cols: Column[] = [];
  private lineNos = new Int32Array(0);

  /** @param keepLabels keep the text of a period column named as such (for row labels). */
  constructor(private readonly keepLabels = true) {}

  /** Adds one record: the first is the header, the rest data rows of the same width. */
  add(fields: string[], line: number): void {
    if (this.cols.length === 0) {
      this.header = checkHeader(fields);
      this.cols = this.header.map((h, j) => new Column(j === 0 && LABEL_NAMES.test(h), this.keepLabels));
      return;
    }
    checkWidth(fields, this.header.length, line);
    const i = this.rows++;
    if (i >= this.lineNos.length) this.reserve(Math.max(1024, Math.ceil(this.lineNos.length * 1.5)));
    this.lineNos[i] = line;
    for (let j = 0; j < fields.length; j++) this.cols[j].add(i, fields[j]);
  }

  /** Makes room for about n data rows at once (a reader that knows the file's size estimates it). */
  reserve(n: number): void {
    for (const c of this.cols) c.reserve(n);
    if (n > this.lineNos.length) {
      const l = new Int32Array(n);
      l.set(this.lineNos);
      this.lineNos = l;
    }
  }

  /** The cells of column j (blank → null, number, or text). */
  cells(j: number): RawCell[] {
    return this.cols[j].cells(this.rows);
  }

  /** The line of the file on which data row i (0-based) starts. */
  line(i: number): number {
    return i < this.rows ? this.lineNos[i] : i + 2;
  }

  /** Checks that there was a header and at least one data row. */
  finish(): this {
    if (this.cols.length === 0) throw noRows();
    if (this.rows === 0) throw headerOnly();
    return this;
  }

  /** Whether column j holds labels: named like a period column (first only) or mostly not numbers. */
  isLabel(j: number): boolean {
    const c = this.cols[j];
    return c.labelByName || (c.nonBlank > 0 && c.numeric * 2 < c.nonBlank);
  }

  /** Column j's cells as label text. */
  labels(j: number): string[] {
    return this.cols[j].labels(this.rows);
  }
}

/** Series found in a CSV table. */
export interface CsvSeries {
  names: string[];
  /** The cells of series j (made on demand, so a large file holds one series' cells at a time). */
  column: (j: number) => RawCell[];
  /** The label column's name and values, when there is one. */
  labelColumn: { name: string; values: string[] } | null;
  /** The line of the file of data row i (0-based). */
  line: (i: number) => number;
  /** Number of data rows. */
  rows: number;
}

/**
 * Splits columns into a label column and series. A column is a label column when most of its
 * non-blank values are not numbers, or when it is the first column and is named period, date,
 * month, year, quarter, week, day, time or t (so a column of years is not a series).
 * @example csvSeries(parseCsv("month,sales\n2024-01,5\n2024-02,6\n")).names // ["sales"]
 */
export function csvSeries(cols: CsvColumns): CsvSeries {
  const names: string[] = [];
  const index: number[] = [];
  let labelColumn: CsvSeries["labelColumn"] = null;
  cols.header.forEach((h, j) => {
    if (cols.isLabel(j)) {
      if (!labelColumn) labelColumn = { name: h || `column ${j + 1}`, values: cols.labels(j) };
      return;
    }
    names.push(h || `column ${j + 1}`);
    index.push(j);
  });
  if (names.length === 0) throw new EngineError("input", "No column of numbers was found. Each series needs a column of numbers under its name.");
  return { names, column: (j) => cols.cells(index[j]), labelColumn, line: (i) => cols.line(i), rows: cols.rows };
}

/** Quotes a field for CSV output when needed. */
export function csvCell(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "";
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Formats rows as CSV text. */
export function toCsv(header: string[], rows: unknown[][]): string {
  return [header.map(csvCell).join(","), ...rows.map((r) => r.map(csvCell).join(","))].join("\n") + "\n";
}
