import { EngineError } from "../errors";
import { findRoot, minimizeBounded } from "../_lib/brent";
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
  let minLog = Infinity;
  let maxLog = -Infinity;
  for (let i = 0; i < n; i++) {
    const l = Math.log(values[i]);
    logs[i] = l;
    sumLog += l;
    if (l < minLog) minLog = l;
    if (l > maxLog) maxLog = l;
  }
  const work = new Float64Array(n);
  return (lambda: number): number => {
    let logVar: number;
    if (Math.abs(lambda) < LAMBDA_ZERO) {
      logVar = Math.log(variance(logs, n));
    } else {
      const maxArg = lambda > 0 ? lambda * maxLog : lambda * minLog;
      const maxAbs = Math.abs(lambda) * Math.max(Math.abs(minLog), Math.abs(maxLog));
      let sum = 0;
      if (maxAbs <= 1) {
        // y^λ is near 1: expm1 keeps the digits that y^λ − 1 would cancel.
        for (let i = 0; i < n; i++) {
          const w = Math.expm1(lambda * logs[i]) / lambda;
          work[i] = w;
          sum += w;
        }
        logVar = Math.log(centredSquares(work, n, sum / n) / n);
      } else {
        // Away from λ·ln y ≈ 0 the −1 of the transform is only a shift, and subtracting it would
        // cancel digits when every y^λ ≪ 1; y^λ may also overflow. So use
        // var(w) = var(y^λ)/λ² = e^{2M}·var(e^{λ ln y − M})/λ², with M = max λ·ln y.
        for (let i = 0; i < n; i++) {
          const u = Math.exp(lambda * logs[i] - maxArg);
          work[i] = u;
          sum += u;
        }
        logVar = 2 * maxArg + Math.log(centredSquares(work, n, sum / n) / n) - 2 * Math.log(Math.abs(lambda));
      }
    }
    return (lambda - 1) * sumLog - 0.5 * n * logVar;
  };
}

/** Σ(x − m)² with the usual correction for the rounding error in m (two-pass variance). */
function centredSquares(x: Float64Array, n: number, m: number): number {
  let s = 0;
  let c = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i] - m;
    s += d * d;
    c += d;
  }
  return s - (c * c) / n;
}

function variance(x: Float64Array, n: number): number {
  let m = 0;
  for (let i = 0; i < n; i++) m += x[i];
  return centredSquares(x, n, m / n) / n;
}

/**
 * Box-Cox profile log-likelihood ℓ(λ) of a positive series (Box & Cox 1964), without constants,
 * matching scipy.stats.boxcox_llf.
 * @example boxCoxLogLik([1, 2, 3, 4, 5], 1) // -1.7328679513998633 (= −(5/2)·ln 2)
 */
export function boxCoxLogLik(values: readonly number[], lambda: number): number {
  requirePositiveSeries(values, 2, "the series", "a Box-Cox likelihood");
  requireFinite(lambda, "lambda");
  if (isConstant(values)) throw new EngineError("input", "The series is constant, so its Box-Cox likelihood is unbounded. λ cannot be estimated from it.");
  return profileLogLik(values)(lambda);
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
  /** Compute the likelihood-ratio interval (default true); false leaves it [null, null]. */
  withInterval?: boolean;
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
 * [lower, upper] (default [−1, 2]) by a 13-point grid scan then Brent's method, with the
 * likelihood-ratio interval {λ : ℓ(λ) ≥ ℓ(λ̂) − ½χ²₁(level)} found by Brent root-finding inside
 * the grid cells that bracket it (not truncated to the bounds). Needs ≥ 4 positive values that are not all equal.
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
  // Grid scan (13 points) for the global maximum, then Brent's method in the cells around it.
  const points = 13;
  const step = (bounds[1] - bounds[0]) / (points - 1);
  const grid: number[] = [];
  const vals: number[] = [];
  let best = 0;
  for (let i = 0; i < points; i++) {
    grid.push(bounds[0] + i * step);
    vals.push(llf(grid[i]));
    if (vals[i] > vals[best] || !Number.isFinite(vals[best])) best = i;
  }
  const lo = grid[Math.max(0, best - 1)];
  const hi = grid[Math.min(points - 1, best + 1)];
  const opt = minimizeBounded((l) => -llf(l), lo, hi, 1e-10);
  const lambda = opt.x;
  const loglik = -opt.fx;
  const cut = loglik - 0.5 * chiSquareQuantile(level, 1);
  const g = (l: number): number => llf(l) - cut;
  return {
    lambda,
    loglik,
    interval: options.withInterval === false ? [null, null] : [intervalEnd(g, lambda, -1, grid, vals, cut), intervalEnd(g, lambda, +1, grid, vals, cut)],
    level,
    bounds,
    onBound: boundHit(lambda, bounds),
    n: values.length,
  };
}

/**
 * One end of the likelihood-ratio interval: the crossing of g = ℓ − cut on the `dir` side of λ̂.
 * The grid already evaluated usually brackets it; otherwise walk outward (up to 10 from λ̂).
 * Null when ℓ never drops that far.
 */
function intervalEnd(g: (l: number) => number, center: number, dir: -1 | 1, grid: number[], vals: number[], cut: number): number | null {
  let inner = center;
  const order = dir < 0 ? grid.map((_, i) => grid.length - 1 - i) : grid.map((_, i) => i);
  for (const i of order) {
    if ((grid[i] - center) * dir <= 0) continue;
    const v = vals[i] - cut;
    if (!Number.isFinite(v) || v < 0) {
      const r = findRoot(g, inner, grid[i], 1e-9);
      return Number.isFinite(r) ? r : null;
    }
    inner = grid[i];
  }
  let step = 0.25;
  for (let travelled = Math.abs(inner - center); travelled < 10; ) {
    const outer = center + dir * Math.min(10, travelled + step);
    const v = g(outer);
    if (!Number.isFinite(v) || v < 0) {
      const r = findRoot(g, inner, outer, 1e-9);
      return Number.isFinite(r) ? r : null;
    }
    inner = outer;
    travelled = Math.abs(outer - center);
    step = Math.min(step * 2, 2);
  }
  return null;
}
