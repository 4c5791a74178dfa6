// Forecasts back on the original scale: the fan table (mean, median, interval ends per step),
// arbitrary quantiles, totals over a horizon, and a model description (METHODS §4).
import { EngineError } from "../errors";
import { fmt, requireLevelPercent, requireProbability } from "../_lib/check";
import type { MeanMethod } from "../distribution/backtransform";
import { forecastMean, MeanResult, parseMeanMethod } from "../distribution/mean";
import { normalQuantile } from "../distribution/normal";
import { LAMBDA_ZERO } from "../transform/box-cox";
import { describeTransform, exactMeanExists, transformInverse } from "../transform/spec";
import { checkHorizon, Forecaster } from "./fit";

/** A value that may not exist, with the reason when it does not. */
export interface Maybe { value: number | null; note: string | null }

/** One step of the fan. */
export interface FanRow {
  h: number;
  /** Transformed-scale mean and sd. */
  mu: number;
  sd: number;
  mean: Maybe;
  /** How the mean was made (exact or Taylor), both values, and a caution when it is approximate. */
  meanDetail: MeanResult;
  median: Maybe;
  /** Per level (percent, as text key): [low, high]. */
  intervals: Record<string, [Maybe, Maybe]>;
}

/** The fan table and what it was computed with. */
export interface FanTable {
  label: string;
  method: string;
  lambda: number | null;
  sigma: number;
  levels: number[];
  meanMethod: MeanMethod;
  rows: FanRow[];
  notes: string[];
}

/**
 * Parses levels given as numbers or text like "80,95" or "80;95" (percent); default [80, 95].
 * @example parseLevels("95, 80") // [80, 95]
 */
export function parseLevels(levels: readonly number[] | string | undefined | null): number[] {
  if (levels === undefined || levels === null || (typeof levels === "string" && levels.trim() === "")) return [80, 95];
  const list = typeof levels === "string" ? levels.split(/[,;\s]+/).filter((s) => s !== "").map((s) => {
    const v = Number(s);
    if (!Number.isFinite(v)) throw new EngineError("input", `levels must be percentages like "80,95"; "${s}" is not a number.`);
    return v;
  }) : levels.slice();
  if (list.length === 0) throw new EngineError("input", 'levels must list at least one percentage, e.g. "80,95".');
  for (const l of list) requireLevelPercent(l, "each level");
  return Array.from(new Set(list)).sort((a, b) => a - b);
}

function inverseOf(f: Forecaster, w: number, what: string): Maybe {
  const r = transformInverse(f.transform, w);
  if (r.status === "ok") return { value: r.value, note: null };
  const lam = fmt(f.lambda as number);
  if (r.status === "floor") return { value: r.value, note: `${what} is at the floor ${fmt(r.value)}: the normal forecast on the λ = ${lam} scale reaches below −1/λ` };
  if (r.status === "low-pole") return { value: null, note: `${what} is unbounded below (past the negative-side pole of Yeo-Johnson λ = ${lam})` };
  return { value: null, note: `${what} is unbounded (past the pole of λ = ${lam} or too large to represent)` };
}

function meanOf(f: Forecaster, mu: number, sd: number, method: MeanMethod): MeanResult {
  return forecastMean(f.transform, mu, sd, method);
}

/** One sentence for the steps whose mean carries a caution (the same rule for the fan and the total). */
function meanCautions(rows: { h: number; m: MeanResult }[]): string | null {
  const flagged = rows.filter((r) => r.m.accuracy !== null);
  if (flagged.length === 0) return null;
  const steps = flagged.length === 1 ? `step ${flagged[0].h}` : `steps ${flagged[0].h}–${flagged[flagged.length - 1].h}`;
  return `Mean at ${steps}: ${flagged[flagged.length - 1].m.accuracy}`;
}

/**
 * The fan table for steps 1..H: the mean (`auto`, the default: exact where it exists, Taylor with
 * its accuracy stated where it does not; or `exact` / `taylor`), the median f(μ_h), and the low/high
 * ends f(μ_h ∓ z σ_h) of each central interval (default 80 and 95%). Quantiles map exactly through
 * the monotone inverse transform (METHODS §4); a floor or pole is reported per cell instead of a NaN,
 * and steps whose mean is only approximate are named in the notes (METHODS §9).
 * @example fanTable(fitForecast(air, { lambda: 0, period: 12, method: "holt-winters" }), 12).rows[0].median.value
 */
