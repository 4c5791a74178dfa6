// λ under the forecasting model (issue 12 §2; METHODS §7): the original-scale likelihood with the
// Jacobian (Box & Cox 1964), the `model` profile interval, the `auto` rule, and the invariants
// every face relies on. Outside references: test/fixtures/lambda-model/make_lambda_model.py
// (mpmath densities by numerical differentiation of the CDF; scipy boxcox_normmax / boxcox).
import * as fs from "fs";
import * as path from "path";
import {
  createRandom, fitForecast, fitLambda, fitLambdaForModel, makeTransform, originalScaleFit, profileModelLambda, screenSeries, smoothingWithParams,
} from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ref: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "lambda-model", "lambda-model.json"), "utf8"));

describe("original-scale log-likelihood: ℓ(w) + (λ − 1)Σ ln y equals the density of y computed directly (mpmath 1.2.1: d/dy of the CDF, make_lambda_model.py)", () => {
  const air = dataset(ref.density.dataset);
  for (const c of ref.density.cases) {
    test(`${c.method}, λ = ${c.lambda}, fixed parameters`, () => {
      const t = makeTransform("box-cox", c.lambda);
      const w = air.map((v) => (c.lambda === 0 ? Math.log(v) : (v ** c.lambda - 1) / c.lambda));
      const p = c.params;
      const m = smoothingWithParams(w, c.method, 1, { alpha: p.alpha, beta: p.beta ?? 0, gamma: 0, phi: 1 }, { level: p.level0, trend: p.trend0 ?? 0, season: [0] });
      expectClose(originalScaleFit(m, air, t, false).loglik, c.loglik_y, { rtol: 1e-9 }, "ℓ(y)");
    });
  }
});

describe("AICc on the original scale compares across λ", () => {
  const air = dataset("AirPassengers");
  test("at λ = 1 (given) the Jacobian vanishes: AICc equals the untransformed fit's (Box & Cox 1964: w = y − 1 is a shift)", () => {
    for (const method of ["ses", "holt", "naive", "drift"]) {
      const one = fitForecast(air, { method, lambda: 1 });
      const none = fitForecast(air, { method, lambda: "none" });
      expectClose(one.fit?.aicc as number, none.fit?.aicc as number, { rtol: 1e-8 }, `${method} AICc`);
      expectClose(one.fit?.loglik as number, none.fit?.loglik as number, { rtol: 1e-8 }, `${method} loglik`);
    }
  });
  test("auto's (λ, form) beats every readable λ for that form: same parameter count, so the highest original-scale ℓ (the rule as stated in METHODS §7)", () => {
    const f = fitForecast(air, { period: 12 });
    expect(f.lambdaSource).toBe("auto");
    for (const l of [1, 0.5, 1 / 3, 0, -0.5, -1]) {
      const g = fitForecast(air, { period: 12, method: f.method, lambda: l });
      expect(f.fit?.loglik as number).toBeGreaterThanOrEqual((g.fit?.loglik as number) - 1e-9);
    }
  });
});

describe("the bound case (scipy 1.10.1 boxcox_normmax(method='mle') and boxcox(alpha=0.05), unbounded; series made with λ = 3)", () => {
  const b = ref.bound;
  test("mle widens past the default [−1, 2] and reports scipy's λ̂ and interval, which rejects λ = 1", () => {
    const f = fitLambda(b.values, { method: "mle" });
    expectClose(f.lambda, b.lambda_normmax, { atol: 1e-4 }, "λ̂");
    expectClose(f.interval[0] as number, b.ci95[0], { atol: 1e-4 }, "ci low");
    expectClose(f.interval[1] as number, b.ci95[1], { atol: 1e-4 }, "ci high");
    expect(f.note).toMatch(/widened/);
    expect(f.interval[0] as number).toBeGreaterThan(1);
  });
});

describe("`model` λ: its likelihood-ratio interval covers the true λ at about its nominal 95% (seeded simulation)", () => {
  // 100 series per λ; with true coverage 0.95 the observed share has s.e. √(0.95·0.05/100) ≈ 0.022,
  // so the check allows 3 s.e. below (0.885) — a one-sided binomial check (common practice).
  for (const [lambda, level0, sigma] of [[0, 5, 0.08], [0.5, 20, 0.6]]) {
    test(`λ = ${lambda}: simple smoothing (α = 0.4), n = 60`, () => {
      const rng = createRandom(1200 + lambda * 10);
      let covered = 0;
      const reps = 100;
      for (let r = 0; r < reps; r++) {
        let l = level0;
        const y: number[] = [];
        for (let t = 0; t < 60; t++) {
          const e = sigma * rng.normal();
          const w = l + e;
          l += 0.4 * e;
          y.push(lambda === 0 ? Math.exp(w) : (1 + lambda * w) ** (1 / lambda));
        }
        const m = profileModelLambda(y, "ses");
        const [lo, hi] = m.interval;
        if ((lo === null || lo <= lambda) && (hi === null || lambda <= hi)) covered++;
      }
      expect(covered / reps).toBeGreaterThanOrEqual(0.885);
    });
  }
});

describe("invariants on every fixture dataset (issue 12 §4)", () => {
  const sets: [string, number][] = [["AirPassengers", 12], ["UKgas", 4], ["nile", 1], ["lynx", 1], ["airmiles", 1], ["copper_worldconsumption", 1], ["macrodata_realgdp", 4], ["elnino", 12]];
  for (const [name, period] of sets) {
    test(`${name}: screen suggests the λ auto uses; each printed interval contains its printed λ`, () => {
      const y = dataset(name);
      const auto = fitForecast(y, { period });
      const s = screenSeries(y, { period });
      expect(s.suggestedLambda).toBe(auto.lambda);
      const a = fitLambdaForModel(y, { period });
      expect(a.lambda).toBe(auto.lambda);
      for (const c of [a, fitLambda(y, { method: "mle", period })]) {
        const [lo, hi] = c.interval;
        if (lo !== null) expect(lo).toBeLessThanOrEqual(c.lambda);
        if (hi !== null) expect(hi).toBeGreaterThanOrEqual(c.lambda);
      }
      expect(fitLambda(y, { method: "guerrero", period }).interval).toEqual([null, null]);
    });
  }
});
