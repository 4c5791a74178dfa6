import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import { cap } from "../_lib/cells";

/**
 * Checks that a series is usable by Box-Cox: at least `minLength` finite values, all > 0.
 * `label` names the series in messages (e.g. "column B" or a header). Returns the same array.
 * Throws an `input` EngineError that says what to fix.
 * @example requirePositiveSeries([1, 2, 3], 2) // [1, 2, 3]
 */
export function requirePositiveSeries(values: readonly number[], minLength: number, label = "the series", purpose = "this"): readonly number[] {
  if (values.length === 0) throw new EngineError("input", `${cap(label)} has no numbers. Select a range with at least ${minLength} numeric values.`);
  let zeros = 0;
  let negatives = 0;
  let firstBad = -1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v)) {
      throw new EngineError("input", `${cap(label)} has a value that is not a finite number at position ${i + 1}. Remove it or replace it with a number.`);
    }
    if (v === 0) zeros++;
    else if (v < 0) negatives++;
    if (v <= 0 && firstBad < 0) firstBad = i;
  }
  if (zeros + negatives > 0) {
    const parts: string[] = [];
    if (zeros) parts.push(`${zeros} zero${zeros > 1 ? "s" : ""}`);
    if (negatives) parts.push(`${negatives} negative value${negatives > 1 ? "s" : ""}`);
    throw new EngineError("input", `Box-Cox needs values > 0; ${label} has ${parts.join(" and ")} (first at position ${firstBad + 1}). Use shift "auto" (command line: --shift auto) or transform "yeo-johnson" (command line: --transform yeo-johnson).`);
  }
  if (values.length < minLength) {
    throw new EngineError("input", `${cap(label)} is too short for ${purpose}: it has ${values.length} value${values.length === 1 ? "" : "s"}, at least ${minLength} are needed.`);
  }
  return values;
}

/**
 * True when every value equals the first (nothing to estimate from).
 * @example isConstant([2, 2, 2]) // true
 */
export function isConstant(values: readonly number[]): boolean {
  for (let i = 1; i < values.length; i++) if (values[i] !== values[0]) return false;
  return true;
}


export { fmt };
