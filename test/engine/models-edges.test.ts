// Edges of the model layer that the mutation run (MUTATION.md §2) found unguarded. Expected values
// come from closed forms (the lognormal mean; the shift rule stated in the README) computed here.
import { aiccOf, fitAuto, ARIMA_LIMITS, arimaTitle, autoArima, chooseLambdaAuto, createRandom, describeForecaster, fitForecast, fitSmoothing, makeTransform, originalScaleFit, profileModelLambda, totalForecast } from "../../src/engine";
import { dataset } from "../helpers/reference";

describe("the model description's mean rows (the lognormal closed forms)", () => {
  test("log scale: 'Taylor vs exact mean at step 1' is 100·((1 + σ²/2)/e^{σ²/2} − 1)", () => {
    // INVENTED monthly revenue of a shop (positive, mild growth).
    const y = Array.from({ length: 36 }, (_, i) => 500 * Math.exp(0.01 * i + 0.08 * Math.sin(1.3 * i)));
    const f = fitForecast(y, { method: "naive", lambda: 0 });
    const s2 = (f.model?.sigma as number) ** 2;
    const rows = describeForecaster(f);
    const row = rows.find((r) => r[0] === "Taylor vs exact mean at step 1 (%)");
    expect(row).toBeDefined();
    expect(row?.[1] as number).toBeCloseTo(100 * ((1 + s2 / 2) / Math.exp(s2 / 2) - 1), 9);
  });
});

describe("messages for values Box-Cox cannot take, and for λ out of range", () => {
  test("zeros and negatives are counted, the first is named with its row, and shift auto's amount is given", () => {
    // shift auto = −minimum + half the smallest step above it: −(−5) + (−3 − (−5))/2 = 6 (README, shift).
    const y = [120, -3, 130, 0, 140, 150, -5, 160, 170, 165];
    expect(() => fitForecast(y, { method: "naive", lambda: 0 })).toThrow(/has 1 zero and 2 negative values \(first: -3 in row 2\).*adds 6/);
  });
  test("λ outside −5…5 is refused with the range", () => {
    expect(() => fitForecast([1, 2, 3, 4, 5, 6], { method: "naive", lambda: 7 })).toThrow(/lambda must be between -5 and 5/);
  });
});

describe("the original-scale fit counts λ as a parameter only when it was estimated (Box & Cox 1964; AICc: Hurvich & Tsai 1989)", () => {
  test("given λ: k is the model's own count; estimated λ: one more, and the AICc follows 2k − 2ℓ + 2k(k + 1)/(n − k − 1)", () => {
    // INVENTED monthly costs of a shop.
    const y = Array.from({ length: 48 }, (_, i) => 300 * Math.exp(0.005 * i + 0.06 * Math.sin(0.9 * i)));
    const t = makeTransform("box-cox", 0);
    const m = fitSmoothing(y.map(Math.log), "ses", 1);
    const given = originalScaleFit(m, y, t, false);
    const estimated = originalScaleFit(m, y, t, true);
    expect(given.k).toBe(m.k);
    expect(estimated.k).toBe(m.k + 1);
    const n = m.residuals.length;
    for (const f of [given, estimated]) {
      expect(f.aicc).toBeCloseTo(2 * f.k - 2 * f.loglik + (2 * f.k * (f.k + 1)) / (n - f.k - 1), 9);
      expect(f.aicc).toBeCloseTo(aiccOf(f.loglik, f.k, n), 12);
    }
    // and no transform never counts a λ
    expect(originalScaleFit(m, y, makeTransform("none", null), true).k).toBe(m.k);
  });
});

describe("the automatic ARIMA search says how it chose d and the order, and nothing else", () => {
  test("a non-seasonal random walk with drift: KPSS notes (5% critical value 0.463, Kwiatkowski et al. 1992), then the stepwise search's note", () => {
    // INVENTED: a seeded-looking deterministic walk (sum of a fixed sine-like sequence plus drift).
    const w: number[] = [];
    let x = 5;
    for (let i = 0; i < 80; i++) { x += 0.02 + 0.1 * Math.sin(2.3 * i) * Math.cos(0.7 * i); w.push(x); }
    const r = autoArima(w, 1);
    expect(r.notes.length).toBeGreaterThanOrEqual(2);
    for (const n of r.notes.slice(0, -1)) expect(n).toMatch(/^KPSS after \d+ differences?: \d+\.\d{3} (≤|>) 0\.463 \(5%\)/);
    expect(r.notes[r.notes.length - 1]).toMatch(/^Stepwise search by AICc \(Hyndman & Khandakar 2008\): \d+ models tried; ARIMA/);
  });
});

