import erfcinv from "@stdlib/math-base-special-erfcinv";
import erfc from "@stdlib/math-base-special-erfc";
import { EngineError } from "../errors";

const SQRT1_2 = Math.SQRT1_2;
const INV_SQRT_2PI = 0.3989422804014327;

/**
 * Standard normal quantile z_p = Φ⁻¹(p), for 0 < p < 1.
 * Method: z_p = −√2·erfcinv(2p) with @stdlib/math-base-special-erfcinv (Boost-derived rational
 * approximations, ~1e-16 relative). Using erfcinv of 2p, never of 1 − p, keeps full relative
 * accuracy in the lower tail (p = 1e-10 and smaller). Throws for p outside (0, 1).
 * @example normalQuantile(0.975) // 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) {
    throw new EngineError("input", `A probability must be strictly between 0 and 1; got ${p}.`);
  }
  if (p === 0.5) return 0;
  return -Math.SQRT2 * erfcinv(2 * p);
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
