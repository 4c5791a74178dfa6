// Missing observations inside a series (METHODS §8). Exponential smoothing with gaps is held to two
// outside references made by test/fixtures/missing/make_missing.py (numpy 1.24, statsmodels 0.13.5):
// the joint-normal density of the observed points computed directly from the model's
// moving-average form, and statsmodels' own Kalman filter (plus SARIMAX(0,1,1) for simple
// smoothing, SARIMAX(0,2,2) for Holt). The benchmarks with gaps are checked against values worked by hand below.
import * as fs from "fs";
import * as path from "path";
import { backtest, cleanSeries, describeForecaster, fitBenchmark, fitForecast, fitLambda, lambdaGuerrero, guerreroObjective, totalForecast, MAX_MISSING_SHARE } from "../../src/engine";
import { fitSmoothing, smoothingWithParams, Smoothing, InitialStates } from "../../src/engine/models/ets";
import { concentrateWithGaps, filterWithGaps, gapStates, gapWorkspace } from "../../src/engine/models/ets-gaps";
import type { SmoothingMethod } from "../../src/engine/models/methods";
import { expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;
const FIXTURE: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "missing", "missing.json"), "utf8"));
const seriesOf = (c: Json): number[] => c.y.map((v: number | null) => (v === null ? NaN : v));

describe("smoothing with gaps equals the joint-normal density of the observed points (numpy, direct; rtol 1e-9)", () => {
  for (const c of FIXTURE.cases) {
    test(`${c.id}: log-likelihood, σ², forecast means and variances`, () => {
      const model = smoothingWithParams(seriesOf(c), c.method as SmoothingMethod, c.period, c.params as Smoothing, c.x0 as InitialStates);
      const e = c.direct;
      expect(model.missing).toBe(c.y.filter((v: number | null) => v === null).length);
      expectClose(model.loglik, e.loglik, { rtol: 1e-9 }, "loglik");
      expectClose(model.sigma ** 2, e.sigma2, { rtol: 1e-9 }, "sigma^2");
      model.forecast(c.horizon).forEach((s, i) => {
        expectClose(s.mean, e.mean[i], { rtol: 1e-9 }, `mean h=${i + 1}`);
        expectClose(s.sd ** 2, e.variance[i], { rtol: 1e-9 }, `variance h=${i + 1}`);
      });
    });
  }
});

describe("smoothing with gaps equals statsmodels 0.13.5's Kalman filter (error carried in the state; SARIMAX(0,1,1) for ses, SARIMAX(0,2,2) for holt)", () => {
  for (const c of FIXTURE.cases) {
    for (const ref of ["statsmodels_kalman", "statsmodels_sarimax"]) {
      if (!c[ref]) continue;
      test(`${c.id} vs ${ref}`, () => {
        const model = smoothingWithParams(seriesOf(c), c.method as SmoothingMethod, c.period, c.params as Smoothing, c.x0 as InitialStates);
        expectClose(model.loglik, c[ref].loglik, { rtol: 1e-9 }, "loglik");
        model.forecast(c.horizon).forEach((s, i) => {
          expectClose(s.mean, c[ref].mean[i], { rtol: 1e-9 }, `mean h=${i + 1}`);
          expectClose(s.sd ** 2, c[ref].variance[i], { rtol: 1e-9 }, `variance h=${i + 1}`);
        });
      });
    }
  }
});

