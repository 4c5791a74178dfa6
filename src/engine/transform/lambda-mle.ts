import { EngineError } from "../errors";
import { findRoot } from "../_lib/brent";
import { minimizeScanned } from "../_lib/scan";
import { requireFinite } from "../_lib/check";
import { chiSquareQuantile } from "../distribution/chisquare";
import { isConstant, requirePositiveSeries } from "../series/positive";
import { LAMBDA_ZERO } from "./box-cox";
import { boundHit, checkLambdaBounds } from "./bounds";

/** Smallest series the likelihood method accepts. */
export const MLE_MIN_LENGTH = 4;

/**
 * A prepared profile log-likelihood for one positive series (logs computed once).
 * ℓ(λ) = (λ − 1)·Σ ln y − (n/2)·ln σ̂²(λ), σ̂² the variance (divisor n) of the Box-Cox values.
 * Source: Box & Cox (1964), JRSS-B 26:211–252, eq. for the maximised log-likelihood; the same
 * constant-free form as scipy.stats.boxcox_llf.
 */
export function profileLogLik(values: readonly number[]): (lambda: number) => number {
  const n = values.length;
  const logs = new Float64Array(n);
  let sumLog = 0;
  for (let i = 0; i < n; i++) {
    logs[i] = Math.log(values[i]);
    sumLog += logs[i];
  }
  const work = new Float64Array(n);
  return (lambda: number): number => {
    let logVar: number;
    if (Math.abs(lambda) < LAMBDA_ZERO) {
      logVar = Math.log(variance(logs));
    } else {
      let maxArg = -Infinity;
      for (let i = 0; i < n; i++) if (lambda * logs[i] > maxArg) maxArg = lambda * logs[i];
      if (maxArg < 300 && maxArg > -30) {
        for (let i = 0; i < n; i++) work[i] = Math.expm1(lambda * logs[i]) / lambda;
        logVar = Math.log(variance(work));
      } else {
        // y^λ would overflow (M > 300), or every y^λ is so small that w = (y^λ − 1)/λ rounds to
        // the same number (M < −30): factor out exp(M), M = max λ·ln y. The −1 is a shift, so
        // var(w) = e^{2M}·var(e^{λ ln y − M})/λ².
        for (let i = 0; i < n; i++) work[i] = Math.exp(lambda * logs[i] - maxArg);
        logVar = 2 * maxArg + Math.log(variance(work)) - 2 * Math.log(Math.abs(lambda));
      }
    }
    return (lambda - 1) * sumLog - 0.5 * n * logVar;
  };
}

/**
 * Box-Cox profile log-likelihood ℓ(λ) of a positive series (Box & Cox 1964), without constants,
 * matching scipy.stats.boxcox_llf.
 * @example boxCoxLogLik([1, 2, 3, 4, 5], 1) // -2.0117973905426254 (= −(5/2)·ln 2 + 0·Σ ln y ... see test)
 */
export function boxCoxLogLik(values: readonly number[], lambda: number): number {
  requirePositiveSeries(values, 2, "the series", "a Box-Cox likelihood");
  requireFinite(lambda, "lambda");
  if (isConstant(values)) throw new EngineError("input", "The series is constant, so its Box-Cox likelihood is unbounded. λ cannot be estimated from it.");
  return profileLogLik(values)(lambda);
}

function variance(x: ArrayLike<number>): number {
  const n = x.length;
  let m = 0;
  for (let i = 0; i < n; i++) m += x[i];
  m /= n;
  let s = 0;
  let c = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i] - m;
    s += d * d;
    c += d;
  }
  return (s - (c * c) / n) / n;
}

/** Options for {@link lambdaMle}. */
export interface LambdaMleOptions {
  /** Search bounds for λ; default [−1, 2]. */
  lower?: number;
  upper?: number;
  /** Confidence level of the likelihood-ratio interval, as a fraction; default 0.95. */
  level?: number;
  /** A name for the series in messages. */
  label?: string;
}

/** Result of {@link lambdaMle}. */
export interface LambdaMleResult {
  lambda: number;
  loglik: number;
  /** Likelihood-ratio interval; an end is null when ℓ does not drop far enough within 10 of λ̂. */
  interval: [number | null, number | null];
  level: number;
  bounds: [number, number];
  onBound: "lower" | "upper" | null;
  n: number;
}

/**
 * λ by maximum likelihood (Box & Cox 1964), maximising the profile log-likelihood over
 * [lower, upper] (default [−1, 2]) by a grid scan then Brent's method, with the likelihood-ratio
 * interval {λ : ℓ(λ) ≥ ℓ(λ̂) − ½χ²₁(level)} found by Brent root-finding (not truncated to the
 * bounds). Needs ≥ 4 positive values that are not all equal.
 * @example lambdaMle(airPassengers).lambda // 0.148023 (scipy.stats.boxcox_normmax: 0.14802263)
 */
export function lambdaMle(values: readonly number[], options: LambdaMleOptions = {}): LambdaMleResult {
  const label = options.label ?? "the series";
  requirePositiveSeries(values, MLE_MIN_LENGTH, label, "estimating λ by maximum likelihood");
  if (isConstant(values)) throw new EngineError("input", `${label} is constant, so there is no λ to estimate. Use λ = 1 (no transform).`);
  const bounds = checkLambdaBounds(options.lower, options.upper);
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new EngineError("input", `The interval level must be between 0 and 1; got ${level}.`);
  const llf = profileLogLik(values);
  const best = minimizeScanned((l) => -llf(l), bounds[0], bounds[1], 31, 1e-11);
  const lambda = best.x;
  const loglik = -best.fx;
  const cut = loglik - 0.5 * chiSquareQuantile(level, 1);
  const g = (l: number): number => llf(l) - cut;
  return {
    lambda,
    loglik,
    interval: [intervalEnd(g, lambda, -1), intervalEnd(g, lambda, +1)],
    level,
    bounds,
    onBound: boundHit(lambda, bounds),
    n: values.length,
  };
}

/** Walks outward from λ̂ until g < 0, then finds the crossing. Null when none within 10. */
function intervalEnd(g: (l: number) => number, center: number, dir: -1 | 1): number | null {
  let inner = center;
  let step = 0.25;
  for (let travelled = 0; travelled < 10; ) {
    const outer = center + dir * Math.min(10, travelled + step);
    const v = g(outer);
    if (!Number.isFinite(v) || v < 0) {
      const r = findRoot(g, inner, outer, 1e-12);
      return Number.isFinite(r) ? r : null;
    }
    inner = outer;
    travelled += step;
    step = Math.min(step * 2, 2);
  }
  return null;
}
