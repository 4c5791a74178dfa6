// The mean a user sees (issue 12 §1; METHODS §4, §9): exact where it exists, Taylor with its
// accuracy stated where it does not. References: mpmath 1.2.1 quadrature and a numpy Monte Carlo
// of the fitted model, made by test/fixtures/mean/make_mean.py (output committed as mean.json).
import * as fs from "fs";
import * as path from "path";
import {
  backtransformMean, backtransformMeanExact, backtransformMeanTaylor, fanTable, fitForecast, forecastMean, makeTransform, totalForecast,
} from "../../src/engine";
import { expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ref: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "mean", "mean.json"), "utf8"));

describe("the exact mean on a (μ, σ, λ ≥ 0) grid (source: mpmath 1.2.1 quadrature at 50 digits, make_mean.py)", () => {
  for (const g of ref.grid) {
    test(`λ = ${g.lambda}, μ = ${g.mu}, σ = ${g.sigma}`, () => {
      expectClose(backtransformMeanExact(g.mu, g.sigma, g.lambda).mean, g.mean, { rtol: 1e-11 }, "exact mean");
      expectClose(backtransformMean(g.mu, g.sigma, g.lambda), g.mean, { rtol: 1e-11 }, "default (auto) mean");
      expectClose(forecastMean(makeTransform("box-cox", g.lambda), g.mu, g.sigma).value as number, g.mean, { rtol: 1e-11 }, "forecastMean");
    });
  }
  test("tiny λ (1e-13): the exact mean stays above the median, as the lognormal's does (log1p/expm1 forms)", () => {
    const m = backtransformMeanExact(5, 1, 1e-13).mean;
    expect(m).toBeGreaterThan(Math.exp(5));
    expectClose(m, Math.exp(5.5), { rtol: 1e-11 }, "close to the λ = 0 closed form");
  });
});

describe("the sunspot case (statsmodels sunspots yearly + 1, naive, λ = 0, 12 steps)", () => {
  const s = ref.sunspots;
  const f = fitForecast(s.values, { method: "naive", lambda: 0 });
  test("σ² matches the naive method's residual variance computed in numpy", () => {
    expectClose((f.model as { sigma: number }).sigma ** 2, s.sigma2, { rtol: 1e-12 }, "σ²");
  });
  test("the default mean of every step is the exact lognormal mean exp(w_T + hσ²/2) (numpy/mpmath)", () => {
    const t = fanTable(f, s.horizon);
    t.rows.forEach((r, i) => expectClose(r.mean.value as number, s.step_exact_means[i], { rtol: 1e-12 }, `step ${r.h}`));
    expect(t.meanMethod).toBe("auto");
    expect(t.rows.every((r) => r.meanDetail.used === "exact")).toBe(true);
  });
  test("the default total is ≈ 211 (exact), not the Taylor 106.9; `taylor` still gives it, with a caution", () => {
    const t = totalForecast(f, s.horizon);
    expectClose(t.mean.value as number, s.total_exact_mean, { rtol: 1e-12 }, "total (auto)");
    expect(t.mean.value).toBeGreaterThan(210);
    expect(t.meanUsed).toBe("exact");
    const tt = totalForecast(f, s.horizon, { mean: "taylor" });
    expectClose(tt.mean.value as number, s.total_taylor_mean, { rtol: 1e-12 }, "total (taylor)");
    expect(tt.meanAccuracy).toMatch(/Taylor approximation and may be far off/);
    expect(tt.notes.join(" ")).toMatch(/Taylor/);
  });
  test("the default total lies within 4 standard errors of an outside Monte Carlo of the fitted random walk (numpy, 10⁶ paths)", () => {
    const t = totalForecast(f, s.horizon);
    const mc = s.monte_carlo;
    expect(Math.abs((t.mean.value as number) - mc.mean)).toBeLessThanOrEqual(4 * mc.se);
  });
  test("the engine's own simulated total agrees with its default mean within 4 Monte Carlo standard errors", () => {
    const t = totalForecast(f, s.horizon, { paths: 200000, seed: 7 });
    expect(Math.abs((t.mean.value as number) - (t.simulatedMean as number))).toBeLessThanOrEqual(4 * (t.monteCarloError as number));
  });
});

describe("λ < 0: no exact mean; Taylor with its accuracy (METHODS §9)", () => {
  const t = makeTransform("box-cox", -0.5);
  test("auto gives the Taylor value, quietly when the correction is small and nothing lies past the pole", () => {
    const m = forecastMean(t, 1.5, 0.01);
    expect(m.used).toBe("taylor");
    expect(m.value).toBeCloseTo(backtransformMeanTaylor(1.5, 0.01, -0.5), 12);
    expect(m.accuracy).toBeNull();
  });
  test("a caution when the correction exceeds 5% of the median or more than 0.1% lies past the pole (stated thresholds)", () => {
    const m = forecastMean(t, 1.5, 0.3);
    expect(m.used).toBe("taylor");
    expect(m.poleProbability).toBeGreaterThan(0.001);
    expect(m.accuracy).toMatch(/past the pole/);
  });
  test("exact asked for: no value, and the Taylor value offered by name", () => {
    const m = forecastMean(t, 1.5, 0.1, "exact");
    expect(m.value).toBeNull();
    expect(m.note).toMatch(/mean "taylor" or "auto"/);
  });
  test("fan and total use one rule: the same steps are flagged in both", () => {
    const y = Array.from({ length: 40 }, (_, i) => 20 + 8 * Math.sin(i) + i * 0.3);
    const f = fitForecast(y, { method: "naive", lambda: -1 });
    const fan = fanTable(f, 30);
    const tot = totalForecast(f, 30);
    const flagged = fan.rows.filter((r) => r.meanDetail.accuracy !== null).length;
    expect(flagged).toBeGreaterThan(0);
    expect(fan.notes.some((n) => n.startsWith("Mean at step"))).toBe(true);
    expect(tot.meanAccuracy).toBe(fan.notes.find((n) => n.startsWith("Mean at step")));
  });
  test("total with mean exact at λ < 0 offers the total's Taylor value, not one step's", () => {
    const y = Array.from({ length: 40 }, (_, i) => 20 + 8 * Math.sin(i) + i * 0.3);
    const f = fitForecast(y, { method: "naive", lambda: -1 });
    const exact = totalForecast(f, 6, { mean: "exact" });
    const taylor = totalForecast(f, 6, { mean: "taylor" });
    expect(exact.mean.value).toBeNull();
    const offered = Number(/\(([-\d.e+]+)\)\.?$/.exec(exact.mean.note as string)?.[1]);
    expectClose(offered, taylor.mean.value as number, { rtol: 1e-5 }, "offered Taylor total");
  });
});
