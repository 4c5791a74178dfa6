import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda, requireProbability, requireSigma } from "../_lib/check";
import { integrate } from "../_lib/quadrature";
import { boxCoxInverse, boxCoxInverseDetailed, InverseStatus, LAMBDA_ZERO } from "../transform/box-cox";
import { normalCdf, normalPdf, normalQuantile } from "./normal";

/** Validated (μ, σ, λ) of a normal forecast on the Box-Cox scale. */
function check(mu: number, sigma: number, lambda: number): void {
  requireFinite(mu, "mu (the transformed-scale mean)");
  requireSigma(sigma, "sd (the transformed-scale standard deviation)");
  requireLambda(lambda);
}

/**
 * Median on the original scale of w ~ N(μ, σ²) on the Box-Cox scale: f(μ), f the inverse
 * transform. A monotone transform maps quantiles to quantiles, so the back-transformed point
 * forecast is the median, not the mean (METHODS §4; e.g. Guerrero 1993).
 * Throws a `domain` EngineError where f(μ) does not exist.
 * @example backtransformMedian(5, 0.1, 0) // 148.4131591025766 (= e⁵)
 */
export function backtransformMedian(mu: number, sigma: number, lambda: number): number {
  check(mu, sigma, lambda);
  return boxCoxInverse(mu, lambda);
}

/** A back-transformed quantile with the domain edge made explicit. */
export interface QuantileValue {
  value: number;
  /** "floor": the normal puts this quantile below −1/λ (λ > 0), so it is 0; "pole": unbounded (λ < 0). */
  status: InverseStatus;
}

/**
 * The p-quantile on the original scale, f(μ + σ·z_p), with the floor (λ > 0) or pole (λ < 0)
 * reported in `status` rather than hidden. Source: quantiles are preserved by monotone maps.
 * @example backtransformQuantileDetailed(5, 0.1, 0, 0.975).value // 180.54795090102658
 */
export function backtransformQuantileDetailed(mu: number, sigma: number, lambda: number, p: number): QuantileValue {
  check(mu, sigma, lambda);
  requireProbability(p);
  return boxCoxInverseDetailed(mu + sigma * normalQuantile(p), lambda);
}

/**
 * The p-quantile on the original scale, f(μ + σ·z_p). Throws a `domain` EngineError when it falls
 * on the floor at 0 (λ > 0) or at the pole (λ < 0), saying which.
 * @example backtransformQuantile(5, 0.1, 0, 0.025) // 121.99787194971402
 */
export function backtransformQuantile(mu: number, sigma: number, lambda: number, p: number): number {
  const q = backtransformQuantileDetailed(mu, sigma, lambda, p);
  if (q.status === "ok") return q.value;
  if (q.status === "floor") {
    throw new EngineError("domain", `The ${fmt(p)} quantile falls below the floor at 0: with λ = ${fmt(lambda)} the normal forecast puts ${pct(normalCdf((-1 / lambda - mu) / sigma))} of its probability where no positive value exists. The normal assumption is strained; try a smaller λ (e.g. 0).`);
  }
  throw new EngineError("domain", `The ${fmt(p)} quantile is unbounded: with λ = ${fmt(lambda)} it lies at or past the pole of the inverse transform (or overflows). Try a larger λ (e.g. 0) or a lower probability.`);
}

/**
 * Bias-adjusted mean on the original scale by the second-order Taylor expansion
 * E f(w) ≈ f(μ) + ½σ²f″(μ): exp(μ)(1 + σ²/2) at λ = 0, else
 * (λμ + 1)^(1/λ)·[1 + σ²(1 − λ)/(2(λμ + 1)²)] (METHODS §4; used in forecasting since at least
 * Guerrero 1993). Throws a `domain` EngineError where λμ + 1 ≤ 0 or on overflow.
 * @example backtransformMeanTaylor(5, 0.5, 0) // 166.96480399039868
 */
export function backtransformMeanTaylor(mu: number, sigma: number, lambda: number): number {
  check(mu, sigma, lambda);
  const median = boxCoxInverse(mu, lambda);
  const s2 = sigma * sigma;
  const adj = Math.abs(lambda) < LAMBDA_ZERO ? 1 + s2 / 2 : 1 + (s2 * (1 - lambda)) / (2 * (lambda * mu + 1) ** 2);
  const m = median * adj;
  if (!Number.isFinite(m)) throw new EngineError("domain", `The mean for mu = ${fmt(mu)}, sd = ${fmt(sigma)}, λ = ${fmt(lambda)} is too large to represent.`);
  return m;
}

/** Exact mean with its diagnostics. */
export interface ExactMean {
  mean: number;
  /** Probability Φ((−1/λ − μ)/σ) that the normal falls below the floor (λ > 0); 0 otherwise. */
  floorProbability: number;
  /** Estimated absolute error of the quadrature (0 for the closed form). */
  error: number;
  method: "closed-form" | "quadrature";
}