describe("through a gap the state's uncertainty grows (METHODS §8)", () => {
  test("a gap just before the end adds P̃_T to every forecast variance (worked by hand for simple smoothing)", () => {
    const c = FIXTURE.cases.find((x: Json) => x.id === "ses.gap-before-end");
    const model = smoothingWithParams(seriesOf(c), "ses", 1, c.params, c.x0);
    const s2 = model.sigma ** 2;
    const a = c.params.alpha;
    // period 11 missing: P̃ = 0 → α²; period 12 observed: P̃ ← P̃(1 − α)²/(1 + P̃) (the scalar filter of METHODS §8)
    const pT = (a * a * (1 - a) ** 2) / (1 + a * a);
    model.forecast(4).forEach((s, i) => {
      // Hyndman et al. (2008) Table 6.1, A,N,N with a known final state: σ²(1 + α²(h − 1)); the gap adds σ²P̃_T
      const known = s2 * (1 + a * a * i);
      expect(s.sd ** 2).toBeGreaterThan(known);
      expectClose(s.sd ** 2, known + s2 * pT, { rtol: 1e-12 }, `variance h=${i + 1}`);
    });
  });

  test("simulated paths start from N(x̂_T, σ²P̃_T): their per-step mean and variance match the forecast (Monte Carlo, 40,000 paths)", () => {
    for (const id of ["ses.gap-before-end", "holt-winters.gaps", "damped.gaps"]) {
      const c = FIXTURE.cases.find((x: Json) => x.id === id);
      const model = smoothingWithParams(seriesOf(c), c.method, c.period, c.params, c.x0);
      const H = c.horizon;
      const paths = 40000;
      const sims = model.simulate(H, paths, 7);
      model.forecast(H).forEach((s, j) => {
        let m = 0;
        for (let r = 0; r < paths; r++) m += sims[r * H + j];
        m /= paths;
        let v = 0;
        for (let r = 0; r < paths; r++) v += (sims[r * H + j] - m) ** 2;
        v /= paths - 1;
        // 5 Monte Carlo standard errors: mean σ/√N, variance σ²√(2/N)
        expect(Math.abs(m - s.mean)).toBeLessThan((5 * s.sd) / Math.sqrt(paths));
        expect(Math.abs(v / s.sd ** 2 - 1)).toBeLessThan(5 * Math.sqrt(2 / paths));
      });
    }
  });
});

describe("with nothing missing the gap filter is the ordinary recursion (so today's results stand)", () => {
  const c = FIXTURE.cases.find((x: Json) => x.id === "holt-winters.gaps");
  const y = seriesOf(c).map((v, i) => (Number.isNaN(v) ? 20 + 0.3 * i : v));
  const shape = { trend: true, damped: false, seasonal: true, m: 4 };

  test("the Kalman filter on a complete series gives the complete-data likelihood and residuals", () => {
    const a = smoothingWithParams(y, "holt-winters", 4, c.params, c.x0);
    const r = filterWithGaps(y, shape, c.params, c.x0);
    expect(r.nObs).toBe(y.length);
    expect(Array.from(r.P).every((v) => v === 0)).toBe(true);
    expectClose(r.sse / y.length, a.sigma ** 2, { rtol: 1e-12 }, "sigma^2");
    r.residuals.forEach((e, t) => expectClose(e, a.residuals[t], { rtol: 1e-9, atol: 1e-12 }, `residual ${t}`));
  });

  test("the weighted least-squares initial states equal the complete-data least-squares ones", () => {
    const fit = fitSmoothing(y, "holt-winters", 4);
    const p = { alpha: fit.params.alpha, beta: fit.params.beta, gamma: fit.params.gamma, phi: 1 };
    const ws = gapWorkspace(y, shape);
    const r = concentrateWithGaps(y, shape, p, ws);
    const x0 = gapStates(ws, shape);
    expectClose(x0.level, fit.params.level0, { rtol: 1e-8 }, "level0");
    expectClose(x0.trend, fit.params.trend0, { rtol: 1e-8, atol: 1e-10 }, "trend0");
    for (let j = 1; j < 4; j++) expectClose(x0.season[j], fit.params[`season${j + 1}`], { rtol: 1e-8, atol: 1e-10 }, `season${j + 1}`);
    expectClose(r.sse / y.length, fit.sigma ** 2, { rtol: 1e-9 }, "sigma^2");
    expect(r.sumLogS).toBe(0);
  });
});

