// The total of a forecast published elsewhere as monthly medians and central intervals (an annual
// budget from a monthly forecast): each month's transformed-scale normal from its interval
// (METHODS §4), how the months move together (METHODS §10), the mean as the sum of the monthly
// means, and the median and interval by seeded simulation of the joint normal.
import { EngineError, isEngineError } from "../errors";
import { fmt, requireLambda, requireLevelPercent } from "../_lib/check";
import { choleskyLower } from "../_lib/cholesky-factor";
import { simulateBacktransformedSum } from "../_lib/backtransformed-sum";
import { sortedQuantile } from "../_lib/sorted-quantile";
import { backtransformMeanExact, backtransformMeanTaylor } from "../distribution/backtransform";
import { impliedLambda, meanFromInterval } from "../distribution/from-interval";
import { normalQuantile } from "../distribution/normal";
import { boxCoxInverseDetailed } from "../transform/box-cox";
import { READABLE_LAMBDAS } from "../transform/readable";
import { fitLocalLevelWidening, localLevelCorrelation, LocalLevelFit } from "./implied-dependence";

/** How the months move together: inferred from the widths, none, perfect, or a common correlation. */
export type DependenceSpec = "implied" | "independent" | "comonotone" | number;

/**
 * Reads a dependence: "implied" (default), "independent", "comonotone", or a common correlation
 * from 0 to 1 (a number or numeric text).
 * @example parseDependence(" Comonotone ") // "comonotone"
 */
export function parseDependence(x: unknown): DependenceSpec {
  if (x === undefined || x === null || (typeof x === "string" && x.trim() === "")) return "implied";
  const help = 'Use "implied", "independent", "comonotone", or a correlation from 0 to 1 such as 0.5.';
  let r: number;
  if (typeof x === "string") {
    const k = x.trim().toLowerCase();
    if (k === "implied" || k === "independent" || k === "comonotone") return k;
    r = Number(k);
    if (!Number.isFinite(r)) throw new EngineError("input", `Unknown dependence "${x.slice(0, 30)}". ${help}`);
  } else if (typeof x === "number") r = x;
  else throw new EngineError("input", `dependence must be a keyword or a number. ${help}`);
  if (!Number.isFinite(r) || r < 0 || r > 1) throw new EngineError("input", `dependence as a correlation must be from 0 (independent months) to 1 (comonotone); got ${fmt(r)}. ${help}`);
  return r;
}

/** One published month, read back. */
export interface PublishedMonth {
  h: number;
  median: number;
  lower: number;
  upper: number;
  /** Transformed-scale mean g(median) and sd (g(U) − g(L))/(2z). */
  mu: number;
  sigma: number;
  /** Mean on the original scale (exact for λ ≥ 0, Taylor for λ < 0); null when it cannot be represented. */
  mean: number | null;
  /** The λ that makes this month's interval symmetric (null when none in [−5, 5] does). */
  impliedLambda: number | null;
  /** (g(U) − g(m))/(g(m) − g(L)) on the λ used. */
  asymmetry: number;
  consistent: boolean;
}

/** A total's median and central interval. */
export interface TotalRange {
  median: number;
  /** [low, high]; high is null when unbounded (past the pole of λ < 0). */
  interval: [number, number | null];
}

/** The total of a published forecast and the assumption it rests on. */
export interface PublishedTotal {
  level: number;
  lambda: number;
  lambdaSource: "given" | "implied";
  /** What was asked for. */
  dependence: DependenceSpec;
  /** What was used (after any fallback). */
  used: "local-level" | "independent" | "comonotone" | "correlation";
  /** The common correlation when one was given. */
  correlation: number | null;
  /** The local-level fit to the widths (always computed, so it can be shown). */
  fit: LocalLevelFit;
  months: PublishedMonth[];
  /** Sum of the monthly means (exact by linearity whatever the dependence); null when a month's mean cannot be represented. */
  mean: number | null;
  meanMethod: "exact" | "taylor";
  median: number;
  interval: [number, number | null];
  /** The same total assuming independent months, and perfectly dependent ones. */
  independent: TotalRange;
  comonotone: TotalRange;
  /** Mean of the simulated totals and its Monte Carlo standard error (null for comonotone or an unbounded path). */
  simulatedMean: number | null;
  monteCarloError: number | null;
  paths: number;
  seed: number;
  notes: string[];
}

/** Options for {@link publishedTotal}. */
export interface PublishedTotalOptions {
  /** Box-Cox λ of the forecast's scale (default 0, the log) or "implied". */
  lambda?: number | "implied" | string;
  dependence?: DependenceSpec | string;
  /** Simulated paths (default 20,000) and seed (default 1). */
  paths?: number;
  seed?: number;
}

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

function readLambdaOption(x: unknown): number | "implied" {
  if (x === undefined || x === null || (typeof x === "string" && x.trim() === "")) return 0;
  if (typeof x === "string") {
    const k = x.trim().toLowerCase();
    if (k === "implied") return "implied";
    const v = Number(k);
    if (!Number.isFinite(v)) throw new EngineError("input", `lambda must be a number between -5 and 5 (0 = log) or "implied"; got "${x.slice(0, 30)}".`);
    return requireLambda(v);
  }
  return requireLambda(x);
}