/**
 * Exact mean E f(w) for w ~ N(μ, σ²) on the Box-Cox scale.
 * - λ = 0: exp(μ + σ²/2), the lognormal mean (closed form).
 * - λ > 0: ∫ f(μ + σz)φ(z)dz with f floored at 0 below w = −1/λ, by adaptive Gauss–Kronrod
 *   (QUADPACK, Piessens et al. 1983); the floor's probability is reported.
 * - λ < 0: the normal puts mass past the pole at w = −1/λ, where no value exists, so the mean does
 *   not exist; throws an `unavailable` EngineError whose `details.taylor` holds the Taylor value.
 * @example backtransformMeanExact(5, 0.5, 0).mean // 168.17414165184545
 */
export function backtransformMeanExact(mu: number, sigma: number, lambda: number): ExactMean {
  check(mu, sigma, lambda);
  if (Math.abs(lambda) < LAMBDA_ZERO) {
    const mean = Math.exp(mu + (sigma * sigma) / 2);
    if (!Number.isFinite(mean)) throw new EngineError("domain", `The mean exp(mu + sd²/2) for mu = ${fmt(mu)}, sd = ${fmt(sigma)} is too large to represent.`);
    return { mean, floorProbability: 0, error: 0, method: "closed-form" };
  }
  if (lambda < 0) {
    let taylor: number | null = null;
    try {
      taylor = backtransformMeanTaylor(mu, sigma, lambda);
    } catch {
      taylor = null;
    }
    throw new EngineError(
      "unavailable",
      `The exact mean does not exist for λ = ${fmt(lambda)} < 0: a normal forecast on that scale puts probability past the pole at ${fmt(-1 / lambda)}, where the original value is unbounded.` +
        (taylor !== null ? ` Use the Taylor approximation instead (${fmt(taylor)}).` : ""),
      { taylor },
    );
  }
  const base = lambda * mu + 1;
  // The log of the integrand, log1p(λ(μ + σz))/λ − z²/2, is concave in z with its peak where
  // λσz² + (1 + λμ)z − σ = 0; the root is written 2σ/(b + √(b² + 4λσ²)) so it keeps its digits for
  // tiny λ (the textbook (−b + √…)/(2λσ) cancels). log1p likewise keeps (1 + λw)^(1/λ) accurate as
  // λ → 0 (at λ = 1e-13 the plain log lost the mean below the median).
  const zPeak = (2 * sigma) / (base + Math.sqrt(base * base + 4 * lambda * sigma * sigma));
  const zFloor = (-1 / lambda - mu) / sigma;
  const lo = Math.max(zFloor, zPeak - 40);
  const hi = zPeak + 40;
  const { exp, log1p } = Math;
  const f = (z: number): number => {
    const a = lambda * (mu + sigma * z);
    return a > -1 ? exp(log1p(a) / lambda) * normalPdf(z) : 0;
  };
  const left = lo < zPeak ? integrate(f, lo, zPeak, 1e-14) : { value: 0, error: 0 };
  const right = integrate(f, Math.max(lo, zPeak), hi, 1e-14);
  const mean = left.value + right.value;
  if (!Number.isFinite(mean)) throw new EngineError("domain", `The mean for mu = ${fmt(mu)}, sd = ${fmt(sigma)}, λ = ${fmt(lambda)} is too large to represent.`);
  return { mean, floorProbability: zFloor < -38 ? 0 : normalCdf(zFloor), error: left.error + right.error, method: "quadrature" };
}

/**
 * Which mean: `auto` (the exact mean where it exists, λ ≥ 0; the Taylor value with its accuracy
 * where it does not, λ < 0; METHODS §9), `exact`, or `taylor`.
 */
export type MeanMethod = "auto" | "exact" | "taylor";

/** The mean-method keywords the faces accept. */
export const MEAN_METHODS: readonly MeanMethod[] = ["auto", "exact", "taylor"];

/**
 * Bias-adjusted mean by the chosen method: `auto` (default) is the exact mean for λ ≥ 0 and the
 * Taylor value for λ < 0, where no exact mean exists (see {@link backtransformMeanTaylor} and
 * {@link backtransformMeanExact}; METHODS §9).
 * @example backtransformMean(2, 1, 0) // 12.182493960703473 (exact: e^2.5)
 */
export function backtransformMean(mu: number, sigma: number, lambda: number, method: MeanMethod = "auto"): number {
  if (method === "taylor") return backtransformMeanTaylor(mu, sigma, lambda);
  if (method === "exact") return backtransformMeanExact(mu, sigma, lambda).mean;
  if (method === "auto") {
    check(mu, sigma, lambda);
    return lambda > -LAMBDA_ZERO ? backtransformMeanExact(mu, sigma, lambda).mean : backtransformMeanTaylor(mu, sigma, lambda);
  }
  throw new EngineError("input", `Unknown mean method "${String(method)}". Use "auto", "exact" or "taylor".`);
}

function pct(p: number): string {
  return `${Number((100 * p).toPrecision(2))}%`;
}
