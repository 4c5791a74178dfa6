// Scores of interval and quantile forecasts: Winkler's interval score, the pinball loss and the
// CRPS (for a normal forecast in closed form; for a back-transformed one by integrating pinball
// losses over p).
import { EngineError } from "../errors";
import { requireFinite, requireLambda, requireProbability, requireSigma } from "../_lib/check";
import { integrate } from "../_lib/quadrature";
import { normalCdf, normalPdf } from "../distribution/normal";
import { boxCoxInverseDetailed } from "../transform/box-cox";

/**
 * Interval (Winkler) score of a central (1 − α) interval [l, u] for the outcome y:
 * (u − l) + (2/α)(l − y)·1{y < l} + (2/α)(y − u)·1{y > u} (Winkler 1972, JASA 67:187–191;
 * Gneiting & Raftery 2007, JASA 102:359–378, eq. 43). Lower is better.
 * @example intervalScore(90, 110, 85, 0.05) // 220
 */
export function intervalScore(lower: number, upper: number, y: number, alpha: number): number {
  requireFinite(lower, "lower");
  requireFinite(upper, "upper");
  requireFinite(y, "actual");
  if (!(alpha > 0 && alpha < 1)) throw new EngineError("input", `α must be strictly between 0 and 1; got ${alpha}.`);
  if (lower > upper) throw new EngineError("input", `The lower end (${lower}) is above the upper end (${upper}).`);
  let s = upper - lower;
  if (y < lower) s += (2 / alpha) * (lower - y);
  if (y > upper) s += (2 / alpha) * (y - upper);
  return s;
}

/**
 * Pinball (quantile) loss of the p-quantile forecast q for outcome y: max(p(y − q), (p − 1)(y − q))
 * (Koenker & Bassett 1978, Econometrica 46:33–50; Gneiting & Raftery 2007).
 * @example pinball(110, 120, 0.975) // 9.75
 */
export function pinball(q: number, y: number, p: number): number {
  requireFinite(q, "quantile");
  requireFinite(y, "actual");
  requireProbability(p);
  const d = y - q;
  return d >= 0 ? p * d : (p - 1) * d;
}

/**
 * CRPS of a normal forecast N(μ, σ²) for y: σ[z(2Φ(z) − 1) + 2φ(z) − 1/√π], z = (y − μ)/σ
 * (Gneiting, Raftery, Westveld & Goldman 2005, Monthly Weather Review 133:1098–1118).
 * @example crpsNormal(0, 1, 0) // 0.23369497725510913
 */
export function crpsNormal(mu: number, sigma: number, y: number): number {
  requireFinite(mu, "mu");
  requireSigma(sigma);
  requireFinite(y, "actual");
  const z = (y - mu) / sigma;
  return sigma * (z * (2 * normalCdf(z) - 1) + 2 * normalPdf(z) - 1 / Math.sqrt(Math.PI));
}

/**
 * CRPS of a back-transformed forecast (w ~ N(μ, σ²) on the Box-Cox scale λ) for an outcome y on the
 * original scale, as 2∫₀¹ pinball_p(Q(p), y) dp with Q(p) = f(μ + σ z_p), integrated in z
 * (p = Φ(z)) by adaptive Gauss–Kronrod (Gneiting & Raftery 2007, eq. 21 with the quantile
 * representation of Laio & Tamea 2007). For λ < 0 the normal puts mass past the pole, so the
 * CRPS (like the mean) does not exist: an `unavailable` EngineError says so.
 * @example crpsBacktransformed(5, 0.1, 0, 150) // ≈ 4.2
 */
export function crpsBacktransformed(mu: number, sigma: number, lambda: number, y: number): number {
  requireFinite(mu, "mu");
  requireSigma(sigma);
  requireLambda(lambda);
  requireFinite(y, "actual");
  if (lambda < -1e-14) throw new EngineError("unavailable", `The CRPS does not exist for λ = ${lambda} < 0: the forecast puts probability past the pole, where values are unbounded.`);
  const f = (z: number): number => {
    const p = normalCdf(z);
    if (p <= 0 || p >= 1) return 0;
    const q = boxCoxInverseDetailed(mu + sigma * z, lambda).value;
    const d = y - q;
    return 2 * (d >= 0 ? p * d : (p - 1) * d) * normalPdf(z);
  };
  // the integrand is smooth except where Q(p) = y; split there
  const zy = y > 0 ? (lambda === 0 || Math.abs(lambda) < 1e-14 ? (Math.log(y) - mu) / sigma : ((Math.pow(y, lambda) - 1) / lambda - mu) / sigma) : -40;
  const a = -40, b = 40;
  const mid = Math.min(Math.max(zy, a), b);
  const left = mid > a ? integrate(f, a, mid, 1e-12).value : 0;
  const right = mid < b ? integrate(f, mid, b, 1e-12).value : 0;
  return left + right;
}
