// CSV reading for the command line: RFC 4180 quoting, CRLF or LF, an optional UTF-8 BOM, and
// lines starting with "#" as comments. A column whose values are mostly not numbers is a label
// column (dates, periods); every other column is a series, with blank cells as gaps.
import { EngineError, RawCell } from "../engine";

/** A parsed CSV table: header names and rows of raw text fields. */
export interface CsvTable {
  header: string[];
  rows: string[][];
  /** 1-based line number in the file of each data row (for messages). */
  lines: number[];
}

/**
 * Parses CSV text. Throws an `input` EngineError naming the line for unequal rows or an
 * unterminated quote.
 * @example parseCsv("a,b\n1,2\n").rows // [["1", "2"]]
 */
export function parseCsv(text: string): CsvTable {
  let s = text;
  if (s.charCodeAt(0) === 0xfeff) s = s.slice(1);
  if (s.indexOf("\u0000") >= 0) throw new EngineError("input", "The file is not text (it contains NUL bytes). Export the sheet as CSV first.");
  const records: { fields: string[]; line: number }[] = [];
  let field = "";
  let fields: string[] = [];
  let inQuotes = false;
  let line = 1;
  let recordLine = 1;
  let atLineStart = true;
  let i = 0;
  const n = s.length;
  const endRecord = (): void => {
    fields.push(field);
    if (!(fields.length === 1 && fields[0].trim() === "")) records.push({ fields, line: recordLine });
    fields = [];
    field = "";
  };
  while (i < n) {
    const ch = s[i];
    if (inQuotes) {
      if (ch === '"') {
        if (s[i + 1] === '"') { field += '"'; i += 2; continue; }
        inQuotes = false; i++; continue;
      }
      if (ch === "\n") line++;
      field += ch; i++; continue;
    }
    if (atLineStart && ch === "#") {
      while (i < n && s[i] !== "\n") i++;
      i++; line++; recordLine = line; atLineStart = true;
      continue;
    }
    atLineStart = false;
    if (ch === '"' && field.trim() === "") { field = ""; inQuotes = true; i++; continue; }
    if (ch === ",") { fields.push(field); field = ""; i++; continue; }
    if (ch === "\r" && s[i + 1] === "\n") { i++; continue; }
    if (ch === "\n" || ch === "\r") {
      endRecord(); i++; line++; recordLine = line; atLineStart = true;
      continue;
    }
    field += ch; i++;
  }
  if (inQuotes) throw new EngineError("input", `A quoted field starting on line ${recordLine} is never closed. Check the quotes in the file.`);
  if (field !== "" || fields.length > 0) endRecord();
  if (records.length === 0) throw new EngineError("input", "The file has no rows. It needs a header row naming the columns, then the data.");
  const header = records[0].fields.map((h) => h.trim());
  const rows: string[][] = [];
  const lines: number[] = [];
  for (let r = 1; r < records.length; r++) {
    const f = records[r].fields;
    if (f.length !== header.length) {
      throw new EngineError("input", `Line ${records[r].line} has ${f.length} field${f.length === 1 ? "" : "s"} but the header has ${header.length}. Every row needs one value (or an empty field) per column.`);
    }
    rows.push(f);
    lines.push(records[r].line);
  }
  if (rows.length === 0) throw new EngineError("input", "The file has a header row but no data rows.");
  return { header, rows, lines };
}

/** Header names that mark the first column as period labels even when they are numbers (years). */
const LABEL_NAMES = /^(period|date|month|year|quarter|week|day|time|t)$/i;

const GROUPED = /^[-+]?\d{1,3}(,\d{3})+(\.\d+)?$/;

/**
 * Reads one CSV field as a cell: blank → null; a number (also with thousands separators such as
 * "12,500") → number; anything else → the text.
 * @example fieldToCell(" 12,500 ") // 12500
 */
export function fieldToCell(f: string): RawCell {
  const t = f.trim();
  if (t === "") return null;
  const plain = GROUPED.test(t) ? t.replace(/,/g, "") : t;
  if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(plain)) {
    const v = Number(plain);
    if (Number.isFinite(v)) return v;
  }
  return t;
}

/** Series found in a CSV table. */
export interface CsvSeries {
  names: string[];
  series: RawCell[][];
  /** The label column's name and values, when there is one. */
  labelColumn: { name: string; values: string[] } | null;
  /** Line number of each data row. */
  lines: number[];
}

/**
 * Splits a table into a label column and series columns. A column is a label column when most
 * of its non-blank values are not numbers, or when it is the first column and is named period,
 * date, month, year, quarter, week, day, time or t (so a column of years is not a series).
 * @example csvSeries(parseCsv("month,sales\n2024-01,5\n2024-02,6\n")).names // ["sales"]
 */
export function csvSeries(t: CsvTable): CsvSeries {
  const names: string[] = [];
  const series: RawCell[][] = [];
  let labelColumn: CsvSeries["labelColumn"] = null;
  t.header.forEach((h, j) => {
    const cells = t.rows.map((r) => fieldToCell(r[j]));
    const nonBlank = cells.filter((c) => c !== null);
    const numeric = nonBlank.filter((c) => typeof c === "number").length;
    const labelByName = j === 0 && LABEL_NAMES.test(h);
    if (labelByName || (nonBlank.length > 0 && numeric * 2 < nonBlank.length)) {
      if (!labelColumn) labelColumn = { name: h || `column ${j + 1}`, values: t.rows.map((r) => r[j].trim()) };
      return;
    }
    names.push(h || `column ${j + 1}`);
    series.push(cells);
  });
  if (series.length === 0) throw new EngineError("input", "No column of numbers was found. Each series needs a column of numbers under its name.");
  return { names, series, labelColumn, lines: t.lines };
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
