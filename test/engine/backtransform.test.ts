// Back-transformation held to scipy 1.10.1 reference values (scipy.special.inv_boxcox,
// scipy.integrate.quad, via the fixtures), to the closed forms METHODS §4 states, and to
// seeded simulation for the trade's facts.
import fc from "fast-check";
import {
  backtransformMean, backtransformMeanExact, backtransformMeanTaylor, backtransformMedian, backtransformQuantile,
  backtransformQuantileDetailed, boxCox, boxCoxInverse, EngineError, impliedLambda, meanFromInterval, normalQuantile,
} from "../../src/engine";
import { createRandom } from "../../src/engine/_lib/random";
import { check, checks, expectClose, num } from "../helpers/reference";

describe("back-transform on the (μ, σ, λ) grid (source: scipy 1.10.1 backtransform.grid)", () => {
  const c = check("backtransform.grid");
  const tol = c.tolerance;
  for (const e of c.expected) {
    test(`λ=${e.lmbda} μ=${e.mu} σ=${e.sigma}: median, quantiles, Taylor and exact means`, () => {
      expectClose(backtransformMedian(e.mu, e.sigma, e.lmbda), e.median, { rtol: tol.quantile_rtol }, "median");
      for (const [p, q] of Object.entries(e.quantiles)) {
        const ref = num(q as number | string);
        if (Number.isFinite(ref)) {
          expectClose(backtransformQuantile(e.mu, e.sigma, e.lmbda, Number(p)), ref, { rtol: tol.quantile_rtol }, `q${p}`);
        } else {
          // scipy gives inf/nan past the pole; we give an explicit domain error and a "pole" flag.
          expect(() => backtransformQuantile(e.mu, e.sigma, e.lmbda, Number(p))).toThrow(/unbounded/);
          expect(backtransformQuantileDetailed(e.mu, e.sigma, e.lmbda, Number(p)).status).toBe("pole");
        }
      }
      expectClose(backtransformMeanTaylor(e.mu, e.sigma, e.lmbda), e.mean_taylor, { rtol: tol.mean_taylor_rtol }, "taylor");
      if (e.lmbda >= 0) {
        const ex = backtransformMeanExact(e.mu, e.sigma, e.lmbda);
        expectClose(ex.mean, num(e.mean_exact_quad), { rtol: tol.mean_exact_rtol }, "exact");
        if (e.prob_mass_outside_domain !== undefined) {
          expectClose(ex.floorProbability, e.prob_mass_outside_domain, { rtol: 1e-9, atol: 1e-300 }, "floor probability");
        }
      } else {
        // scipy integrates to inf for −1 ≤ λ < 0, and for λ < −1 only over the valid region while the
        // normal still puts mass past the pole (prob_mass_outside_domain > 0). We say the mean does
        // not exist in both cases (METHODS §4) and offer the Taylor value.
        expect(e.mean_exact_quad === "inf" || e.prob_mass_outside_domain > 0).toBe(true);
        try {
          backtransformMeanExact(e.mu, e.sigma, e.lmbda);
          throw new Error("expected an unavailable error");
        } catch (err) {
          expect(err).toBeInstanceOf(EngineError);
          expect((err as EngineError).code).toBe("unavailable");
          expect((err as EngineError).message).toMatch(/does not exist.*Taylor/);
          expectClose((err as EngineError).details?.taylor as number, e.mean_taylor, { rtol: 1e-12 }, "offered taylor");
        }
      }
    });
  }
});

describe("back-transform of published model forecasts (source: statsmodels 0.13.5 ETS / numpy benchmark formulas, via backtransform.* fixtures)", () => {
  for (const c of checks("backtransform.").filter((x) => x.id !== "backtransform.grid")) {
    test(`${c.id}: every step's median, quantiles and means`, () => {
      const lambda = c.inputs.lambda;
      for (const e of c.expected) {
        expectClose(backtransformMedian(e.mu, e.sigma, lambda), e.median, { rtol: 1e-12 }, "median");
        for (const [p, q] of Object.entries(e.quantiles)) {
          expectClose(backtransformQuantile(e.mu, e.sigma, lambda, Number(p)), q as number, { rtol: 1e-12 }, `q${p}`);
        }
        expectClose(backtransformMeanTaylor(e.mu, e.sigma, lambda), e.mean_taylor, { rtol: 1e-12 }, "taylor");
        expectClose(backtransformMeanExact(e.mu, e.sigma, lambda).mean, num(e.mean_exact_quad), { rtol: 1e-9 }, "exact");
      }
    });
  }
});

describe("facts the trade states (METHODS §4)", () => {
  test("for λ = 0 the exact mean is exp(μ + σ²/2) and the Taylor mean exp(μ)(1 + σ²/2)", () => {
    for (const [mu, s] of [[0, 0.3], [4.2, 0.05], [9, 1.2]]) {
      expect(backtransformMeanExact(mu, s, 0).mean).toBeCloseTo(Math.exp(mu + s * s / 2), 8);
      expectClose(backtransformMeanTaylor(mu, s, 0), Math.exp(mu) * (1 + s * s / 2), { rtol: 1e-15 }, "taylor");
    }
  });
  test("a back-transformed point forecast is the median, and back-transformed interval ends keep their coverage (100,000 seeded draws, within 4 binomial s.e.)", () => {
    const rng = createRandom(2026);
    const cases = [[5, 0.4, 0], [3, 0.3, 0.5], [1, 0.1, -0.5]];
    for (const [mu, s, l] of cases) {
      const med = backtransformMedian(mu, s, l);
      const lo = backtransformQuantile(mu, s, l, 0.1);
      const hi = backtransformQuantile(mu, s, l, 0.9);
      const n = 100000;
      let below = 0;
      let inside = 0;
      for (let i = 0; i < n; i++) {
        const y = boxCoxInverse(mu + s * rng.normal(), l);
        if (y <= med) below++;
        if (y >= lo && y <= hi) inside++;
      }
      expect(Math.abs(below / n - 0.5)).toBeLessThan(4 * Math.sqrt(0.25 / n));
      expect(Math.abs(inside / n - 0.8)).toBeLessThan(4 * Math.sqrt(0.16 / n));
    }
  });
});

