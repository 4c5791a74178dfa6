// Edges of the totals that the mutation run (MUTATION.md §2) found unguarded. Expected values are
// derived in the test from closed forms: the Box-Cox exact mean (lognormal mean at λ = 0), the
// normal quantile, and the month's (μ, σ) recovered from its interval (METHODS §10).
import { alignSeries, backtransformMeanExact, fitForecast, normalQuantile, parseDependence, poleProbability, publishedTotal, totalAcross } from "../../src/engine";

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

describe("a total across series with no transform is normal with a closed form (seed-20 mutation sample)", () => {
  // INVENTED: two cost centres' monthly costs, random-walk-like. Naive forecasts with no transform:
  // step h of series s is y_s + σ_s·(e₁ + … + e_h), so the total over steps 1..H of both series is
  // normal with mean H(y_A + y_B) and variance (σ_A² + σ_B² + 2ρσ_Aσ_B)·Σ_{h,k ≤ H} min(h, k), where
  // Σ min(h, k) = H(H + 1)(2H + 1)/6 (sums of a random walk; Box & Jenkins 1970, ch. 5).
  const a = Array.from({ length: 48 }, (_, i) => 500 + 20 * Math.sin(0.9 * i) + 3 * i);
  const b = Array.from({ length: 48 }, (_, i) => 300 + 15 * Math.cos(1.3 * i) + 12 * Math.sin(0.9 * i));
  const fa = fitForecast(a, { method: "naive", lambda: "none", label: "Stores" });
  const fb = fitForecast(b, { method: "naive", lambda: "none", label: "Transport" });
  const H = 6;
  const paths = 20000;
  const t = totalAcross([fa, fb], H, { level: 90, paths, seed: 11 });
  const sa = fa.model?.sigma as number;
  const sb = fb.model?.sigma as number;
  const k = (H * (H + 1) * (2 * H + 1)) / 6;
  const mean = H * (a[47] + b[47]);
  const z = normalQuantile(0.95);
  test("the mean is H·(last values), and the simulated mean agrees within 4 Monte Carlo errors", () => {
    expect(t.mean as number).toBeCloseTo(mean, 6);
    expect(Math.abs((t.simulatedMean as number) - mean)).toBeLessThan(4 * (t.monteCarloError as number));
  });
  test("the 90% interval is mean ± z₀.₉₅·sd with the estimated correlation; with independent innovations ρ = 0", () => {
    const rho = t.correlation[0][1];
    const sd = Math.sqrt((sa * sa + sb * sb + 2 * rho * sa * sb) * k);
    const sd0 = Math.sqrt((sa * sa + sb * sb) * k);
    // a quantile's Monte Carlo standard error at p = 0.05 is √(p(1−p)/N)/φ(z)·sd ≈ 0.015·sd here; allow 0.08·sd
    expect(Math.abs(t.interval[0] - (mean - z * sd))).toBeLessThan(0.08 * sd);
    expect(Math.abs((t.interval[1] as number) - (mean + z * sd))).toBeLessThan(0.08 * sd);
    expect(Math.abs(t.independent.interval[0] - (mean - z * sd0))).toBeLessThan(0.08 * sd0);
    expect(Math.abs(t.median - mean)).toBeLessThan(0.05 * sd);
  });
});

describe("the note when series end at different periods agrees in number (common practice)", () => {
  test("one series cut: 'it is cut there … its later values'; two: 'they are … their'", () => {
    expect(alignSeries([[1, 2, 3], [1, 2, 3, null]], ["A", "B"]).note).toBeNull(); // a trailing blank is not a later value
    const cut1 = alignSeries([[1, 2, 3], [1, 2, 3, 4]], ["A", "B"]);
    expect(cut1.note).toBe("The series end at different periods: B has values after row 3, the latest period every series has; it is cut there so all forecasts start from the same period (its later values are not used).");
    const cut2 = alignSeries([[1, 2, 3], [1, 2, 3, 4], [1, 2, 3, 4, 5]], ["A", "B", "C"]);
    expect(cut2.note).toBe("The series end at different periods: B, C have values after row 3, the latest period every series has; they are cut there so all forecasts start from the same period (their later values are not used).");
  });
});

