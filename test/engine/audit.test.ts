// The audit engine held to outside references: scipy 1.10.1 coverage fixtures (Kupiec, Christoffersen;
// rtol 1e-10), the Basel Committee's (1996) 250-observation table recomputed from the binomial,
// Gneiting & Raftery's (2007) interval-score identity, the CRPS closed form against the integral
// definition (Matheson & Winkler 1976), and simulated series with known behaviour.
import {
  auditCoverage, backtest, binomialTail, christoffersenIndependence, conditionalCoverage, crpsBacktransformed, crpsNormal,
  EngineError, hitSequence, intervalScore, kupiec, normalCdf, pinball, trafficLight,
} from "../../src/engine";
import { integrate } from "../../src/engine/_lib/quadrature";
import { createRandom } from "../../src/engine/_lib/random";
import { check, checks, expectClose } from "../helpers/reference";

describe("coverage tests (source: coverage.* fixtures, numpy/scipy; rtol 1e-10)", () => {
  for (const c of checks("coverage.n")) {
    test(`${c.id}`, () => {
      const hits = (c.inputs.hits as string).split("").map(Number);
      const e = c.expected;
      const p = c.inputs.miss_prob;
      const tol = { rtol: c.tolerance.rtol, atol: c.tolerance.atol };
      const misses = hits.reduce((s, v) => s + v, 0);
      expect(misses).toBe(e.N);
      const uc = kupiec(misses, hits.length, p);
      expectClose(uc.lr, e.LR_uc, tol, "LR_uc");
      expectClose(uc.p, e.p_value_uc, tol, "p_uc");
      const ind = christoffersenIndependence(hits);
      expect([ind.n00, ind.n01, ind.n10, ind.n11]).toEqual([e.n00, e.n01, e.n10, e.n11]);
      expectClose(ind.pi01, e.pi01, tol, "pi01");
      expectClose(ind.pi11, e.pi11, tol, "pi11");
      expectClose(ind.pi, e.pi, tol, "pi");
      expectClose(ind.lr, Math.max(0, e.LR_ind), tol, "LR_ind");
      expectClose(ind.p, e.p_value_ind, tol, "p_ind");
      const cc = conditionalCoverage(uc, ind);
      expectClose(cc.lr, e.LR_cc, tol, "LR_cc");
      expectClose(cc.p, e.p_value_cc, tol, "p_cc");
    });
  }
  test("degenerate sequences are handled and explained (no misses, all misses)", () => {
    expect(christoffersenIndependence(new Array(100).fill(0)).note).toMatch(/No misses/);
    expect(christoffersenIndependence(new Array(20).fill(1)).note).toMatch(/Every row/);
    expect(christoffersenIndependence([0, 0, 0, 1]).note).toMatch(/No row follows a miss/);
    expect(kupiec(0, 100, 0.05).note).toMatch(/No misses/);
  });
});

describe("binomial tail and traffic-light zones (Basel Committee 1996, Table 1/2; recomputed from the binomial)", () => {
  test("P(X ≤ k) for 250 observations at 99% matches the framework's cumulative probabilities (4 d.p.)", () => {
    const table = [0.0811, 0.2858, 0.5432, 0.7581, 0.8922, 0.9588, 0.9863, 0.996, 0.9989, 0.9997];
    table.forEach((v, k) => expect(Math.abs(trafficLight(k, 250, 0.01).cumulative - v)).toBeLessThan(5e-5));
  });
  test("zones: green 0–4, yellow 5–9, red 10 or more", () => {
    const zones = Array.from({ length: 13 }, (_, k) => trafficLight(k, 250, 0.01).zone);
    expect(zones).toEqual(["green", "green", "green", "green", "green", "yellow", "yellow", "yellow", "yellow", "yellow", "red", "red", "red"]);
  });
  test("the tail P(X ≥ x) equals a direct sum of binomial terms (common practice: the definition)", () => {
    const direct = (x: number, n: number, p: number): number => {
      let s = 0;
      let logC = 0; // log C(n, k), built up
      for (let k = 0; k <= n; k++) {
        if (k > 0) logC += Math.log((n - k + 1) / k);
        if (k >= x) s += Math.exp(logC + k * Math.log(p) + (n - k) * Math.log1p(-p));
      }
      return s;
    };
    for (const [x, n, p] of [[3, 250, 0.01], [17, 250, 0.05], [40, 120, 0.2], [0, 10, 0.3], [10, 10, 0.3]] as const) {
      expectClose(binomialTail(x, n, p), direct(x, n, p), { rtol: 1e-11 }, `P(X ≥ ${x} | ${n}, ${p})`);
    }
  });
});

