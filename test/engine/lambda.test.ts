// λ selection held to scipy 1.10.1 / statsmodels 0.13.5 reference values (test/fixtures).
import { boxCoxLogLik, fitLambda, lambdaGuerrero, lambdaMle, readableLambda, EngineError } from "../../src/engine";
import { guerreroObjective } from "../../src/engine/transform/guerrero";
import { check, checks, dataset, expectClose } from "../helpers/reference";

describe("Box-Cox maximum likelihood λ (source: scipy.stats.boxcox_normmax / boxcox / boxcox_llf)", () => {
  for (const c of checks("lambda.mle.")) {
    const name = c.dataset.name as string;
    const e = c.expected;
    test(`${name}: λ, log-likelihood and 95% interval match scipy`, () => {
      const x = dataset(name);
      expect(x.length).toBe(e.n);
      // Widen the bounds so scipy's unbounded optimum is reachable for every dataset.
      const r = lambdaMle(x, { lower: -3, upper: 3 });
      expectClose(r.lambda, e.lambda_boxcox_normmax, { atol: c.tolerance.lambda_abs }, "lambda");
      expectClose(r.loglik, e.llf_at_lambda, { rtol: c.tolerance.llf_rtol }, "llf at lambda");
      expectClose(r.interval[0] as number, e.ci95[0], { atol: c.tolerance.ci_abs }, "ci low");
      expectClose(r.interval[1] as number, e.ci95[1], { atol: c.tolerance.ci_abs }, "ci high");
    });
    test(`${name}: profile log-likelihood on the grid matches scipy.stats.boxcox_llf (rtol 1e-12)`, () => {
      const x = dataset(name);
      for (const [l, v] of Object.entries(e.llf_grid)) {
        expectClose(boxCoxLogLik(x, Number(l)), v as number, { rtol: 1e-12 }, `llf(${l})`);
      }
    });
  }

  test("with the default bounds [-1, 2] the estimate is the same when scipy's optimum lies inside", () => {
    for (const c of checks("lambda.mle.")) {
      const l = c.expected.lambda_boxcox_normmax;
      if (l > -1 && l < 2) {
        const r = lambdaMle(dataset(c.dataset.name));
        expectClose(r.lambda, l, { atol: 1e-6 }, c.id);
        expect(r.onBound).toBeNull();
      }
    }
  });

  test("statsmodels' bounded 'loglik' estimate agrees (source: statsmodels BoxCox._est_lambda, abs 1e-4)", () => {
    for (const c of checks("lambda.loglik.")) {
      const r = lambdaMle(dataset(c.dataset.name));
      expectClose(r.lambda, c.expected.lambda_statsmodels, { atol: 1e-4 }, c.id);
      expectClose(r.lambda, c.expected.lambda_tight, { atol: 1e-6 }, `${c.id} tight`);
    }
  });

  test("an estimate on a bound is never used silently: fitLambda widens the search and measures the interval from the true maximum (source: scipy.stats.boxcox_normmax / boxcox(alpha=0.05), unbounded)", () => {
    // Strongly right-skewed data want λ well below 0; bounds [0, 2] force the lower bound.
    const x = dataset("UKgas");
    const r = lambdaMle(x, { lower: 0, upper: 2 });
    expect(r.onBound).toBe("lower");
    const f = fitLambda(x, { method: "mle", lower: 0, upper: 2 });
    expect(f.note).toMatch(/search was widened/);
    const e = check("lambda.mle.UKgas").expected;
    expectClose(f.lambda, e.lambda_boxcox_normmax, { atol: 1e-5 }, "λ at the true maximum");
    expectClose(f.interval[0] as number, e.ci95[0], { atol: 1e-4 }, "ci low");
    expectClose(f.interval[1] as number, e.ci95[1], { atol: 1e-4 }, "ci high");
  });
});

