// Element-by-element evaluation over ranges of the same shape (a single cell stretches to fit).
import { EngineError, RawCell } from "../engine";
import { notFiniteError, toExcelError } from "./excel-errors";

/** One result cell: a number, text, a boolean, blank ("") or an error. */
export type OutCell = number | string | boolean | CustomFunctions.Error;

/**
 * Applies f to each aligned set of cells. Every input is either a single cell or a range of the
 * common shape. A blank in any input gives a blank result; text gives #VALUE! in that cell; an
 * EngineError from f becomes that cell's error; a non-finite result becomes #NUM!.
 */
export function elementwise(inputs: { name: string; cells: RawCell[][] }[], f: (...xs: number[]) => number): OutCell[][] {
  let rows = 1;
  let cols = 1;
  for (const inp of inputs) {
    const r = inp.cells.length;
    const c = inp.cells[0].length;
    if (r === 1 && c === 1) continue;
    if (rows === 1 && cols === 1) {
      rows = r;
      cols = c;
    } else if (r !== rows || c !== cols) {
      throw new EngineError("input", `The ranges must have the same size (or be single cells): ${inputs.map((i) => `${i.name} is ${i.cells.length}×${i.cells[0].length}`).join(", ")}.`);
    }
  }
  const out: OutCell[][] = [];
  for (let i = 0; i < rows; i++) {
    const row: OutCell[] = [];
    for (let j = 0; j < cols; j++) {
      const xs: number[] = [];
      let blank = false;
      let bad: string | null = null;
      for (const inp of inputs) {
        const c = inp.cells.length === 1 && inp.cells[0].length === 1 ? inp.cells[0][0] : inp.cells[i][j];
        if (c === null || c === undefined || c === "") blank = true;
        else if (typeof c !== "number") bad = `${inp.name} is not a number here (${JSON.stringify(c).slice(0, 20)}).`;
        else xs.push(c);
      }
      if (bad) row.push(toExcelError(new EngineError("input", bad)));
      else if (blank) row.push("");
      else {
        try {
          const v = f(...xs);
          row.push(Number.isFinite(v) ? v : notFiniteError("The result"));
        } catch (e) {
          row.push(toExcelError(e));
        }
      }
    }
    out.push(row);
  }
  return out;
}

/** Replaces any non-finite number in a result table by a #NUM! cell (a last safety net). */
export function finiteTable(t: (number | string | boolean | null | CustomFunctions.Error)[][]): OutCell[][] {
  return t.map((row) => row.map((v) => (v === null ? "" : typeof v === "number" && !Number.isFinite(v) ? notFiniteError("A result") : v)));
}