describe("scores", () => {
  test("interval score and pinball losses match the fixture (coverage.interval_score, rtol 1e-14)", () => {
    for (const e of check("coverage.interval_score").expected) {
      expectClose(intervalScore(e.lower, e.upper, e.actual, e.alpha), e.interval_score, { rtol: 1e-14 }, "IS");
      expectClose(pinball(e.lower, e.actual, e.alpha / 2), e.pinball_lower, { rtol: 1e-13, atol: 1e-15 }, "pinball low");
      expectClose(pinball(e.upper, e.actual, 1 - e.alpha / 2), e.pinball_upper, { rtol: 1e-13, atol: 1e-15 }, "pinball high");
    }
  });
  test("identity: interval score = (2/α)(pinball_{α/2}(l) + pinball_{1−α/2}(u)) (Gneiting & Raftery 2007)", () => {
    const rng = createRandom(8);
    for (let i = 0; i < 500; i++) {
      const l = 100 * rng.uniform(), u = l + 50 * rng.uniform(), y = 150 * rng.uniform(), a = 0.01 + 0.5 * rng.uniform();
      expectClose(intervalScore(l, u, y, a), (2 / a) * (pinball(l, y, a / 2) + pinball(u, y, 1 - a / 2)), { rtol: 1e-12, atol: 1e-12 }, "identity");
    }
  });
  test("the normal CRPS closed form equals ∫(F(x) − 1{x ≥ y})² dx (Matheson & Winkler 1976 definition)", () => {
    for (const [mu, s, y] of [[0, 1, 0], [10, 2, 13.5], [-3, 0.5, -4], [100, 15, 60]]) {
      const F = (x: number): number => normalCdf((x - mu) / s);
      const lo = mu - 40 * s, hi = mu + 40 * s;
      const def = integrate((x) => F(x) ** 2, lo, y, 1e-13).value + integrate((x) => (1 - F(x)) ** 2, y, hi, 1e-13).value;
      expectClose(crpsNormal(mu, s, y), def, { rtol: 1e-10 }, `crps(${mu},${s},${y})`);
    }
    expectClose(crpsNormal(0, 1, 0), (Math.SQRT2 - 1) / Math.sqrt(Math.PI), { rtol: 1e-14 }, "crps(0,1,0) = 2φ(0) − 1/√π");
  });
  test("the back-transformed CRPS by integrating pinball losses: λ = 1 is the normal shifted by 1; λ = 0 matches the definition", () => {
    for (const [mu, s, y] of [[5, 0.8, 6.2], [2, 0.3, 1.1]]) expectClose(crpsBacktransformed(mu, s, 1, y), crpsNormal(mu + 1, s, y), { rtol: 1e-9 }, "λ = 1");
    const mu = 4, s = 0.3, y = 70;
    const F = (x: number): number => (x <= 0 ? 0 : normalCdf((Math.log(x) - mu) / s));
    const def = integrate((x) => F(x) ** 2, 1e-12, y, 1e-13).value + integrate((x) => (1 - F(x)) ** 2, y, Math.exp(mu + 12 * s), 1e-13).value;
    expectClose(crpsBacktransformed(mu, s, 0, y), def, { rtol: 1e-8 }, "λ = 0 against the definition");
    expect(() => crpsBacktransformed(1, 0.1, -0.5, 3)).toThrow(/does not exist/);
  });
});

describe("auditCoverage", () => {
  test("hit sequence: inclusive ends, blanks skipped and counted", () => {
    const h = hitSequence([100, 90, null, 111, 95], [90, 91, 90, 90, 95], [110, 110, 110, 110, 96]);
    expect(h.hits).toEqual([0, 1, 1, 0]);
    expect(h.skipped).toBe(1);
  });
  test("intervals that are too narrow are caught: low coverage, tiny Kupiec p, red zone, a verdict that says so", () => {
    const rng = createRandom(4);
    const actual: number[] = [], lo: number[] = [], hi: number[] = [];
    for (let i = 0; i < 200; i++) {
      const y = 100 * Math.exp(0.2 * rng.normal());
      actual.push(y);
      lo.push(100 * Math.exp(-1.2816 * 0.1));
      hi.push(100 * Math.exp(1.2816 * 0.1));
    }
    const a = auditCoverage(actual, lo, hi, 80);
    expect(a.coverage).toBeLessThan(0.6);
    expect(a.kupiec.p).toBeLessThan(1e-6);
    expect(a.zone).toBe("red");
    expect(a.verdict).toMatch(/too narrow/);
  });
  test("bad input: unequal lengths, low > high (naming the row), level outside (0, 100), fewer than 2 usable rows", () => {
    expect(() => auditCoverage([1, 2], [0, 1], [2], 80)).toThrow(/same number of rows; they have 2, 2 and 1/);
    expect(() => auditCoverage([1, 2, 3], [0, 5, 1], [2, 4, 4], 80, 2)).toThrow(/Row 3: the lower end \(5\) is above the upper end \(4\)/);
    expect(() => auditCoverage([1, 2], [0, 1], [2, 3], 100)).toThrow(/between 0 and 100/);
    expect(() => auditCoverage([1, null], [0, 1], [2, 3], 80)).toThrow(/At least 2 rows/);
  });
});