/**
 * The total of a forecast known only by monthly medians m_h and central intervals [L_h, U_h] of
 * one level, made on the Box-Cox scale λ (default 0; "implied" takes the median of the months'
 * implied λ, or the readable value — 1, ½, ⅓, 0, −½, −1 — nearest to it when one lies within
 * the months' range, since rounded figures scatter the months' values). Each month gives μ_h = g(m_h) and σ_h = (g(U_h) − g(L_h))/(2z) (METHODS §4). The
 * months' dependence is "implied" by fitting a local-level structure to how σ_h² widens
 * (METHODS §10; its correlation with the published σ_h as margins; when the fit is poor it falls
 * back to comonotone, the widest, with a note), "independent", "comonotone" (correlation 1: the
 * total's quantiles are the sums of the months' quantiles), or a common correlation. The mean is
 * the sum of the monthly means (exact for λ ≥ 0, the lognormal mean at λ = 0; Taylor for λ < 0,
 * where no exact mean exists); the median and the level% interval come from seeded simulation of
 * the joint normal, back-transformed month by month. The independent and comonotone totals are
 * always reported beside the chosen one.
 * @example publishedTotal([100, 100], [80, 75], [125, 133.3], 80, { dependence: "comonotone" }).median // 200
 */
export function publishedTotal(medians: readonly number[], lowers: readonly number[], uppers: readonly number[], level: number, options: PublishedTotalOptions = {}): PublishedTotal {
  const H = medians.length;
  if (lowers.length !== H || uppers.length !== H) {
    throw new EngineError("input", `medians, lowers and uppers must have one value per month; got ${H} medians, ${lowers.length} lowers and ${uppers.length} uppers.`);
  }
  if (H === 0) throw new EngineError("input", "Give at least one month: medians, lowers and uppers are empty.");
  if (H > 1200) throw new EngineError("input", `At most 1,200 months can be totalled; got ${H}.`);
  const c = requireLevelPercent(level);
  const lambdaOpt = readLambdaOption(options.lambda);
  const dependence = parseDependence(options.dependence);
  const paths = options.paths ?? 20000;
  if (!Number.isInteger(paths) || paths < 100 || paths > 1000000) throw new EngineError("input", `paths must be a whole number from 100 to 1,000,000; got ${paths}.`);
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new EngineError("input", `seed must be a whole number; got ${seed}.`);
  const notes: string[] = [];

  // λ: given, or the median of the months' implied λ
  const implied: (number | null)[] = medians.map((m, i) => {
    try {
      return impliedLambda(m, lowers[i], uppers[i]);
    } catch (e) {
      if (isEngineError(e) && /too lopsided/.test(e.message)) return null;
      throw monthError(e, i);
    }
  });
  let lambda: number;
  let lambdaSource: PublishedTotal["lambdaSource"];
  if (lambdaOpt === "implied") {
    const ok = implied.filter((v): v is number => v !== null);
    if (ok.length === 0) throw new EngineError("input", 'No month\'s interval is symmetric on any Box-Cox scale between -5 and 5, so no λ is implied. Give lambda as a number (0 for a log-scale forecast).');
    const mid = median(ok);
    const lo = Math.min(...ok);
    const hi = Math.max(...ok);
    // a readable λ inside the months' own spread is as consistent with them as their median (rounded figures)
    const readable = READABLE_LAMBDAS.filter((r) => r >= lo && r <= hi).sort((a, b) => Math.abs(a - mid) - Math.abs(b - mid))[0];
    lambda = requireLambda(readable ?? mid);
    lambdaSource = "implied";
    notes.push(readable !== undefined
      ? `λ implied by the intervals: ${fmt(lambda)} (the months' implied λ range from ${fmt(lo)} to ${fmt(hi)}, median ${fmt(mid)}; the readable value ${fmt(lambda)} lies within that range, so it is used).`
      : `λ implied by the intervals: ${fmt(lambda)} (the median of the months' implied λ, which range from ${fmt(lo)} to ${fmt(hi)}).`);
  } else {
    lambda = lambdaOpt;
    lambdaSource = "given";
  }

  // each month on the λ scale
  const meanMethod: PublishedTotal["meanMethod"] = lambda >= 0 ? "exact" : "taylor";
  let meanSum: number | null = 0;
  const months: PublishedMonth[] = medians.map((m, i) => {
    let r;
    try {
      r = meanFromInterval(m, lowers[i], uppers[i], level, lambda, "taylor");
    } catch (e) {
      throw monthError(e, i);
    }
    let mean: number | null;
    try {
      mean = meanMethod === "exact" ? backtransformMeanExact(r.mu, r.sigma, lambda).mean : backtransformMeanTaylor(r.mu, r.sigma, lambda);
    } catch (e) {
      if (!isEngineError(e)) throw e;
      mean = null;
    }
    if (mean === null) meanSum = null;
    else if (meanSum !== null) meanSum += mean;
    return { h: i + 1, median: m, lower: lowers[i], upper: uppers[i], mu: r.mu, sigma: r.sigma, mean, impliedLambda: implied[i], asymmetry: r.asymmetry, consistent: r.consistent };
  });
  if (meanSum !== null && !Number.isFinite(meanSum)) meanSum = null;
  if (meanSum === null) notes.push("The total's mean cannot be represented (a month's mean overflows).");
  if (meanMethod === "taylor") notes.push(`With λ = ${fmt(lambda)} < 0 the exact mean does not exist (the normal reaches the pole); the mean shown is the sum of the Taylor approximations.`);
  const skewed = months.filter((mo) => !mo.consistent).map((mo) => mo.h);
  if (skewed.length) {
    notes.push(`${skewed.length === 1 ? "Month" : "Months"} ${listSteps(skewed)} ${skewed.length === 1 ? "is" : "are"} not symmetric around the median on the λ = ${fmt(lambda)} scale (more than 10% apart); the forecast may have been made on another scale — try lambda "implied".`);
  }

  const mu = months.map((mo) => mo.mu);
  const sd = months.map((mo) => mo.sigma);
  const fit = fitLocalLevelWidening(sd);
  const comonotone = comonotoneTotal(mu, sd, lambda, c);

  let used: PublishedTotal["used"];
  let R: Float64Array | null = null;
  if (dependence === "implied") {
    notes.push(fit.note);
    if (fit.ok) {
      used = fit.alpha === 0 ? "independent" : "local-level";
      if (used === "local-level") R = localLevelCorrelation(fit.alpha, H);
    } else {
      used = "comonotone";
      notes.push("Falling back to comonotone months (correlation 1): the widest total the published intervals allow. Give dependence as a correlation if you know better.");
    }
  } else if (dependence === "independent") used = "independent";
  else if (dependence === "comonotone") used = "comonotone";
  else if (dependence === 1) used = "comonotone";
  else if (dependence === 0) used = "independent";
  else {
    used = "correlation";
    R = new Float64Array(H * H).fill(dependence);
    for (let h = 0; h < H; h++) R[h * H + h] = 1;
  }

  const a = (1 - c) / 2;
  const range = (L: Float64Array | null): { r: TotalRange; mean: number | null; err: number | null } => {
    const s = simulateBacktransformedSum(mu, sd, L, lambda, paths, seed);
    const hi = sortedQuantile(s.totals, 1 - a);
    if (s.unbounded) notes.push(`${s.unbounded} of ${paths} simulated totals are unbounded on the λ = ${fmt(lambda)} scale (past its pole).`);
    return { r: { median: sortedQuantile(s.totals, 0.5), interval: [sortedQuantile(s.totals, a), Number.isFinite(hi) ? hi : null] }, mean: s.mean, err: s.monteCarloError };
  };
  const independent = range(null);
  let chosen: { r: TotalRange; mean: number | null; err: number | null };
  if (used === "independent") chosen = independent;
  else if (used === "comonotone") chosen = { r: comonotone, mean: null, err: null };
  else {
    const L = choleskyLower(R as Float64Array, H);
    if (L === null) throw new EngineError("input", "The months' correlation matrix is not valid (not positive semi-definite). Use a correlation from 0 to 1.");
    chosen = range(L);
  }
  notes.push(used === "comonotone" ? "The total's median and interval are the sums of the months' medians and interval ends (exact under comonotone months)." : `The total's median and interval come from ${paths} simulated paths (seed ${seed}).`);
  return {
    level: c * 100, lambda, lambdaSource, dependence, used, correlation: typeof dependence === "number" ? dependence : null, fit, months,
    mean: meanSum, meanMethod, median: chosen.r.median, interval: chosen.r.interval,
    independent: independent.r, comonotone, simulatedMean: chosen.mean, monteCarloError: chosen.err, paths, seed, notes,
  };
}

