// Forecasting on the transformed scale and back, held to outside references: the benchmark
// formulas computed in numpy (bench.* fixtures), statsmodels 0.13.5 ETS forecasts back-transformed
// by scipy (backtransform.* fixtures), the closed-form variances of Hyndman et al. (2008, Table
// 6.1), and seeded simulation against analytic values.
import {
  backtransformMeanExact, boxCoxInverse, EngineError, fanTable, fitBenchmark, fitForecast, normalCdf, normalQuantile,
  quantileTable, smoothingWithParams, totalForecast, describeForecaster,
} from "../../src/engine";
import { createRandom } from "../../src/engine/_lib/random";
import { check, checks, dataset, expectClose, num } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;

describe("benchmark methods (source: bench.* fixtures, numpy formulas; rtol 1e-12)", () => {
  for (const c of checks("bench.")) {
    const y = dataset(c.dataset.name).map(Math.log);
    const e = c.expected;
    const H = e.horizon.length;
    test(`${c.id}: naive point, σ and standard errors`, () => {
      const f = fitBenchmark(y, "naive", 1).forecast(H);
      expectClose(fitBenchmark(y, "naive", 1).sigma, e.naive.sigma, { rtol: 1e-12 }, "sigma");
      f.forEach((s, i) => {
        expectClose(s.mean, e.naive.point[i], { rtol: 1e-12 }, `point ${i + 1}`);
        expectClose(s.sd, e.naive.se[i], { rtol: 1e-12 }, `se ${i + 1}`);
      });
    });
    test(`${c.id}: drift point, σ (divisor T − 2) and exact standard errors h(1 + h/(T − 1))`, () => {
      const model = fitBenchmark(y, "drift", 1);
      expectClose(model.params.drift, e.drift.drift, { rtol: 1e-12 }, "drift");
      expectClose(model.sigma, e.drift.sigma, { rtol: 1e-12 }, "sigma");
      model.forecast(H).forEach((s, i) => {
        expectClose(s.mean, e.drift.point[i], { rtol: 1e-12 }, `point ${i + 1}`);
        expectClose(s.sd, e.drift.se_exact[i], { rtol: 1e-12 }, `se ${i + 1}`);
        const z = normalQuantile(0.975);
        expectClose(s.mean - z * s.sd, e.drift.pi95_lower_exact[i], { rtol: 1e-12 }, `pi95 low ${i + 1}`);
        expectClose(s.mean + z * s.sd, e.drift.pi95_upper_exact[i], { rtol: 1e-12 }, `pi95 high ${i + 1}`);
      });
    });
    if (e.seasonal_naive) {
      test(`${c.id}: seasonal naive point, σ and standard errors √(k + 1)`, () => {
        const m = e.seasonal_naive.m;
        const model = fitBenchmark(y, "seasonal-naive", m);
        expectClose(model.sigma, e.seasonal_naive.sigma, { rtol: 1e-12 }, "sigma");
        model.forecast(H).forEach((s, i) => {
          expectClose(s.mean, e.seasonal_naive.point[i], { rtol: 1e-12 }, `point ${i + 1}`);
          expectClose(s.sd, e.seasonal_naive.se[i], { rtol: 1e-12 }, `se ${i + 1}`);
        });
      });
    }
  }
  test("mean method: w̄ with σ²(1 + 1/T), σ² the sample variance (METHODS §3 table; common practice)", () => {
    const y = [3, 5, 4, 6, 7];
    const mean = 5;
    const s2 = y.reduce((s, v) => s + (v - mean) ** 2, 0) / 4;
    const f = fitBenchmark(y, "mean", 1).forecast(3);
    for (const s of f) {
      expect(s.mean).toBe(mean);
      expectClose(s.sd, Math.sqrt(s2 * (1 + 1 / 5)), { rtol: 1e-15 }, "sd");
    }
  });
});

