import erfc from "@stdlib/math-base-special-erfc";
import { EngineError } from "../errors";
import { normalQuantile } from "./normal";

/**
 * Upper tail P(X ≥ x) of a chi-square variable with 1 or 2 degrees of freedom, the two cases the
 * likelihood-ratio tests need: df = 1 → erfc(√(x/2)); df = 2 → exp(−x/2) (closed forms, e.g.
 * Abramowitz & Stegun 1964, 26.4.4–26.4.5). x ≤ 0 gives 1.
 * @example chiSquareSf(3.841458820694124, 1) // 0.05
 */
export function chiSquareSf(x: number, df: 1 | 2): number {
  if (Number.isNaN(x)) throw new EngineError("domain", "chi-square statistic is not a number.");
  if (x <= 0) return 1;
  if (df === 1) return erfc(Math.sqrt(0.5 * x));
  return Math.exp(-0.5 * x);
}

/**
 * Chi-square quantile for df 1 or 2 at probability q in (0, 1): df = 1 → z²_{(1+q)/2};
 * df = 2 → −2·ln(1 − q).
 * @example chiSquareQuantile(0.95, 1) // 3.841458820694124
 */
export function chiSquareQuantile(q: number, df: 1 | 2): number {
  if (!(q > 0 && q < 1)) throw new EngineError("input", `A probability must be strictly between 0 and 1; got ${q}.`);
  if (df === 1) {
    const z = normalQuantile(0.5 + 0.5 * q);
    return z * z;
  }
  return -2 * Math.log1p(-q);
}
