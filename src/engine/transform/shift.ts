import { EngineError } from "../errors";
import { fmt } from "../_lib/check";

/**
 * The `auto` shift for a shifted Box-Cox: 0 when every value is > 0; otherwise
 * c = −min(y) + ½·d, where d is the smallest distance from the minimum to a larger value, so the
 * lowest value lands at ½d above zero and the shift never exceeds |min| plus half of the smallest
 * step. With zeros and positives this is half the smallest positive value — the half-of-the-
 * smallest substitution used before taking logs of data with zeros (Hornung & Reed 1990, Applied
 * Occupational and Environmental Hygiene 5:46–51; reference from memory). Missing values (NaN) are
 * ignored. A series whose values are all equal gets c = −min + 1.
 * @example autoShift([0, 4, 10, 6]) // 2
 */
export function autoShift(y: readonly number[]): number {
  let min = Infinity;
  for (const v of y) if (Number.isFinite(v) && v < min) min = v;
  if (!Number.isFinite(min)) throw new EngineError("input", "The series has no numbers to choose a shift from.");
  if (min > 0) return 0;
  let step = Infinity;
  for (const v of y) if (Number.isFinite(v) && v > min && v - min < step) step = v - min;
  return -min + (Number.isFinite(step) ? step / 2 : 1);
}

/**
 * Reads a shift: a number (added before Box-Cox), "auto" (see {@link autoShift}), or blank (0).
 * @example parseShift("auto") // "auto"
 */
export function parseShift(shift: unknown): number | "auto" {
  if (shift === undefined || shift === null || shift === "") return 0;
  if (typeof shift === "number") {
    if (!Number.isFinite(shift)) throw new EngineError("input", `shift must be a finite number or "auto"; got ${fmt(shift)}.`);
    return shift;
  }
  const k = String(shift).trim().toLowerCase();
  if (k === "auto") return "auto";
  const v = Number(k);
  if (k !== "" && Number.isFinite(v)) return v;
  throw new EngineError("input", `shift must be a number (added to every value before Box-Cox) or "auto"; got "${String(shift)}".`);
}
