// What "Write to sheet" will occupy, worked out before anything is written (pure, for tests): the
// formula's cell and the block its result spills into, and the chart's helper block beside it.
// excel-io.ts reads those cells first and writes only when they are empty or the user said to
// overwrite them.

/** One rectangular block of cells on the active sheet. */
export interface Area {
  /** What it is for, in words ("the fan's spill area"). */
  role: string;
  address: string;
  row: number; // 0-based
  col: number; // 0-based
  rows: number;
  cols: number;
}

/** The blocks a write will occupy. */
export interface WritePlan {
  /** The cell the formula goes in (A1 address, no sheet). */
  formulaCell: string;
  /** The spill block (the formula's cell is its top-left) and, with a chart, the helper block. */
  areas: Area[];
  /** The fan's width in columns: step, mean, median, then low and high per level. */
  width: number;
  /** Columns of the chart's helper block (0 without a chart). */
  helperCols: number;
}

const MAX_ROWS = 1048576;
const MAX_COLS = 16384;

/** "AB" → 27 (0-based column index). */
function colIndex(letters: string): number {
  return letters.split("").reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
}

/** 27 → "AB". */
export function colLetters(index: number): string {
  let s = "";
  for (let k = index + 1; k > 0; k = Math.floor((k - 1) / 26)) s = String.fromCharCode(65 + ((k - 1) % 26)) + s;
  return s;
}

/** A1 address of a block (a single cell when 1×1). */
export function blockAddress(row: number, col: number, rows: number, cols: number): string {
  const tl = `${colLetters(col)}${row + 1}`;
  return rows === 1 && cols === 1 ? tl : `${tl}:${colLetters(col + cols - 1)}${row + rows}`;
}

/** Reads a single-cell address on the active sheet ("J2", "$J$2", "j2"). */
export function parseCell(text: string): { row: number; col: number } {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d{1,7})$/.exec(text.trim());
  if (!m) throw new Error(`"${text.trim()}" is not a cell address: type one cell of the active sheet, such as J2.`);
  const col = colIndex(m[1].toUpperCase());
  const row = Number(m[2]) - 1;
  if (row < 0 || row >= MAX_ROWS || col >= MAX_COLS) throw new Error(`${text.trim()} is outside the sheet.`);
  return { row, col };
}

/**
 * The blocks writing the fan at `target` will occupy: the spill area (horizon rows × the fan's
 * width, from the target) and, with a chart, the helper block one column to its right (horizon rows
 * × 2·levels columns: the stacked band heights).
 * @example fanWritePlan("J2", 12, [80, 95], true).areas.map((a) => a.address) // ["J2:P13", "R2:U13"]
 */
export function fanWritePlan(target: string, horizon: number, levels: number[], withChart: boolean): WritePlan {
  if (!Number.isInteger(horizon) || horizon < 1) throw new Error("Set the horizon to a whole number of periods (1 or more) first.");
  const { row, col } = parseCell(target);
  const width = 3 + 2 * levels.length;
  const helperCols = withChart ? 2 * levels.length : 0;
  const lastCol = col + width - 1 + (withChart ? 1 + helperCols : 0);
  if (row + horizon > MAX_ROWS || lastCol >= MAX_COLS) throw new Error(`From ${target.trim().toUpperCase()} the fan (${horizon} rows × ${width + (withChart ? 1 + helperCols : 0)} columns) would run off the sheet; choose a cell further up or left.`);
  const areas: Area[] = [{ role: "the fan's spill area", address: blockAddress(row, col, horizon, width), row, col, rows: horizon, cols: width }];
  if (withChart) areas.push({ role: "the chart's helper columns", address: blockAddress(row, col + width + 1, horizon, helperCols), row, col: col + width + 1, rows: horizon, cols: helperCols });
  return { formulaCell: blockAddress(row, col, 1, 1), areas, width, helperCols };
}

/** A cell that is in the way, for the message. */
export interface InTheWay {
  address: string;
  role: string;
  /** What it holds, shortened: a formula or a value. */
  holds: string;
}

/**
 * The non-empty cells of each area, given each area's `formulas` (a formula, a constant, or "" when
 * empty, as Excel's Range.formulas gives them).
 * @example occupiedCells(fanWritePlan("A1", 1, [80], false).areas, [[["", 5, "", "", ""]]]).map((c) => c.address) // ["B1"]
 */
export function occupiedCells(areas: Area[], formulas: unknown[][][]): InTheWay[] {
  const out: InTheWay[] = [];
  areas.forEach((a, k) => {
    const grid = formulas[k] ?? [];
    for (let i = 0; i < a.rows; i++) for (let j = 0; j < a.cols; j++) {
      const v = grid[i]?.[j];
      if (v === "" || v === null || v === undefined) continue;
      const s = String(v);
      out.push({ address: blockAddress(a.row + i, a.col + j, 1, 1), role: a.role, holds: s.length > 30 ? `${s.slice(0, 29)}…` : s });
    }
  });
  return out;
}

/**
 * One sentence saying what is in the way and where, asking before overwriting.
 * @example describeInTheWay([{ address: "K5", role: "the fan's spill area", holds: "1200" }]) // 'K5 (in the fan's spill area) holds 1200. Writing would overwrite it: choose another cell, or press "Overwrite" to replace it.'
 */
export function describeInTheWay(cells: InTheWay[]): string {
  if (cells.length === 0) return "";
  const shown = cells.slice(0, 3).map((c) => `${c.address} (in ${c.role}) holds ${c.holds}`);
  const more = cells.length > 3 ? `, and ${cells.length - 3} more cell${cells.length - 3 === 1 ? "" : "s"}` : "";
  const it = cells.length === 1 ? "it" : "them";
  return `${shown.join("; ")}${more}. Writing would overwrite ${it}: choose another cell, or press "Overwrite" to replace ${it}.`;
}
