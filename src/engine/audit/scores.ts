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
 * CRPS (like the mean) does not exist: an `unavailable` EngineError says so, as it does when the
 * CRPS is too large for a double. For λ = 0 it equals the log-normal closed form of Baran & Lerch
 * (2015, Q. J. R. Meteorol. Soc. 141:2289–2299).
 * @example crpsBacktransformed(5, 0.1, 0, 150) // ≈ 4.2
 */
export function crpsBacktransformed(mu: number, sigma: number, lambda: number, y: number): number {
  requireFinite(mu, "mu");
  requireSigma(sigma);
  requireLambda(lambda);
  requireFinite(y, "actual");
  if (lambda < -1e-14) throw new EngineError("unavailable", `The CRPS does not exist for λ = ${lambda} < 0: the forecast puts probability past the pole, where values are unbounded.`);
  const logScale = Math.abs(lambda) < 1e-14;
  const f = (z: number): number => {
    const w = mu + sigma * z;
    const q = boxCoxInverseDetailed(w, lambda).value;
    if (!Number.isFinite(q)) {
      // Q(p) overflows a double: the term 2·Φ(−z)·(Q − y)·φ(z) ≈ 2·Φ(−z)·Q·φ(z), in logs. Past
      // z ≈ 38 Φ(−z) underflows too: there Φ(−z) = φ(z)/z·(1 − 1/z² + O(z⁻⁴)) (Mills ratio). A term
      // that still overflows makes the CRPS too large to represent (Infinity, refused below).
      const logQ = logScale ? w : Math.log1p(lambda * w) / lambda;
      const tail = normalCdf(-z);
      const logPdf = -0.5 * z * z - 0.5 * Math.log(2 * Math.PI);
      if (tail > 0) return 2 * Math.exp(Math.log(tail) + logQ + logPdf);
      return 2 * Math.exp(logQ + 2 * logPdf - Math.log(z) + Math.log1p(-1 / (z * z)));
    }
    const d = y - q;
    // pinball loss at p = Φ(z): p·d where y ≥ Q, (1 − p)·(Q − y) where y < Q, with 1 − p = Φ(−z)
    // computed as such (1 − Φ(z) loses every digit in the upper tail, where a wide fan's CRPS lives).
    const loss = d >= 0 ? normalCdf(z) * d : normalCdf(-z) * -d;
    return loss === 0 ? 0 : 2 * loss * normalPdf(z);
  };
  // the integrand is smooth except where Q(p) = y; split there
  const zy = y > 0 ? (lambda === 0 || Math.abs(lambda) < 1e-14 ? (Math.log(y) - mu) / sigma : ((Math.pow(y, lambda) - 1) / lambda - mu) / sigma) : -40;
  const a = -40, b = 40;
  const mid = Math.min(Math.max(zy, a), b);
  const left = mid > a ? integrate(f, a, mid, 1e-12).value : 0;
  const right = mid < b ? integrate(f, mid, b, 1e-12).value : 0;
  const crps = left + right;
  if (!Number.isFinite(crps)) throw new EngineError("unavailable", `The CRPS is too large to represent for mu = ${mu}, sd = ${sigma} on the Box-Cox scale λ = ${lambda}: the forecast's upper tail is unbounded in double precision.`);
  return crps;
}
