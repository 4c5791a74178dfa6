import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda } from "../_lib/check";

/** |λ| below this is treated as exactly 0 (the log). The stable forms below are accurate far past it. */
export const LAMBDA_ZERO = 1e-14;

/**
 * Box-Cox transform w = (y^λ − 1)/λ, or ln y at λ = 0 (Box & Cox 1964, JRSS-B 26:211–252),
 * evaluated as expm1(λ·ln y)/λ so it stays accurate as λ → 0.
 * Domain: y > 0, λ in [−5, 5]. Throws an `input` EngineError otherwise.
 * @example boxCox(100, 0) // 4.605170185988092 (= ln 100)
 */
export function boxCox(y: number, lambda: number): number {
  requireFinite(y, "value");
  requireLambda(lambda);
  if (!(y > 0)) {
    throw new EngineError("input", `Box-Cox needs values > 0; got ${fmt(y)}. Shift the series (shifted Box-Cox) or use Yeo-Johnson.`);
  }
  const w = boxCoxUnchecked(y, lambda);
  if (!Number.isFinite(w)) {
    throw new EngineError("domain", `Box-Cox of ${fmt(y)} with λ = ${fmt(lambda)} is too large to represent; use a smaller λ (e.g. 0, the log).`);
  }
  return w;
}

/** Box-Cox without argument checks, for inner loops whose inputs are already validated. */
export function boxCoxUnchecked(y: number, lambda: number): number {
  const ly = Math.log(y);
  if (Math.abs(lambda) < LAMBDA_ZERO) return ly;
  return Math.expm1(lambda * ly) / lambda;
}

/** How an inverse Box-Cox value came about. */
export type InverseStatus = "ok" | "floor" | "pole";

/**
 * Inverse Box-Cox with the domain edge made explicit instead of a NaN:
 * y = (λw + 1)^(1/λ) = exp(log1p(λw)/λ), or exp(w) at λ = 0. Where λw + 1 ≤ 0:
 * - λ > 0: the value is the floor 0 (`status: "floor"`);
 * - λ < 0: w has reached or passed the pole at −1/λ, y is unbounded (`status: "pole"`, value +∞).
 * Overflow past the largest double also reports `status: "pole"`.
 * Source: Box & Cox (1964); the domain analysis is in ../shared METHODS §1.
 * @example boxCoxInverseDetailed(-3, 0.5) // { value: 0, status: "floor" }
 */
export function boxCoxInverseDetailed(w: number, lambda: number): { value: number; status: InverseStatus } {
  if (Math.abs(lambda) < LAMBDA_ZERO) {
    const v = Math.exp(w);
    return Number.isFinite(v) ? { value: v, status: "ok" } : { value: Infinity, status: "pole" };
  }
  const base = lambda * w;
  if (!(base > -1)) {
    return lambda > 0 ? { value: 0, status: "floor" } : { value: Infinity, status: "pole" };
  }
  const v = Math.exp(Math.log1p(base) / lambda);
  if (!Number.isFinite(v)) return { value: Infinity, status: "pole" };
  return { value: v, status: "ok" };
}

/**
 * Inverse Box-Cox y = (λw + 1)^(1/λ), exp(w) at λ = 0 (Box & Cox 1964).
 * Throws a `domain` EngineError when λw + 1 ≤ 0 (no positive value exists: below the floor for
 * λ > 0, past the pole for λ < 0) or when the result overflows.
 * @example boxCoxInverse(4.605170185988092, 0) // 100
 */
export function boxCoxInverse(w: number, lambda: number): number {
  requireFinite(w, "transformed value");
  requireLambda(lambda);
  const r = boxCoxInverseDetailed(w, lambda);
  if (r.status === "ok") return r.value;
  if (r.status === "floor") {
    throw new EngineError("domain", `Transformed value ${fmt(w)} is at or below -1/λ = ${fmt(-1 / lambda)}: with λ = ${fmt(lambda)} it has no positive original value (the floor at 0).`);
  }
  if (Math.abs(lambda) >= LAMBDA_ZERO && lambda < 0 && !(lambda * w > -1)) {
    throw new EngineError("domain", `Transformed value ${fmt(w)} is at or past the pole -1/λ = ${fmt(-1 / lambda)}: with λ = ${fmt(lambda)} the original value would be infinite.`);
  }
  throw new EngineError("domain", `Transformed value ${fmt(w)} with λ = ${fmt(lambda)} back-transforms to a number too large to represent.`);
}

/**
 * Shifted Box-Cox: the Box-Cox transform of y + c (the two-parameter family of Box & Cox 1964),
 * for series with zeros or negatives. Needs y + c > 0.
 * @example boxCoxShifted(0, 0, 1) // 0 (= ln 1)
 */
export function boxCoxShifted(y: number, lambda: number, shift: number): number {
  requireFinite(shift, "shift");
  requireFinite(y, "value");
  if (!(y + shift > 0)) {
    throw new EngineError("input", `Shifted Box-Cox needs value + shift > 0; ${fmt(y)} + ${fmt(shift)} is not. Use a shift larger than ${fmt(-y)}.`);
  }
  return boxCox(y + shift, lambda);
}

/**
 * Inverse of {@link boxCoxShifted}: boxCoxInverse(w, λ) − c. Throws like {@link boxCoxInverse}.
 * @example boxCoxShiftedInverse(0, 0, 1) // 0
 */
export function boxCoxShiftedInverse(w: number, lambda: number, shift: number): number {
  requireFinite(shift, "shift");
  return boxCoxInverse(w, lambda) - shift;
}
