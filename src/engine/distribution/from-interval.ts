import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda, requireLevelPercent } from "../_lib/check";
import { findRoot } from "../_lib/brent";
import { boxCox } from "../transform/box-cox";
import { backtransformMean, MeanMethod } from "./backtransform";
import { normalQuantile } from "./normal";

/** A forecast distribution recovered from a published median and interval. */
export interface RecoveredForecast {
  /** Transformed-scale mean g(m). */
  mu: number;
  /** Transformed-scale sd (g(U) − g(L)) / (2·z_{(1+c)/2}). */
  sigma: number;
  /** Bias-adjusted mean on the original scale. */
  mean: number;
  /** (g(U) − g(m)) / (g(m) − g(L)): 1 when the interval is symmetric on the transformed scale. */
  asymmetry: number;
  /** True when the asymmetry is within 10% of 1 (rounded published figures rarely do better). */
  consistent: boolean;
  note: string;
}

function checkTriple(median: number, lower: number, upper: number): void {
  requireFinite(median, "median");
  requireFinite(lower, "lower");
  requireFinite(upper, "upper");
  if (!(lower > 0)) throw new EngineError("input", `The interval's lower end must be > 0 for a Box-Cox forecast; got ${fmt(lower)}.`);
  if (!(lower < median && median < upper)) {
    throw new EngineError("input", `Need lower < median < upper; got lower ${fmt(lower)}, median ${fmt(median)}, upper ${fmt(upper)}. Check the order of the arguments.`);
  }
}

/**
 * Recovers the transformed-scale normal forecast from a median m and a central interval [L, U] of
 * level c (percent) published on the original scale, and its bias-adjusted mean:
 * μ = g(m), σ = (g(U) − g(L))/(2·z_{(1+c)/2}), g the Box-Cox transform with the given λ (default 0,
 * the log); the mean by `method` (`auto` default: exact where it exists, λ ≥ 0; Taylor for λ < 0).
 * METHODS §4 (a consequence of quantile preservation under monotone maps).
 * @example meanFromInterval(100, 60, 166.67, 95).mean // ≈ 106.9 (log scale, exact)
 */
export function meanFromInterval(median: number, lower: number, upper: number, levelPercent: number, lambda = 0, method: MeanMethod = "auto"): RecoveredForecast {
  checkTriple(median, lower, upper);
  const c = requireLevelPercent(levelPercent);
  requireLambda(lambda);
  const gm = boxCox(median, lambda);
  const gl = boxCox(lower, lambda);
  const gu = boxCox(upper, lambda);
  const z = normalQuantile(0.5 + c / 2);
  const sigma = (gu - gl) / (2 * z);
  const asymmetry = (gu - gm) / (gm - gl);
  const consistent = Math.abs(asymmetry - 1) <= 0.1;
  const mean = backtransformMean(gm, sigma, lambda, method);
  const note = consistent
    ? ""
    : `The interval is not symmetric around the median on the λ = ${fmt(lambda)} scale (upper part ${fmt(asymmetry)} × the lower part); the forecast was probably made on another scale. Try the λ from the implied-λ function.`;
  return { mu: gm, sigma, mean, asymmetry, consistent, note };
}

/** ln(expm1(x)/x), accurate for every real x. */
function lnExpm1OverX(x: number): number {
  if (Math.abs(x) < 1e-8) return x / 2;
  if (x > 30) return x + Math.log1p(-Math.exp(-x)) - Math.log(x);
  if (x < -30) return Math.log(-Math.expm1(x)) - Math.log(-x);
  return Math.log(Math.expm1(x) / x);
}

/**
 * The λ in [−5, 5] that makes a published interval symmetric around its median on the Box-Cox
 * scale: g(U) − g(m) = g(m) − g(L) (METHODS §4). A symmetric interval gives 1; a right-skewed one
 * (typical of log-scale forecasts) gives λ < 1, near 0 for a log-normal one.
 * Throws when no λ in [−5, 5] symmetrises it.
 * @example impliedLambda(100, 50, 200) // 0 (symmetric in logs)
 */
export function impliedLambda(median: number, lower: number, upper: number): number {
  checkTriple(median, lower, upper);
  const a = Math.log(upper / median);
  const b = Math.log(median / lower);
  // ln[(g(U) − g(m)) / (g(m) − g(L))] = λb + ln a + ln E(λa) − ln b − ln E(λb), E(x) = expm1(x)/x.
  const r = (l: number): number => l * b + Math.log(a) + lnExpm1OverX(l * a) - Math.log(b) - lnExpm1OverX(l * b);
  if (Math.abs(a - b) <= 1e-15 * Math.max(a, b)) return 0;
  const root = findRoot(r, -5, 5, 1e-14);
  if (!Number.isFinite(root)) {
    throw new EngineError("input", `No λ between -5 and 5 makes the interval [${fmt(lower)}, ${fmt(upper)}] symmetric around ${fmt(median)}; it is too lopsided. Check the figures.`);
  }
  return root;
}
