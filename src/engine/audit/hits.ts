import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import type { RawCell } from "../series/screen";
import { isBlank } from "../_lib/cells";

/** Hits of a set of intervals against what happened. */
export interface HitSequence {
  /** 1 when the actual fell outside its interval (a miss), 0 inside; in row order, blanks skipped. */
  hits: number[];
  /** Row (0-based) of each hit in the inputs. */
  rows: number[];
  /** Rows skipped because the actual or an interval end was blank. */
  skipped: number;
  actual: number[];
  lower: number[];
  upper: number[];
}


/**
 * The hit sequence I_t = 1{y_t < l_t or y_t > u_t} (ends inclusive: an actual equal to an end is
 * inside). Rows where any of the three is blank are skipped and counted; text, unequal lengths and
 * a low end above its high end are refused, naming the row. `firstRow` numbers the rows in messages.
 * @example hitSequence([100, 130], [90, 95], [110, 120]).hits // [0, 1]
 */
export function hitSequence(actual: readonly RawCell[], lower: readonly RawCell[], upper: readonly RawCell[], firstRow = 1): HitSequence {
  if (actual.length !== lower.length || actual.length !== upper.length) {
    throw new EngineError("input", `actual, lower and upper must have the same number of rows; they have ${actual.length}, ${lower.length} and ${upper.length}.`);
  }
  const out: HitSequence = { hits: [], rows: [], skipped: 0, actual: [], lower: [], upper: [] };
  for (let i = 0; i < actual.length; i++) {
    const y = actual[i], l = lower[i], u = upper[i];
    if (isBlank(y) || isBlank(l) || isBlank(u)) {
      out.skipped++;
      continue;
    }
    for (const [v, name] of [[y, "actual"], [l, "lower"], [u, "upper"]] as const) {
      if (typeof v !== "number" || !Number.isFinite(v)) {
        throw new EngineError("input", `Row ${firstRow + i}: the ${name} value is not a number (${JSON.stringify(v).slice(0, 20)}). Fix it or leave the row blank.`);
      }
    }
    const yy = y as number, ll = l as number, uu = u as number;
    if (ll > uu) throw new EngineError("input", `Row ${firstRow + i}: the lower end (${fmt(ll)}) is above the upper end (${fmt(uu)}). Check that the columns are in the order actual, lower, upper.`);
    out.hits.push(yy < ll || yy > uu ? 1 : 0);
    out.rows.push(i);
    out.actual.push(yy);
    out.lower.push(ll);
    out.upper.push(uu);
  }
  if (out.hits.length < 2) {
    throw new EngineError("input", `At least 2 rows with an actual and both interval ends are needed to check coverage; there ${out.hits.length === 1 ? "is 1" : `are ${out.hits.length}`}${out.skipped ? ` (${out.skipped} skipped for blanks)` : ""}.`);
  }
  return out;
}
