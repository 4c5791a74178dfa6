// Simulated sample paths and simulated totals held to closed forms:
//  - every model's paths have, step by step, the mean and variance of its analytic forecast
//    distribution (the state-space moments of Hyndman, Koehler, Ord & Snyder 2008, eqs. 6.1–6.2,
//    themselves checked against statsmodels in ets.test.ts; the benchmark variance rules of
//    METHODS §3, checked against numpy in forecast.test.ts; ARIMA's Kalman-filter forecast moments,
//    checked against statsmodels SARIMAX in the ARIMA tests);
//  - with no transform the mean method's total is exactly normal: Σ_h (ȳ + e + ε_h) with
//    e ~ N(0, σ²/T) shared and ε_h ~ N(0, σ²) fresh gives N(H·ȳ, σ²(H + H²/T)) (sum of normals,
//    common practice);
//  - a total over one step is that step's forecast, so its interval is the step's interval.
// Monte Carlo tolerances are 5 standard errors of the estimate in question: the mean's σ/√N, the
// sample variance's σ²·√(2/(N − 1)) for normal draws, a p-quantile's √(p(1 − p)/N)/density
// (asymptotic normality of sample quantiles, common practice). Seeds are fixed, so a pass is stable.
import {
  boxCox, fanTable, fitBenchmark, fitForecast, normalQuantile, smoothingWithParams, totalForecast,
} from "../../src/engine";
import type { FittedModel } from "../../src/engine";
import type { SmoothingMethod } from "../../src/engine/models/methods";
import { dataset, expectClose } from "../helpers/reference";

/** Standard normal density (the definition). */
const phi = (z: number): number => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);

/** An invented, strongly trending quarterly series with a season (the Quillmere kiosk; invented). */
const m = 4;
const season = [0, 6, -4, 2];
const trending = Array.from({ length: 40 }, (_, t) => 100 + 5 * t + season[t % m] + 0.8 * Math.sin(1.7 * t));

/** Per-step sample mean and variance of row-major paths (paths × H). */
function stepMoments(paths: Float64Array, N: number, H: number): { mean: number[]; variance: number[] } {
  const mean: number[] = [];
  const variance: number[] = [];
  for (let j = 0; j < H; j++) {
    let s = 0;
    for (let r = 0; r < N; r++) s += paths[r * H + j];
    const mu = s / N;
    let ss = 0;
    for (let r = 0; r < N; r++) ss += (paths[r * H + j] - mu) ** 2;
    mean.push(mu);
    variance.push(ss / (N - 1));
  }
  return { mean, variance };
}

function expectPathsMatchMoments(model: Pick<FittedModel, "forecast" | "simulate">, H: number, what: string): void {
  const N = 20000;
  const paths = model.simulate(H, N, 2024);
  expect(paths.length).toBe(N * H);
  const sim = stepMoments(paths, N, H);
  model.forecast(H).forEach((s, j) => {
    const v = s.sd ** 2;
    const seMean = s.sd / Math.sqrt(N);
    const seVar = v * Math.sqrt(2 / (N - 1));
    const okMean = Math.abs(sim.mean[j] - s.mean) <= 5 * seMean;
    const okVar = Math.abs(sim.variance[j] - v) <= 5 * seVar;
    if (!okMean || !okVar) {
      throw new Error(`${what} step ${j + 1}: simulated mean ${sim.mean[j]} vs analytic ${s.mean} (5 s.e. = ${5 * seMean}); simulated variance ${sim.variance[j]} vs analytic ${v} (5 s.e. = ${5 * seVar})`);
    }
  });
}

describe("every model's simulated paths have its analytic per-step means and variances (Hyndman et al. 2008, eqs. 6.1–6.2; METHODS §3; 20,000 paths, 5 Monte Carlo s.e.)", () => {
  const H = 2 * m + 3; // past two seasons, so the seasonal lags wrap
  for (const method of ["mean", "naive", "drift", "seasonal-naive"] as const) {
    test(`${method} (benchmark rules of METHODS §3) on a strongly trending series, no transform`, () => {
      expectPathsMatchMoments(fitForecast(trending, { method, lambda: "none", period: m }), H, method);
    });
  }
  // Fixed parameters (no estimation), chosen so each component matters: a large final trend
  // (≈ 5 per step) makes a trend damped twice, or not at all, show at once.
  const p = { alpha: 0.45, beta: 0.2, gamma: 0.25, phi: 0.85 };
  const x0 = { level: 100, trend: 5, season: season.slice() };
  for (const method of ["ses", "holt", "damped", "seasonal-ses", "holt-winters", "damped-holt-winters"] as SmoothingMethod[]) {
    test(`${method} with α=${p.alpha}, β=${p.beta}, γ=${p.gamma}, φ=${p.phi} on a strongly trending series`, () => {
      expectPathsMatchMoments(smoothingWithParams(trending, method, m, p, x0), H, method);
    });
  }
  test("the fitted damped and Holt models on a strongly trending series (a trend near 5 per step)", () => {
    for (const method of ["damped", "holt", "damped-holt-winters"]) {
      const f = fitForecast(trending, { method, lambda: "none", period: m });
      expectPathsMatchMoments(f, H, `fitted ${method}`);
    }
  });
  for (const method of ["arima:1,1,0", "arima:0,1,1/0,1,1", "arima:2,0,0+c", "arima:0,1,0+c"]) {
    test(`${method} (fitted, no transform): paths against the Kalman-filter forecast moments`, () => {
      expectPathsMatchMoments(fitForecast(trending, { method, lambda: "none", period: m }), H, method);
    });
  }
  test("seasonal naive reads exactly the last season (paths start from y_{T−m+j}; METHODS §3)", () => {
    const model = fitBenchmark(trending, "seasonal-naive", m);
    const T = trending.length;
    const paths = model.simulate(m, 2000, 3);
    const sim = stepMoments(paths, 2000, m);
    sim.mean.forEach((mu, j) => expect(Math.abs(mu - trending[T - m + j])).toBeLessThan(5 * model.sigma / Math.sqrt(2000)));
  });
});

