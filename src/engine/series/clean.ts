import { EngineError } from "../errors";
import type { RawCell } from "./screen";
import { isBlank, cap } from "../_lib/cells";

/** A series ready for the numeric engine, with what was trimmed. */
export interface CleanSeries {
  values: number[];
  /** Blank cells skipped before the first number. */
  leadingBlanks: number;
  /** Blank cells skipped after the last number. */
  trailingBlanks: number;
}


/**
 * Turns raw cells into a gap-free numeric series: leading and trailing blanks are trimmed (and
 * counted); a blank, text or boolean between the first and last number is refused, naming its
 * row, because a forecast needs equally spaced periods (common practice). `firstRow` is the
 * row number of cells[0] in the user's range, so messages point at the right cell.
 * @example cleanSeries([null, 3, 4, 5, null]).values // [3, 4, 5]
 */
export function cleanSeries(cells: readonly RawCell[], label = "the series", firstRow = 1): CleanSeries {
  let first = -1;
  let last = -1;
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (typeof c === "number") {
      if (!Number.isFinite(c)) throw new EngineError("input", `${cap(label)} has a value that is not a finite number in row ${firstRow + i}. Replace it with a number.`);
      if (first < 0) first = i;
      last = i;
    } else if (!isBlank(c)) {
      if (first < 0 && last < 0) continue; // text before the numbers is treated like a leading blank
    }
  }
  if (first < 0) throw new EngineError("input", `${cap(label)} has no numbers. Select a range that holds the series' values.`);
  const values: number[] = [];
  for (let i = first; i <= last; i++) {
    const c = cells[i];
    if (typeof c === "number") values.push(c);
    else if (isBlank(c)) {
      throw new EngineError("input", `${cap(label)} has a blank in row ${firstRow + i}, inside the series. Fill it (or remove the period) so the periods stay equally spaced.`);
    } else {
      throw new EngineError("input", `${cap(label)} has text (${JSON.stringify(String(c)).slice(0, 24)}) in row ${firstRow + i}, inside the series. Replace it with a number.`);
    }
  }
  let trailing = 0;
  for (let i = cells.length - 1; i > last; i--) trailing++;
  return { values, leadingBlanks: first, trailingBlanks: trailing };
}