describe("back-transform properties (fast-check, seeded)", () => {
  const muSigmaLambda = fc.tuple(fc.double({ min: 0.5, max: 8, noNaN: true }), fc.double({ min: 0.01, max: 0.6, noNaN: true }), fc.double({ min: -0.9, max: 2, noNaN: true }));
  test("quantiles increase with p", () => {
    fc.assert(fc.property(muSigmaLambda, fc.double({ min: 0.01, max: 0.98, noNaN: true }), ([mu, s, l], p) => {
      const a = backtransformQuantileDetailed(mu, s, l, p);
      const b = backtransformQuantileDetailed(mu, s, l, p + 0.01);
      return b.value >= a.value;
    }), { seed: 3, numRuns: 2000 });
  });
  test("the Taylor mean is at least the median for λ ≤ 1 and at most for λ > 1", () => {
    fc.assert(fc.property(muSigmaLambda, ([mu, s, l]) => {
      let med: number;
      try { med = backtransformMedian(mu, s, l); } catch { return true; }
      const m = backtransformMeanTaylor(mu, s, l);
      return l <= 1 ? m >= med : m <= med;
    }), { seed: 5, numRuns: 2000 });
  });
  test("the exact mean is at least the median for 0 ≤ λ ≤ 1 and at most for λ > 1 (Jensen)", () => {
    fc.assert(fc.property(fc.double({ min: 2, max: 8, noNaN: true }), fc.double({ min: 0.01, max: 0.5, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true }), (mu, s, l) => {
      const med = backtransformMedian(mu, s, l);
      const m = backtransformMeanExact(mu, s, l).mean;
      return l <= 1 ? m >= med * (1 - 1e-12) : m <= med * (1 + 1e-12);
    }), { seed: 9, numRuns: 300 });
  });
  test("Taylor → exact as σ → 0 (relative gap shrinks like σ⁴)", () => {
    // (λ = ½ and ⅓ are left out: there the inverse is a polynomial and Taylor is already exact.)
    for (const l of [0, 0.25, 1.5]) {
      const gap = (s: number): number => Math.abs(backtransformMeanTaylor(3, s, l) / backtransformMean(3, s, l, "exact") - 1);
      expect(gap(0.01)).toBeLessThan(1e-8);
      expect(gap(0.02) / Math.max(gap(0.01), 1e-300)).toBeGreaterThan(8);
    }
  });
});

describe("a forecast known only by its median and interval (METHODS §4)", () => {
  test("recovers μ and σ of a log-normal forecast and its mean (round trip through the quantiles)", () => {
    const mu = 6, s = 0.25;
    const z = normalQuantile(0.975);
    const r = meanFromInterval(Math.exp(mu), Math.exp(mu - z * s), Math.exp(mu + z * s), 95);
    expectClose(r.mu, mu, { rtol: 1e-14 }, "mu");
    expectClose(r.sigma, s, { rtol: 1e-12 }, "sigma");
    expectClose(r.mean, Math.exp(mu + s * s / 2), { rtol: 1e-12 }, "default (exact) mean");
    expectClose(meanFromInterval(Math.exp(mu), Math.exp(mu - z * s), Math.exp(mu + z * s), 95, 0, "taylor").mean, Math.exp(mu) * (1 + s * s / 2), { rtol: 1e-12 }, "taylor mean");
    expect(r.consistent).toBe(true);
    expectClose(meanFromInterval(Math.exp(mu), Math.exp(mu - z * s), Math.exp(mu + z * s), 95, 0, "exact").mean, Math.exp(mu + s * s / 2), { rtol: 1e-12 }, "exact mean");
  });
  test("flags an interval that is not symmetric on the stated scale", () => {
    const r = meanFromInterval(100, 80, 120, 80, 0);
    expect(r.consistent).toBe(false);
    expect(r.note).toMatch(/not symmetric/);
  });
  test("the implied λ of a log-symmetric interval is 0 and of a symmetric one is 1", () => {
    expect(impliedLambda(100, 50, 200)).toBe(0);
    expectClose(impliedLambda(100, 80, 120), 1, { atol: 1e-10 }, "symmetric");
  });
  test("the implied λ recovers the λ an interval was built with", () => {
    for (const l of [-0.5, 0.25, 0.5, 1.5]) {
      // A median of 100 and a spread of about ±10% on the original scale, built on the λ scale.
      const mu = boxCox(100, l), s = 0.1 * Math.pow(100, l), z = normalQuantile(0.9);
      const inv = (w: number): number => boxCoxInverse(w, l);
      expectClose(impliedLambda(inv(mu), inv(mu - z * s), inv(mu + z * s)), l, { atol: 1e-9 }, `λ=${l}`);
    }
  });
  test("refuses a median outside its interval, naming the order needed", () => {
    expect(() => meanFromInterval(120, 90, 110, 80)).toThrow(/lower < median < upper/);
    expect(() => impliedLambda(100, 120, 110)).toThrow(/lower < median < upper/);
  });
});
