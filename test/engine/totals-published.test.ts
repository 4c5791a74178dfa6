// The total of a published forecast (issue 13 §1): known log-scale models published as rounded
// monthly medians and 80%/95% intervals; the truth of the total simulated from each model's own
// recursion with numpy (test/fixtures/totals/make_totals.py → totals.json, numpy 1.24.2 /
// scipy 1.10.1, 400,000 paths).
import * as fs from "fs";
import * as path from "path";
import { EngineError, fitLocalLevelWidening, localLevelCorrelation, parseDependence, publishedTotal } from "../../src/engine";
import { expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fx: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "totals", "totals.json"), "utf8"));

function totalOf(model: { published: Record<string, number[]> }, level: 80 | 95, dependence?: string | number) {
  const p = model.published;
  return publishedTotal(p.median, p[`lower${level}`], p[`upper${level}`], level, { dependence });
}

describe("a local-level log-scale forecast (ETS(A,N,N) on ln y; truth simulated with numpy)", () => {
  const ll = fx.localLevel;
  for (const level of [80, 95] as const) {
    test(`implied dependence: the ${level}% interval of the total is within 0.5% of the simulated truth`, () => {
      const t = totalOf(ll, level);
      expect(t.used).toBe("local-level");
      expect(t.fit.ok).toBe(true);
      const truth = ll.truth[`interval${level}`];
      expectClose(t.interval[0], truth[0], { rtol: 0.005 }, "low end");
      expectClose(t.interval[1] as number, truth[1], { rtol: 0.005 }, "high end");
      expectClose(t.median, ll.truth.median, { rtol: 0.002 }, "median");
    });
    test(`independent and comonotone months bracket the implied ${level}% interval and the truth`, () => {
      const t = totalOf(ll, level);
      const truth = ll.truth[`interval${level}`];
      expect(t.independent.interval[0]).toBeGreaterThan(t.interval[0]);
      expect(t.independent.interval[1] as number).toBeLessThan(t.interval[1] as number);
      expect(t.comonotone.interval[0]).toBeLessThan(t.interval[0]);
      expect(t.comonotone.interval[1] as number).toBeGreaterThan(t.interval[1] as number);
      expect(t.independent.interval[0]).toBeGreaterThan(truth[0]);
      expect(t.comonotone.interval[1] as number).toBeGreaterThan(truth[1]);
    });
  }
  test("the mean of the total equals the simulated truth within Monte Carlo error (4 standard errors + rounding of the published figures)", () => {
    const t = totalOf(ll, 95);
    expect(t.meanMethod).toBe("exact");
    expect(Math.abs((t.mean as number) - ll.truth.mean)).toBeLessThan(4 * ll.truth.meanSE + 12);
    // and the exact lognormal means of the unrounded forecast
    expectClose(t.mean as number, ll.exactMean, { rtol: 2e-5 }, "Σ exp(μ_h + σ_h²/2)");
  });
  test("the widths' fit recovers the model's α and σ from the rounded intervals", () => {
    const t = totalOf(ll, 95);
    expectClose(t.fit.alpha, ll.alpha, { rtol: 0.03 }, "α");
    expectClose(Math.sqrt(t.fit.sigma2), ll.sigma, { rtol: 0.01 }, "σ");
    expect(t.fit.rmsRelative).toBeLessThan(0.01);
  });
  test("each month's μ and σ are those of the model (rounding only)", () => {
    const t = totalOf(ll, 80);
    t.months.forEach((m, i) => {
      expectClose(m.mu, ll.mu[i], { atol: 1e-5 }, `μ_${i + 1}`);
      expectClose(m.sigma, ll.sd[i], { rtol: 2e-3 }, `σ_${i + 1}`);
    });
  });
  test('lambda "implied" finds the log scale and says so', () => {
    const p = ll.published;
    const t = publishedTotal(p.median, p.lower95, p.upper95, 95, { lambda: "implied" });
    expect(Math.abs(t.lambda)).toBeLessThan(0.05);
    expect(t.lambdaSource).toBe("implied");
    expect(t.notes.join(" ")).toMatch(/implied by the intervals/);
  });
});

describe("a seasonal log-scale forecast (ETS(A,N,A) on ln y, period 12; truth simulated with numpy)", () => {
  const se = fx.seasonal;
  test("first 12 months: a seasonal model's errors within one season have the local-level structure, so implied is within 0.5%", () => {
    const p = se.published;
    const t = publishedTotal(p.median.slice(0, 12), p.lower95.slice(0, 12), p.upper95.slice(0, 12), 95);
    expectClose(t.interval[0], se.truthFirst12.interval95[0], { rtol: 0.005 }, "low end");
    expectClose(t.interval[1] as number, se.truthFirst12.interval95[1], { rtol: 0.005 }, "high end");
  });
  test("24 months: how far implied is off (documented in the README; 0.10–0.15% here): within 0.5% of the truth; independent and comonotone bracket it", () => {
    for (const level of [80, 95] as const) {
      const t = totalOf(se, level);
      const truth = se.truth[`interval${level}`];
      const off = [t.interval[0] / truth[0] - 1, (t.interval[1] as number) / truth[1] - 1];
      // recorded for the README's note on seasonal forecasts
      console.log(`seasonal 24 months, ${level}%: implied [${t.interval[0].toFixed(0)}, ${(t.interval[1] as number).toFixed(0)}] vs truth [${truth[0].toFixed(0)}, ${truth[1].toFixed(0)}]: ends off by ${(100 * off[0]).toFixed(2)}% and ${(100 * off[1]).toFixed(2)}%; fit ${t.fit.note}`);
      expect(Math.abs(off[0])).toBeLessThan(0.005);
      expect(Math.abs(off[1])).toBeLessThan(0.005);
      expect(t.independent.interval[0]).toBeGreaterThan(truth[0]);
      expect(t.independent.interval[1] as number).toBeLessThan(truth[1]);
      expect(t.comonotone.interval[0]).toBeLessThan(truth[0]);
      expect(t.comonotone.interval[1] as number).toBeGreaterThan(truth[1]);
      expect(Math.abs((t.mean as number) - se.truth.mean)).toBeLessThan(4 * se.truth.meanSE + 24);
    }
  });
});

