// How Excel's cells become engine inputs. Decided once, here (DESIGN.md habit 5), and stated in
// the README ("How Fanwise reads cells"):
//  - a number is a value; an empty cell (null or "") is a blank;
//  - text and TRUE/FALSE are not values: in a series they count as "text cells" (and are refused
//    when they sit between the first and last number); in element-by-element functions their
//    result cell is #VALUE!;
//  - a first row whose non-blank cells are all text is a header: it names the series;
//  - a multi-column range is one series per column; a single row is one series;
//  - an error value (#N/A, #DIV/0!, …) anywhere in an input range is refused with its position.
import { EngineError, isHeaderRow, RawCell } from "../engine";

/** A value as Excel passes it: number, string, boolean, null (empty), or an error object. */
export type ExcelValue = unknown;

/** Series read from a range. */
export interface SeriesRange {
  names: string[];
  series: RawCell[][];
  /** 1 when the first row was a header (so data row k is sheet row k + 1 of the range). */
  headerRows: number;
}

function isErrorValue(v: ExcelValue): boolean {
  if (typeof CustomFunctions !== "undefined" && v instanceof CustomFunctions.Error) return true;
  return typeof v === "object" && v !== null && typeof (v as { code?: unknown }).code === "string" && String((v as { code: string }).code).startsWith("#");
}

function errorCode(v: ExcelValue): string {
  return String((v as { code?: unknown }).code ?? "#VALUE!");
}

/** Turns one Excel cell into a RawCell, refusing error values and non-finite numbers. */
export function toRawCell(v: ExcelValue, where: string): RawCell {
  if (v === null || v === undefined) return null;
  if (typeof v === "number") {
    if (!Number.isFinite(v)) throw new EngineError("input", `${where} is not a finite number.`);
    return v;
  }
  if (typeof v === "string" || typeof v === "boolean") return v;
  if (isErrorValue(v)) throw new EngineError("input", `${where} holds the error ${errorCode(v)}. Fix that cell (or leave it empty) first.`);
  throw new EngineError("input", `${where} holds something that is not a number or text.`);
}

/** Requires a non-empty 2-D array (what Excel passes for a range). */
export function requireRange(range: ExcelValue, name: string): ExcelValue[][] {
  if (!Array.isArray(range) || range.length === 0 || !Array.isArray(range[0]) || range[0].length === 0) {
    throw new EngineError("input", `${name} must be a range of cells, e.g. B2:B73.`);
  }
  const width = range[0].length;
  for (const row of range) {
    if (!Array.isArray(row) || row.length !== width) throw new EngineError("input", `${name} must be a rectangular range.`);
  }
  return range as ExcelValue[][];
}