describe("series in → fan table out (source: backtransform.* fixtures: statsmodels forecasts, scipy back-transform)", () => {
  for (const c of checks("backtransform.").filter((x: Json) => x.id !== "backtransform.grid")) {
    const from = check(c.inputs.from_check);
    const lambda = c.inputs.lambda;
    const raw = dataset(from.dataset.name);
    const isBench = c.id.startsWith("backtransform.bench.");
    const method = isBench ? "drift" : ({ ANN: "ses", AAN: "holt", AAdN: "damped", AAA: "holt-winters" } as Record<string, string>)[c.id.split(".").pop() as string];
    const period = from.dataset.seasonal_periods ?? 1;
    // Benchmarks are pure formulas (rtol 1e-12); our own ETS fit differs from statsmodels' in the
    // last digits of its parameters, so its forecasts are compared at the fixture's fitted_forecast_rtol.
    const rtol = isBench ? 1e-11 : (from.tolerance.fitted_forecast_rtol as number);
    test(`${c.id}: ${method}, λ = ${lambda}`, () => {
      const f = fitForecast(raw, { method, lambda, period });
      const H = c.expected.length;
      const fan = fanTable(f, H, { levels: [80, 95], mean: "taylor" });
      const exact = fanTable(f, H, { levels: [95], mean: "exact" });
      const byDefault = fanTable(f, H, { levels: [95] });
      const probs = Object.keys(c.expected[0].quantiles).map(Number);
      const qs = quantileTable(f, H, probs);
      c.expected.forEach((e: Json, i: number) => {
        expectClose(fan.rows[i].median.value as number, e.median, { rtol }, `median ${i + 1}`);
        expectClose(fan.rows[i].mean.value as number, e.mean_taylor, { rtol }, `taylor mean ${i + 1}`);
        expectClose(exact.rows[i].mean.value as number, num(e.mean_exact_quad), { rtol: Math.max(rtol, 1e-9) }, `exact mean ${i + 1}`);
        // the default (auto) mean is the exact one wherever it exists (λ ≥ 0; issue 12 §1)
        if (lambda >= 0) expectClose(byDefault.rows[i].mean.value as number, num(e.mean_exact_quad), { rtol: Math.max(rtol, 1e-9) }, `default mean ${i + 1}`);
        expectClose(fan.rows[i].intervals["95"][0].value as number, e.quantiles["0.025"], { rtol }, `95% low ${i + 1}`);
        expectClose(fan.rows[i].intervals["95"][1].value as number, e.quantiles["0.975"], { rtol }, `95% high ${i + 1}`);
        expectClose(fan.rows[i].intervals["80"][0].value as number, e.quantiles["0.1"], { rtol }, `80% low ${i + 1}`);
        probs.forEach((p, j) => expectClose(qs[i][j].value as number, e.quantiles[String(p)], { rtol }, `q${p} ${i + 1}`));
      });
    });
  }
});

describe("closed-form forecast variances (Hyndman et al. 2008, Table 6.1) equal the general state-space formula", () => {
  const rng = createRandom(61);
  const y = Array.from({ length: 60 }, (_, t) => 10 + 0.1 * t + Math.sin(t) + rng.normal());
  const H = 30;
  const m = 4;
  for (let trial = 0; trial < 25; trial++) {
    const alpha = 0.05 + 0.9 * rng.uniform();
    const beta = alpha * rng.uniform();
    const gamma = (1 - alpha) * rng.uniform();
    const x0 = { level: 10, trend: 0.1, season: [0, 0.5, -0.3, 0.2] };
    test(`trial ${trial}: α=${alpha.toFixed(3)} β=${beta.toFixed(3)} γ=${gamma.toFixed(3)}`, () => {
      const cases: [string, (h: number) => number][] = [
        ["ses", (h) => 1 + alpha ** 2 * (h - 1)],
        ["holt", (h) => 1 + (h - 1) * (alpha ** 2 + alpha * beta * h + (beta ** 2 * h * (2 * h - 1)) / 6)],
        ["seasonal-ses", (h) => { const k = Math.floor((h - 1) / m); return 1 + alpha ** 2 * (h - 1) + gamma * k * (2 * alpha + gamma); }],
        ["holt-winters", (h) => { const k = Math.floor((h - 1) / m); return 1 + (h - 1) * (alpha ** 2 + alpha * beta * h + (beta ** 2 * h * (2 * h - 1)) / 6) + gamma * k * (2 * alpha + gamma + beta * m * (k + 1)); }],
      ];
      for (const [method, closed] of cases) {
        const model = smoothingWithParams(y, method as never, m, { alpha, beta, gamma, phi: 1 }, x0);
        const s2 = model.sigma ** 2;
        model.forecast(H).forEach((s) => expectClose(s.sd ** 2 / s2, closed(s.h), { rtol: 1e-11 }, `${method} h=${s.h}`));
      }
    });
  }
});

