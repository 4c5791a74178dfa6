import stdQuantile from "@stdlib/stats-base-dists-normal-quantile";
import erfc from "@stdlib/math-base-special-erfc";
import { EngineError } from "../errors";

const SQRT1_2 = Math.SQRT1_2;
const INV_SQRT_2PI = 0.3989422804014327;

/**
 * Standard normal quantile z_p = Φ⁻¹(p), for 0 < p < 1.
 * Method: @stdlib/stats-base-dists-normal-quantile (inverse error function, Boost-derived
 * rational approximations; ~1e-16 relative). Throws for p outside (0, 1).
 * @example normalQuantile(0.975) // 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) {
    throw new EngineError("input", `A probability must be strictly between 0 and 1; got ${p}.`);
  }
  return stdQuantile(p, 0, 1);
}

/**
 * Standard normal CDF Φ(z) = ½·erfc(−z/√2); accurate in relative terms in the lower tail.
 * Method: @stdlib/math-base-special-erfc (W. J. Cody's rational approximations, as in FreeBSD msun).
 * @example normalCdf(1.959963984540054) // 0.975
 */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z * SQRT1_2);
}

/**
 * Standard normal upper tail 1 − Φ(z) = ½·erfc(z/√2), accurate for large z.
 * @example normalSf(1.959963984540054) // 0.025
 */
export function normalSf(z: number): number {
  return 0.5 * erfc(z * SQRT1_2);
}

/**
 * Standard normal density φ(z).
 * @example normalPdf(0) // 0.3989422804014327
 */
export function normalPdf(z: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}
