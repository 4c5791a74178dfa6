// Rolling-origin evaluation (Tashman 2000, International Journal of Forecasting 16:437–450): refit at
// every origin t ≥ t₀ on the data up to t, forecast 1..H steps, and score each step ahead.
import { EngineError, isEngineError } from "../errors";
import { requireLevelPercent } from "../_lib/check";
import { cleanSeries } from "../series/clean";
import type { RawCell } from "../series/screen";
import { benchmarkMinimumLength } from "../models/benchmarks";
import { minimumLength } from "../models/ets";
import type { MeanMethod } from "../distribution/backtransform";
import { parseMeanMethod } from "../distribution/mean";
import { fanTable } from "../models/fan";
import { fitForecast, ForecastOptions, checkHorizon } from "../models/fit";
import { isBenchmark, parseMethod } from "../models/methods";
import { intervalScore } from "./scores";
import { isArimaMethod, parseArimaMethod } from "../models/arima/order";
import { arimaMinimumLength } from "../models/arima/fit";
import type { SmoothingMethod } from "../models/methods";
import { trafficLight } from "./coverage-tests";
import { overlapTests } from "./overlap";
import { Verdict, verdictOf } from "./verdict";

/** Per-step-ahead results of a backtest. */
export interface BacktestRow {
  h: number;
  /** Origins with an actual h steps later. */
  origins: number;
  /** Share of actuals inside the interval (null when no origin reached this step). */
  coverage: number | null;
  /** Mean interval score. */
  intervalScore: number | null;
  /** Mean of actual − bias-adjusted mean. */
  meanErrorOfMean: number | null;
  /** Mean of actual − median (the back-transformed point forecast). */
  meanErrorOfMedian: number | null;
  /** Mean absolute error of the mean and of the median. */
  maeOfMean: number | null;
  maeOfMedian: number | null;
  /** Misses at this step (actual outside the interval). */
  misses: number;
  /** Kupiec's p-value of the miss rate (for h > 1 on every h-th origin, Bonferroni); null with no origin. */
  kupiecP: number | null;
  /** Christoffersen's independence p-value, likewise. */
  independenceP: number | null;
  /** The verdict at this step (null with no origin). */
  verdict: Verdict | null;
}

/** A backtest's results. */
export interface Backtest {
  horizon: number;
  level: number;
  first: number;
  /** Origins at which the fit failed (with the first message), skipped. */
  failures: number;
  failureNote: string | null;
  /** Origins skipped because their last period is a missing observation. */
  gapOrigins: number;
  /** The origins used: the first fit uses `first` values, the last `last`; `count` refits. */
  origins: { first: number; last: number; count: number };
  /** Which origins were used and why the first window has its length, in words. */
  originNote: string;
  rows: BacktestRow[];
}

/** Options for {@link backtest}. */
export interface BacktestOptions extends ForecastOptions {
  /** Interval level in percent (default 95). */
  level?: number;
  /**
   * Length of the first fitting window (default: the smallest the method needs, or, on a long
   * series, the length that leaves the latest {@link DEFAULT_ORIGINS} origins).
   */
  first?: number;
  /** Which mean is scored: `auto` (default: exact where it exists, Taylor otherwise), `exact` or `taylor`. */
  mean?: MeanMethod | string;
  /** Called after each origin (done, total), e.g. for a progress bar. */
  onProgress?: (done: number, total: number) => void;
}

/** Origins checked by default on a long series (the latest ones): each is a refit. */
export const DEFAULT_ORIGINS = 500;
/** The most origins a backtest will refit at, whatever `first` says. */
export const MAX_ORIGINS = 5000;

/** The history a practitioner would want before the first origin when `first` is not given. */
export const PRACTICAL_MINIMUM = 10;

function smallestLength(method: string, period: number): number {
  const m = parseMethod(method);
  if (m === "auto") return Math.max(4, minimumLength("ses", 1));
  if (isBenchmark(m)) return Math.max(4, benchmarkMinimumLength(m, period));
  if (isArimaMethod(m)) {
    const spec = parseArimaMethod(m, period);
    // auto: enough for the four starting models with a seasonal difference (two seasons and more)
    return spec.auto ? Math.max(20, period > 1 ? 3 * period : 0) : arimaMinimumLength(spec.order);
  }
  return minimumLength(m as SmoothingMethod, period);
}

/**
 * The shortest first window used by default: the method's own minimum, at least two full seasons
 * when the model may be seasonal (period > 1), and at least {@link PRACTICAL_MINIMUM} values
 * (common practice: a fit on a handful of values says little about the method).
 * @example practicalMinimum("auto", 12) // { length: 24, reason: "two full seasons of 12" }
 */
