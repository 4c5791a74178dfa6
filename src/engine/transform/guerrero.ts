import { EngineError } from "../errors";
import { minimizeScanned } from "../_lib/scan";
import { requirePositiveSeries } from "../series/positive";
import { boundHit, checkLambdaBounds } from "./bounds";
import { cap } from "../_lib/cells";

/** Options for {@link lambdaGuerrero}. */
export interface GuerreroOptions {
  /** Subseries length R: the seasonal period, or 2 for non-seasonal data (the default). */
  window?: number;
  lower?: number;
  upper?: number;
  label?: string;
}

/** Result of {@link lambdaGuerrero}. */
export interface GuerreroResult {
  lambda: number;
  /** The coefficient of variation minimised, at λ. */
  cv: number;
  window: number;
  /** Number of subseries used. */
  groups: number;
  /** Subseries left out because too many of their points are missing (see {@link guerreroWindowsUsable}). */
  skipped: number;
  /** Observations left out at the start so the subseries are complete. */
  dropped: number;
  bounds: [number, number];
  onBound: "lower" | "upper" | null;
  n: number;
}

/**
 * Which of Guerrero's windows a series with missing observations (NaN) can use: a window is used
 * when at most a quarter of its points (⌊R/4⌋) are missing and at least 2 are observed — our own
 * rule (common practice, no published source): a window's mean and spread then rest mostly on
 * observed points, and for R = 2 (no season) only complete pairs count. Windows are aligned as in
 * {@link guerreroObjective} (the first n mod R points left out).
 * @example guerreroWindowsUsable([1, 2, NaN, 4, 5, 6], 2) // { used: 2, groups: 3, usable: [true, false, true] }
 */
export function guerreroWindowsUsable(values: readonly number[], window: number): { used: number; groups: number; usable: boolean[] } {
  const groups = Math.floor(values.length / window);
  const dropped = values.length - groups * window;
  const allowed = Math.floor(window / 4);
  const usable: boolean[] = [];
  for (let h = 0; h < groups; h++) {
    let miss = 0;
    for (let j = 0; j < window; j++) if (Number.isNaN(values[dropped + h * window + j])) miss++;
    usable.push(miss <= allowed && window - miss >= 2);
  }
  return { used: usable.filter(Boolean).length, groups, usable };
}

/**
 * Prepares Guerrero's objective for a series: the coefficient of variation (sample sd / mean)
 * of r_h = s_h / m_h^(1−λ) over H non-overlapping subseries of length R, with m_h and s_h
 * (sample sd, divisor R − 1) each subseries' mean and spread. The first n mod R observations
 * are left out so every subseries is complete (the statsmodels 0.13 convention). Missing
 * observations (NaN): a window's mean and sd are those of its observed points, and a window with
 * too many missing ({@link guerreroWindowsUsable}) is skipped and counted in `skipped`.
 * Source: Guerrero (1993), Journal of Forecasting 12:37–48.
 * @example guerreroObjective(nile, 2).cv(1) // 0.755904140432374 (statsmodels _guerrero_cv)
 */
export function guerreroObjective(values: readonly number[], window: number): { cv: (lambda: number) => number; groups: number; dropped: number; skipped: number } {
  const n = values.length;
  const all = guerreroWindowsUsable(values, window);
  const dropped = n - all.groups * window;
  const groups = all.used;
  const logMean = new Float64Array(groups);
  const sd = new Float64Array(groups);
  for (let h = 0, g = 0; h < all.groups; h++) {
    if (!all.usable[h]) continue;
    const start = dropped + h * window;
    let m = 0;
    let r = 0;
    for (let j = 0; j < window; j++) {
      const v = values[start + j];
      if (Number.isNaN(v)) continue;
      m += v;
      r++;
    }
    m /= r;
    let ss = 0;
    for (let j = 0; j < window; j++) {
      const v = values[start + j];
      if (Number.isNaN(v)) continue;
      const d = v - m;
      ss += d * d;
    }
    logMean[g] = Math.log(m);
    sd[g] = Math.sqrt(ss / (r - 1));
    g++;
  }
  const r = new Float64Array(groups);
  const cv = (lambda: number): number => {
    let mean = 0;
    for (let h = 0; h < groups; h++) {
      r[h] = sd[h] * Math.exp((lambda - 1) * logMean[h]);
      mean += r[h];
    }
    mean /= groups;
    let ss = 0;
    for (let h = 0; h < groups; h++) {
      const d = r[h] - mean;
      ss += d * d;
    }
    return Math.sqrt(ss / (groups - 1)) / mean;
  };
  return { cv, groups, dropped, skipped: all.groups - all.used };
}

/**
 * λ by Guerrero's method (Guerrero 1993): minimise the coefficient of variation of
 * s_h / m_h^(1−λ) over subseries of length R (default 2; pass the seasonal period) on
 * [lower, upper] (default [−1, 2]), by a grid scan then Brent's method.
 * Needs R ≥ 2, at least two complete subseries, positive values, and some variation within them.
 * @example lambdaGuerrero(airPassengers, { window: 12 }).lambda // -0.294723 (statsmodels 0.13.5)
 */
export function lambdaGuerrero(values: readonly number[], options: GuerreroOptions = {}): GuerreroResult {
  const label = options.label ?? "the series";
  const window = options.window ?? 2;
  if (!Number.isInteger(window) || window < 2) {
    throw new EngineError("input", `Guerrero's window (the season length) must be a whole number of at least 2; got ${window}. Use 2 for data without a season.`);
  }
  const observed = values.filter((v) => !Number.isNaN(v));
  requirePositiveSeries(observed, 2, label, `Guerrero's method`);
  if (values.length < 2 * window) requirePositiveSeries(observed, 2 * window, label, `Guerrero's method with windows of ${window} (two complete windows)`);
  const bounds = checkLambdaBounds(options.lower, options.upper);
  const obj = guerreroObjective(values, window);
  if (obj.groups < 2) {
    throw new EngineError("input", `${cap(label)} has too many missing values for Guerrero's method: only ${obj.groups} of its ${obj.groups + obj.skipped} windows of ${window} have at most ${Math.floor(window / 4)} missing (at least 2 are needed). Use the maximum-likelihood method ("mle"), or give λ yourself.`);
  }
  const at1 = obj.cv(1);
  if (!Number.isFinite(at1)) {
    throw new EngineError("input", `${label} does not vary within its windows of ${window}, so Guerrero's method has nothing to compare. Give λ yourself or use the maximum-likelihood method.`);
  }
  const best = minimizeScanned(obj.cv, bounds[0], bounds[1], 31, 1e-11);
  return {
    lambda: best.x,
    cv: best.fx,
    window,
    groups: obj.groups,
    skipped: obj.skipped,
    dropped: obj.dropped,
    bounds,
    onBound: boundHit(best.x, bounds),
    n: values.length,
  };
}
