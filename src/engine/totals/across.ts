// The total over several series (a company total across shops): the mean is the sum of every
// series' means; the median and interval come from simulating all series jointly, each with its
// own model, with one-step innovations drawn together, ε_t ~ N(0, Σ), Σ from the series'
// transformed-scale one-step residuals over their common periods (METHODS §10).
import { EngineError } from "../errors";
import { fmt, requireLevelPercent } from "../_lib/check";
import { choleskyLower } from "../_lib/cholesky-factor";
import { createRandom } from "../_lib/random";
import { sortedQuantile } from "../_lib/sorted-quantile";
import { cleanSeries } from "../series/clean";
import type { RawCell } from "../series/screen";
import { LAMBDA_ZERO } from "../transform/box-cox";
import { exactMeanExists, transformInverse } from "../transform/spec";
import { checkHorizon, Forecaster } from "../models/fit";
import { checkWindowStart, fanTable } from "../models/fan";
import type { TotalRange } from "./published";

/** Columns cut to end at the latest period every series has, and what was cut. */
export interface AlignedColumns {
  columns: RawCell[][];
  /** Number of rows kept (the latest common period is the last of them). */
  rows: number;
  /** Labels of the series whose later values were cut. */
  cut: string[];
  note: string | null;
}

/**
 * Aligns series of different lengths (one per column, same rows = same periods) on the latest
 * period they all have: a series whose values go on after the earliest last value is cut there,
 * so that every forecast starts from the same period and the total covers the same future
 * periods; the note says which series were cut and where. Leading blanks (a later start) are
 * kept: they only shorten the common history. Common practice.
 * @example alignSeries([[1, 2, 3], [4, 5, null]], ["A", "B"]).rows // 2
 */
export function alignSeries(columns: readonly (readonly RawCell[])[], labels: readonly string[], firstRow = 1): AlignedColumns {
  if (columns.length === 0) throw new EngineError("input", "No series given.");
  const ends = columns.map((c, j) => c.length - cleanSeries(c, labels[j] ?? `series ${j + 1}`, firstRow).trailingBlanks);
  const rows = Math.min(...ends);
  const cut = labels.filter((_, j) => ends[j] > rows);
  const out = columns.map((c) => c.slice(0, rows));
  const note = cut.length
    ? `The series end at different periods: ${cut.join(", ")} ${cut.length === 1 ? "has" : "have"} values after row ${firstRow + rows - 1}, the latest period every series has; ${cut.length === 1 ? "it is" : "they are"} cut there so all forecasts start from the same period (${cut.length === 1 ? "its" : "their"} later values are not used).`
    : null;
  return { columns: out, rows, cut, note };
}

/** One series' part of the total. */
export interface AcrossSeries {
  label: string;
  method: string;
  lambda: number | null;
  n: number;
  /** Sum of the series' step means over the window; null when one does not exist. */
  mean: number | null;
}

/** The total over series and steps from..horizon. */
export interface AcrossTotal {
  from: number;
  horizon: number;
  level: number;
  series: AcrossSeries[];
  /** Σ over series and steps of the means (exact by linearity); null with meanNote when one does not exist. */
  mean: number | null;
  meanNote: string | null;
  median: number;
  interval: [number, number | null];
  /** The same total with the series' innovations independent. */
  independent: TotalRange;
  /** Correlation of the one-step innovations used (series × series; 0 for a constant series). */
  correlation: number[][];
  /** Periods where every (non-constant) series has a residual. */
  commonPeriods: number;
  estimator: string;
  simulatedMean: number | null;
  monteCarloError: number | null;
  paths: number;
  seed: number;
  notes: string[];
}

/** Options for {@link totalAcross}. */
export interface TotalAcrossOptions {
  from?: number;
  level?: number;
  /** Simulated paths (default 10,000) and seed (default 1). */
  paths?: number;
  seed?: number;
  /** The step means: "auto" (default: exact for λ ≥ 0, Taylor for λ < 0), "exact" or "taylor". */
  mean?: "auto" | "exact" | "taylor";
}

/** The fewest common periods accepted for the correlation (our choice: fewer says too little). */
export const ACROSS_MIN_COMMON = 8;

/**
 * The total over several fitted series (aligned: all ending at the same period) and steps
 * from..horizon. Mean: the sum of every series' step means (by default exact for λ ≥ 0 and Taylor
 * for λ < 0, as in {@link fanTable}; `mean` forces one). Median and level% interval: `paths` joint simulations in which each
 * step's standard-normal innovations are drawn together with correlation R, R the Pearson
 * correlation of the series' transformed-scale one-step residuals over the periods where every
 * series has one (METHODS §10); each series runs its own model with its own σ and λ; paths are
 * back-transformed and summed. The interval with independent innovations (same draws, R = I) is
 * reported beside it. Refuses a single series (use the per-series total) and fewer than
 * {@link ACROSS_MIN_COMMON} common periods.
 * @example totalAcross([fa, fb], 12, { level: 95 }).interval // the company total's 95% interval
 */