export function practicalMinimum(method: string, period: number): { length: number; reason: string } {
  const need = smallestLength(method, period);
  const m = parseMethod(method);
  const seasonal = period > 1 && (m === "auto" || m === "seasonal-naive" || /seasonal|winters/.test(m) || isArimaMethod(m));
  // On a tie the first reason is given: seasons, then the stated minimum, then the method's own.
  const cands: [number, string][] = [[PRACTICAL_MINIMUM, `the stated minimum of ${PRACTICAL_MINIMUM} values`], [need, `the least ${method} can fit`]];
  if (seasonal) cands.unshift([2 * period, `two full seasons of ${period}`]);
  let best = cands[0];
  for (const c of cands) if (c[0] > best[0]) best = c;
  return { length: best[0], reason: best[1] };
}

function prepare(cells: readonly RawCell[], horizon: number, options: BacktestOptions): { y: number[]; H: number; first: number; level: number; origins: number; note: string } {
  const y = cleanSeries(cells, options.label ?? "the series", options.firstRow ?? 1, { zeros: options.zeros }).values;
  const H = checkHorizon(horizon, y.length);
  const level = options.level ?? 95;
  requireLevelPercent(level);
  const period = options.period ?? 1;
  const method = String(options.method ?? "auto");
  const need = smallestLength(method, period);
  const practical = practicalMinimum(method, period);
  let first: number;
  let note: string;
  if (options.first === undefined) {
    first = Math.max(practical.length, y.length - DEFAULT_ORIGINS);
    note = first > practical.length ? `the latest ${DEFAULT_ORIGINS} origins (the default on a long series)` : `the first fit uses ${first} values (${practical.reason})`;
    if (first + H > y.length) throw new EngineError("input", `A backtest of ${method} wants at least ${practical.length} values before the first origin (${practical.reason}) and ${H} more to check ${H} steps; the series has ${y.length}. Use a smaller horizon, or give first (at least ${need}) to start earlier.`);
  } else {
    first = options.first;
    note = `first = ${first} as given`;
    if (Number.isInteger(first) && first >= need && first < practical.length) note += ` (shorter than ${practical.length}, ${practical.reason}: the earliest origins rest on little data)`;
  }
  if (!Number.isInteger(first) || first < 2) throw new EngineError("input", `first must be a whole number of at least 2 (the length of the first fitting window); got ${first}.`);
  if (first < need) throw new EngineError("input", `first = ${first} is too short for ${method}: it needs at least ${need} values.`);
  if (first + 1 > y.length) throw new EngineError("input", `The first origin (after ${first} values) leaves no room to check a forecast: the series has ${y.length} values. Use a smaller first or a longer series.`);
  if (first + H > y.length) throw new EngineError("input", `The first origin (after ${first} values) leaves no room for ${H} steps: the series has ${y.length} values, so at most ${y.length - first} steps can be checked. Use a smaller horizon or first.`);
  if (y.length - first > MAX_ORIGINS) throw new EngineError("input", `first = ${first} means ${y.length - first} origins, each a refit; at most ${MAX_ORIGINS} are checked. Use first = ${y.length - MAX_ORIGINS} or more (the default checks the latest ${DEFAULT_ORIGINS}).`);
  return { y, H, first, level, origins: y.length - first, note };
}

/**
 * Rolling-origin backtest: for each origin t from `first` to n − 1 (by default the latest
 * DEFAULT_ORIGINS origins on a long series; at most MAX_ORIGINS), refit (λ chosen afresh when it
 * is `auto`/`guerrero`/`mle`) on y[0..t), forecast up to H steps, and record, per step ahead, the
 * coverage of the central `level`% interval, the mean interval score (Winkler 1972), and the mean
 * error of the bias-adjusted mean and of the median — what using medians has cost on this history.
 * Source: Tashman (2000). Origins whose fit fails are skipped and counted. With missing
 * observations, an origin whose last period is missing is skipped (counted in `gapOrigins`) and a
 * missing actual is not scored.
 * @example backtest(air, 12, { method: "holt-winters", lambda: 0, period: 12 }).rows[0].coverage
 */
export function backtest(cells: readonly RawCell[], horizon: number, options: BacktestOptions = {}): Backtest {
  const run = backtestRun(cells, horizon, options);
  for (let r = run.next(); ; r = run.next()) if (r.done) return r.value;
}

/**
 * {@link backtest}, pausing after every origin with the caller's `pause` (e.g. a zero-delay timer),
 * so a long backtest never blocks a single-threaded host such as Excel's shared runtime. The
 * engine itself stays free of timers.
 * @example await backtestAsync(air, 12, { method: "holt-winters", period: 12 }, () => new Promise((r) => setTimeout(r, 0)))
 */
