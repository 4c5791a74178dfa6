// Reading a worksheet of an .xlsx workbook into the shared reader's columns (src/io), so a sheet
// goes through the same reader as a CSV file (period column, calendar, Total rows, number formats
// of text cells): numbers are numbers and dates are dates as the workbook stores them (no locale
// guessing), the first row of the range names the columns (a merged header over two rows is
// joined), formulas are read by their saved results, merged cells below the header hold their
// value once.
import * as fs from "fs";
import { Cell, ValueType, Workbook, Worksheet } from "exceljs";
import { EngineError, RawCell } from "../engine";
import { CsvColumns } from "../io";

/** A cell range in A1 notation, as row and column numbers (1-based, inclusive). */
export interface CellRange {
  top: number;
  left: number;
  bottom: number;
  right: number;
}

/**
 * A column's letters from its number: 1 → "A", 28 → "AB".
 * @example columnLetters(28) // "AB"
 */
export function columnLetters(c: number): string {
  let s = "";
  for (let n = c; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

/**
 * Parses --range ("B2:H74", also "$B$2:$H$74"); a usage error that shows the form otherwise.
 * @example parseRange("B2:H74") // { top: 2, left: 2, bottom: 74, right: 8 }
 */
export function parseRange(text: string): CellRange {
  const m = /^\s*\$?([A-Za-z]{1,3})\$?(\d{1,7})\s*:\s*\$?([A-Za-z]{1,3})\$?(\d{1,7})\s*$/.exec(text);
  const col = (s: string): number => s.toUpperCase().split("").reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
  if (!m) throw new EngineError("input", `--range must be two cell addresses with a colon, header row first, e.g. --range B2:H74; got "${text}".`);
  const r = { top: Number(m[2]), left: col(m[1]), bottom: Number(m[4]), right: col(m[3]) };
  if (r.top < 1 || r.bottom < r.top + 1 || r.right < r.left) {
    throw new EngineError("input", `--range ${text} needs its top-left cell first and at least two rows (a header and one value), e.g. --range B2:H74.`);
  }
  return r;
}

/** An ISO date (YYYY-MM-DD) of a date cell; dates are stored as UTC days by the library. */
function isoDate(d: Date): string {
  return d.toISOString().slice(0, 10);
}

/** Refuses, with what to do, a file that is not an .xlsx package (encrypted, old .xls, not a zip). */
function checkPackage(file: string): void {
  let head: Buffer;
  try {
    const fd = fs.openSync(file, "r");
    head = Buffer.alloc(8);
    fs.readSync(fd, head, 0, 8, 0);
    fs.closeSync(fd);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new EngineError("input", code === "ENOENT" ? `File not found: ${file}` : code === "EISDIR" ? `${file} is a folder, not a workbook.` : code === "EACCES" ? `No permission to read ${file}.` : `Cannot read ${file} (${code ?? "error"}).`);
  }
  if (head.equals(Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]))) {
    throw new EngineError("input", `${file} is password-protected (encrypted) or an old-style .xls workbook, which fanwise does not open. Save a copy without a password as .xlsx (or export the sheet as CSV) and give that file.`);
  }
  if (head.readUInt32BE(0) !== 0x504b0304) {
    throw new EngineError("input", `${file} is not an .xlsx workbook (an .xlsx file is a zip package; this one is not). If it is a CSV file, give it a .csv name; otherwise save it again as .xlsx.`);
  }
}

/** What one cell holds, as the series rules read it, and whether it is a date. */
interface ReadCell {
  cell: RawCell;
  date: string | null;
}

