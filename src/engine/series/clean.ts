import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import type { RawCell } from "./screen";
import { isBlank, cap } from "../_lib/cells";

/**
 * The largest share of missing observations a series may have between its first and last value
 * (20%). Our own rule (common practice, no published source): the Kalman filter handles any
 * pattern of gaps exactly, but beyond a fifth missing the fitted parameters and λ rest more on the
 * model than on the data, and a forecast from them should not be offered without a warning.
 */
export const MAX_MISSING_SHARE = 0.2;

/** How zeros are read: as values (default), or as missing observations (a closed period). */
export type ZerosRule = "keep" | "missing";

/** Options for {@link cleanSeries}. */
export interface CleanOptions {
  /** `missing`: a zero is a missing observation (a period the shop was closed). Default `keep`. */
  zeros?: ZerosRule;
  /** How a face names the zeros option in messages (default names every face's). */
  zerosOption?: string;
}

/**
 * A series ready for the numeric engine, with what was trimmed. Missing observations are `NaN`
 * at their place in `values` (the engine's one representation of a gap); every other value is a
 * finite number, and the first and last values are always observed.
 */
export interface CleanSeries {
  values: number[];
  /** Blank cells (and, with zeros as missing, zeros) skipped before the first number. */
  leadingBlanks: number;
  /** Blank cells skipped after the last number. */
  trailingBlanks: number;
  /** Missing observations inside the series (NaN entries of `values`). */
  missing: number;
  /** Their rows in the user's numbering (firstRow-based). */
  missingRows: number[];
  /** Zeros read as missing observations (inside the series and leading), when `zeros: "missing"`. */
  zerosAsMissing: number;
}

/** Default wording of the zeros option, naming it for every face. */
export const ZEROS_OPTION_ALL_FACES = 'leave those cells blank (cells), add --zeros missing (command line), or tick "Treat zeros as missing" (pane)';

/**
 * Turns raw cells into a numeric series: leading and trailing blanks are trimmed (and counted); a
 * blank between the first and last number is a missing observation, `NaN` at its place (so the
 * periods stay equally spaced and the models handle the gap, METHODS §8); text or a boolean
 * between them is refused, naming its row. With `zeros: "missing"` a zero counts as a blank
 * (leading zeros are trimmed; a zero in the last place is refused, because a forecast starts from
 * an observed value). Refused, with the numbers: more than {@link MAX_MISSING_SHARE} of the periods
 * missing. `firstRow` is the row number of cells[0] in the user's range, so messages point at the
 * right cell.
 * @example cleanSeries([null, 3, null, 5, 6, null]).values // [3, NaN, 5, 6]
 */
export function cleanSeries(cells: readonly RawCell[], label = "the series", firstRow = 1, options: CleanOptions = {}): CleanSeries {
  const zerosMissing = options.zeros === "missing";
  if (options.zeros !== undefined && options.zeros !== "keep" && options.zeros !== "missing") {
    throw new EngineError("input", `zeros must be "keep" or "missing"; got ${JSON.stringify(String(options.zeros))}.`);
  }
  const gap = (c: RawCell): boolean => isBlank(c) || (zerosMissing && c === 0);
  let first = -1;
  let last = -1;
  let lastNumber = -1;
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (typeof c === "number") {
      if (!Number.isFinite(c)) throw new EngineError("input", `${cap(label)} has a value that is not a finite number in row ${firstRow + i}. Replace it with a number.`);
      lastNumber = i;
      if (zerosMissing && c === 0) continue;
      if (first < 0) first = i;
      last = i;
    }
  }
  if (first < 0) {
    if (lastNumber >= 0) throw new EngineError("input", `${cap(label)} has only zeros, and zeros are read as missing. Read them as values (zeros "keep"), or give the series' values.`);
    throw new EngineError("input", `${cap(label)} has no numbers. Select a range that holds the series' values.`);
  }
  if (zerosMissing && lastNumber > last) {
    const zeroRows = [];
    for (let i = last + 1; i <= lastNumber; i++) if (cells[i] === 0) zeroRows.push(firstRow + i);
    throw new EngineError("input", `The last value of ${label} is missing: ${zeroRows.length > 1 ? `rows ${zeroRows.join(", ")} are zeros` : `row ${zeroRows[0]} is a zero`}, read as missing, after the last observed value (row ${firstRow + last}). A forecast must start from an observed value: remove the closed period${zeroRows.length > 1 ? "s" : ""} at the end, or read zeros as values.`);
  }
  const values: number[] = [];
  const missingRows: number[] = [];
  let zerosAsMissing = 0;
  for (let i = 0; i < first; i++) if (zerosMissing && cells[i] === 0) zerosAsMissing++;
  for (let i = first; i <= last; i++) {
    const c = cells[i];
    if (gap(c)) {
      if (c === 0) zerosAsMissing++;
      values.push(NaN);
      missingRows.push(firstRow + i);
    } else if (typeof c === "number") values.push(c);
    else {
      throw new EngineError("input", `${cap(label)} has text (${JSON.stringify(String(c)).slice(0, 24)}) in row ${firstRow + i}, inside the series. Replace it with a number, or empty the cell to mark a missing observation.`);
    }
  }
  const missing = missingRows.length;
  if (missing > MAX_MISSING_SHARE * values.length) {
    throw new EngineError("input", `${cap(label)} has ${missing} missing value${missing > 1 ? "s" : ""} among its ${values.length} periods (${Math.round((100 * missing) / values.length)}%, rows ${listRows(missingRows)}); at most ${fmt(100 * MAX_MISSING_SHARE)}% may be missing for a forecast. Fill some of them, or use a shorter stretch with fewer gaps.`);
  }
  let trailing = 0;
  for (let i = cells.length - 1; i > last; i--) trailing++;
  return { values, leadingBlanks: first, trailingBlanks: trailing, missing, missingRows, zerosAsMissing };
}

/**
 * Row numbers for a message: all of them when there are at most six, else the first five and "…".
 * @example listRows([4, 9]) // "4, 9"
 */
export function listRows(rows: readonly (number | string)[]): string {
  return rows.length <= 6 ? rows.join(", ") : `${rows.slice(0, 5).join(", ")}, …`;
}

/**
 * The observed (finite) values of a series that marks missing observations with NaN.
 * @example observedValues([3, NaN, 5]) // [3, 5]
 */
export function observedValues(values: readonly number[]): number[] {
  const out: number[] = [];
  for (const v of values) if (!Number.isNaN(v)) out.push(v);
  return out;
}

/**
 * Number of missing observations (NaN entries) in a series.
 * @example countMissing([3, NaN, 5]) // 1
 */
export function countMissing(values: readonly number[]): number {
  let k = 0;
  for (const v of values) if (Number.isNaN(v)) k++;
  return k;
}