export function fanTable(f: Forecaster, horizon: number, options: { levels?: readonly number[] | string; mean?: MeanMethod | string } = {}): FanTable {
  const H = checkHorizon(horizon, f.n);
  const levels = parseLevels(options.levels);
  const meanMethod = parseMeanMethod(options.mean);
  const z = levels.map((l) => normalQuantile(0.5 + l / 200));
  const steps = f.forecast(H);
  const rows: FanRow[] = steps.map((s) => {
    const intervals: Record<string, [Maybe, Maybe]> = {};
    levels.forEach((l, i) => {
      intervals[String(l)] = [inverseOf(f, s.mean - z[i] * s.sd, `the ${l}% low end`), inverseOf(f, s.mean + z[i] * s.sd, `the ${l}% high end`)];
    });
    const m = meanOf(f, s.mean, s.sd, meanMethod);
    return { h: s.h, mu: s.mean, sd: s.sd, mean: { value: m.value, note: m.note }, meanDetail: m, median: inverseOf(f, s.mean, "the median"), intervals };
  });
  const notes = f.notes.slice();
  const caution = meanCautions(rows.map((r) => ({ h: r.h, m: r.meanDetail })));
  if (caution) notes.push(caution);
  return { label: f.label, method: f.method, lambda: f.lambda, sigma: f.model ? f.model.sigma : 0, levels, meanMethod, rows, notes };
}

/**
 * Quantiles f(μ_h + σ_h z_p) for each step h = 1..H and probability p (horizon × probs).
 * @example quantileTable(fitForecast(air, { lambda: 0 }), 3, [0.1, 0.9]).length // 3
 */
export function quantileTable(f: Forecaster, horizon: number, probs: readonly number[]): Maybe[][] {
  const H = checkHorizon(horizon, f.n);
  if (probs.length === 0) throw new EngineError("input", "probs must list at least one probability, e.g. 0.1 and 0.9.");
  const z = probs.map((p) => normalQuantile(requireProbability(p, "each probability")));
  return f.forecast(H).map((s) => z.map((zi, j) => inverseOf(f, s.mean + zi * s.sd, `the ${fmt(probs[j])} quantile`)));
}

/** A forecast of the total over steps from..H. */
export interface TotalForecast {
  /** First step of the window (1 = the next period). */
  from: number;
  horizon: number;
  level: number;
  /** Sum of the per-step means (linearity of expectation; each mean exact where it exists, see meanUsed). */
  mean: Maybe;
  /** How the step means were made: all exact, all Taylor, or null when the mean is missing. */
  meanUsed: "exact" | "taylor" | null;
  /** A caution when some step means are only approximate (the fan's rule), else null. */
  meanAccuracy: string | null;
  /** Median and interval of the total, from simulated paths. */
  median: number;
  interval: [number, number | null];
  paths: number;
  seed: number;
  /** Mean of the simulated totals and its Monte Carlo standard error. */
  simulatedMean: number | null;
  monteCarloError: number | null;
  notes: string[];
}

/**
 * Checks the first step of a window from..horizon: a whole number from 1 to horizon.
 * @example checkWindowStart(8, 19) // 8
 */
export function checkWindowStart(from: unknown, horizon: number): number {
  if (from === undefined || from === null) return 1;
  if (typeof from !== "number" || !Number.isFinite(from) || !Number.isInteger(from) || from < 1) {
    throw new EngineError("input", `from (the first step of the window) must be a whole number of at least 1; got ${typeof from === "number" ? fmt(from) : String(from)}.`);
  }
  if (from > horizon) {
    throw new EngineError("input", `from (${from}) is after horizon (${horizon}): the window from..horizon is empty. Give from ≤ horizon, e.g. from 8 and horizon 19 for January–December of next year after a history ending in May.`);
  }
  return from;
}

/**
 * The total over steps from..H (default from 1; e.g. a year's budget from monthly forecasts, or
 * steps 8..19 for next calendar year after a May history end): the mean is the sum of the per-step
 * means (linearity of expectation, whatever the dependence between steps), each by `mean` (`auto`
 * default: exact where it exists, Taylor with its accuracy stated where it does not; METHODS §9),
 * with the fan's caution rule; medians do not add, so the
 * median and central interval of the total come from `paths` sample paths simulated on the
 * transformed scale with the model's own recursion (seeded), back-transformed and summed
 * (METHODS §4). The simulated total's mean and its Monte Carlo standard error are reported so
 * the simulation's precision is visible.
 * @example totalForecast(f, 12, { level: 95 }).mean.value // Σ of the 12 monthly means
 */
