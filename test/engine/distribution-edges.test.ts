// Edges of the back-transform and mean functions that the mutation run (MUTATION.md §2) found
// unguarded: argument checks, the messages that carry a number, degenerate forecasts and the
// branch notes. Each expected value is derived in the test from a published closed form or a
// standard normal table value (named beside it).
import {
  backtransformMean, backtransformMeanExact, backtransformMeanTaylor, backtransformQuantile, chiSquareQuantile, chiSquareSf, EngineError,
  forecastMean, makeTransform, meanFromInterval, parseMeanMethod,
} from "../../src/engine";

/** The error a call throws (fails the test when it does not throw). */
function thrown(f: () => unknown): EngineError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(EngineError);
    return e as EngineError;
  }
  throw new Error("expected the call to throw");
}

describe("argument checks name the argument (common practice: never a NaN out of a NaN in)", () => {
  test("the Taylor and exact means refuse a NaN μ, a negative σ and a λ that is not a number, as input errors", () => {
    for (const f of [backtransformMeanTaylor, (m: number, s: number, l: number) => backtransformMeanExact(m, s, l).mean]) {
      const a = thrown(() => f(Number.NaN, 1, 0));
      expect(a.code).toBe("input");
      expect(a.message).toMatch(/mu/);
      const b = thrown(() => f(5, -1, 0));
      expect(b.code).toBe("input");
      expect(b.message).toMatch(/sd/);
      expect(thrown(() => f(5, 1, Number.NaN)).code).toBe("input");
    }
    expect(thrown(() => backtransformMean(Number.NaN, 1, 0.5)).code).toBe("input");
  });
  test("an unknown mean method is refused with the choices, not read as auto", () => {
    const e = thrown(() => backtransformMean(5, 1, 0, "median" as never));
    expect(e.code).toBe("input");
    expect(e.message).toMatch(/Unknown mean method "median".*"auto", "exact" or "taylor"/);
    expect(thrown(() => parseMeanMethod("average")).message).toMatch(/Unknown mean "average"\. Use "auto"/);
    expect(parseMeanMethod(" Exact ")).toBe("exact");
    expect(parseMeanMethod(null)).toBe("auto");
  });
  test("a chi-square statistic that is not a number is refused (never a NaN p-value)", () => {
    expect(thrown(() => chiSquareSf(Number.NaN, 1)).code).toBe("domain");
    expect(thrown(() => chiSquareSf(Number.NaN, 2)).message).toBe("chi-square statistic is not a number.");
  });
  test("a published interval whose lower end is not positive is refused, naming the lower end", () => {
    const e = thrown(() => meanFromInterval(100, 0, 200, 95));
    expect(e.code).toBe("input");
    expect(e.message).toMatch(/lower end must be > 0/);
  });
});

describe("messages that carry a number carry the right one", () => {
  test("a quantile on the floor states the normal's share below the floor, Φ((−1/λ − μ)/σ)", () => {
    // λ = 1, μ = −1.5, σ = 2: the floor w = −1 is z = (−1 + 1.5)/2 = 0.25 standard deviations up;
    // Φ(0.25) = 0.5987 (standard normal table; scipy.stats.norm.cdf(0.25) = 0.598706…) → "60%".
    const e = thrown(() => backtransformQuantile(-1.5, 2, 1, 0.025));
    expect(e.code).toBe("domain");
    expect(e.message).toMatch(/puts 60% of its probability where no positive value exists/);
  });
  test("λ < 0: the exact mean does not exist, and the refusal offers the Taylor value", () => {
    // Taylor (METHODS §4): (λμ + 1)^(1/λ)·[1 + σ²(1 − λ)/(2(λμ + 1)²)] at λ = −0.5, μ = 1, σ = 0.5:
    // 0.5^(−2)·[1 + 0.25·1.5/(2·0.25)] = 4·1.75 = 7.
    const e = thrown(() => backtransformMeanExact(1, 0.5, -0.5));
    expect(e.code).toBe("unavailable");
    expect(e.message).toMatch(/Use the Taylor approximation instead \(7\)/);
    expect((e.details as { taylor: number }).taylor).toBeCloseTo(7, 12);
  });
});