export function totalAcross(forecasters: readonly Forecaster[], horizon: number, options: TotalAcrossOptions = {}): AcrossTotal {
  const K = forecasters.length;
  if (K < 2) throw new EngineError("input", `A total across series needs at least two series (one per column); got ${K}. For one series use the per-series total (FW.TOTAL, or fanwise total without --across).`);
  const H = checkHorizon(horizon, Math.min(...forecasters.map((f) => f.n)));
  const from = checkWindowStart(options.from, H);
  const level = options.level ?? 95;
  const c = requireLevelPercent(level);
  let paths = options.paths ?? 10000;
  if (!Number.isInteger(paths) || paths < 100 || paths > 1000000) throw new EngineError("input", `paths must be a whole number from 100 to 1,000,000; got ${paths}.`);
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new EngineError("input", `seed must be a whole number; got ${seed}.`);
  const notes: string[] = [];
  const end = forecasters[0].leadingBlanks + forecasters[0].n;
  for (const f of forecasters) {
    if (f.leadingBlanks + f.n !== end) throw new EngineError("input", `The series end at different periods (${f.label} ends at position ${f.leadingBlanks + f.n}, ${forecasters[0].label} at ${end}); align them on their latest common period first.`);
    if (!f.simulateShocks) throw new EngineError("input", `${f.label}'s method (${f.method}) cannot yet be simulated jointly with other series; choose another method.`);
  }
  const budget = 8e6;
  if (K * H * paths > budget) {
    const fewer = Math.floor(budget / (K * H) / 100) * 100;
    if (fewer < 1000) throw new EngineError("input", `${K} series × ${H} steps is too large to simulate jointly here; total fewer series or a shorter horizon.`);
    notes.push(`${paths} paths of ${K} series × ${H} steps would not fit in memory; ${fewer} paths are used.`);
    paths = fewer;
  }

  // the correlation of the one-step residuals over the common periods
  const active = forecasters.map((f, i) => (f.model ? i : -1)).filter((i) => i >= 0);
  const resid = forecasters.map((f) => {
    const map = new Map<number, number>();
    if (!f.model) return map;
    const r = f.model.residuals;
    const start = f.leadingBlanks + (f.n - r.length);
    for (let i = 0; i < r.length; i++) if (Number.isFinite(r[i])) map.set(start + i, r[i]);
    return map;
  });
  let common: number[] = [];
  if (active.length) {
    common = Array.from(resid[active[0]].keys()).filter((t) => active.every((i) => resid[i].has(t))).sort((a, b) => a - b);
  }
  const P = common.length;
  if (active.length >= 2 && P < ACROSS_MIN_COMMON) {
    throw new EngineError("input", `The series share only ${P} periods with one-step residuals; at least ${ACROSS_MIN_COMMON} are needed to estimate how they move together. Select longer histories that overlap.`);
  }
  const corr: number[][] = forecasters.map((_, i) => forecasters.map((__, j) => (i === j ? 1 : 0)));
  if (active.length >= 2) {
    const centred = active.map((i) => {
      const xs = common.map((t) => resid[i].get(t) as number);
      const m = xs.reduce((s, x) => s + x, 0) / P;
      return xs.map((x) => x - m);
    });
    const ss = centred.map((xs) => xs.reduce((s, x) => s + x * x, 0));
    for (let a = 0; a < active.length; a++) {
      for (let b = a + 1; b < active.length; b++) {
        let s = 0;
        for (let t = 0; t < P; t++) s += centred[a][t] * centred[b][t];
        const r = ss[a] > 0 && ss[b] > 0 ? s / Math.sqrt(ss[a] * ss[b]) : 0;
        corr[active[a]][active[b]] = r;
        corr[active[b]][active[a]] = r;
      }
    }
  }
  const estimator = `Pearson correlation of the series' transformed-scale one-step residuals over the ${P} periods where every series has one`;
  if (active.length >= 2 && P < 24) notes.push(`The correlations rest on only ${P} common periods; they are rough.`);
  if (active.length < K) notes.push(`${K - active.length} constant series add a fixed amount (no uncertainty).`);

  // the means
  let mean: number | null = 0;
  let meanNote: string | null = null;
  const meanOption = options.mean ?? "auto";
  if (meanOption !== "auto" && meanOption !== "exact" && meanOption !== "taylor") throw new EngineError("input", `Unknown mean method "${String(meanOption)}". Use "auto", "exact" or "taylor".`);
  const series: AcrossSeries[] = forecasters.map((f) => {
    const exact = meanOption === "exact" || (meanOption === "auto" && exactMeanExists(f.transform));
    if (meanOption === "auto" && !exact) notes.push(`${f.label}: at λ = ${fmt(f.lambda as number)} no exact mean exists; its mean is the Taylor approximation.`);
    const rows = fanTable(f, H, { levels: [80], mean: exact ? "exact" : "taylor" }).rows;
    let s: number | null = 0;
    for (const r of rows) {
      if (r.h < from) continue;
      if (r.mean.value === null) {
        s = null;
        meanNote = `${f.label}: ${r.mean.note ?? "a step's mean does not exist"}`;
        break;
      }
      s += r.mean.value;
    }
    if (s === null) mean = null;
    else if (mean !== null) mean += s;
    return { label: f.label, method: f.method, lambda: f.lambda, n: f.n, mean: s };
  });
  if (mean !== null && !Number.isFinite(mean)) {
    mean = null;
    meanNote = "The total's mean is too large to represent.";
  }

  // joint innovations: ε = L z with L L′ = R (active series), and z itself for independence
  const A = active.length;
  const Rm = new Float64Array(A * A);
  for (let a = 0; a < A; a++) for (let b = 0; b < A; b++) Rm[a * A + b] = corr[active[a]][active[b]];
  const L = choleskyLower(Rm, A);
  if (L === null) throw new EngineError("domain", "The residual correlation matrix is not positive semi-definite; this should not happen with common periods. Please report it with the inputs.");
  const rng = createRandom(seed);
  const joint = active.map(() => new Float64Array(paths * H));
  const indep = active.map(() => new Float64Array(paths * H));
  const z = new Float64Array(A);
  for (let r = 0; r < paths; r++) {
    for (let j = 0; j < H; j++) {
      const o = r * H + j;
      for (let a = 0; a < A; a++) z[a] = rng.normal();
      for (let a = 0; a < A; a++) {
        let e = 0;
        for (let b = 0; b <= a; b++) e += L[a * A + b] * z[b];
        joint[a][o] = e;
        indep[a][o] = z[a];
      }
    }
  }
  const totalsJoint = new Float64Array(paths);
  const totalsIndep = new Float64Array(paths);
  let unbounded = 0;
  let floored = 0;
  forecasters.forEach((f, i) => {
    const a = active.indexOf(i);
    const sub = seed + 7919 * (i + 1); // the model's own extra draws (e.g. a drift's error), independent across series
    const simJ = (f.simulateShocks as NonNullable<Forecaster["simulateShocks"]>)(H, paths, sub, a >= 0 ? joint[a] : new Float64Array(paths * H));
    const simI = (f.simulateShocks as NonNullable<Forecaster["simulateShocks"]>)(H, paths, sub, a >= 0 ? indep[a] : new Float64Array(paths * H));
    const { exp, log1p } = Math; // local: no global lookup per value
    const add = (sim: Float64Array, totals: Float64Array): void => {
      const tr = f.transform;
      const lam = f.lambda;
      const boxCox = tr.kind === "box-cox";
      const shift = boxCox ? tr.shift : 0;
      const logScale = lam !== null && Math.abs(lam) < LAMBDA_ZERO;
      for (let r = 0; r < paths; r++) {
        let t = 0;
        for (let j = from - 1; j < H; j++) {
          const w = sim[r * H + j];
          if (lam === null) t += w;
          else if (!boxCox) t += transformInverse(tr, w).value; // Yeo-Johnson: defined everywhere
          else if (logScale) t += exp(w) - shift;
          else {
            const base = lam * w;
            if (base > -1) t += exp(log1p(base) / lam) - shift;
            else if (lam > 0) {
              floored++; // the floor: y + shift = 0
              t -= shift;
            } else t = Infinity;
          }
        }
        totals[r] += t;
      }
    };
    add(simJ, totalsJoint);
    add(simI, totalsIndep);
  });
  let simulatedMean: number | null = null;
  let monteCarloError: number | null = null;
  for (let r = 0; r < paths; r++) if (!Number.isFinite(totalsJoint[r])) unbounded++;
  if (unbounded === 0) {
    let s = 0;
    for (let r = 0; r < paths; r++) s += totalsJoint[r];
    simulatedMean = s / paths;
    let q = 0;
    for (let r = 0; r < paths; r++) q += (totalsJoint[r] - simulatedMean) ** 2;
    monteCarloError = Math.sqrt(q / (paths - 1) / paths);
  } else notes.push(`${unbounded} of ${paths} simulated totals are unbounded (a series with λ < 0 past its pole); the upper end may not exist.`);
  if (floored) notes.push(`${floored} simulated values fell on the floor at 0; the normal assumption is strained for a series with λ > 0.`);
  totalsJoint.sort();
  totalsIndep.sort();
  const al = (1 - c) / 2;
  const ends = (t: Float64Array): [number, number | null] => {
    const hi = sortedQuantile(t, 1 - al);
    return [sortedQuantile(t, al), Number.isFinite(hi) ? hi : null];
  };
  notes.push(`The median and interval come from ${paths} joint simulations (seed ${seed}); innovations correlated by the ${estimator}.`);
  return {
    from, horizon: H, level: c * 100, series, mean, meanNote,
    median: sortedQuantile(totalsJoint, 0.5), interval: ends(totalsJoint),
    independent: { median: sortedQuantile(totalsIndep, 0.5), interval: ends(totalsIndep) },
    correlation: corr, commonPeriods: P, estimator, simulatedMean, monteCarloError, paths, seed, notes,
  };
}
