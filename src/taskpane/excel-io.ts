// The only Excel.run code of the pane: read the selection, write the FW.FAN formula and,
// where the API allows, a native fan chart next to it.
import { isHeaderRow, RawCell } from "../engine";
import { findDateColumn } from "../io";
import type { PaneData } from "./view-model";
import { formatWhole } from "./locale";
import { describeInTheWay, fanWritePlan, InTheWay, occupiedCells } from "./write-plan";

/** The most cells the pane reads from a selection (a whole-column selection is first cut to the data). */
export const MAX_SELECTION_CELLS = 200000;

/**
 * Reads the selected range (address, values, valueTypes; ExcelApi 1.1) as named columns: each
 * column is a series; a first row of text names them. Error cells become text, so the series
 * check counts them instead of failing. A selection of more than MAX_SELECTION_CELLS cells (whole
 * columns, say) is first cut to the part that holds data (ExcelApi 1.4); if it is still too large,
 * nothing is read and the error says what to select instead.
 */
export async function readSelection(): Promise<PaneData> {
  return Excel.run(async (ctx) => {
    let range = ctx.workbook.getSelectedRange();
    range.load(["address", "rowCount", "columnCount"]);
    await ctx.sync();
    if (range.rowCount * range.columnCount > MAX_SELECTION_CELLS && Office.context.requirements.isSetSupported("ExcelApi", "1.4")) {
      const used = range.getIntersectionOrNullObject(range.worksheet.getUsedRange(true));
      used.load(["address", "rowCount", "columnCount"]);
      await ctx.sync();
      if (used.isNullObject) return { source: `Selection ${range.address} (no data in it)`, address: range.address, names: [], columns: [], headerRows: 0 };
      range = used;
    }
    const n = range.rowCount * range.columnCount;
    if (n > MAX_SELECTION_CELLS) {
      throw new Error(`The selection ${range.address} has ${formatWhole(range.rowCount)} rows × ${range.columnCount} columns (${formatWhole(n)} cells); the pane previews up to ${formatWhole(MAX_SELECTION_CELLS)} cells. Select fewer rows or columns; the FW functions in cells take any size.`);
    }
    if (n <= READ_PIECE_CELLS) {
      range.load(["values", "valueTypes", "numberFormat"]);
      await ctx.sync();
      return selectionData(range.address, range.values as unknown[][], range.valueTypes as string[][], (range.numberFormat as unknown as string[][] | undefined) ?? null);
    }
    // Large selections are read in pieces of whole rows, one request each, so no response passes
    // Excel on the web's 5 MB limit (see READ_PIECE_CELLS).
    const values: unknown[][] = [];
    const types: string[][] = [];
    const formats: string[][] = [];
    let haveFormats = true;
    for (const [start, rows] of readPieces(range.rowCount, range.columnCount)) {
      const piece = range.getCell(start, 0).getResizedRange(rows - 1, range.columnCount - 1);
      piece.load(["values", "valueTypes", "numberFormat"]);
      await ctx.sync();
      for (const row of piece.values as unknown[][]) values.push(row);
      for (const row of piece.valueTypes as string[][]) types.push(row);
      const f = piece.numberFormat as unknown as string[][] | undefined;
      if (f) for (const row of f) formats.push(row);
      else haveFormats = false;
    }
    return selectionData(range.address, values, types, haveFormats ? formats : null);
  });
}

/**
 * The most cells the pane reads in one request. Excel on the web limits a request or a response to
 * 5 MB ("Resource limits and performance optimization for Office Add-ins", Excel add-ins:
 * https://learn.microsoft.com/office/dev/add-ins/concepts/resource-limits-and-performance-optimization;
 * "Performance optimization using the Excel JavaScript API": keep payloads below the limits by
 * chunking, https://learn.microsoft.com/office/dev/add-ins/excel/performance). A number with its
 * type costs at most about 40 bytes of JSON ("-1.2345678901234567e-308","Double"), so 20,000 cells
 * are under 1 MB (test/taskpane/excel-io.test.ts measures the worst case), leaving room for text
 * averaging over 200 characters a cell before a piece could reach 5 MB. The number formats are read
 * too (a date column is told by its format); a format of up to 100 characters adds at most 2 MB.
 */
