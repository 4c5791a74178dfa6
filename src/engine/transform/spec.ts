// One descriptor for the transform a forecast is made on: its kind, λ and shift, with the forward
// map, the inverse (domain edges made explicit), the log-Jacobian and the inverse's second
// derivative (for the Taylor mean). The forecaster, the fan and the totals use only this.
import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda } from "../_lib/check";
import { normalCdf, normalSf } from "../distribution/normal";
import { InverseStatus, LAMBDA_ZERO } from "./box-cox";

/** Which transform: Box-Cox (optionally shifted), Yeo-Johnson, or none. */
export type TransformKind = "box-cox" | "yeo-johnson" | "none";

/** The transform keywords the faces accept (cells, CLI, pane). */
export const TRANSFORMS: readonly TransformKind[] = ["box-cox", "yeo-johnson", "none"];

/**
 * A transform: `box-cox` applies to y + shift (Box & Cox 1964, the two-parameter form when the
 * shift is not 0); `yeo-johnson` (Yeo & Johnson 2000) accepts any real y (shift 0); `none` is the
 * identity (λ null).
 */
export interface TransformSpec {
  readonly kind: TransformKind;
  /** λ; null for `none`. */
  readonly lambda: number | null;
  /** Added to y before a Box-Cox transform; 0 otherwise. */
  readonly shift: number;
}

/** An inverse value with its domain edge: "floor" (the lowest value, y = −shift), "pole" (+∞), "low-pole" (−∞, Yeo-Johnson with λ > 2). */
export interface SpecInverse { value: number; status: InverseStatus | "low-pole" }

/**
 * Builds a validated transform descriptor.
 * @example makeTransform("box-cox", 0, 1) // { kind: "box-cox", lambda: 0, shift: 1 }
 */
export function makeTransform(kind: TransformKind, lambda: number | null, shift = 0): TransformSpec {
  if (kind === "none") return Object.freeze({ kind, lambda: null, shift: 0 });
  if (lambda === null) throw new EngineError("input", `The ${kind} transform needs a λ.`);
  requireLambda(lambda);
  requireFinite(shift, "shift");
  if (kind === "yeo-johnson" && shift !== 0) throw new EngineError("input", "shift applies to Box-Cox only; Yeo-Johnson already accepts zeros and negatives. Leave shift empty or use transform \"box-cox\".");
  return Object.freeze({ kind, lambda, shift });
}

/**
 * The forward transform w = g(y) without argument checks (inputs validated by the caller); NaN
 * outside the domain (y + shift ≤ 0 for Box-Cox).
 * @example transformForward(makeTransform("yeo-johnson", 1), -3) // -3
 */
export function transformForward(t: TransformSpec, y: number): number {
  if (t.kind === "none") return y;
  const l = t.lambda as number;
  if (t.kind === "box-cox") {
    const x = y + t.shift;
    if (!(x > 0)) return NaN;
    const ly = Math.log(x);
    return Math.abs(l) < LAMBDA_ZERO ? ly : Math.expm1(l * ly) / l;
  }
  if (y >= 0) {
    const ly = Math.log1p(y);
    return Math.abs(l) < LAMBDA_ZERO ? ly : Math.expm1(l * ly) / l;
  }
  const k = 2 - l;
  const ln = Math.log1p(-y);
  return Math.abs(k) < LAMBDA_ZERO ? -ln : -Math.expm1(k * ln) / k;
}

/**
 * ln|g′(y)|, the log-Jacobian that takes a density of w = g(y) to a density of y (Box & Cox 1964;
 * METHODS §7): (λ − 1)·ln(y + c) for Box-Cox, (λ − 1)·sign(y)·ln(|y| + 1) for Yeo-Johnson, 0 for none.
 * @example logJacobian(makeTransform("box-cox", 0), Math.E) // -1
 */
export function logJacobian(t: TransformSpec, y: number): number {
  if (t.kind === "none") return 0;
  const l = t.lambda as number;
  if (t.kind === "box-cox") return (l - 1) * Math.log(y + t.shift);
  return (l - 1) * Math.sign(y) * Math.log1p(Math.abs(y));
}

/**
 * The inverse y = g⁻¹(w) with the domain edge made explicit instead of a NaN. Box-Cox: the
 * floor y = −shift below w = −1/λ (λ > 0), the pole (+∞) at and past −1/λ (λ < 0); Yeo-Johnson:
 * the pole past −1/λ on the positive side (λ < 0), a pole towards −∞ past 1/(λ − 2) on the negative
 * side (λ > 2). Overflow reports the pole.
 * @example transformInverse(makeTransform("box-cox", 0, 1), 0) // { value: 0, status: "ok" }
 */