/** Column letters for messages: 0 → A. */
export function columnName(i: number): string {
  let s = "";
  let n = i + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/**
 * Reads a range as series: one per column (a single row is one series); a first row of text is a
 * header naming them. Names default to "column A", "column B", … relative to the range.
 * @example readSeries([["Shop"], [1], [2]]).names // ["Shop"]
 */
export function readSeries(range: ExcelValue, name = "values"): SeriesRange {
  const r = requireRange(range, name);
  const rows = r.length;
  const cells: RawCell[][] = r.map((row, i) => row.map((v, j) => toRawCell(v, `${name} row ${i + 1}, column ${columnName(j)}`)));
  if (rows === 1) {
    if (!cells[0].some((c) => typeof c === "number")) {
      throw new EngineError("input", `${name} has no numbers${cells[0].some((c) => typeof c === "string") ? " (only a header?)" : ""}; select the series' values too.`);
    }
    return { names: ["row 1"], series: [cells[0]], headerRows: 0 };
  }
  const first = cells[0];
  const header = isHeaderRow(first);
  const body = header ? cells.slice(1) : cells;
  if (body.length === 0) throw new EngineError("input", `${name} has only a header row; select the numbers under it too.`);
  const names = first.map((c, j) => (header && typeof c === "string" && c.trim() !== "" ? c.trim() : `column ${columnName(j)}`));
  const series = names.map((_, j) => body.map((row) => row[j]));
  return { names, series, headerRows: header ? 1 : 0 };
}

/**
 * Says what a user passed, for messages: `the text "abc"`, `TRUE`, `an empty cell`, `the error
 * #N/A`, `a range of 3×2 cells`, or the number itself. Never throws, whatever the value.
 * @example describeValue([[1, 2]]) // "a range of 1×2 cells"
 */
export function describeValue(v: ExcelValue): string {
  if (v === null || v === undefined || v === "") return "an empty cell";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "a value that is not a finite number";
  if (typeof v === "string") return `the text "${v.length > 20 ? `${v.slice(0, 20)}…` : v}"`;
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (Array.isArray(v)) {
    const rows = v.length;
    const cols = Array.isArray(v[0]) ? v[0].length : 1;
    return rows === 0 || cols === 0 ? "an empty range" : `a range of ${rows}×${cols} cells`;
  }
  if (isErrorValue(v)) return `the error ${errorCode(v)}`;
  return "a value that is neither a number nor text";
}

/**
 * One argument that must be a single value: a 1×1 range is unwrapped; a larger range or an error
 * value is refused with a message naming the argument.
 */
function singleValue(v: ExcelValue, name: string): ExcelValue {
  if (!Array.isArray(v)) {
    if (isErrorValue(v)) throw new EngineError("input", `${name} holds the error ${errorCode(v)}. Fix that cell first.`);
    return v;
  }
  if (v.length === 1 && Array.isArray(v[0]) && v[0].length === 1) return singleValue(v[0][0], name);
  throw new EngineError("input", `${name} must be a single cell; got ${describeValue(v)}.`);
}

/** An optional number argument: null/undefined/"" → the default; text that is not a number is refused. */
export function optionalNumber(v: ExcelValue, name: string, dflt: number): number {
  const x = singleValue(v, name);
  if (x === null || x === undefined || x === "") return dflt;
  return requiredNumber(x, name);
}

/** A required number argument (a single cell holding a number). */
export function requiredNumber(v: ExcelValue, name: string): number {
  const x = singleValue(v, name);
  if (typeof x === "number" && Number.isFinite(x)) return x;
  if (x === null || x === undefined || x === "") throw new EngineError("input", `${name} is missing; give a number.`);
  throw new EngineError("input", `${name} must be a number; got ${describeValue(x)}.`);
}

/** An optional whole number ≥ min. */
export function optionalInteger(v: ExcelValue, name: string, dflt: number, min: number): number {
  const x = optionalNumber(v, name, dflt);
  if (!Number.isInteger(x) || x < min) throw new EngineError("input", `${name} must be a whole number of at least ${min}; got ${x}.`);
  return x;
}

/** An optional keyword from a fixed list, matched case-insensitively; the message lists the valid ones. */
export function optionalKeyword<T extends string>(raw: ExcelValue, name: string, allowed: readonly T[], dflt: T): T {
  const v = singleValue(raw, name);
  if (v === null || v === undefined || v === "") return dflt;
  if (typeof v !== "string") throw new EngineError("input", `${name} must be one of ${allowed.map((a) => `"${a}"`).join(", ")}; got ${describeValue(v)}.`);
  const k = v.trim().toLowerCase();
  const hit = allowed.find((a) => a === k);
  if (!hit) throw new EngineError("input", `Unknown ${name} "${v}". Use one of ${allowed.map((a) => `"${a}"`).join(", ")}.`);
  return hit;
}

/** A numeric matrix argument (a single cell or a range); each element is a RawCell. */
export function readMatrix(v: ExcelValue, name: string): RawCell[][] {
  if (!Array.isArray(v)) return [[toRawCell(v, name)]];
  const r = requireRange(v, name);
  return r.map((row, i) => row.map((c, j) => toRawCell(c, `${name} row ${i + 1}, column ${columnName(j)}`)));
}

/** An optional TRUE/FALSE argument (numbers 0/1 are accepted too). */
export function optionalBoolean(raw: ExcelValue, name: string, dflt: boolean): boolean {
  const v = singleValue(raw, name);
  if (v === null || v === undefined || v === "") return dflt;
  if (typeof v === "boolean") return v;
  if (v === 0 || v === 1) return v === 1;
  throw new EngineError("input", `${name} must be TRUE or FALSE; got ${describeValue(v)}.`);
}

/** λ for a forecast: a number, or "auto" / "guerrero" / "mle" / "none" (any case). Default "auto". */
export function readLambda(v: ExcelValue): string | number {
  const x = singleValue(v, "lambda");
  if (x === null || x === undefined || x === "") return "auto";
  if (typeof x === "number") {
    if (!Number.isFinite(x)) throw new EngineError("input", "lambda is not a finite number.");
    return x;
  }
  if (typeof x === "string") return x;
  throw new EngineError("input", `lambda must be a number or one of "auto", "model", "guerrero", "mle", "none"; got ${describeValue(x)}.`);
}

/** A shift: a number, "auto", or blank (0). */
export function readShift(v: ExcelValue): number | string {
  const x = singleValue(v, "shift");
  if (x === null || x === undefined || x === "") return 0;
  if (typeof x === "number") {
    if (!Number.isFinite(x)) throw new EngineError("input", "shift is not a finite number.");
    return x;
  }
  if (typeof x === "string") return x;
  throw new EngineError("input", `shift must be a number or "auto"; got ${describeValue(x)}.`);
}

/** Interval levels: a cell, a range of numbers, or text like "80,95"; blank → the default. */
export function readLevels(v: ExcelValue): number[] | string | undefined {
  if (v === null || v === undefined || v === "") return undefined;
  if (typeof v === "string") return v;
  if (typeof v === "number") {
    if (!Number.isFinite(v)) throw new EngineError("input", "levels is not a finite number; give percentages like 80 and 95.");
    return [v];
  }
  if (Array.isArray(v)) {
    const cells = (v as ExcelValue[][]).flat().filter((c) => c !== null && c !== "");
    if (cells.length === 1 && typeof cells[0] === "string") return cells[0] as string;
    return cells.map((c) => {
      if (typeof c !== "number" || !Number.isFinite(c)) throw new EngineError("input", `levels must be percentages like 80 and 95; got ${describeValue(c)}.`);
      return c;
    });
  }
  throw new EngineError("input", 'levels must be percentages like 80 and 95, or text like "80,95".');
}

/** Probabilities from a cell or a range (blanks skipped); each must be a number. */
export function readProbs(v: ExcelValue): number[] {
  const cells = (Array.isArray(v) ? (v as ExcelValue[][]).flat() : [v]).filter((c) => c !== null && c !== "" && c !== undefined);
  if (cells.length === 0) throw new EngineError("input", "probs must list at least one probability, e.g. 0.1 and 0.9.");
  return cells.map((c) => {
    if (typeof c !== "number" || !Number.isFinite(c)) throw new EngineError("input", `probs must be numbers strictly between 0 and 1; got ${describeValue(c)}.`);
    return c;
  });
}