export const READ_PIECE_CELLS = 20000;

/**
 * How a rowCount × columnCount selection is read: [first row, rows] pieces of whole rows, each at
 * most READ_PIECE_CELLS cells (one row at least; a sheet has at most 16,384 columns).
 * @example readPieces(50001, 4) // [[0, 5000], [5000, 5000], …, [50000, 1]] (11 pieces)
 */
export function readPieces(rowCount: number, columnCount: number): [number, number][] {
  const per = Math.max(1, Math.floor(READ_PIECE_CELLS / Math.max(1, columnCount)));
  const out: [number, number][] = [];
  for (let start = 0; start < rowCount; start += per) out.push([start, Math.min(per, rowCount - start)]);
  return out;
}

/**
 * Turns a range's values, value types and number formats into the pane's columns (pure, for tests).
 * A column of dates (numbers shown with a date format, or period labels as text) is not a series:
 * it labels the rows, gives the period (monthly 12, quarterly 4, …) and the forecast's dates. When
 * the rows are not in time order, skip a period or hold a Total row, the data carries a `problem`
 * saying what to change (the FW functions read the cells as they stand).
 */
export function selectionData(address: string, values: unknown[][], types: string[][], formats: string[][] | null = null): PaneData {
  const cells: RawCell[][] = values.map((row, i) => row.map((v, j) => {
    const t = types[i][j];
    if (t === "Empty") return null;
    if (t === "Double") return typeof v === "number" ? v : Number(v);
    if (t === "Boolean") return Boolean(v);
    return String(v);
  }));
  const header = cells.length > 1 && isHeaderRow(cells[0]);
  const body = header ? cells.slice(1) : cells;
  const width = cells[0]?.length ?? 0;
  const names = Array.from({ length: width }, (_, j) => (header && typeof cells[0][j] === "string" ? String(cells[0][j]) : `column ${j + 1}`));
  const columns = Array.from({ length: width }, (_, j) => body.map((r) => r[j]));
  const data: PaneData = { source: `Selection ${address}`, address, names, columns, headerRows: header ? 1 : 0 };
  const firstRow = (Number(/(\d+)(?::|$)/.exec(address.split("!").pop() ?? "")?.[1]) || 1) + (header ? 1 : 0);
  const dates = width > 1 ? findDateColumn(body, formats ? (header ? formats.slice(1) : formats) : null, firstRow, (j) => names[j]) : null;
  // Columns of text only (series names in a forecast log, shop names) label rows: they are offered
  // as the audit's group column, not checked as series. Kept as series when nothing numeric is left.
  const isText = (j: number): boolean => body.some((r) => typeof r[j] === "string" && String(r[j]).trim() !== "") && !body.some((r) => typeof r[j] === "number");
  const candidates = names.map((_, j) => j).filter((j) => !dates || j !== dates.column);
  const textCols = candidates.filter(isText);
  const hasNumber = (j: number): boolean => body.some((r) => typeof r[j] === "number");
  const labelCols = candidates.some((j) => !textCols.includes(j) && hasNumber(j)) ? textCols : [];
  if (!dates && labelCols.length === 0) return data;
  const keep = candidates.filter((j) => !labelCols.includes(j));
  data.names = keep.map((j) => names[j]);
  data.columns = keep.map((j) => columns[j]);
  data.rangeColumns = keep;
  if (labelCols.length) data.labelColumns = labelCols.map((j) => ({ name: names[j], values: body.map((r) => (r[j] === null || r[j] === undefined ? "" : String(r[j]))) }));
  if (!dates) return data;
  if (dates.problem) data.problem = dates.problem;
  else if (dates.calendar) {
    const cal = dates.calendar;
    data.rowLabels = cal.labels;
    data.period = cal.period;
    data.nextLabel = cal.next;
    data.notes = [`Dates in "${names[dates.column]}": ${cal.frequency}, ${cal.labels[0]} to ${cal.labels[cal.labels.length - 1]}; period ${cal.period}.`];
  }
  return data;
}