describe("degenerate and noted forecasts", () => {
  test("σ = 0: the mean is the median itself, f(μ), for every transform (a point mass; common practice)", () => {
    const bc = forecastMean(makeTransform("box-cox", 0.5), 4, 0);
    expect(bc.value).toBeCloseTo((0.5 * 4 + 1) ** 2, 12); // Box-Cox inverse (λw + 1)^(1/λ) = 9
    expect(bc.used).toBe("exact");
    expect(bc.correction).toBe(0);
    const lg = forecastMean(makeTransform("box-cox", 0), 2, 0, "taylor");
    expect(lg.value).toBeCloseTo(Math.exp(2), 12);
    expect(lg.used).toBe("exact");
  });
  test("σ = 0 past the pole (λ = −0.5, μ = 3: λμ + 1 < 0): no mean, with a note that says why", () => {
    const m = forecastMean(makeTransform("box-cox", -0.5), 3, 0);
    expect(m.value).toBeNull();
    expect(m.note).toMatch(/unbounded/);
  });
  test("no transform: the mean is μ whatever σ, reported as exact with no correction", () => {
    const m = forecastMean(makeTransform("none", null), 120, 15, "taylor");
    expect(m.value).toBe(120);
    expect(m.used).toBe("exact");
    expect(m.correction).toBe(0);
  });
  test("an exact mean with much of the normal below the floor says so", () => {
    // λ = 1, μ = 0, σ = 1: the floor w = −1 holds Φ(−1) = 0.1587 (standard normal table) → "16%".
    const m = forecastMean(makeTransform("box-cox", 1), 0, 1);
    expect(m.used).toBe("exact");
    expect(m.floorProbability).toBeCloseTo(0.15865525393145707, 12); // scipy.stats.norm.cdf(-1)
    expect(m.accuracy).toMatch(/16% of the normal forecast on the λ = 1 scale falls below the floor/);
    // and none when the floor is out of reach: λ = 1, μ = 100, σ = 1
    expect(forecastMean(makeTransform("box-cox", 1), 100, 1).accuracy).toBeNull();
  });
});

describe("an exact mean too large for a double is said in the result, not thrown (seed-20 mutation sample)", () => {
  test("λ = 0, μ = 709.5, σ = 1: e^{μ+σ²/2} = e^{710} is past the largest double (e^{709.78}, IEEE 754): no value, the note says why", () => {
    for (const method of ["exact", "auto"] as const) {
      const r = forecastMean(makeTransform("box-cox", 0), 709.5, 1, method);
      expect(r.value).toBeNull();
      expect(r.note).toMatch(/too large/);
    }
    // one step inside: e^{709} is a double, and the exact mean is exactly it (μ = 708.5, σ = 1)
    expect(forecastMean(makeTransform("box-cox", 0), 708.5, 1, "exact").value).toBe(Math.exp(709));
  });
});

describe("seed-22 mutation sample: the chi-square quantile's probability", () => {
  test("q must be strictly between 0 and 1: 0, 1, −0.5 and 1.5 are refused with the rule (common practice)", () => {
    for (const q of [0, 1, -0.5, 1.5]) for (const df of [1, 2] as const) expect(() => chiSquareQuantile(q, df)).toThrow(/A probability must be strictly between 0 and 1; got/);
    // and inside, the 95% points of χ²₁ and χ²₂ (3.841458820694124, 5.991464547107979: any χ² table)
    expect(chiSquareQuantile(0.95, 1)).toBeCloseTo(3.841458820694124, 12);
    expect(chiSquareQuantile(0.95, 2)).toBeCloseTo(5.991464547107979, 12);
  });
});