describe("the mean method's total with no transform is exactly N(H·ȳ, σ²(H + H²/T)) (sum of normals, common practice)", () => {
  // Invented weekly footfall of a Quillmere shop (invented data).
  const y = [212, 198, 230, 205, 221, 189, 240, 215, 208, 226, 199, 232, 218, 204, 227, 211, 195, 236, 209, 223];
  const T = y.length;
  const ybar = y.reduce((s, v) => s + v, 0) / T;
  const s2 = y.reduce((s, v) => s + (v - ybar) ** 2, 0) / (T - 1); // sample variance (METHODS §3 table)
  const f = fitForecast(y, { method: "mean", lambda: "none" });
  const N = 100000;
  for (const [H, level] of [[12, 90], [5, 95], [30, 80]] as const) {
    test(`H = ${H}, ${level}% interval: mean, median, interval ends, simulated mean and its standard error`, () => {
      const S = Math.sqrt(s2 * (H + (H * H) / T));
      const t = totalForecast(f, H, { level, paths: N, seed: 11 });
      expect(t.horizon).toBe(H);
      expectClose(t.mean.value as number, H * ybar, { rtol: 1e-12 }, "mean = H·ȳ");
      const a = (1 - level / 100) / 2;
      const z = normalQuantile(1 - a); // checked against mpmath in distribution.test.ts
      const seQ = (p: number): number => (Math.sqrt((p * (1 - p)) / N) / phi(normalQuantile(p))) * S;
      expectClose(t.median, H * ybar, { atol: 5 * seQ(0.5) }, "median");
      expectClose(t.interval[0], H * ybar - z * S, { atol: 5 * seQ(a) }, "low end");
      expectClose(t.interval[1] as number, H * ybar + z * S, { atol: 5 * seQ(a) }, "high end");
      expectClose(t.simulatedMean as number, H * ybar, { atol: (5 * S) / Math.sqrt(N) }, "simulated mean");
      // the Monte Carlo standard error of a mean of N totals is S/√N (the sample sd is within 2% of S)
      expectClose(t.monteCarloError as number, S / Math.sqrt(N), { rtol: 0.02 }, "Monte Carlo standard error");
    });
  }
});

describe("a total over one step is that step's forecast: same median and interval (common practice: a sum of one term)", () => {
  const air = dataset("AirPassengers");
  const N = 100000;
  for (const [method, lambda, level] of [["holt-winters", 0, 80], ["drift", 0.5, 95], ["ses", 0, 50]] as const) {
    test(`${method}, λ = ${lambda}, ${level}%: compared on the transformed scale`, () => {
      const f = fitForecast(air, { method, lambda, period: 12 });
      const t = totalForecast(f, 1, { level, paths: N, seed: 5 });
      const step = fanTable(f, 1, { levels: [level] }).rows[0];
      const a = (1 - level / 100) / 2;
      const seQ = (p: number): number => (Math.sqrt((p * (1 - p)) / N) / phi(normalQuantile(p))) * step.sd;
      const w = (x: number): number => boxCox(x, lambda);
      const [lo, hi] = step.intervals[String(level)];
      expectClose(w(t.interval[0]), w(lo.value as number), { atol: 5 * seQ(a) }, "low end");
      expectClose(w(t.interval[1] as number), w(hi.value as number), { atol: 5 * seQ(a) }, "high end");
      expectClose(w(t.median), w(step.median.value as number), { atol: 5 * seQ(0.5) }, "median");
      expectClose(t.mean.value as number, step.mean.value as number, { rtol: 1e-12 }, "mean");
    });
  }
});

describe("the total sums exactly steps 1..H (linearity of expectation, common practice)", () => {
  const f = fitForecast(dataset("airmiles"), { method: "drift", lambda: "none" });
  const fan = fanTable(f, 8);
  for (const H of [1, 2, 5, 8]) {
    test(`H = ${H}: the mean is the sum of the first H step means and the paths add H steps`, () => {
      const t = totalForecast(f, H, { paths: 20000, seed: 9 });
      const sum = fan.rows.slice(0, H).reduce((s, r) => s + (r.mean.value as number), 0);
      expect(t.horizon).toBe(H);
      expectClose(t.mean.value as number, sum, { rtol: 1e-12 }, "Σ means");
      // the paths' total has that mean too (drift, no transform: the total is normal)
      expect(Math.abs((t.simulatedMean as number) - sum)).toBeLessThan(5 * (t.monteCarloError as number));
      // and one step more or less would be far off
      expect(Math.abs((t.simulatedMean as number) - sum)).toBeLessThan(0.05 * (fan.rows[0].mean.value as number));
    });
  }
});