/** The address of one column of a range address ("Sheet1!B2:H74", column 2 → "Sheet1!D2:D74"). */
export function columnAddress(address: string, column: number): string {
  const m = /^(.*!)?\$?([A-Z]+)\$?(\d+)(?::\$?([A-Z]+)\$?(\d+))?$/.exec(address);
  if (!m) return address;
  const sheet = m[1] ?? "";
  const toNum = (s: string): number => s.split("").reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
  const toCol = (n: number): string => {
    let s = "";
    for (let k = n; k > 0; k = Math.floor((k - 1) / 26)) s = String.fromCharCode(65 + ((k - 1) % 26)) + s;
    return s;
  };
  const col = toCol(toNum(m[2]) + column);
  return `${sheet}${col}${m[3]}:${col}${m[5] ?? m[3]}`;
}

/** What writing to the sheet did. */
export interface WriteResult {
  formulaAt: string;
  chart: boolean;
  note: string;
  /** False when nothing was written because cells are in the way (see inTheWay). */
  written: boolean;
  /** The non-empty cells the write would overwrite (empty when it wrote). */
  inTheWay: InTheWay[];
}

/**
 * Runs a batch that waits while the user is editing a cell: Excel.RunOptions.delayForCellEdit
 * delays the batch until the edit ends instead of failing it
 * (https://learn.microsoft.com/javascript/api/excel/excel.runoptions). Where the host still refuses
 * (an Excel without the option), the error says what to do. mergeUndoGroup (ExcelApi 1.20, same
 * page) keeps the write one undo step even where a host splits a batch.
 */
async function runWhenNotEditing<T>(batch: (ctx: Excel.RequestContext) => Promise<T>): Promise<T> {
  const mergeUndo = Office.context.requirements.isSetSupported("ExcelApi", "1.20");
  try {
    return await Excel.run({ delayForCellEdit: true, ...(mergeUndo ? { mergeUndoGroup: true } : {}) } as Excel.RunOptions, batch);
  } catch (e) {
    const code = (e as { code?: string }).code;
    if (code === "InvalidOperationInCellEditMode") throw new Error("Excel is editing a cell. Finish the edit (Enter or Esc), then press Write to sheet again.");
    throw e;
  }
}

/**
 * Puts the FW.FAN formula at `target` (a cell address on the active sheet) so it recalculates with
 * the data and, when asked and ExcelApi 1.7 is available, adds a native fan chart beside it:
 * stacked areas over helper columns (the lowest, up to the 95% low end, left unfilled) with the
 * mean and median as lines. Without 1.7 it writes the formula only and says why.
 *
 * It never destroys a user's cells unasked: it first reads the formula's cell, everything the fan
 * will spill into and the chart's helper block (write-plan.ts); if any of them holds something it
 * writes nothing and returns what is in the way and where (`written: false`), unless `overwrite`.
 * All writes then go in one batch: one sync, so one undo record (each context.sync() makes one:
 * Excel.RunOptions.mergeUndoGroup, https://learn.microsoft.com/javascript/api/excel/excel.runoptions),
 * waiting while the user edits a cell.
 */
