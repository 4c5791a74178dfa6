// The benchmark methods with their exact variance rules (METHODS §3 table):
//   mean: w̄, σ_h² = σ̂²(1 + 1/T);  naive: w_T, hσ̂²;  seasonal naive: w_{T+h−m(k+1)}, (k+1)σ̂²;
//   drift: w_T + h(w_T − w_1)/(T − 1), σ̂²·h(1 + h/(T − 1)).
// σ̂² is the mean square of the one-step residuals with divisor (residuals − estimated parameters).
import { EngineError } from "../errors";
import { createRandom } from "../_lib/random";
import type { BenchmarkMethod } from "./methods";
import type { FittedModel, StepMoments } from "./types";

const TITLES: Record<BenchmarkMethod, string> = {
  mean: "mean of the history",
  naive: "naive (random walk)",
  "seasonal-naive": "seasonal naive",
  drift: "random walk with drift",
};

/** Smallest series each benchmark accepts. */
export function benchmarkMinimumLength(method: BenchmarkMethod, period: number): number {
  if (method === "seasonal-naive") return 2 * period;
  if (method === "drift") return 3;
  return 2;
}

/**
 * Fits a benchmark method on the transformed scale (no estimation beyond a mean or a drift).
 * Sources: the variance rules are derived in METHODS §3 (random walk: h i.i.d. shocks; drift: plus
 * h times the drift estimate's error, variance σ²/(T − 1); seasonal naive: one shock per season).
 * Missing observations (NaN; the first and last values must be observed) use what is observed:
 * mean — the mean of the observed values, σ_h² = σ̂²(1 + 1/n_obs); naive — a difference over d
 * periods is the sum of d shocks, so σ̂² = Σ(Δ²/d)/(number of differences); drift — the slope over
 * the true time span, (w_T − w_1)/(T − 1) (also the maximum-likelihood slope: Δ ~ N(c·d, dσ²)), its
 * variance σ²/(T − 1) as before, σ̂² from (Δ − c·d)²/d; seasonal naive — the last observed value in
 * the step's season, k seasons back, σ_h² = kσ̂².
 * @example fitBenchmark([1, 2, 4, 7], "naive", 1).forecast(2)[1].sd // σ̂·√2
 */
