// Duan's smearing mean (Duan 1983, JASA 78:605–610): against a direct numpy/scipy computation
// (test/fixtures/totals/make_totals.py → totals.json, numpy 1.24.2 / scipy 1.10.1
// scipy.special.inv_boxcox), and against the exact lognormal mean exp(μ + σ²/2) when the residuals
// are a large normal sample.
import * as fs from "fs";
import * as path from "path";
import { createRandom, EngineError, smearingMean } from "../../src/engine";
import { expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fx: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "totals", "totals.json"), "utf8")).smearing;

describe("smearing mean against numpy: mean(inv_boxcox(mu + e, lam)) for skewed residuals", () => {
  for (const c of fx.cases as { mu: number; lambda: number; mean: number }[]) {
    test(`mu ${c.mu}, λ ${Number(c.lambda.toFixed(4))}`, () => {
      const r = smearingMean(c.mu, fx.residuals, c.lambda);
      expectClose(r.mean, c.mean, { rtol: 1e-13 }, "smearing mean");
      expect(r.n).toBe(fx.residuals.length);
    });
  }
});

test("with 200,000 normal residuals (sd 0.5) the smearing mean equals the lognormal mean exp(μ + σ²/2) within 4 standard errors", () => {
  const rng = createRandom(2026);
  const n = 200000;
  const sigma = 0.5;
  const mu = 3;
  const e = Array.from({ length: n }, () => sigma * rng.normal());
  const r = smearingMean(mu, e, 0);
  const terms = e.map((x) => Math.exp(mu + x));
  const m = terms.reduce((s, x) => s + x, 0) / n;
  const se = Math.sqrt(terms.reduce((s, x) => s + (x - m) ** 2, 0) / (n - 1) / n);
  expect(Math.abs(r.mean - Math.exp(mu + (sigma * sigma) / 2))).toBeLessThan(4 * se);
});

test("λ > 0: terms below −1/λ count as the floor 0, and are counted", () => {
  const r = smearingMean(0, [-3, 1], 0.5); // w = −3 is below −1/λ = −2
  expect(r.floored).toBe(1);
  expectClose(r.mean, (0 + 1.5 ** 2) / 2, { rtol: 1e-14 }, "(0 + (1 + 0.5·1)²)/2");
});

describe("bad input says what to fix", () => {
  test("a residual that reaches the pole of λ < 0", () => {
    expect(() => smearingMean(1, [0.5, 1.5], -0.5)).toThrow(EngineError);
    expect(() => smearingMean(1, [0.5, 1.5], -0.5)).toThrow(/does not exist here: with λ = -0.5, mu 1 plus 1 of the 2 residuals reaches the pole at 2/);
  });
  test("fewer than two residuals", () => {
    expect(() => smearingMean(1, [0.1], 0)).toThrow(/at least 2 residuals; got 1/);
  });
  test("a residual that is not a number", () => {
    expect(() => smearingMean(1, [0.1, NaN], 0)).toThrow(/residual 2 must be a finite number/);
  });
});