export async function writeFan(target: string, formula: string, horizon: number, levels: number[], withChart: boolean, options: { overwrite?: boolean } = {}): Promise<WriteResult> {
  const lv = levels.slice().sort((a, b) => a - b);
  const chartable = withChart && Office.context.requirements.isSetSupported("ExcelApi", "1.7");
  const plan = fanWritePlan(target, horizon, lv, chartable);
  return runWhenNotEditing(async (ctx) => {
    const sheet = ctx.workbook.worksheets.getActiveWorksheet();
    const areas = plan.areas.map((a) => sheet.getRange(a.address).load("formulas"));
    await ctx.sync();
    const inTheWay = occupiedCells(plan.areas, areas.map((r) => r.formulas as unknown[][]));
    if (inTheWay.length > 0 && !options.overwrite) {
      return { formulaAt: plan.formulaCell, chart: false, written: false, inTheWay, note: describeInTheWay(inTheWay) };
    }
    const cell = sheet.getRange(plan.formulaCell);
    // Clear the spill area first (its other cells), so the formula's result can spill where the
    // user agreed to overwrite; then the formula itself.
    if (inTheWay.length > 0) sheet.getRange(plan.areas[0].address).clear(Excel.ClearApplyTo.contents);
    cell.formulas = [[formula]];
    const result: WriteResult = { formulaAt: plan.formulaCell, chart: false, note: "Formula written.", written: true, inTheWay: [] };
    if (withChart && !chartable) {
      await ctx.sync();
      result.note = "Formula written. This Excel does not offer the chart features the fan needs (ExcelApi 1.7), so no chart was added.";
      return result;
    }
    if (!withChart) {
      await ctx.sync();
      return result;
    }
    // The fan occupies horizon rows × (1 + 2 + 2·levels) columns from the target cell.
    const width = plan.width;
    // Helper columns start one column after the fan; helper column h refers to fan column k as
    // RC[k − (width + 1 + h)] in R1C1 notation, so the block recalculates with the fan.
    const lowOf = (i: number): number => 3 + 2 * i; // fan columns: 0 step, 1 mean, 2 median, then low/high per level
    const highOf = (i: number): number => 4 + 2 * i;
    const outer = lv.length - 1;
    const terms: [number, number | null][] = [[lowOf(outer), null]]; // [plus, minus]
    for (let i = outer; i > 0; i--) terms.push([lowOf(i - 1), lowOf(i)]);
    terms.push([highOf(0), lowOf(0)]);
    for (let i = 1; i <= outer; i++) terms.push([highOf(i), highOf(i - 1)]);
    const ref = (k: number, h: number): string => `RC[${k - (width + 1 + h)}]`;
    const row = terms.map(([plus, minus], h) => (minus === null ? `=${ref(plus, h)}` : `=${ref(plus, h)}-${ref(minus, h)}`));
    const helper = cell.getOffsetRange(0, width + 1).getResizedRange(horizon - 1, terms.length - 1);
    helper.formulasR1C1 = Array.from({ length: horizon }, () => row);
    const chart = sheet.charts.add(Excel.ChartType.areaStacked, helper, Excel.ChartSeriesBy.columns);
    chart.title.text = "Fanwise fan";
    const colour = (i: number): string => {
      const l = i === 0 ? null : i <= outer ? lv[outer - i + 1] : lv[i - outer - 1];
      return l === null ? "" : l >= 95 ? "#f4e3bf" : l >= 80 ? "#e9c27a" : "#d4973a";
    };
    // One series per helper column, in order; getItemAt needs no load, so the whole write stays one batch.
    for (let i = 0; i < terms.length; i++) {
      const s = chart.series.getItemAt(i);
      if (i === 0) s.format.fill.clear();
      else s.format.fill.setSolidColor(colour(i));
    }
    const mean = chart.series.add("mean");
    mean.setValues(cell.getOffsetRange(0, 1).getResizedRange(horizon - 1, 0));
    mean.chartType = Excel.ChartType.line;
    mean.format.line.color = "#5a2d82";
    mean.format.line.weight = 2;
    const median = chart.series.add("median");
    median.setValues(cell.getOffsetRange(0, 2).getResizedRange(horizon - 1, 0));
    median.chartType = Excel.ChartType.lineMarkers;
    median.markerStyle = Excel.ChartMarkerStyle.diamond;
    median.format.line.color = "#5a2d82";
    median.format.line.weight = 1;
    await ctx.sync();
    result.chart = true;
    result.note = "Formula and chart written.";
    return result;
  });
}

/**
 * Registers `onChange` for the workbook's selection changes (ExcelApi 1.2) and resolves to a function
 * that removes it again (in the handler's own request context, as the API requires).
 */
export async function addSelectionHandler(onChange: () => void): Promise<() => Promise<void>> {
  return Excel.run(async (ctx) => {
    const handler = ctx.workbook.onSelectionChanged.add(async () => onChange());
    await ctx.sync();
    return async (): Promise<void> => {
      await Excel.run(handler.context as Excel.RequestContext, async (c) => {
        handler.remove();
        await c.sync();
      });
    };
  });
}