export function totalForecast(f: Forecaster, horizon: number, options: { level?: number; paths?: number; seed?: number; mean?: MeanMethod | string; from?: number } = {}): TotalForecast {
  const H = checkHorizon(horizon, f.n);
  const from = checkWindowStart(options.from, H);
  const level = options.level ?? 95;
  requireLevelPercent(level);
  const paths = options.paths ?? 10000;
  if (!Number.isInteger(paths) || paths < 100 || paths > 1000000) throw new EngineError("input", `paths must be a whole number from 100 to 1,000,000; got ${paths}.`);
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new EngineError("input", `seed must be a whole number; got ${seed}.`);
  const meanMethod = parseMeanMethod(options.mean);
  const notes = f.notes.slice();
  let meanSum: number | null = 0;
  let meanNote: string | null = null;
  let taylorSum: number | null = 0;
  const stepMeans: { h: number; m: MeanResult }[] = [];
  for (const s of f.forecast(H)) {
    if (s.h < from) continue;
    const m = meanOf(f, s.mean, s.sd, meanMethod);
    stepMeans.push({ h: s.h, m });
    taylorSum = taylorSum !== null && m.taylor !== null ? taylorSum + m.taylor : null;
    if (m.value === null) {
      if (meanSum !== null) meanNote = m.note;
      meanSum = null;
      continue;
    }
    if (meanSum !== null) meanSum += m.value;
  }
  if (meanSum === null && meanMethod === "exact" && stepMeans.some((r) => r.m.exact === null && r.m.taylor !== null) && taylorSum !== null && Number.isFinite(taylorSum)) {
    // Offer the total's own Taylor value, not one step's.
    meanNote = `The exact mean of the total does not exist at λ = ${fmt(f.lambda as number)}: the normal forecasts reach the pole of the inverse transform. Use mean "auto" or "taylor" for the Taylor approximation of the total (${fmt(taylorSum)}).`;
  }
  const meanAccuracy = meanSum === null ? null : meanCautions(stepMeans);
  if (meanAccuracy) notes.push(meanAccuracy);
  const used = stepMeans.every((r) => r.m.used === "exact") ? "exact" : stepMeans.every((r) => r.m.used === "taylor") ? "taylor" : null;
  const sims = f.simulate(H, paths, seed);
  const totals = new Float64Array(paths);
  let unbounded = 0;
  let floored = 0;
  // The inverse transform, inlined for Box-Cox: this loop runs paths × H times and an object per
  // value made it allocation-bound (same values, same floor/pole rules as transformInverse).
  const tr = f.transform;
  const lam = tr.lambda;
  const boxCox = tr.kind === "box-cox";
  const shift = tr.shift;
  const logScale = lam !== null && Math.abs(lam) < LAMBDA_ZERO;
  const { exp, log1p } = Math; // local: no global lookup per value (slow in sandboxed contexts)
  for (let r = 0; r < paths; r++) {
    let t = 0;
    const o = r * H;
    for (let j = from - 1; j < H; j++) {
      const w = sims[o + j];
      if (lam === null) t += w;
      else if (!boxCox) {
        const v = transformInverse(tr, w);
        t += v.value;
      } else if (logScale) t += exp(w) - shift;
      else {
        const base = lam * w;
        if (base > -1) t += exp(log1p(base) / lam) - shift;
        else if (lam > 0) {
          floored++; // the floor: y + shift = 0
          t -= shift;
        } else t = Infinity; // past the pole
      }
    }
    if (!Number.isFinite(t)) unbounded++;
    totals[r] = t;
  }
  totals.sort();
  const q = (p: number): number => {
    const x = p * (paths - 1);
    const i = Math.floor(x);
    const frac = x - i;
    return i + 1 < paths ? totals[i] + frac * (totals[i + 1] - totals[i]) : totals[i];
  };
  const a = (1 - level / 100) / 2;
  let simulatedMean: number | null = null;
  let monteCarloError: number | null = null;
  if (unbounded === 0) {
    let s = 0;
    for (let r = 0; r < paths; r++) s += totals[r];
    simulatedMean = s / paths;
    let ss = 0;
    for (let r = 0; r < paths; r++) ss += (totals[r] - simulatedMean) ** 2;
    monteCarloError = Math.sqrt(ss / (paths - 1) / paths);
  } else {
    notes.push(`${unbounded} of ${paths} simulated paths are unbounded on the ${describeTransform(f.transform)} scale (past its pole); the total's upper end may not exist.`);
  }
  if (floored) notes.push(`${floored} simulated step values fell on the floor at 0; the normal assumption is strained at this λ.`);
  const hi = q(1 - a);
  if (meanSum !== null && !Number.isFinite(meanSum)) {
    meanSum = null;
    meanNote = "The total's mean is too large to represent.";
  }
  return {
    from,
    horizon: H,
    level,
    mean: { value: meanSum, note: meanNote },
    meanUsed: meanSum === null ? null : used,
    meanAccuracy,
    median: q(0.5),
    interval: [q(a), Number.isFinite(hi) ? hi : null],
    paths,
    seed,
    simulatedMean,
    monteCarloError,
    notes,
  };
}