describe("fitting with gaps (maximum likelihood of the observed points)", () => {
  test("the fit reaches at least the likelihood of the parameters that generated the series, and its states are the concentrated optimum", () => {
    for (const c of FIXTURE.cases) {
      const y = seriesOf(c);
      const fit = fitSmoothing(y, c.method, c.period);
      const atTruth = smoothingWithParams(y, c.method, c.period, c.params, c.x0);
      expect(fit.loglik).toBeGreaterThanOrEqual(atTruth.loglik - 1e-9);
      expect(fit.missing).toBeGreaterThan(0);
      // moving the fitted initial level either way lowers the likelihood
      const p = { alpha: fit.params.alpha, beta: fit.params.beta ?? 0, gamma: fit.params.gamma ?? 0, phi: fit.params.phi ?? 1 };
      const season = Array.from({ length: c.period }, (_, j) => fit.params[`season${j + 1}`] ?? 0);
      const x0 = { level: fit.params.level0, trend: fit.params.trend0 ?? 0, season };
      const here = smoothingWithParams(y, c.method, c.period, p, x0).loglik;
      expectClose(here, fit.loglik, { rtol: 1e-12 }, "refit at the fitted values");
      for (const dl of [-0.05, 0.05]) expect(smoothingWithParams(y, c.method, c.period, p, { ...x0, level: x0.level + dl }).loglik).toBeLessThan(here);
      // AICc counts the observed points only
      const nObs = y.length - fit.missing;
      expectClose(fit.aicc, -2 * fit.loglik + 2 * fit.k + (2 * fit.k * (fit.k + 1)) / (nObs - fit.k - 1), { rtol: 1e-12 }, "AICc");
    }
  });
});

describe("benchmarks with gaps use what is observed (values worked by hand)", () => {
  // invented series; positions 2 and 7 missing
  const y = [10, 12, NaN, 15, 16, 18, 17, NaN, 21, 22];

  test("naive: the last observed value; a difference over d periods counts as d shocks", () => {
    const f = fitBenchmark(y, "naive", 1);
    // squares: 2², 3²/2, 1², 2², 1², 4²/2, 1² → 23.5 over 7 differences
    const s2 = 23.5 / 7;
    expect(f.missing).toBe(2);
    expectClose(f.sigma ** 2, s2, { rtol: 1e-12 }, "sigma^2");
    f.forecast(3).forEach((s, i) => {
      expect(s.mean).toBe(22);
      expectClose(s.sd ** 2, (i + 1) * s2, { rtol: 1e-12 }, "variance");
    });
    expectClose(f.loglik, -3.5 * (Math.log(2 * Math.PI * (23.5 / 7)) + 1) - Math.log(2), { rtol: 1e-12 }, "loglik");
  });

  test("drift: the slope over the true time span, (22 − 10)/9", () => {
    const f = fitBenchmark(y, "drift", 1);
    expectClose(f.params.drift, 4 / 3, { rtol: 1e-12 }, "drift");
    // (Δ − c·d)²/d: 4/9, 1/18, 1/9, 4/9, 49/9, 8/9, 1/9 → 7.5, over 7 − 1
    expectClose(f.sigma ** 2, 1.25, { rtol: 1e-12 }, "sigma^2");
    f.forecast(4).forEach((s, i) => {
      const h = i + 1;
      expectClose(s.mean, 22 + (4 * h) / 3, { rtol: 1e-12 }, "mean");
      expectClose(s.sd ** 2, 1.25 * h * (1 + h / 9), { rtol: 1e-12 }, "variance");
    });
  });

  test("mean: the mean of the 8 observed values", () => {
    const f = fitBenchmark(y, "mean", 1);
    const obs = [10, 12, 15, 16, 18, 17, 21, 22];
    const mean = 131 / 8;
    const s2 = obs.reduce((s, v) => s + (v - mean) ** 2, 0) / 7;
    expect(f.forecast(1)[0].mean).toBeCloseTo(16.375, 12);
    expectClose(f.forecast(2)[1].sd ** 2, s2 * (1 + 1 / 8), { rtol: 1e-12 }, "variance");
  });

  test("seasonal naive (period 4): the last observed value in each season, k seasons back", () => {
    const f = fitBenchmark(y, "seasonal-naive", 4);
    // seasonal differences: 16 − 10, 18 − 12, 21 − 16, 22 − 18 (the others have a gap with nothing before)
    const s2 = (36 + 36 + 25 + 16) / 4;
    expectClose(f.sigma ** 2, s2, { rtol: 1e-12 }, "sigma^2");
    const expected = [[17, 1], [15, 2], [21, 1], [22, 1], [17, 2], [15, 3]];
    f.forecast(6).forEach((s, i) => {
      expect(s.mean).toBe(expected[i][0]);
      expectClose(s.sd ** 2, expected[i][1] * s2, { rtol: 1e-12 }, `variance h=${i + 1}`);
    });
    // simulated paths: the step from two seasons back has twice the variance (Monte Carlo, 40,000 paths)
    const paths = 40000;
    const sims = f.simulate(6, paths, 3);
    for (const j of [1, 5]) {
      let m = 0;
      for (let r = 0; r < paths; r++) m += sims[r * 6 + j];
      m /= paths;
      let v = 0;
      for (let r = 0; r < paths; r++) v += (sims[r * 6 + j] - m) ** 2;
      v /= paths - 1;
      expect(Math.abs(v / (expected[j][1] * s2) - 1)).toBeLessThan(5 * Math.sqrt(2 / paths));
    }
  });
});

