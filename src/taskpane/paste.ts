// The stand-alone pane's paste box: tab- or comma-separated text copied from any spreadsheet.
import { EngineError } from "../engine";
import { csvSeries, parseCsv } from "../cli/csv";
import type { PaneData } from "./view-model";

/**
 * Reads pasted text: tabs if the first line has any (a spreadsheet copy), else commas. The first
 * row names the columns; a column of labels (dates, periods) labels the rows.
 * @example pastedData("month\tsales\n2024-01\t5\n2024-02\t6").names // ["sales"]
 */
export function pastedData(text: string): PaneData {
  const trimmed = text.replace(/\s+$/, "");
  if (trimmed === "") throw new EngineError("input", "Paste a table first: a header row naming the columns, then one row per period.");
  const firstLine = trimmed.split(/\r?\n/)[0];
  const tab = firstLine.includes("\t");
  // Tab-separated: turn it into CSV by quoting each field (fields may contain commas, e.g. "12,500").
  const csv = tab
    ? trimmed.split(/\r?\n/).map((l) => l.split("\t").map((f) => `"${f.replace(/"/g, '""')}"`).join(",")).join("\n")
    : trimmed;
  const table = parseCsv(csv);
  const s = csvSeries(table);
  return {
    source: `Pasted table (${s.names.length} series × ${table.rows} rows)`,
    names: s.names,
    columns: s.names.map((_, j) => s.column(j)),
    rowLabels: s.labelColumn ? s.labelColumn.values : undefined,
    labelColumns: table.header.map((h, j) => ({ h, j })).filter(({ j }) => table.isLabel(j)).map(({ h, j }) => ({ name: h || `column ${j + 1}`, values: table.labels(j) })),
    headerRows: 1,
  };
}