/** One row of a model description. */
export type DescriptionRow = [string, number | string];

function meanRows(f: Forecaster, h: number): DescriptionRow[] {
  const s = f.forecast(h)[h - 1];
  const m = forecastMean(f.transform, s.mean, s.sd, "auto");
  const med = transformInverse(f.transform, s.mean);
  const rows: DescriptionRow[] = [];
  if (m.exact !== null && m.taylor !== null && m.exact !== 0) rows.push([`Taylor vs exact mean at step ${h} (%)`, (100 * (m.taylor - m.exact)) / Math.abs(m.exact)]);
  if (m.used === "taylor") {
    if (m.correction !== null && Number.isFinite(m.correction) && med.status === "ok") rows.push([`Taylor correction at step ${h} (% of median)`, 100 * m.correction]);
    rows.push([`probability past the pole at step ${h}`, m.poleProbability]);
  }
  if (m.floorProbability > 0) rows.push([`probability on the floor at step ${h}`, m.floorProbability]);
  return rows;
}

/**
 * A model's description as label/value rows: method, transform, λ (with the interval that belongs
 * to its estimate), shift, each parameter, σ, the log-likelihood and AICc on the original scale
 * (comparable across λ; METHODS §7) and on the transformed scale, n (periods fitted), missing (how
 * many of them were missing observations), and which mean is shown with its accuracy at step 1 and
 * one season (or 12 steps) ahead (METHODS §9).
 * @example describeForecaster(f)[0] // ["method", "holt-winters"]
 */
export function describeForecaster(f: Forecaster): DescriptionRow[] {
  const rows: DescriptionRow[] = [["method", f.method]];
  rows.push(["transform", f.transform.kind]);
  rows.push(["lambda", f.lambda === null ? "none" : f.lambda]);
  rows.push(["lambda source", f.lambdaSource]);
  const c = f.lambdaChoice;
  if (c && (c.interval[0] !== null || c.interval[1] !== null)) {
    rows.push([`lambda ${Math.round(c.level * 100)}% interval low`, c.interval[0] ?? "open"]);
    rows.push([`lambda ${Math.round(c.level * 100)}% interval high`, c.interval[1] ?? "open"]);
  }
  if (f.transform.kind === "box-cox") rows.push(["shift", f.transform.shift]);
  const arima = f.model as (typeof f.model & { standardErrors?: Readonly<Record<string, number>> | null; nobs?: number; title: string }) | null;
  if (arima && arima.standardErrors !== undefined) rows.push(["model", arima.title]);
  if (f.model) {
    for (const [k, v] of Object.entries(f.model.params)) {
      rows.push([k, v]);
      const se = arima?.standardErrors?.[k];
      if (se !== undefined) rows.push([`${k} standard error`, se]);
    }
  }
  rows.push(["sigma", f.model ? f.model.sigma : 0]);
  rows.push(["loglik", f.fit ? f.fit.loglik : "n/a (constant series)"]);
  rows.push(["AICc", f.fit ? f.fit.aicc : "n/a (constant series)"]);
  rows.push(["loglik (transformed scale)", f.model ? f.model.loglik : "n/a (constant series)"]);
  rows.push(["n", f.n]);
  rows.push(["missing", f.missing]);
  if (arima && arima.nobs !== undefined) rows.push(["differences used", arima.nobs]);
  if (f.auto) rows.push(["AICc margin over next best", f.auto.margin]);
  const exists = exactMeanExists(f.transform);
  rows.push(["mean shown", f.model === null ? "exact (no uncertainty)" : exists ? "exact" : `taylor (no exact mean at λ = ${fmt(f.lambda as number)})`]);
  if (f.model) {
    const far = f.period > 1 ? f.period : 12;
    rows.push(...meanRows(f, 1));
    if (far > 1 && far <= 10 * f.n) rows.push(...meanRows(f, far));
  }
  return rows;
}