describe("the stepwise ARIMA search ends at a local minimum of its own step set (Hyndman & Khandakar 2008, §3.2)", () => {
  test("log AirPassengers (open dataset), period 12: every valid neighbour of the chosen order was tried and has no lower AICc", () => {
    const r = autoArima(dataset("AirPassengers").map(Math.log), 12);
    expect(r.notes.join(" ")).not.toMatch(/stopped after/);
    const o = r.model.order;
    const key = (x: typeof o): string => `${x.p},${x.q},${x.P},${x.Q},${x.constant ? 1 : 0}`;
    const tried = new Map(r.tried.map((t) => [key(t.order), t.aicc]));
    const best = tried.get(key(o)) as number;
    // the paper's moves: p, q, P, Q by ±1; p and q together; P and Q together; the constant in or out
    // (allowed when d + D ≤ 1)
    const moves: Array<Partial<typeof o>> = [];
    for (const dp of [-1, 1]) {
      moves.push({ p: o.p + dp }, { q: o.q + dp }, { p: o.p + dp, q: o.q + dp }, { P: o.P + dp }, { Q: o.Q + dp }, { P: o.P + dp, Q: o.Q + dp });
    }
    if (o.d + o.D <= 1) moves.push({ constant: !o.constant });
    let checked = 0;
    for (const mv of moves) {
      const v = { ...o, ...mv };
      const ok = v.p >= 0 && v.q >= 0 && v.P >= 0 && v.Q >= 0 && v.p <= ARIMA_LIMITS.p && v.q <= ARIMA_LIMITS.q && v.P <= ARIMA_LIMITS.P && v.Q <= ARIMA_LIMITS.Q && v.p + v.q + v.P + v.Q <= 5;
      if (!ok) continue;
      checked++;
      expect(tried.has(key(v))).toBe(true);
      expect(tried.get(key(v)) as number).toBeGreaterThanOrEqual(best - 1e-9);
    }
    expect(checked).toBeGreaterThanOrEqual(6);
  });
});

describe("the λ rule when the smallest readable λ (−1) is the best (seed-20 mutation sample)", () => {
  // INVENTED: a price index simulated to be exactly normal on the Box-Cox λ = −1 scale, w = 1 − 1/y:
  // a slowly wandering level near w = 0.9 (y ≈ 10) observed with noise, so the spread of y grows
  // with y² (Box & Cox 1964: the maximum-likelihood λ then sits near −1).
  const r = createRandom(3);
  let level = 0.9;
  const y: number[] = [];
  for (let i = 0; i < 120; i++) {
    level += 0.004 * r.normal();
    y.push(1 / (1 - (level + 0.012 * r.normal())));
  }
  test("λ = −1 is chosen and held against the profile's own maximum, searched below −1 (the bracket's open side)", () => {
    const c = chooseLambdaAuto(y, { method: "ses" });
    expect(c.lambda).toBe(-1);
    expect(c.usedMaximum).toBe(false);
    // the profile maximum of the chosen form lies within the likelihood-ratio cut of λ = −1
    const p = profileModelLambda(y, "ses");
    expect(p.lambda).toBeLessThan(-0.5);
    expect(p.loglik - c.fit.loglik).toBeLessThanOrEqual(0.5 * 3.841458820694124); // χ²₁(0.95)/2, Box & Cox 1964
  });
});

describe("seed-21 mutation sample: ARIMA titles in the usual (p,d,q)(P,D,Q)[m] notation (Box & Jenkins 1970)", () => {
  test("no seasonal part is written when P, D and Q are all 0; the constant is named by the differencing", () => {
    expect(arimaTitle({ p: 1, d: 1, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true })).toBe("ARIMA(1,1,0) with drift");
    expect(arimaTitle({ p: 2, d: 0, q: 1, P: 0, D: 0, Q: 0, m: 12, constant: true })).toBe("ARIMA(2,0,1) with mean");
    expect(arimaTitle({ p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false })).toBe("ARIMA(0,1,1)(0,1,1)[12]");
  });
});