/** Under comonotone months every month sits at the same normal quantile, so the total's p-quantile is Σ_h f(μ_h + σ_h z_p). */
function comonotoneTotal(mu: number[], sd: number[], lambda: number, c: number): TotalRange {
  const z = normalQuantile(0.5 + c / 2);
  const sum = (k: number): number | null => {
    let t = 0;
    for (let h = 0; h < mu.length; h++) {
      const r = boxCoxInverseDetailed(mu[h] + k * sd[h], lambda);
      if (r.status === "pole") return null;
      t += r.value;
    }
    return Number.isFinite(t) ? t : null;
  };
  const med = sum(0);
  const lo = sum(-z);
  if (med === null || lo === null) throw new EngineError("domain", `The total of the months' medians or lower ends cannot be represented on the λ = ${fmt(lambda)} scale.`);
  return { median: med, interval: [lo, sum(z)] };
}

function monthError(e: unknown, i: number): unknown {
  if (isEngineError(e)) return new EngineError(e.code, `Month ${i + 1}: ${e.message}`, e.details ? { ...e.details } : undefined);
  return e;
}

function listSteps(hs: number[]): string {
  return hs.length > 8 ? `${hs.slice(0, 8).join(", ")} and ${hs.length - 8} more` : hs.join(", ");
}