describe("a published total on the square-root scale (Box-Cox λ = ½; seed-20 mutation sample)", () => {
  // At λ = ½ the inverse is y = (1 + w/2)², so a month's mean is exactly (1 + μ/2)² + σ²/4 (the
  // mean of a squared normal), and the independent months' total has that sum as its mean.
  const med = [100, 110, 121];
  const lo = [80, 86, 92];
  const hi = [123, 138, 155];
  const t = publishedTotal(med, lo, hi, 90, { lambda: 0.5, dependence: "independent", paths: 40000, seed: 3 });
  test("the simulated mean agrees with the sum of the exact monthly means within 4 Monte Carlo errors", () => {
    const z = normalQuantile(0.95);
    const g = (y: number): number => 2 * (Math.sqrt(y) - 1); // Box-Cox λ = ½
    let exact = 0;
    for (let i = 0; i < 3; i++) {
      const mu = g(med[i]);
      const s = (g(hi[i]) - g(lo[i])) / (2 * z);
      exact += (1 + mu / 2) ** 2 + (s * s) / 4;
    }
    expect(t.mean as number).toBeCloseTo(exact, 8);
    expect(Math.abs((t.simulatedMean as number) - exact)).toBeLessThan(4 * (t.monteCarloError as number));
  });
  test("one month's total is that month's interval (the total of one step is the step; Monte Carlo quantile error only)", () => {
    const one = publishedTotal([100], [80], [123], 90, { lambda: 0.5, dependence: "independent", paths: 40000, seed: 4 });
    expect(Math.abs(one.interval[0] - 80)).toBeLessThan(0.6);
    expect(Math.abs((one.interval[1] as number) - 123)).toBeLessThan(0.9);
    expect(Math.abs(one.median - 100)).toBeLessThan(0.5);
  });
});

describe("seed-21 mutation sample: published totals' checks and notes", () => {
  test("a dependence that is neither a keyword nor a number is refused as such", () => {
    expect(() => parseDependence(true)).toThrow(/dependence must be a keyword or a number/);
    expect(parseDependence(0.3)).toBe(0.3);
  });
  test("a seed that is not whole is refused, naming it", () => {
    expect(() => publishedTotal([100], [80], [125], 80, { seed: 1.5 })).toThrow(/seed must be a whole number; got 1\.5\./);
  });
  test("only the months whose interval is lopsided on the λ scale are named (10% rule, METHODS §10)", () => {
    // Month 1: 80–125 around 100 is symmetric in logs (ln 1.25 = −ln 0.8). Month 2: 80–120 is
    // symmetric on the original scale, so in logs its upper arm ln 1.2 = 0.182 is 18% shorter than ln 1.25.
    const t = publishedTotal([100, 100], [80, 80], [125, 120], 80, { lambda: 0, dependence: "independent" });
    expect(t.months.map((m) => m.consistent)).toEqual([true, false]);
    expect(t.notes.filter((n) => /not symmetric/.test(n))).toEqual([expect.stringMatching(/^Month 2 is not symmetric around the median on the λ = 0 scale/)]);
  });
  test("on the log scale no simulated total is unbounded, and no note says so", () => {
    const t = publishedTotal([100, 105, 110], [80, 83, 86], [125, 133, 141], 80, { lambda: 0, dependence: "independent" });
    expect(t.notes.join(" ")).not.toMatch(/unbounded/);
  });
  test("published widths that shrink with the horizon: the implied fit takes α = 0 and says why", () => {
    // log-scale half-widths ln(1.25) > ln(1.2) > ln(1.15): no local level grows like that
    const t = publishedTotal([100, 100, 100], [80, 100 / 1.2, 100 / 1.15], [125, 120, 115], 80, { lambda: 0 });
    expect(t.fit.alpha).toBe(0);
    expect(t.fit.note).toMatch(/The widths do not grow with the horizon, so the fit takes α = 0 \(independent months\)\./);
  });
});