function readCell(c: Cell, noResult: string[]): ReadCell {
  if (c.type === ValueType.Merge) return { cell: null, date: null }; // a merged cell's value sits in its first cell only
  const v = c.value as unknown;
  if (v === null || v === undefined) return { cell: null, date: null };
  if (typeof v === "number") return { cell: Number.isFinite(v) ? v : null, date: null };
  if (typeof v === "string") return { cell: v.trim() === "" ? null : v.trim(), date: null };
  if (typeof v === "boolean") return { cell: v ? "TRUE" : "FALSE", date: null };
  if (v instanceof Date) return { cell: isoDate(v), date: isoDate(v) };
  const o = v as { formula?: string; sharedFormula?: string; result?: unknown; richText?: { text: string }[]; text?: unknown; error?: string };
  if (o.formula !== undefined || o.sharedFormula !== undefined) {
    const r = o.result;
    if (r === undefined || r === null) {
      noResult.push(c.address);
      return { cell: null, date: null };
    }
    if (typeof r === "object" && r !== null && "error" in (r as object)) return { cell: String((r as { error: string }).error), date: null };
    if (r instanceof Date) return { cell: isoDate(r), date: isoDate(r) };
    return readCell({ type: ValueType.Number, value: r, address: c.address } as unknown as Cell, noResult);
  }
  if (o.richText) return readCell({ type: ValueType.String, value: o.richText.map((t) => t.text).join(""), address: c.address } as unknown as Cell, noResult);
  if (o.error !== undefined) return { cell: String(o.error), date: null };
  if (o.text !== undefined) return readCell({ type: ValueType.String, value: typeof o.text === "string" ? o.text : "", address: c.address } as unknown as Cell, noResult);
  return { cell: String(v), date: null };
}

function usedRange(ws: Worksheet): CellRange | null {
  let top = 0;
  let bottom = 0;
  let left = Infinity;
  let right = 0;
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    let any = false;
    row.eachCell({ includeEmpty: false }, (c, col) => {
      if (c.type === ValueType.Null) return;
      any = true;
      left = Math.min(left, col);
      right = Math.max(right, col);
    });
    if (!any) return;
    if (top === 0) top = r;
    bottom = r;
  });
  return top === 0 ? null : { top, left, bottom, right };
}

/** "a, b and 3 more" */
function someOf(xs: string[], n = 3): string {
  return xs.length <= n ? xs.join(", ") : `${xs.slice(0, n).join(", ")} and ${xs.length - n} more`;
}

/** A worksheet read into the shared reader's columns, and how its cells were read. */
export interface XlsxTable {
  /** The sheet's columns (read them with src/io's readTable). */
  columns: CsvColumns;
  /** Merged cells, formulas without results, … */
  notes: string[];
}

/**
 * Reads one worksheet of an .xlsx workbook (the first, or --sheet NAME; the used range, or --range)
 * into the shared reader's columns. Refuses encrypted, old-format or damaged files with what to do.
 * @example (await readXlsxTable("book.xlsx", { sheet: "Sales" })).columns.header // ["month", "Harbour Street", …]
 */
