// A CSV table's columns stored compactly as records arrive: a double and two bytes per cell, text
// kept only where a cell is text that is neither a plain number nor a period label. How a column is
// read (series or labels, its decimal mark, its calendar) is decided afterwards from the whole
// column (table.ts), so a large file is never held as text and as a table at the same time.
import { EngineError } from "../engine";
import { delimiterName, DelimiterFrom, likelyDelimiter } from "./delimiter";
import type { Delimiter } from "./records";
import { LabelFamily, LabelParts, parsePeriodLabel } from "./period-labels";

/** Cell kinds. */
export const BLANK = 0;
/** A plain number (digits, optionally one "." and more digits); its written shape is in `shape`. */
export const NUM = 1;
/** One to three digits, a comma, three digits ("1,234"): 1234 or 1.234 by the column's mark. */
export const COMMA3 = 2;
/** Any other text. */
export const TEXT = 3;
/** A period label (parsed; its family in `shape`). */
export const LABEL = 4;
/** A number stored as a number by its source (a workbook cell): no written form to decide. */
export const VALUE = 5;

export const FAMILIES: LabelFamily[] = ["ym", "my", "ymd", "dmy", "slash", "mon", "q", "year", "serial"];

/** Header names that mark the first column as period labels even when they are numbers (years). */
export const LABEL_NAMES = /^(period|date|month|year|quarter|week|day|time|t|datum|monat|jahr|quartal|woche|tag|zeitraum|periode|date de valeur|mois|année|annee|trimestre|semaine|jour|fecha|mes|año|ano|periodo|data|mese|anno|maand|jaar|kwartaal)$/i;

const PLAIN = /^-?(\d{1,15})(?:\.(\d{1,15}))?$/;
const COMMA_GROUP = /^-?[1-9]\d{0,2},\d{3}$/;

/** Unparsed label texts a label column named as such keeps when the caller does not ask for text. */
const LABEL_TEXT_CAP = 1000;

/** One column stored compactly. */
export class Column {
  nums = new Float64Array(0);
  kinds = new Uint8Array(0);
  /** NUM: integer digits × 16 + fraction digits (a leading zero of "01.1995" counted); LABEL: family index. */
  shape = new Uint8Array(0);
  texts = new Map<number, string>();
  /** How labels of each family were written (the first seen), for the report. */
  formats = new Map<LabelFamily, string>();
  nonBlank = 0;
  /** Texts not kept (a label column named as such, past LABEL_TEXT_CAP, when text is not wanted). */
  dropped = 0;

  /** How messages name the column: `column "sales"` (a long file's series: `series "Harbour Street" (column "sales")`). */
  title: string;

  constructor(readonly name: string, readonly labelByName: boolean, private readonly keepText: boolean, title?: string) {
    this.title = title ?? `column "${name}"`;
  }

  add(i: number, field: string): void {
    if (i >= this.kinds.length) this.reserve(Math.max(1024, Math.ceil(this.kinds.length * 1.5)));
    const t = field.trim();
    if (t === "") { this.kinds[i] = BLANK; return; }
    this.nonBlank++;
    const m = PLAIN.exec(t);
    if (m) {
      this.kinds[i] = NUM;
      this.nums[i] = Number(t);
      this.shape[i] = m[1].length * 16 + (m[2] ? m[2].length : 0);
      return;
    }
    if (COMMA_GROUP.test(t)) {
      this.kinds[i] = COMMA3;
      this.nums[i] = Number(t.replace(",", ""));
      return;
    }
    const p = parsePeriodLabel(t);
    if (p) {
      this.kinds[i] = LABEL;
      this.nums[i] = p.y * 10000 + p.a * 100 + p.b;
      this.shape[i] = FAMILIES.indexOf(p.family);
      if (!this.formats.has(p.family)) this.formats.set(p.family, p.format);
      return;
    }
    this.kinds[i] = TEXT;
    if (this.labelByName && !this.keepText && this.texts.size >= LABEL_TEXT_CAP) { this.dropped++; return; }
    this.texts.set(i, t);
  }

  /** Adds a number its source stored as a number (a workbook cell); non-finite is blank. */
  addValue(i: number, v: number): void {
    if (i >= this.kinds.length) this.reserve(Math.max(1024, Math.ceil(this.kinds.length * 1.5)));
    if (!Number.isFinite(v)) { this.kinds[i] = BLANK; return; }
    this.nonBlank++;
    this.kinds[i] = VALUE;
    this.nums[i] = v;
  }

  /** Makes room for n rows. */
  reserve(n: number): void {
    if (n <= this.kinds.length) return;
    const grow = <T extends Float64Array | Uint8Array>(a: T, make: (k: number) => T): T => {
      const b = make(n);
      b.set(a);
      return b;
    };
    this.kinds = grow(this.kinds, (k) => new Uint8Array(k));
    this.shape = grow(this.shape, (k) => new Uint8Array(k));
    this.nums = grow(this.nums, (k) => new Float64Array(k));
  }

  /** The text of cell i as it was written (a plain number rebuilt from its value and shape). */
  text(i: number): string {
    switch (this.kinds[i]) {
      case BLANK: return "";
      case NUM: return numText(this.nums[i], this.shape[i]);
      case COMMA3: {
        const v = Math.abs(this.nums[i]);
        return `${this.nums[i] < 0 ? "-" : ""}${Math.floor(v / 1000)},${String(v % 1000).padStart(3, "0")}`;
      }
      case LABEL: return labelText(this.label(i) as LabelParts);
      case VALUE: return String(this.nums[i]);
      default: return this.texts.get(i) ?? "";
    }
  }