describe("seed-21 mutation sample: a total across Yeo-Johnson series", () => {
  // INVENTED: two product lines' monthly margins; on the Yeo-Johnson λ = ½ scale the simulation must
  // back-transform each path with the Yeo-Johnson inverse (Yeo & Johnson 2000), so its mean agrees
  // with the sum of the exact step means (quadrature) within Monte Carlo error.
  const a = Array.from({ length: 48 }, (_, i) => 40 + 0.3 * i + 6 * Math.sin(0.8 * i));
  const b = Array.from({ length: 48 }, (_, i) => 25 + 4 * Math.cos(1.1 * i) + 0.1 * i);
  const fa = fitForecast(a, { method: "naive", transform: "yeo-johnson", lambda: 0.5, label: "Line A" });
  const fb = fitForecast(b, { method: "naive", transform: "yeo-johnson", lambda: 0.5, label: "Line B" });
  test("simulated mean = sum of exact means within 4 Monte Carlo errors; the interval brackets it", () => {
    const t = totalAcross([fa, fb], 6, { level: 90, paths: 20000, seed: 8 });
    expect(Math.abs((t.simulatedMean as number) - (t.mean as number))).toBeLessThan(4 * (t.monteCarloError as number));
    expect(t.interval[0]).toBeLessThan(t.mean as number);
    expect(t.interval[1] as number).toBeGreaterThan(t.mean as number);
  });
});

describe("seed-22 mutation sample: a total across series with a constant one, and Taylor means asked for", () => {
  // INVENTED: a shop's monthly sales and its fixed rent (a constant series: λ = 1, σ = 0).
  const a = Array.from({ length: 40 }, (_, i) => 100 * Math.exp(0.01 * i + 0.05 * Math.sin(i)));
  const rent = Array.from({ length: 40 }, () => 1000);
  const fa = fitForecast(a, { method: "naive", lambda: 0, label: "Sales" });
  const fr = fitForecast(rent, { method: "naive", label: "Rent" });
  test("the rent adds exactly 6 × 1,000 to the mean, and the interval stays finite around it", () => {
    const alone = totalAcross([fa, fa], 6, { level: 90, paths: 4000, seed: 2 });
    const t = totalAcross([fa, fr], 6, { level: 90, paths: 4000, seed: 2 });
    expect(t.mean as number).toBeCloseTo((alone.mean as number) / 2 + 6000, 6);
    expect(Number.isFinite(t.interval[0]) && Number.isFinite(t.interval[1] as number)).toBe(true);
    expect(t.interval[0]).toBeGreaterThan(6000);
    expect(t.interval[0]).toBeLessThan(t.mean as number);
    expect(t.interval[1] as number).toBeGreaterThan(t.mean as number);
  });
  test("with Taylor means asked for, no note claims that no exact mean exists at λ = 0", () => {
    const t = totalAcross([fa, fa], 6, { level: 90, paths: 1000, seed: 2, mean: "taylor" });
    expect(t.notes.join(" ")).not.toMatch(/no exact mean exists/);
  });
});

describe("seed-22 mutation sample: Taylor means asked for are used", () => {
  test("at λ = 0 the total's Taylor mean Σ e^μ(1 + σ²/2) is below its exact mean Σ e^{μ+σ²/2} (e^x > 1 + x), and equals the sum of the steps' Taylor means", () => {
    const a = Array.from({ length: 40 }, (_, i) => 100 * Math.exp(0.01 * i + 0.05 * Math.sin(i))); // INVENTED
    const fa = fitForecast(a, { method: "naive", lambda: 0, label: "Sales" });
    const ex = totalAcross([fa, fa], 6, { paths: 1000, seed: 2, mean: "exact" });
    const ta = totalAcross([fa, fa], 6, { paths: 1000, seed: 2, mean: "taylor" });
    expect(ta.mean as number).toBeLessThan(ex.mean as number);
    const s2 = (fa.model?.sigma as number) ** 2;
    const last = a[39];
    let taylor = 0;
    for (let h = 1; h <= 6; h++) taylor += last * (1 + (h * s2) / 2); // naive on logs: μ_h = ln y_T, σ_h² = hσ²
    expect(ta.mean as number).toBeCloseTo(2 * taylor, 6);
  });
});