export async function readXlsxTable(file: string, options: { sheet?: string; range?: string } = {}): Promise<XlsxTable> {
  checkPackage(file);
  const range = options.range === undefined ? null : parseRange(options.range);
  const wb = new Workbook();
  try {
    await wb.xlsx.readFile(file);
  } catch (e) {
    throw new EngineError("input", `${file} could not be read as a workbook (${String(e instanceof Error ? e.message : e).slice(0, 120)}). It may be damaged: open it in a spreadsheet program and save it again as .xlsx, or export the sheet as CSV.`);
  }
  const sheets = wb.worksheets;
  if (sheets.length === 0) throw new EngineError("input", `${file} has no worksheets.`);
  let ws: Worksheet | undefined;
  if (options.sheet === undefined) ws = sheets[0];
  else {
    ws = sheets.find((s) => s.name === options.sheet) ?? sheets.find((s) => s.name.toLowerCase() === options.sheet?.trim().toLowerCase());
    if (!ws) throw new EngineError("input", `--sheet: no sheet named "${options.sheet}" in ${file}. Sheets: ${sheets.map((s) => s.name).join(", ")}.`);
  }
  const name = ws.name;
  const r = range ?? usedRange(ws);
  if (!r) throw new EngineError("input", `Sheet "${name}" of ${file} is empty.${sheets.length > 1 ? ` Other sheets: ${sheets.filter((s) => s !== ws).map((s) => s.name).join(", ")} (choose one with --sheet).` : ""}`);
  const width = r.right - r.left + 1;
  const notes: string[] = [];
  const noResult: string[] = [];
  const get = (row: number, col: number): Cell => (ws as Worksheet).getCell(row, col);

  // The header: the range's first row, joined with the rows below it that continue a merged
  // header (a cell merged down from the first row, or names under a cell merged across columns).
  const headerRows = [r.top];
  const mergedAcross = (row: number): boolean => Array.from({ length: width }, (_, k) => get(row, r.left + k)).some((c) => c.isMerged && Number(c.master.row) === row && Number(c.master.col) !== Number(c.col));
  for (let row = r.top + 1; row < r.bottom && headerRows.length < 3; row++) {
    const cells = Array.from({ length: width }, (_, k) => get(row, r.left + k));
    const continues = cells.some((c) => c.type === ValueType.Merge && headerRows.includes(Number(c.master.row)));
    const namesBelowMerge = mergedAcross(headerRows[headerRows.length - 1]) && cells.every((c) => c.type === ValueType.Merge || c.value === null || typeof c.value === "string");
    if (!continues && !namesBelowMerge) break;
    headerRows.push(row);
  }
  const rawNames = Array.from({ length: width }, (_, k) => {
    const parts: string[] = [];
    for (const row of headerRows) {
      const c = get(row, r.left + k);
      const src = c.isMerged ? c.master : c;
      const t = readCell(src.type === ValueType.Merge ? src : ({ type: src.type, value: src.value, address: src.address } as unknown as Cell), []).cell;
      const text = t === null ? "" : String(t);
      if (text !== "" && parts[parts.length - 1] !== text) parts.push(text);
    }
    return parts.join(" ");
  });
  const merges = Array.from({ length: width }, (_, k) => get(r.top, r.left + k)).filter((c) => c.isMerged && c.master.address === c.address);
  if (merges.length > 0 || headerRows.length > 1) {
    notes.push(`Sheet "${name}": the header ${headerRows.length > 1 ? `spans rows ${headerRows[0]}–${headerRows[headerRows.length - 1]} (merged cells)` : "has merged cells"}; columns read as ${someOf(rawNames.filter(Boolean).map((n) => `"${n}"`), 6)}. Use --range to start at a single header row if that is not what you meant.`);
  }
  const first = headerRows[headerRows.length - 1] + 1;
  const rows = Math.max(0, r.bottom - first + 1);
  if (rows === 0) throw new EngineError("input", `Sheet "${name}" has a header row but no values below it${range ? ` in --range ${options.range}` : ""}.`);
  // Rows are named by the sheet's row numbers; the header row's number stands for the header.
  const columns = new CsvColumns(true, ",", "workbook", (row) => `row ${row} of sheet "${name}"`);
  columns.add(rawNames, r.top);
  let mergedData = 0;
  for (let row = first; row <= r.bottom; row++) {
    const wsRow = ws.getRow(row);
    const cells: (number | string | null)[] = [];
    for (let k = 0; k < width; k++) {
      const c = wsRow.getCell(r.left + k);
      if (c.type === ValueType.Merge) mergedData++;
      const x = readCell(c, noResult);
      cells.push(typeof x.cell === "number" || typeof x.cell === "string" ? x.cell : x.cell === null || x.cell === undefined ? null : String(x.cell));
    }
    columns.addCells(cells, row);
  }
  if (noResult.length > 0) {
    notes.push(`Sheet "${name}": ${noResult.length} formula cell${noResult.length === 1 ? " has" : "s have"} no saved result (${someOf(noResult)}); read as blank. Open the workbook in a spreadsheet program and save it (so the results are stored), or type the values in.`);
  }
  if (mergedData > 0) notes.push(`Sheet "${name}": ${mergedData} cell${mergedData === 1 ? " is" : "s are"} part of a merged block below the header; a merged block's value is read once, in its first cell, and its other cells as blank.`);
  return { columns: columns.finish(), notes };
}
