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
  let resid: number[];
  let nParams: number;
  let params: Record<string, number>;
  let drift = 0;
  let mean = 0;
  if (method === "mean") {
    for (const v of y) mean += v;
    mean /= T;
    resid = y.map((v) => v - mean);
    nParams = 1;
    params = { mean };
  } else if (method === "naive") {
    resid = y.slice(1).map((v, i) => v - y[i]);
    nParams = 0;
    params = {};
  } else if (method === "drift") {
    drift = (y[T - 1] - y[0]) / (T - 1);
    resid = y.slice(1).map((v, i) => v - y[i] - drift);
    nParams = 1;
    params = { drift };
  } else {
    resid = y.slice(m).map((v, i) => v - y[i]);
    nParams = 0;
    params = {};
  }
  const sse = resid.reduce((s, e) => s + e * e, 0);
  const dof = resid.length - nParams;
  if (dof < 1) throw new EngineError("input", `${method} needs more values to estimate its spread; the series has ${T}.`);
  const sigma2 = sse / dof;
  const nr = resid.length;
  const loglik = -0.5 * nr * (Math.log((2 * Math.PI * Math.max(sse, 1e-300)) / nr) + 1);
  const k = nParams + 1;
  const aicc = -2 * loglik + 2 * k + (2 * k * (k + 1)) / Math.max(nr - k - 1, 1e-9);
  const last = y[T - 1];

  const point = (h: number): number => {
    if (method === "mean") return mean;
    if (method === "naive") return last;
    if (method === "drift") return last + h * drift;
    const k2 = Math.floor((h - 1) / m);
    return y[T + h - m * (k2 + 1) - 1];
  };
  const factor = (h: number): number => {
    if (method === "mean") return 1 + 1 / T;
    if (method === "naive") return h;
    if (method === "drift") return h * (1 + h / (T - 1));
    return Math.floor((h - 1) / m) + 1;
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
        // the mean is estimated: one shared error of variance σ²/T, plus a fresh shock each step
        const shared = (sigma / Math.sqrt(T)) * rng.normal();
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
          const prev = j >= m ? out[o + j - m] : y[T - m + j];
          out[o + j] = prev + sigma * shock(r, j);
        }
      }
    }
    return out;
  };
  return Object.freeze({
    method,
    title: TITLES[method],
    n: T,
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
