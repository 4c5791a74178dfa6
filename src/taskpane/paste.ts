// The stand-alone pane's paste box: a table copied from any spreadsheet (tab-separated), or CSV text
// with commas or semicolons; read by the shared reader (src/io) like a file.
import { EngineError, isEngineError } from "../engine";
import { DecimalMark, ParseOptions, readCsvText, ReadOptions, SeriesTable } from "../io";
import type { PaneData } from "./view-model";

/**
 * Reads pasted text: the delimiter detected (tab, semicolon or comma), number formats and dates read
 * as for a file. The first row names the columns; a column of period labels labels the rows, puts
 * them in time order and gives the period and the future periods' labels. A table whose periods
 * repeat (a forecast log: one row per forecast) is read in the order pasted, for the audit; it
 * carries the repeat as its `problem`, so it is not forecast as one series.
 * @example pastedData("month\tsales\n2024-01\t5\n2024-02\t6").names // ["sales"]
 */
export function pastedData(text: string, decimal?: DecimalMark): PaneData {
  const trimmed = text.replace(/\s+$/, "");
  if (trimmed === "") throw new EngineError("input", "Paste a table first: a header row naming the columns, then one row per period.");
  const options: ParseOptions & ReadOptions = { decimal, decimalFix: (m) => `Decimal mark: ${m === "," ? "comma" : "point"}`, delimiterFix: (d) => `a first line sep=${d === "tab" ? "\\t" : d}, or copy the cells straight from the sheet (tabs)` };
  let s: SeriesTable;
  let problem: string | undefined;
  try {
    s = readCsvText(trimmed, options);
  } catch (e) {
    if (!isEngineError(e) || !/ appears twice in /.test(e.message)) throw e;
    s = readCsvText(trimmed, { ...options, calendar: false });
    problem = `${e.message} (Read in the order pasted, for an audit of a forecast log.)`;
  }
  const columns = s.names.map((_, j) => s.column(j));
  const labelNames = s.header.filter((h) => !s.names.includes(h));
  return {
    source: `Pasted table (${s.names.length} series × ${s.rows} rows)`,
    names: s.names,
    columns,
    rowLabels: s.labelColumn ? s.labelColumn.values : undefined,
    labelColumns: labelNames.map((h) => ({ name: h, values: (s.columnNamed(h) ?? []).map((x) => (x === null || x === undefined ? "" : String(x))) })),
    headerRows: 1,
    period: s.calendar ? s.period : undefined,
    nextLabel: s.next ?? undefined,
    notes: s.reading.notes,
    ...(problem ? { problem } : {}),
  };
}