  /** The label parts of cell i, when it is a period label (text, or a number read as one by `asNumber`). */
  label(i: number): LabelParts | null {
    if (this.kinds[i] !== LABEL) return null;
    const v = this.nums[i];
    const family = FAMILIES[this.shape[i]];
    return { family, y: Math.floor(v / 10000), a: Math.floor(v / 100) % 100, b: v % 100, format: this.formats.get(family) ?? "" };
  }
}

/** A plain number's text from its value and shape (integer and fraction digits as written). */
export function numText(v: number, shape: number): string {
  const intDigits = shape >> 4;
  const frac = shape & 15;
  const s = Math.abs(v).toFixed(frac);
  const [ip, fp] = s.split(".");
  return `${v < 0 || Object.is(v, -0) ? "-" : ""}${ip.padStart(intDigits, "0")}${fp !== undefined ? `.${fp}` : ""}`;
}

function labelText(p: LabelParts): string {
  const two = (n: number): string => String(n).padStart(2, "0");
  switch (p.family) {
    case "ym": case "mon": case "my": return `${p.y}-${two(p.a)}`;
    case "q": return `${p.y}-Q${p.a}`;
    case "year": return String(p.y);
    case "slash": return `${two(p.a)}/${two(p.b)}/${p.y}`;
    default: return `${p.y}-${two(p.a)}-${two(p.b)}`;
  }
}

function noRows(): EngineError {
  return new EngineError("input", "The file has no rows. It needs a header row naming the columns, then the data.");
}
function headerOnly(): EngineError {
  return new EngineError("input", "The file has a header row but no data rows.");
}

/**
 * Trims the header's names, refuses a first row that is all numbers (the file has no header), and
 * makes repeated names unique ("sales", "sales (2)") so no column is lost in the JSON output.
 * Common practice.
 * @example checkHeader([" month", "sales", "sales"]) // ["month", "sales", "sales (2)"]
 */
export function checkHeader(fields: string[]): string[] {
  const names = fields.map((h) => h.trim());
  if (names.every((h) => PLAIN.test(h) || COMMA_GROUP.test(h) || /^-?\d+(\.\d+)?[eE][-+]?\d+$/.test(h))) {
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

/** A CSV file's columns, collected record by record. */
export class CsvColumns {
  header: string[] = [];
  rows = 0;
  /** The columns (read them through table.ts's readTable). */
  cols: Column[] = [];
  /** The first lines as read (for a message naming the likely delimiter). */
  sample: string[] = [];
  protected lineNos = new Int32Array(0);

  /**
   * @param keepLabels keep the text of a label column named as such (for row labels).
   * @param delimiter the delimiter the records were split with, and how it was decided (for the report).
   * @param place how a row is named in messages from its line ("line 12"; a workbook: "row 12 of sheet …").
   */
  constructor(private readonly keepLabels = true, readonly delimiter: Delimiter = ",", readonly delimiterFrom: DelimiterFrom = "default", readonly place: (line: number) => string = (l) => `line ${l}`) {}

  /**
   * Data row i (0-based) in words for messages: "line 12", or the source's own naming. `j` (the
   * column of the cell meant) matters only where a row's cells come from different lines (a long file).
   */
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  where(i: number, j?: number): string {
    return this.place(this.line(i));
  }

  /**
   * Adds one data row of cells as a workbook stores them (after the header, given with {@link add}):
   * numbers stay numbers (no written form to decide), text is read like a CSV field, null is blank.
   */
  addCells(cells: (number | string | null)[], line: number): void {
    if (cells.length !== this.header.length) throw new EngineError("input", `Row ${line} has ${cells.length} cells but the header has ${this.header.length}.`);
    const i = this.rows++;
    if (i >= this.lineNos.length) this.reserve(Math.max(1024, Math.ceil(this.lineNos.length * 1.5)));
    this.lineNos[i] = line;
    for (let j = 0; j < cells.length; j++) {
      const v = cells[j];
      if (typeof v === "number") this.cols[j].addValue(i, v);
      else this.cols[j].add(i, v ?? "");
    }
  }

  /** Adds one record: the first is the header, the rest data rows of the same width. */
  add(fields: string[], line: number): void {
    if (this.sample.length < 5) this.sample.push(fields.join(this.delimiter));
    if (this.cols.length === 0) {
      this.header = checkHeader(fields);
      this.cols = this.header.map((h, j) => new Column(h || `column ${j + 1}`, j === 0 && LABEL_NAMES.test(h), this.keepLabels));
      return;
    }
    this.checkWidth(fields.length, this.header.length, line);
    const i = this.rows++;
    if (i >= this.lineNos.length) this.reserve(Math.max(1024, Math.ceil(this.lineNos.length * 1.5)));
    this.lineNos[i] = line;
    for (let j = 0; j < fields.length; j++) this.cols[j].add(i, fields[j]);
  }

  /** Refuses a data row whose width differs from the header's, naming the likely delimiter. */
  protected checkWidth(width: number, headerWidth: number, line: number): void {
    if (width === headerWidth) return;
    const likely = likelyDelimiter(this.sample, this.delimiter);
    if (likely && (headerWidth === 1 || width === 1)) {
      throw new EngineError("input", `Line ${line} has ${width} field${width === 1 ? "" : "s"} but the header has ${headerWidth}: the file's lines hold ${delimiterName(likely)}s, so it is probably ${delimiterName(likely)}-separated. Read it with --delimiter ${likely === "\t" ? "tab" : likely}.`);
    }
    const hint = width > headerWidth && this.delimiter === "," ? ' a value with a comma needs quotes ("12,500")' : "";
    throw new EngineError("input", `Line ${line} has ${width} field${width === 1 ? "" : "s"} but the header has ${headerWidth}. Every row needs one value (or an empty field) per column;${hint || " check the delimiter (--delimiter)"}.`);
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
}