describe("rolling-origin backtest (Tashman 2000)", () => {
  test("a Gaussian random walk backtested with naive on the right scale covers at the nominal rate (1 step: within 4 binomial s.e.)", () => {
    const rng = createRandom(123);
    const y: number[] = [];
    let w = 100;
    for (let t = 0; t < 600; t++) y.push((w += rng.normal()));
    const b = backtest(y, 3, { method: "naive", lambda: "none", level: 80, first: 30 });
    const r1 = b.rows[0];
    expect(r1.origins).toBe(570);
    expect(Math.abs((r1.coverage as number) - 0.8)).toBeLessThan(4 * Math.sqrt(0.16 / r1.origins));
    // overlapping h-step errors are correlated, so allow √h times the binomial error
    b.rows.forEach((r) => expect(Math.abs((r.coverage as number) - 0.8)).toBeLessThan(4 * Math.sqrt(r.h) * Math.sqrt(0.16 / r.origins)));
  });
  test("a series made on the log scale and forecast without a transform shows the coverage failure", () => {
    const rng = createRandom(321);
    const y: number[] = [];
    let w = Math.log(100);
    for (let t = 0; t < 400; t++) y.push(Math.exp((w += 0.01 + 0.08 * rng.normal())));
    const wrong = backtest(y, 1, { method: "naive", lambda: "none", level: 80, first: 30 });
    const right = backtest(y, 1, { method: "naive", lambda: 0, level: 80, first: 30 });
    const k = (b: typeof wrong): number => kupiec(Math.round((1 - (b.rows[0].coverage as number)) * b.rows[0].origins), b.rows[0].origins, 0.2).p;
    expect(k(wrong)).toBeLessThan(0.001);
    expect(k(right)).toBeGreaterThan(0.01);
    // and the median-based point forecast is biased low on the right scale, the mean less so
    expect(right.rows[0].meanErrorOfMedian as number).toBeGreaterThan(right.rows[0].meanErrorOfMean as number);
  });
  test("reports progress, and refuses a first origin that leaves no room for H steps", () => {
    const y = Array.from({ length: 40 }, (_, i) => 100 + i + (i % 3));
    const seen: number[] = [];
    backtest(y, 2, { method: "drift", lambda: 0, first: 35, onProgress: (d) => seen.push(d) });
    expect(seen).toEqual([1, 2, 3, 4, 5]);
    expect(() => backtest(y, 10, { method: "naive", lambda: 0, first: 35 })).toThrow(/no room for 10 steps/);
    expect(() => backtest(y, 1, { method: "naive", lambda: 0, first: 40 })).toThrow(/leaves no room/);
    expect(() => backtest(y, 1, { method: "holt-winters", lambda: 0, period: 12, first: 10 })).toThrow(/too short/);
    expect(() => backtest(y, 1, { level: 0 })).toThrow(EngineError);
  });
  test("a long series checks its latest 500 origins by default, and refuses more than 5,000 refits (project's own limits)", () => {
    const y = Array.from({ length: 700 }, (_, i) => 100 + i + (i % 5));
    const d = backtest(y, 1, { method: "naive", lambda: "none" });
    expect(d.first).toBe(200);
    expect(d.rows[0].origins).toBe(500);
    expect(backtest(y, 1, { method: "naive", lambda: "none", first: 100 }).rows[0].origins).toBe(600);
    const long = Array.from({ length: 5200 }, (_, i) => 100 + (i % 7));
    expect(() => backtest(long, 1, { method: "naive", lambda: "none", first: 10 })).toThrow(/5190 origins, each a refit; at most 5000.*first = 200 or more/);
  });
});