export async function backtestAsync(cells: readonly RawCell[], horizon: number, options: BacktestOptions, pause: () => Promise<void>): Promise<Backtest> {
  const run = backtestRun(cells, horizon, options);
  for (let r = run.next(); ; r = run.next()) {
    if (r.done) return r.value;
    await pause();
  }
}

function* backtestRun(cells: readonly RawCell[], horizon: number, options: BacktestOptions): Generator<number, Backtest, void> {
  const { y, H, first, level, origins, note } = prepare(cells, horizon, options);
  const mean = parseMeanMethod(options.mean);
  const acc = Array.from({ length: H }, () => ({ n: 0, inside: 0, is: 0, emean: 0, emed: 0, amean: 0, amed: 0, hits: [] as number[] }));
  let failures = 0;
  let failureNote: string | null = null;
  let gapOrigins = 0;
  const alpha = 1 - level / 100;
  for (let t = first, k = 0; t < y.length; t++, k++) {
    const steps = Math.min(H, y.length - t);
    if (Number.isNaN(y[t - 1])) {
      // no forecast is made from a missing period: the origin is skipped (and counted)
      gapOrigins++;
      options.onProgress?.(k + 1, origins);
      yield k + 1;
      continue;
    }
    try {
      // missing observations (NaN) go back to blanks, which the fit reads as missing
      const f = fitForecast(y.slice(0, t).map((v) => (Number.isNaN(v) ? null : v)), { method: options.method, lambda: options.lambda, transform: options.transform, shift: options.shift, period: options.period, label: options.label });
      const fan = fanTable(f, steps, { levels: [level], mean });
      fan.rows.forEach((r, j) => {
        const actual = y[t + j];
        const [lo, hi] = r.intervals[String(level)];
        const a = acc[j];
        if (Number.isNaN(actual)) return; // nothing to check against
        if (lo.value === null || hi.value === null || r.median.value === null) return;
        a.n++;
        const inside = actual >= lo.value && actual <= hi.value;
        if (inside) a.inside++;
        a.hits.push(inside ? 0 : 1);
        a.is += intervalScore(lo.value, hi.value, actual, alpha);
        const mean = r.mean.value ?? r.median.value;
        a.emean += actual - mean;
        a.emed += actual - r.median.value;
        a.amean += Math.abs(actual - mean);
        a.amed += Math.abs(actual - r.median.value);
      });
    } catch (e) {
      if (!isEngineError(e)) throw e;
      failures++;
      if (!failureNote) failureNote = `The fit failed at ${failures === 1 ? "an origin" : "some origins"} (first after ${t} values: ${e.message}); they are skipped.`;
    }
    options.onProgress?.(k + 1, origins);
    yield k + 1;
  }
  const c = level / 100;
  const rows = acc.map((a, j) => {
    let kupiecP: number | null = null, independenceP: number | null = null, verdict: Verdict | null = null;
    if (a.n > 0) {
      const t = overlapTests([a.hits], 1 - c, j + 1);
      const misses = a.n - a.inside;
      verdict = verdictOf({ n: a.n, misses, coverage: a.inside / a.n, nominal: c, kupiec: t.kupiec, independence: t.independence, conditional: t.conditional, zone: trafficLight(misses, a.n, 1 - c).zone });
      if (t.adjustment) verdict.text += ` ${t.adjustment}`;
      kupiecP = t.kupiec.p;
      independenceP = t.independence.note ? null : t.independence.p;
    }
    return {
      h: j + 1,
      origins: a.n,
      coverage: a.n ? a.inside / a.n : null,
      intervalScore: a.n ? a.is / a.n : null,
      meanErrorOfMean: a.n ? a.emean / a.n : null,
      meanErrorOfMedian: a.n ? a.emed / a.n : null,
      maeOfMean: a.n ? a.amean / a.n : null,
      maeOfMedian: a.n ? a.amed / a.n : null,
      misses: a.n - a.inside,
      kupiecP, independenceP, verdict,
    };
  });
  if (rows.every((r) => r.origins === 0)) throw new EngineError("input", `The backtest could not fit the model at any origin${failureNote ? `: ${failureNote}` : ""}.`);
  const originNote = `Origins after ${first} to ${y.length - 1} values (${origins} refit${origins === 1 ? "" : "s"}): ${note}.`;
  return { horizon: H, level, first, failures, failureNote, gapOrigins, origins: { first, last: y.length - 1, count: origins }, originNote, rows };
}