describe("seed-21 mutation sample: λ's range, Guerrero's window, the total's mean label", () => {
  // INVENTED monthly revenue of a shop
  const y = Array.from({ length: 30 }, (_, i) => 500 * Math.exp(0.01 * i + 0.06 * Math.sin(1.1 * i)));
  test("λ outside −5…5 is refused with the range (Box-Cox λ beyond it is never useful: common practice)", () => {
    expect(() => fitForecast(y, { method: "naive", lambda: 6 })).toThrow(/lambda must be between -5 and 5/);
    expect(() => fitForecast(y, { method: "naive", lambda: -5.5 })).toThrow(/lambda must be between -5 and 5/);
  });
  test("Guerrero's λ without seasons uses windows of 2 (Guerrero 1993 needs at least two values per window): 3 values are too few", () => {
    expect(() => fitForecast([100, 110, 120], { method: "naive", lambda: "guerrero" })).toThrow(/two windows of 2 are needed/);
  });
  test("a total whose step means are all exact says 'exact'; all Taylor says 'taylor'", () => {
    const f = fitForecast(y, { method: "naive", lambda: 0 });
    expect(totalForecast(f, 6, { paths: 2000 }).meanUsed).toBe("exact");
    expect(totalForecast(f, 6, { paths: 2000, mean: "taylor" }).meanUsed).toBe("taylor");
  });
});

describe("seed-21 mutation sample: when the likelihood rejects every readable λ, the note says whether the maximum is at the search's end", () => {
  // INVENTED: a series simulated to be normal on a Box-Cox scale beyond the readable values
  // (w = a wandering level near 2, y = (1 + λw)^{1/λ}); the likelihood-ratio test (Box & Cox 1964)
  // rejects λ = 1 and the rule uses the form's own maximum, searched between ½ and 2.
  const sim = (lam: number, seed: number): number[] => {
    const r = createRandom(seed);
    let level = 2;
    return Array.from({ length: 300 }, () => {
      level = Math.abs(level + 0.25 * r.normal());
      return Math.pow(1 + lam * Math.abs(level + 0.3 * r.normal()), 1 / lam);
    });
  };
  test("true λ 1.8: the maximum (about 1.3) is inside the search, so no 'end of the search' note", () => {
    const c = chooseLambdaAuto(sim(1.8, 1), { method: "ses" });
    expect(c.usedMaximum).toBe(true);
    expect(c.lambda).toBeGreaterThan(1.05);
    expect(c.lambda).toBeLessThan(1.95);
    expect(c.note).not.toMatch(/end of the search/);
  });
  test("true λ 3: the maximum sits on the search's upper end (2), and the note says to search wider", () => {
    const c = chooseLambdaAuto(sim(3, 1), { method: "ses" });
    expect(c.usedMaximum).toBe(true);
    expect(c.lambda).toBeCloseTo(2, 2);
    expect(c.note).toMatch(/It lies at the end of the search \(0\.5 to 2\); give λ = "model" to search wider\./);
  });
});

describe("seed-22 mutation sample: which forms and lengths apply", () => {
  // INVENTED monthly revenue of a shop, 10 months
  const y10 = [500, 512, 498, 530, 541, 529, 556, 560, 571, 566];
  test("without seasons (period 1) the automatic choice tries only the non-seasonal forms (a season of 1 is none: common practice)", () => {
    const a = fitAuto(y10.map(Math.log), 1);
    expect(a.candidates.map((c) => c.method).sort()).toEqual(["damped", "holt", "ses"]);
  });
  test("naive and drift need 2 and 3 values whatever the period; seasonal naive needs two seasons", () => {
    expect(fitForecast(y10, { method: "naive", lambda: 0, period: 12 }).method).toBe("naive");
    expect(fitForecast(y10, { method: "drift", lambda: 0, period: 12 }).method).toBe("drift");
    expect(() => fitForecast(y10, { method: "seasonal-naive", lambda: 0, period: 12 })).toThrow(/24/);
  });
  test("λ outside −5…5 is an input error (#VALUE! in a cell)", () => {
    expect(() => fitForecast(y10, { method: "naive", lambda: 7 })).toThrow(expect.objectContaining({ code: "input" }));
  });
});