describe("simulation agrees with the analytic forecast (100,000 seeded paths, within 4 Monte Carlo s.e.)", () => {
  const air = dataset("AirPassengers");
  for (const method of ["naive", "ses"]) {
    test(`${method} on the log scale: per-step means, a quantile, and the total's mean`, () => {
      const f = fitForecast(air, { method, lambda: 0 });
      const H = 6;
      const N = 100000;
      const paths = f.simulate(H, N, 99);
      const steps = f.forecast(H);
      let totalExact = 0;
      const totals = new Float64Array(N);
      steps.forEach((s, j) => {
        const exactMean = backtransformMeanExact(s.mean, s.sd, 0).mean;
        totalExact += exactMean;
        const q90 = boxCoxInverse(s.mean + normalQuantile(0.9) * s.sd, 0);
        let sum = 0, sum2 = 0, below = 0;
        for (let r = 0; r < N; r++) {
          const v = Math.exp(paths[r * H + j]);
          totals[r] += v;
          sum += v; sum2 += v * v;
          if (v <= q90) below++;
        }
        const mean = sum / N;
        const se = Math.sqrt((sum2 / N - mean * mean) / N);
        expect(Math.abs(mean - exactMean)).toBeLessThan(4 * se);
        expect(Math.abs(below / N - 0.9)).toBeLessThan(4 * Math.sqrt(0.09 / N));
      });
      let ts = 0, ts2 = 0;
      for (let r = 0; r < N; r++) { ts += totals[r]; ts2 += totals[r] ** 2; }
      const tm = ts / N;
      expect(Math.abs(tm - totalExact)).toBeLessThan(4 * Math.sqrt((ts2 / N - tm * tm) / N));
    });
  }
  test("the total's reported mean is the sum of the per-step means and the paths agree with it", () => {
    const f = fitForecast(air, { method: "holt-winters", lambda: 0, period: 12 });
    const t = totalForecast(f, 12, { mean: "exact", paths: 20000, seed: 5 });
    const sum = fanTable(f, 12, { mean: "exact" }).rows.reduce((s, r) => s + (r.mean.value as number), 0);
    expectClose(t.mean.value as number, sum, { rtol: 1e-12 }, "sum of means");
    expect(Math.abs((t.simulatedMean as number) - sum)).toBeLessThan(4 * (t.monteCarloError as number));
    expect(t.interval[0]).toBeLessThan(t.median);
    expect(t.median).toBeLessThan(t.interval[1] as number);
  });
});

describe("determinism: same inputs → bit-identical outputs", () => {
  test("fit, fan and total twice in one process", () => {
    const air = dataset("AirPassengers");
    const run = (): string => {
      const f = fitForecast(air, { period: 12 });
      return JSON.stringify([describeForecaster(f), fanTable(f, 24), totalForecast(f, 12, { seed: 3 })]);
    };
    expect(run()).toBe(run());
  });
});

describe("automatic choice by AICc", () => {
  test("auto picks the candidate with the lowest AICc and reports the margin", () => {
    const f = fitForecast(dataset("AirPassengers"), { lambda: 0, period: 12 });
    const cands = f.auto?.candidates ?? [];
    expect(cands.length).toBe(6);
    const best = cands.reduce((a, b) => (b.aicc < a.aicc ? b : a));
    expect(f.method).toBe(best.method);
    const second = cands.filter((c) => c !== best).reduce((a, b) => (b.aicc < a.aicc ? b : a));
    expectClose(f.auto?.margin as number, second.aicc - best.aicc, { rtol: 1e-12 }, "margin");
    expect(f.notes.join(" ")).toMatch(/auto chose/);
  });
  test("a series too short for two seasons is fitted without the seasonal forms, and says so", () => {
    const y = dataset("AirPassengers").slice(0, 20);
    const f = fitForecast(y, { lambda: 0, period: 12 });
    expect(f.auto?.skipped.map((s) => s.method)).toEqual(["seasonal-ses", "holt-winters", "damped-holt-winters"]);
    expect(["ses", "holt", "damped"]).toContain(f.method);
  });
});