describe("dependence choices (METHODS §10)", () => {
  const ll = fx.localLevel;
  test("comonotone: the total's median and ends are the sums of the months' medians and ends (exact)", () => {
    const p = ll.published;
    const t = totalOf(ll, 80, "comonotone");
    const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);
    expectClose(t.median, sum(p.median), { rtol: 1e-5 }, "Σ medians");
    expectClose(t.interval[0], sum(p.lower80), { rtol: 1e-5 }, "Σ lower ends");
    expectClose(t.interval[1] as number, sum(p.upper80), { rtol: 1e-5 }, "Σ upper ends");
  });
  test("a common correlation between 0 and 1 gives an interval between independent and comonotone, widening with it", () => {
    const a = totalOf(ll, 95, 0.3);
    const b = totalOf(ll, 95, 0.7);
    expect(a.used).toBe("correlation");
    expect(a.interval[1] as number).toBeLessThan(b.interval[1] as number);
    expect(a.independent.interval[1] as number).toBeLessThan(a.interval[1] as number);
    expect(b.interval[1] as number).toBeLessThan(b.comonotone.interval[1] as number);
  });
  test("correlation 0 is independence and 1 is comonotone", () => {
    expect(totalOf(ll, 95, 0).interval).toEqual(totalOf(ll, 95, "independent").interval);
    expect(totalOf(ll, 95, 1).interval).toEqual(totalOf(ll, 95, "comonotone").interval);
  });
  test("a random walk's errors (α = 1) have correlation √(h/k) between steps h < k (derivation in METHODS §10)", () => {
    const R = localLevelCorrelation(1, 4);
    expectClose(R[0 * 4 + 3], Math.sqrt(1 / 4), { rtol: 1e-14 }, "ρ_14");
    expectClose(R[1 * 4 + 2], Math.sqrt(2 / 3), { rtol: 1e-14 }, "ρ_23");
  });
  test("the widths' fit is exact for unrounded local-level widths, and gives α = 0 for flat widths", () => {
    const sd = [1, 2, 3, 4, 5].map((h) => 0.1 * Math.sqrt(1 + (h - 1) * 0.09));
    const f = fitLocalLevelWidening(sd);
    expectClose(f.alpha, 0.3, { rtol: 1e-10 }, "α");
    expectClose(f.sigma2, 0.01, { rtol: 1e-10 }, "σ²");
    const flat = fitLocalLevelWidening([0.1, 0.1, 0.1]);
    expect(flat.alpha).toBe(0);
  });
  test("widths that shrink and jump fit badly: implied falls back to comonotone and says so", () => {
    const med = [100, 100, 100, 100, 100, 100];
    const sds = [0.3, 0.05, 0.25, 0.02, 0.3, 0.04];
    const lo = sds.map((s) => 100 * Math.exp(-1.2815515655446004 * s));
    const hi = sds.map((s) => 100 * Math.exp(1.2815515655446004 * s));
    const t = publishedTotal(med, lo, hi, 80);
    expect(t.fit.ok).toBe(false);
    expect(t.used).toBe("comonotone");
    expect(t.notes.join(" ")).toMatch(/Falling back to comonotone/);
    expect(t.interval).toEqual(t.comonotone.interval);
  });
  test("one month: the total is that month", () => {
    const t = publishedTotal([100], [80], [125], 80);
    expectClose(t.median, 100, { rtol: 0.01 }, "median");
    expectClose(t.interval[0], 80, { rtol: 0.01 }, "low");
  });
});

describe("bad input says what to fix", () => {
  const err = (f: () => unknown, re: RegExp) => {
    expect(f).toThrow(EngineError);
    expect(f).toThrow(re);
  };
  test("an interval that does not contain its median names the month", () => {
    err(() => publishedTotal([100, 100], [80, 105], [120, 130], 80), /Month 2: Need lower < median < upper/);
  });
  test("a level given as 0.8", () => {
    err(() => publishedTotal([100], [80], [120], 0.8), /in percent: give 80 for an 80% interval, not 0\.8/);
  });
  test("months of different counts", () => {
    err(() => publishedTotal([100, 100], [80], [120, 125], 80), /one value per month; got 2 medians, 1 lowers and 2 uppers/);
  });
  test("a zero or negative lower bound with λ = 0", () => {
    err(() => publishedTotal([100, 100], [0, 80], [120, 125], 80), /Month 1: The interval's lower end must be > 0/);
    err(() => publishedTotal([100, 100], [80, -5], [120, 125], 80), /Month 2: The interval's lower end must be > 0/);
  });
  test("an unknown dependence or a correlation outside 0..1", () => {
    err(() => parseDependence("strong"), /Unknown dependence "strong". Use "implied", "independent", "comonotone", or a correlation/);
    err(() => parseDependence(1.5), /from 0 \(independent months\) to 1/);
    err(() => parseDependence(-0.2), /from 0 \(independent months\) to 1/);
  });
  test("a lambda that is neither a number nor implied", () => {
    err(() => publishedTotal([100], [80], [120], 80, { lambda: "log" }), /lambda must be a number between -5 and 5 \(0 = log\) or "implied"/);
  });
  test("no months", () => {
    err(() => publishedTotal([], [], [], 80), /at least one month/);
  });
});
