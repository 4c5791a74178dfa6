// Writing a command's table to an .xlsx workbook: a header row, the numbers at full precision with
// number formats, the settings that produced them, the cautions, and the charts as pictures beside
// the table (PNG, so the workbook opens without any add-in).
import { Workbook } from "exceljs";
import { version } from "./help";
import { ParsedArgs } from "./options";
import { TableResult } from "./output";
import { svgToPng } from "./png";

const CAUTION = "Forecasts are estimates from past patterns; intervals assume the model holds. Check results before committing money, and follow your organisation's forecasting and audit policies.";

/** Number formats by column name when the command gives none: counts whole, amounts with separators. */
function defaultFormat(column: string): string | undefined {
  if (/^(h|n|horizon|paths|origins|misses|blanks|text_cells|nonpositive|level)$/.test(column)) return "0";
  if (/^(mean|median|low|high|min|max|interval_score|mean_error|mc_std_error|simulated)/.test(column)) return "#,##0.00";
  return undefined;
}

/**
 * Writes the result as a workbook: sheet "fanwise COMMAND" with the table from A1 (header in
 * bold, frozen), then the settings and cautions below it, and one picture per chart beside it.
 * @example await writeResultWorkbook("results.xlsx", result, parsed) // results.xlsx on disk
 */
export async function writeResultWorkbook(file: string, r: TableResult, p: ParsedArgs): Promise<void> {
  const wb = new Workbook();
  wb.creator = "fanwise";
  const ws = wb.addWorksheet(`fanwise ${r.command}`, { views: [{ state: "frozen", ySplit: 1 }] });
  const rows = r.rows();
  ws.addRow(r.header).font = { bold: true };
  for (const row of rows) ws.addRow(row.map((v) => (v === "" || v === undefined || (typeof v === "number" && !Number.isFinite(v)) ? null : v)));
  r.header.forEach((h, j) => {
    const col = ws.getColumn(j + 1);
    const fmt = r.formats?.[h] ?? defaultFormat(h);
    if (fmt) col.numFmt = fmt;
    col.width = Math.min(40, Math.max(8, h.length + 2, ...rows.slice(0, 50).map((x) => (typeof x[j] === "number" ? 12 : String(x[j] ?? "").length + 1))));
  });
  ws.getRow(1).numFmt = "@";
  const at = ws.rowCount + 2;
  ws.getCell(at, 1).value = "Settings";
  ws.getCell(at, 1).font = { bold: true };
  const settings: [string, string][] = [
    ["command", ["fanwise", r.command, ...p.positional, ...p.given().flatMap(([k, v]) => (v === "" ? [k] : [k, /[\s,"]/.test(v) ? JSON.stringify(v) : v]))].join(" ")],
    ["fanwise version", version()],
  ];
  settings.forEach(([k, v], i) => {
    ws.getCell(at + 1 + i, 1).value = k;
    ws.getCell(at + 1 + i, 2).value = v;
  });
  const cautionsAt = at + settings.length + 2;
  ws.getCell(cautionsAt, 1).value = "Cautions";
  ws.getCell(cautionsAt, 1).font = { bold: true };
  [...(r.cautions ?? []), CAUTION].forEach((c, i) => {
    ws.getCell(cautionsAt + 1 + i, 1).value = c;
  });
  const charts = r.charts ? r.charts() : [];
  const left = r.header.length + 1; // one empty column between the table and the pictures
  let top = 0;
  for (const c of charts) {
    const id = wb.addImage({ buffer: svgToPng(c.svg) as unknown as ArrayBuffer, extension: "png" });
    ws.addImage(id, { tl: { col: left, row: top }, ext: { width: c.width, height: c.height }, editAs: "oneCell" });
    top += Math.ceil(c.height / 20) + 1; // default rows are 20 px high
  }
  await wb.xlsx.writeFile(file);
}