describe("bad input gets a clear message", () => {
  const air = dataset("AirPassengers");
  const f = fitForecast(air, { method: "naive", lambda: 0 });
  test("horizon ≤ 0, non-integer, text or absurd", () => {
    expect(() => fanTable(f, 0)).toThrow(/at least 1/);
    expect(() => fanTable(f, 2.5)).toThrow(/whole number/);
    expect(() => fanTable(f, "12" as unknown as number)).toThrow(/the text "12"/);
    expect(() => fanTable(f, 10 * 144 + 1)).toThrow(/more than 10 times/);
  });
  test("period < 1 or non-integer", () => {
    expect(() => fitForecast(air, { period: 0 })).toThrow(/period/);
    expect(() => fitForecast(air, { period: 1.5 })).toThrow(/period/);
  });
  test("a seasonal method without a period, or with fewer than two full seasons", () => {
    expect(() => fitForecast(air, { method: "holt-winters" })).toThrow(/give the period/);
    expect(() => fitForecast(air.slice(0, 20), { method: "holt-winters", period: 12 })).toThrow(/two full seasons \(24 values/);
  });
  test("a series too short for the method says how many values it needs", () => {
    expect(() => fitForecast([5, 6, 7], { method: "damped", lambda: 0 })).toThrow(/needs at least \d+ values/);
  });
  test("interior blanks are missing observations (too many are refused, naming the rows); leading and trailing ones are trimmed and reported", () => {
    expect(() => fitForecast([null, 5, null, 6, null, 7, 8], { method: "naive", lambda: 0, label: "Millbrook" })).toThrow(/Millbrook has 2 missing values among its 6 periods \(33%, rows 3, 5\)/);
    expect(fitForecast([null, 5, 6, null, 7, 8, 9, 8], { method: "naive", lambda: 0, label: "Millbrook" }).missing).toBe(1);
    const g = fitForecast([null, null, 5, 6, 7, 8, null], { method: "naive", lambda: 0 });
    expect(g.n).toBe(4);
    expect(g.notes.join(" ")).toMatch(/2 leading blanks skipped.*1 trailing blank skipped/);
  });
  test("a constant series gives a degenerate fan (σ = 0), not NaN, and says so", () => {
    const c = fitForecast([7, 7, 7, 7, 7, 7], {});
    const fan = fanTable(c, 3);
    expect(fan.rows.every((r) => r.median.value === 7 && r.mean.value === 7 && r.intervals["95"][1].value === 7)).toBe(true);
    expect(c.notes.join(" ")).toMatch(/constant/);
    expect(totalForecast(c, 3).mean.value).toBe(21);
  });
  test("zeros for Box-Cox, an unknown method or λ", () => {
    expect(() => fitForecast([5, 0, 6, 7, 8], { method: "naive" })).toThrow(/1 zero/);
    expect(() => fitForecast(air, { method: "holt_winters" })).toThrow(/Use one of: mean, naive/);
    expect(() => fitForecast(air, { lambda: "log" })).toThrow(/Unknown lambda "log"/);
    expect(() => fitForecast(air, { lambda: 9 })).toThrow(/between -5 and 5/);
  });
  test("values that overflow after back-transform become a per-cell note, never Infinity", () => {
    const big = fitForecast([700, 705, 702, 708, 706, 709], { method: "naive", lambda: "none" });
    // On λ = 1e-14 ≈ 0 the same numbers would be logs of astronomically large values:
    const g = fitForecast([1e300, 1e301, 1e302, 1e303, 1e304, 1e305], { method: "drift", lambda: 0 });
    const fan = fanTable(g, 12);
    const last = fan.rows[11];
    expect(last.median.value === null || Number.isFinite(last.median.value)).toBe(true);
    expect(last.intervals["95"][1].value).toBeNull();
    expect(last.intervals["95"][1].note).toMatch(/unbounded|too large/);
    expect(fanTable(big, 2).rows[0].median.value).toBe(709);
  });
  test("levels outside (0, 100), as a fraction, or text that is not numbers", () => {
    expect(() => fanTable(f, 3, { levels: [100] })).toThrow(/between 0 and 100/);
    expect(() => fanTable(f, 3, { levels: "0.8" })).toThrow(/in percent/);
    expect(() => fanTable(f, 3, { levels: "abc" })).toThrow(/"abc" is not a number/);
    expect(fanTable(f, 3, { levels: "95;80" }).levels).toEqual([80, 95]);
  });
  test("probabilities of 0 or 1", () => {
    expect(() => quantileTable(f, 3, [0, 0.5])).toThrow(/between 0 and 1/);
    expect(() => quantileTable(f, 3, [1])).toThrow(/between 0 and 1/);
  });
  test("the exact mean for λ < 0 is a per-cell 'does not exist' note, with Taylor still available", () => {
    const g = fitForecast(air, { method: "naive", lambda: -0.5 });
    const ex = fanTable(g, 2, { mean: "exact" });
    expect(ex.rows[0].mean.value).toBeNull();
    expect(ex.rows[0].mean.note).toMatch(/does not exist/);
    expect(fanTable(g, 2).rows[0].mean.value).toBeGreaterThan(0);
    expect(normalCdf(0)).toBe(0.5);
  });
  test("an EngineError is what every message comes as", () => {
    expect(() => fitForecast([], {})).toThrow(EngineError);
  });
});
