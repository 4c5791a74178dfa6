// The only Excel.run code of the pane: read the selection as columns of raw cells.
import { RawCell } from "../engine";

/** The selected range as named columns. */
export interface Selection {
  address: string;
  columns: { name: string; cells: RawCell[] }[];
}

/**
 * Reads the selected range (values + valueTypes + address; ExcelApi 1.1). Each column is a series;
 * a first row of text names them. Error cells become text so the check counts them.
 */
export async function readSelection(): Promise<Selection> {
  return Excel.run(async (ctx) => {
    const range = ctx.workbook.getSelectedRange();
    range.load(["address", "values", "valueTypes"]);
    await ctx.sync();
    const values = range.values as unknown[][];
    const types = range.valueTypes as string[][];
    const cells: RawCell[][] = values.map((row, i) => row.map((v, j) => {
      const t = types[i][j];
      if (t === "Empty") return null;
      if (t === "Double") return typeof v === "number" ? v : Number(v);
      if (t === "Boolean") return Boolean(v);
      return String(v);
    }));
    const header = cells.length > 1 && cells[0].every((c) => c === null || typeof c === "string") && cells[0].some((c) => typeof c === "string");
    const body = header ? cells.slice(1) : cells;
    const width = cells[0]?.length ?? 0;
    const columns = Array.from({ length: width }, (_, j) => ({
      name: header && typeof cells[0][j] === "string" ? String(cells[0][j]) : `column ${j + 1}`,
      cells: body.map((r) => r[j]),
    }));
    return { address: range.address, columns };
  });
}