export function fitBenchmark(y: readonly number[], method: BenchmarkMethod, period: number): FittedModel {
  const T = y.length;
  const m = method === "seasonal-naive" ? period : 1;
  if (method === "seasonal-naive" && period < 2) {
    throw new EngineError("input", "seasonal-naive needs a period of at least 2 (12 for monthly data, 4 for quarterly).");
  }
  const need = benchmarkMinimumLength(method, m);
  if (T < need) throw new EngineError("input", `${method} needs at least ${need} values; the series has ${T}.`);
  const isMissing = (t: number): boolean => Number.isNaN(y[t]);
  if (isMissing(0) || isMissing(T - 1)) throw new EngineError("input", `${method} needs the first and last values observed; ${isMissing(T - 1) ? "the last" : "the first"} is missing. Trim the series to its observed ends.`);
  let missing = 0;
  for (let t = 0; t < T; t++) if (isMissing(t)) missing++;
  const nObs = T - missing;
  // resid: aligned to the end of the series as without gaps (NaN where there is none); gaps: the
  // number of periods (or seasons) each residual's difference spans, for the likelihood.
  let resid: number[];
  let nParams: number;
  let params: Record<string, number>;
  let drift = 0;
  let mean = 0;
  let sumLogSpan = 0;
  /** Previous observed time in the same season as t (lag `lag`), or −1. */
  const previous = (t: number, lag: number): number => {
    for (let u = t - lag; u >= 0; u -= lag) if (!isMissing(u)) return u;
    return -1;
  };
  const differences = (lag: number, slope: number): number[] => y.slice(lag).map((v, i) => {
    const t = i + lag;
    if (isMissing(t)) return NaN;
    const u = previous(t, lag);
    if (u < 0) return NaN;
    const d = (t - u) / lag;
    if (d > 1) sumLogSpan += Math.log(d);
    return (v - y[u] - slope * d) / Math.sqrt(d);
  });
  if (method === "mean") {
    for (let t = 0; t < T; t++) if (!isMissing(t)) mean += y[t];
    mean /= nObs;
    resid = y.map((v) => v - mean);
    nParams = 1;
    params = { mean };
  } else if (method === "naive") {
    resid = differences(1, 0);
    nParams = 0;
    params = {};
  } else if (method === "drift") {
    drift = (y[T - 1] - y[0]) / (T - 1);
    resid = differences(1, drift);
    nParams = 1;
    params = { drift };
  } else {
    resid = differences(m, 0);
    nParams = 0;
    params = {};
  }
  // seasonal naive: the last observed value of each season position, and its time
  const lastInSeason = new Array<number>(m).fill(-1);
  if (method === "seasonal-naive") {
    for (let t = T - 1; t >= Math.max(0, T - m); t--) lastInSeason[t % m] = isMissing(t) ? previous(t, m) : t;
    const empty = lastInSeason.findIndex((t) => t < 0);
    if (empty >= 0) {
      const pos = (empty - (T % m) + m) % m;
      throw new EngineError("input", `seasonal-naive needs an observed value in every season; the season of forecast step ${pos + 1} (every ${m}th period) has none. Fill one of its values, or use another method.`);
    }
  }
  let sse = 0;
  let nr = 0;
  for (const e of resid) {
    if (Number.isNaN(e)) continue;
    sse += e * e;
    nr++;
  }
  const dof = nr - nParams;
  if (dof < 1) throw new EngineError("input", `${method} needs more values to estimate its spread; the series has ${nObs} observed${missing ? ` (${missing} missing)` : ""}.`);
  const sigma2 = sse / dof;
  // Gaussian log-likelihood of the residuals with σ² at its maximum; a difference over d periods
  // has variance dσ², hence the −½Σ ln d (0 without gaps).
  const loglik = -0.5 * nr * (Math.log((2 * Math.PI * Math.max(sse, 1e-300)) / nr) + 1) - 0.5 * sumLogSpan;
  const k = nParams + 1;
  const aicc = -2 * loglik + 2 * k + (2 * k * (k + 1)) / Math.max(nr - k - 1, 1e-9);
  const last = y[T - 1];

  /** The seasonal naive's source for step h: the last observed time in that season, and how many seasons back. */
  const seasonalSource = (h: number): { t: number; seasons: number } => {
    const t = lastInSeason[(T - 1 + h) % m];
    return { t, seasons: (T - 1 + h - t) / m };
  };
  const point = (h: number): number => {
    if (method === "mean") return mean;
    if (method === "naive") return last;
    if (method === "drift") return last + h * drift;
    return y[seasonalSource(h).t];
  };
  const factor = (h: number): number => {
    if (method === "mean") return 1 + 1 / nObs;
    if (method === "naive") return h;
    if (method === "drift") return h * (1 + h / (T - 1));
    return seasonalSource(h).seasons;
  };
  const forecast = (H: number): StepMoments[] => {
    const out: StepMoments[] = [];
    for (let h = 1; h <= H; h++) out.push({ h, mean: point(h), sd: Math.sqrt(sigma2 * factor(h)) });
    return out;
  };
  const simulate = (H: number, paths: number, seed: number, shocks?: Float64Array): Float64Array => {
    const rng = createRandom(seed);
    // one-step innovations: given (correlated across series) or drawn here
    const shock = shocks ? (r: number, j: number): number => shocks[r * H + j] : (): number => rng.normal();
    const sigma = Math.sqrt(sigma2);
    const out = new Float64Array(paths * H);
    for (let r = 0; r < paths; r++) {
      const o = r * H;
      if (method === "mean") {
        // the mean is estimated: one shared error of variance σ²/n_obs, plus a fresh shock each step
        const shared = (sigma / Math.sqrt(nObs)) * rng.normal();
        for (let j = 0; j < H; j++) out[o + j] = mean + shared + sigma * shock(r, j);
      } else if (method === "naive" || method === "drift") {
        // drift: the estimate's own error (variance σ²/(T − 1)) is drawn once per path
        const c = method === "drift" ? drift + (sigma / Math.sqrt(T - 1)) * rng.normal() : 0;
        let w = last;
        for (let j = 0; j < H; j++) {
          w += c + sigma * shock(r, j);
          out[o + j] = w;
        }
      } else {
        for (let j = 0; j < H; j++) {
          if (j >= m) {
            out[o + j] = out[o + j - m] + sigma * shock(r, j);
          } else {
            // from the season's last observed value: one shock per season since then
            const src = seasonalSource(j + 1);
            out[o + j] = y[src.t] + sigma * Math.sqrt(src.seasons) * shock(r, j);
          }
        }
      }
    }
    return out;
  };
  return Object.freeze({
    method,
    title: TITLES[method],
    n: T,
    missing,
    period: m,
    params: Object.freeze(params),
    sigma: Math.sqrt(sigma2),
    loglik,
    aicc,
    k,
    residuals: Object.freeze(resid),
    forecast,
    simulate: (H: number, paths: number, seed: number): Float64Array => simulate(H, paths, seed),
    simulateShocks: (H: number, paths: number, seed: number, shocks: Float64Array): Float64Array => simulate(H, paths, seed, shocks),
  });
}