describe("λ on the observed points", () => {
  test("Guerrero (Guerrero 1993) skips a window with a missing point and equals the objective without that window", () => {
    const y = [3, 4, 6, 5, NaN, 9, 8, 11, 12, 10, 15, 17];
    const withGap = guerreroObjective(y, 2);
    expect(withGap.groups).toBe(5);
    expect(withGap.skipped).toBe(1);
    const without = guerreroObjective([3, 4, 6, 5, 8, 11, 12, 10, 15, 17], 2);
    for (const l of [-0.5, 0, 0.5, 1]) expectClose(withGap.cv(l), without.cv(l), { rtol: 1e-14 }, `cv(${l})`);
    const g = lambdaGuerrero(y, { window: 2 });
    expect(g.skipped).toBe(1);
  });

  test("maximum likelihood (Box & Cox 1964, i.i.d.) uses the observed values only", () => {
    const y = [3, 4, 6, 5, NaN, 9, 8, 11, 12, 10, 15, 17];
    const a = fitLambda(y, { method: "mle" });
    const b = fitLambda(y.filter((v) => !Number.isNaN(v)), { method: "mle" });
    expect(a.lambda).toBe(b.lambda);
    expect(a.missing).toBe(1);
    expect(a.n).toBe(11);
  });

  test("Guerrero with too few usable windows says how many were usable and what to use instead", () => {
    expect(lambdaGuerrero([3, NaN, 6, 5, NaN, 9, 8, 11], { window: 2 }).groups).toBe(2);
    expect(() => lambdaGuerrero([3, NaN, 6, NaN, 5, NaN, 9, 8], { window: 2 })).toThrow(/only 1 of its 4 windows of 2.*"mle"/);
  });
});

describe("how a missing observation is represented and reported", () => {
  test("cleanSeries: NaN at the place of an interior blank, with a count and the rows (common practice: equally spaced periods)", () => {
    const c = cleanSeries([null, 3, null, 5, 6, "", 7, 8, 9, 10, 11, 12, null], "Millbrook", 2);
    expect(c.values).toEqual([3, NaN, 5, 6, NaN, 7, 8, 9, 10, 11, 12]);
    expect(c.missing).toBe(2);
    expect(c.missingRows).toEqual([4, 7]);
    expect(c.leadingBlanks).toBe(1);
    expect(c.trailingBlanks).toBe(1);
  });

  test("zeros as missing: interior zeros become NaN, leading zeros are trimmed", () => {
    const c = cleanSeries([0, 5, 6, 0, 7, 8, 9, 10], "Old Quay", 1, { zeros: "missing" });
    expect(c.values).toEqual([5, 6, NaN, 7, 8, 9, 10]);
    expect(c.zerosAsMissing).toBe(2);
    expect(c.leadingBlanks).toBe(1);
  });

  test("every forecaster says how many were missing: the field, a note, and the MODELINFO row", () => {
    const cells = [112, 118, 132, 129, null, 135, 148, 148, 136, 119, 104, 118, 115, 126, 141, 135, 125, 149, 170, 170];
    const f = fitForecast(cells, { method: "holt", lambda: 0, label: "Harbour Street", firstRow: 3 });
    expect(f.missing).toBe(1);
    expect(f.model?.missing).toBe(1);
    expect(f.notes.join(" ")).toMatch(/1 missing observation inside the series \(row 7\) of 20 periods/);
    expect(describeForecaster(f)).toContainEqual(["missing", 1]);
    const t = totalForecast(f, 6, { paths: 2000 });
    expect(Number.isFinite(t.median) && Number.isFinite(t.interval[0])).toBe(true);
    expect(f.forecast(6).every((s) => Number.isFinite(s.mean) && Number.isFinite(s.sd))).toBe(true);
  });

  test("auto fits every smoothing model with gaps and reports the winner's missing count", () => {
    const base = [41, 35, 52, 60, 44, 38, 55, 64, 47, 40, 58, 67, 49, 43, 61, 70, 52, 46, 64, 73];
    const cells: (number | null)[] = base.slice();
    cells[6] = null;
    cells[13] = null;
    const f = fitForecast(cells, { period: 4, lambda: 0 });
    expect(f.missing).toBe(2);
    expect(f.auto?.candidates.length).toBe(6);
    expect(f.model?.missing).toBe(2);
  });
});