export function transformInverse(t: TransformSpec, w: number): SpecInverse {
  if (t.kind === "none") return Number.isFinite(w) ? { value: w, status: "ok" } : { value: w > 0 ? Infinity : -Infinity, status: w > 0 ? "pole" : "low-pole" };
  const l = t.lambda as number;
  if (t.kind === "box-cox") {
    let v: number;
    if (Math.abs(l) < LAMBDA_ZERO) v = Math.exp(w);
    else {
      const base = l * w;
      if (!(base > -1)) return l > 0 ? { value: -t.shift, status: "floor" } : { value: Infinity, status: "pole" };
      v = Math.exp(Math.log1p(base) / l);
    }
    if (!Number.isFinite(v)) return { value: Infinity, status: "pole" };
    return { value: v - t.shift, status: "ok" };
  }
  let y: number;
  if (w >= 0) {
    if (Math.abs(l) < LAMBDA_ZERO) y = Math.expm1(w);
    else {
      if (!(l * w > -1)) return { value: Infinity, status: "pole" };
      y = Math.expm1(Math.log1p(l * w) / l);
    }
  } else {
    const k = 2 - l;
    if (Math.abs(k) < LAMBDA_ZERO) y = -Math.expm1(-w);
    else {
      if (!(-k * w > -1)) return { value: -Infinity, status: "low-pole" };
      y = -Math.expm1(Math.log1p(-k * w) / k);
    }
  }
  if (!Number.isFinite(y)) return y > 0 ? { value: Infinity, status: "pole" } : { value: -Infinity, status: "low-pole" };
  return { value: y, status: "ok" };
}

/**
 * The second derivative of the inverse, f″(w), for the Taylor mean f(μ) + ½σ²f″(μ). Box-Cox:
 * (1 − λ)(1 + λw)^(1/λ − 2); Yeo-Johnson: the same with λ on w ≥ 0 and (1 − λ)(1 − (2 − λ)w)^(1/(2−λ) − 2)
 * on w < 0 (derived from the inverse in Yeo & Johnson 2000). NaN outside the domain.
 * @example inverseSecondDerivative(makeTransform("box-cox", 0), 0) // 1
 */
export function inverseSecondDerivative(t: TransformSpec, w: number): number {
  if (t.kind === "none") return 0;
  const l = t.lambda as number;
  if (t.kind === "box-cox" || w >= 0) {
    if (Math.abs(l) < LAMBDA_ZERO) return Math.exp(w);
    const base = 1 + l * w;
    if (!(base > 0)) return NaN;
    return (1 - l) * Math.exp((1 / l - 2) * Math.log(base));
  }
  const k = 2 - l;
  if (Math.abs(k) < LAMBDA_ZERO) return -Math.exp(-w);
  const base = 1 - k * w;
  if (!(base > 0)) return NaN;
  return (1 - l) * Math.exp((1 / k - 2) * Math.log(base));
}

/**
 * Where the exact mean E g⁻¹(w), w normal, exists: Box-Cox with λ ≥ 0 (Box-Cox with λ < 0 has a pole
 * the normal always reaches; METHODS §9), Yeo-Johnson with 0 ≤ λ ≤ 2 (a pole on the positive side
 * for λ < 0, on the negative side for λ > 2), and no transform.
 * @example exactMeanExists(makeTransform("box-cox", -0.5)) // false
 */
export function exactMeanExists(t: TransformSpec): boolean {
  if (t.kind === "none") return true;
  const l = t.lambda as number;
  if (t.kind === "box-cox") return l > -LAMBDA_ZERO;
  return l > -LAMBDA_ZERO && l < 2 + LAMBDA_ZERO;
}

/**
 * The probability a normal w ~ N(μ, σ²) puts past the pole(s) of the inverse (0 when there is none).
 * @example poleProbability(makeTransform("box-cox", -1), 0.5, 0.25) // 0.02275… (= P(z > 2))
 */
export function poleProbability(t: TransformSpec, mu: number, sigma: number): number {
  if (t.kind === "none" || sigma === 0) return 0;
  const l = t.lambda as number;
  let p = 0;
  if (l < -LAMBDA_ZERO) p += normalSf((-1 / l - mu) / sigma);
  // Yeo-Johnson λ > 2: the inverse's negative branch 1 − (1 + (λ − 2)w)^(1/(2 − λ)) runs to −∞ as w falls
  // to −1/(λ − 2), so the share past that pole is P(w < −1/(λ − 2)).
  if (t.kind === "yeo-johnson" && l > 2 + LAMBDA_ZERO) p += normalCdf((-1 / (l - 2) - mu) / sigma);
  return p;
}

/**
 * A short name for messages: "Box-Cox λ = 0.5", "shifted Box-Cox λ = 0, shift 1", "Yeo-Johnson λ = 1", "no transform".
 * @example describeTransform(makeTransform("box-cox", 0)) // "Box-Cox λ = 0"
 */
export function describeTransform(t: TransformSpec): string {
  if (t.kind === "none") return "no transform";
  if (t.kind === "yeo-johnson") return `Yeo-Johnson λ = ${fmt(t.lambda as number)}`;
  return t.shift !== 0 ? `shifted Box-Cox λ = ${fmt(t.lambda as number)}, shift ${fmt(t.shift)}` : `Box-Cox λ = ${fmt(t.lambda as number)}`;
}
