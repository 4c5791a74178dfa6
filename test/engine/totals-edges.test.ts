// Edges of the totals that the mutation run (MUTATION.md §2) found unguarded. Expected values are
// derived in the test from closed forms: the Box-Cox exact mean (lognormal mean at λ = 0), the
// normal quantile, and the month's (μ, σ) recovered from its interval (METHODS §10).
import { backtransformMeanExact, fitForecast, normalQuantile, parseDependence, publishedTotal, totalAcross } from "../../src/engine";

describe("totals of published forecasts", () => {
  test("λ ≥ 0: each month's mean is the exact mean of its recovered normal, not the Taylor value", () => {
    // A month published as median 100, 95% interval 60–170 on the log scale (λ = 0): μ = ln 100,
    // σ = (ln 170 − ln 60)/(2·z₀.₉₇₅); its mean is the lognormal's exp(μ + σ²/2), not the Taylor
    // e^μ(1 + σ²/2). (At λ = 0.5 the two agree: the inverse is a quadratic.)
    const g = Math.log;
    const z = normalQuantile(0.975);
    const t = publishedTotal([100, 100], [60, 60], [170, 170], 95, { lambda: 0 });
    expect(t.meanMethod).toBe("exact");
    const mu = g(100);
    const sigma = (g(170) - g(60)) / (2 * z);
    const exact = Math.exp(mu + (sigma * sigma) / 2);
    expect(backtransformMeanExact(mu, sigma, 0).mean).toBeCloseTo(exact, 9);
    expect(t.months[0].mean as number).toBeCloseTo(exact, 9);
    expect(t.mean as number).toBeCloseTo(2 * exact, 8);
  });
  test("more than 1,200 months are refused with the count", () => {
    const m = Array.from({ length: 1201 }, () => 100);
    expect(() => publishedTotal(m, m.map(() => 80), m.map(() => 125), 95)).toThrow(/At most 1,200 months can be totalled; got 1201/);
  });
  test("an unknown dependence is quoted, cut to 30 characters", () => {
    const long = "correlated with the weather in the north";
    expect(() => parseDependence(long)).toThrow(/Unknown dependence "correlated with the weather in"\./);
  });
});

describe("totals across series need enough common history to estimate how they move together", () => {
  test("two series sharing fewer than 8 one-step residuals are refused, saying how many they share", () => {
    // INVENTED: two shops, the second opened late (6 months of history overlapping the first's).
    const a = Array.from({ length: 36 }, (_, i) => 100 * Math.exp(0.01 * i + 0.05 * Math.sin(i)));
    const b = Array.from({ length: 36 }, (_, i) => (i < 29 ? null : 80 * Math.exp(0.01 * i + 0.04 * Math.cos(i))));
    const fs = [fitForecast(a, { method: "naive", lambda: 0, label: "Harbour" }), fitForecast(b, { method: "naive", lambda: 0, label: "Mill Lane" })];
    expect(() => totalAcross(fs, 6, { level: 95 })).toThrow(/share only \d periods with one-step residuals; at least 8/);
  });
});