describe("Guerrero's λ (source: statsmodels 0.13.5 BoxCox._est_lambda(method='guerrero'))", () => {
  for (const c of checks("lambda.guerrero.")) {
    const name = c.dataset.name as string;
    for (const [key, v] of Object.entries(c.expected) as [string, any][]) { // eslint-disable-line @typescript-eslint/no-explicit-any
      if (v.scale !== "sd") continue;
      test(`${name} ${key}: λ matches lambda_tight (abs 1e-6) and statsmodels (abs 1e-4)`, () => {
        const x = dataset(name);
        const r = lambdaGuerrero(x, { window: v.window_length });
        expect(r.groups).toBe(v.groups);
        expect(r.dropped).toBe(v.dropped_leading_obs);
        expectClose(r.lambda, v.lambda_tight, { atol: 1e-6 }, "lambda_tight");
        expectClose(r.lambda, v.lambda_statsmodels_default_options, { atol: 1e-4 }, "lambda statsmodels");
        expectClose(r.cv, v.cv_at_tight, { rtol: 1e-9 }, "cv at optimum");
      });
      test(`${name} ${key}: the objective on the grid matches statsmodels' _guerrero_cv (rtol 1e-12)`, () => {
        const obj = guerreroObjective(dataset(name), v.window_length);
        for (const [l, cv] of Object.entries(v.cv_at)) expectClose(obj.cv(Number(l)), cv as number, { rtol: 1e-12 }, `cv(${l})`);
      });
    }
  }

  test("the default window is 2 and fitLambda uses the period as the window", () => {
    const x = dataset("AirPassengers");
    const g = check("lambda.guerrero.AirPassengers").expected.window12_sd;
    const f = fitLambda(x, { period: 12 });
    expect(f.method).toBe("guerrero");
    expect(f.window).toBe(12);
    // Guerrero's λ has no likelihood, so no likelihood interval is shown beside it (issue 12 §2).
    expect(f.interval).toEqual([null, null]);
    expectClose(f.lambda, g.lambda_tight, { atol: 1e-6 }, "lambda");
    expect(lambdaGuerrero([1, 2, 3, 5, 4, 6]).window).toBe(2);
  });

  test("Guerrero refuses a series shorter than two windows, saying how many values it needs", () => {
    expect(() => lambdaGuerrero([1, 2, 3, 4, 5], { window: 4 })).toThrow(/at least 8/);
  });
});

describe("readable λ (common practice: round to 1, ½, ⅓, 0, −½, −1 inside the interval)", () => {
  test("picks the nearest readable value inside the interval", () => {
    expect(readableLambda(0.148, [-0.238, 0.534])).toBe(0);
    expect(readableLambda(0.3, [0.2, 0.45])).toBeCloseTo(1 / 3, 15);
    expect(readableLambda(0.9, [0.6, 1.3])).toBe(1);
  });
  test("keeps λ itself when no readable value lies inside", () => {
    expect(readableLambda(0.15, [0.05, 0.3])).toBe(0.15);
    expect(readableLambda(0.15, null)).toBe(0.15);
  });
  test("AirPassengers by MLE reads as the log (λ = 0 lies in scipy's interval [-0.238, 0.534])", () => {
    const f = fitLambda(dataset("AirPassengers"), { method: "mle", period: 12 });
    expect(f.readable).toBe(0);
  });
});

describe("λ selection rejects what it cannot use", () => {
  test("a zero in the series", () => {
    expect(() => lambdaMle([1, 2, 0, 4, 5])).toThrow(/values > 0.*1 zero/);
  });
  test("a constant series", () => {
    expect(() => lambdaMle([3, 3, 3, 3, 3])).toThrow(/constant/);
  });
  test("bounds in the wrong order or outside [-5, 5]", () => {
    expect(() => lambdaMle([1, 2, 3, 4, 5], { lower: 2, upper: 1 })).toThrow(EngineError);
    expect(() => lambdaMle([1, 2, 3, 4, 5], { lower: -9 })).toThrow(/between -5 and 5/);
  });
  test("an unknown method lists the valid ones", () => {
    expect(() => fitLambda([1, 2, 3, 4, 5], { method: "likelihood" as never })).toThrow(/"guerrero" or "mle"/);
  });
});
