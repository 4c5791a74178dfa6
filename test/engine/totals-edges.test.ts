// Edges of the totals that the mutation run (MUTATION.md §2) found unguarded. Expected values are
// derived in the test from closed forms: the Box-Cox exact mean (lognormal mean at λ = 0), the
// normal quantile, and the month's (μ, σ) recovered from its interval (METHODS §10).
import { backtransformMeanExact, fitForecast, normalQuantile, parseDependence, poleProbability, publishedTotal, totalAcross } from "../../src/engine";

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

describe("a total across series where one series' scale has a pole (Box-Cox λ = −1)", () => {
  // INVENTED: two shops; the second's sales swing widely, and on the λ = −1 scale, w = 1 − 1/y,
  // its random walk reaches the pole w = 1 (y → ∞) within a year with visible probability.
  const a = Array.from({ length: 40 }, (_, i) => 100 * Math.exp(0.01 * i + 0.05 * Math.sin(i)));
  const b = Array.from({ length: 40 }, (_, i) => 12 * Math.exp(0.6 * Math.sin(1.7 * i)));
  const fa = fitForecast(a, { method: "naive", lambda: 0, label: "Harbour" });
  const fb = fitForecast(b, { method: "naive", lambda: -1, label: "Mill Lane" });
  const paths = 4000;
  const t = totalAcross([fa, fb], 12, { level: 90, mean: "exact", paths, seed: 5 });
  test("the exact mean does not exist (METHODS §9): no mean, and the note names the series", () => {
    expect(t.mean).toBeNull();
    expect(t.meanNote).toMatch(/^Mill Lane: /);
  });
  test("the unbounded simulated totals are counted: at least the share past the pole at step 12 alone, Φ-tail of the step's normal", () => {
    const m = /(\d+) of 4000 simulated totals are unbounded/.exec(t.notes.join(" "));
    expect(m).not.toBeNull();
    const share = Number((m as RegExpExecArray)[1]) / paths;
    // the total is unbounded when any step is past the pole; step 12 alone: P(w₁₂ > 1)
    const sd12 = (fb.model?.sigma as number) * Math.sqrt(12);
    const wT = 1 - 1 / b[b.length - 1];
    const p12 = poleProbability(fb.transform, wT, sd12);
    expect(p12).toBeGreaterThan(0.05);
    expect(share).toBeGreaterThanOrEqual(p12 - 4 * Math.sqrt((p12 * (1 - p12)) / paths));
    expect(share).toBeLessThanOrEqual(1);
    expect(t.simulatedMean).toBeNull();
  });
});