describe("backtest with gaps (rolling origin, Tashman 2000)", () => {
  test("an origin whose last period is missing is skipped and counted; a missing actual is not scored", () => {
    // invented series, 30 periods, two missing
    const cells: (number | null)[] = Array.from({ length: 30 }, (_, t) => 50 + t + ((t * 13) % 7));
    cells[20] = null;
    cells[25] = null;
    const b = backtest(cells, 2, { method: "naive", lambda: 0, first: 18 });
    // origins after 18..29 values: the one after 21 values ends on period 21 (missing), likewise after 26
    expect(b.gapOrigins).toBe(2);
    // step 1 is scored at origins whose next period is observed: 12 origins − 2 skipped − 2 with a missing actual
    expect(b.rows[0].origins).toBe(8);
    expect(b.rows.every((r) => r.coverage === null || Number.isFinite(r.coverage))).toBe(true);
  });
});

describe("bad input with gaps gets a message with the numbers and what to do", () => {
  test("a half-missing series", () => {
    const cells = [10, null, 12, null, 11, null, 13, null, 12, null, 14, 15];
    expect(MAX_MISSING_SHARE).toBe(0.2);
    expect(() => fitForecast(cells, { method: "ses", lambda: 0, label: "Millbrook" })).toThrow(/Millbrook has 5 missing values among its 12 periods \(42%, rows 2, 4, 6, 8, 10\); at most 20% may be missing/);
  });

  test("a seasonal series with a whole season missing", () => {
    // invented monthly series, 3 years; every March missing (3 of 36: within the share)
    const cells: (number | null)[] = Array.from({ length: 36 }, (_, t) => 100 + t + 20 * Math.sin((2 * Math.PI * t) / 12) + ((t * 7) % 5));
    for (const i of [2, 14, 26]) cells[i] = null;
    expect(() => fitForecast(cells, { method: "holt-winters", period: 12, lambda: 0 })).toThrow(/at least one observation in every season.*position 3 of the 12-period season \(periods 3, 15, 27/);
    expect(() => fitForecast(cells, { method: "seasonal-naive", period: 12, lambda: 0 })).toThrow(/seasonal-naive needs an observed value in every season/);
    // auto leaves the seasonal forms out and says why in its skipped list
    const f = fitForecast(cells, { period: 12, lambda: 0 });
    expect(f.auto?.skipped.map((s) => s.method)).toEqual(["seasonal-ses", "holt-winters", "damped-holt-winters"]);
  });

  test("the last value missing (a closing zero read as missing)", () => {
    const cells = [10, 12, 11, 13, 12, 14, 15, 0];
    expect(() => fitForecast(cells, { method: "naive", lambda: 0, zeros: "missing", label: "Old Quay" })).toThrow(/The last value of Old Quay is missing: row 8 is a zero, read as missing, after the last observed value \(row 7\)/);
  });

  test("an interior text cell is still refused, and the message says a blank marks a missing value", () => {
    expect(() => cleanSeries([3, "closed", 5], "Millbrook")).toThrow(/text \("closed"\) in row 2.*empty the cell to mark a missing observation/);
  });
});
