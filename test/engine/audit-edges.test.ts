// Edges of the audit and the backtest that the mutation run (MUTATION.md §2) found unguarded.
import { auditLog, backtest, calibrationTable, chiSquareSf, crpsBacktransformed, intervalScore, overlapTests, verdictOf } from "../../src/engine";
import { practicalMinimum } from "../../src/engine/audit/backtest";

describe("a log's unreadable interval end is named by its column and level (common practice: say what to fix)", () => {
  test("text in the upper column at 95% names 'upper (95%)' and the row", () => {
    const input = {
      actual: [100, 102, 98],
      intervals: [{ level: 95, lower: [90, 91, 89], upper: [110, "n/a", 108] }],
      firstRow: 2,
    };
    expect(() => auditLog(input)).toThrow(/upper \(95%\)/);
    expect(() => auditLog(input)).toThrow(/[Rr]ow 3/);
  });
});

describe("a backtest step that no origin reaches has no statistics rather than made-up ones", () => {
  test("the only origin that reaches step 5 follows a missing month: step 5 has no coverage, no test and no verdict", () => {
    // INVENTED series (a shop's monthly sales with a gentle trend); month 25 missing.
    const y: Array<number | null> = Array.from({ length: 30 }, (_, i) => 200 + 2 * i + 5 * Math.sin(i));
    y[24] = null;
    const bt = backtest(y, 5, { method: "naive", lambda: "none", first: 25, level: 80 });
    expect(bt.rows.map((r) => r.origins)).toEqual([4, 3, 2, 1, 0]);
    expect(bt.rows[3].kupiecP).not.toBeNull();
    for (const r of bt.rows.slice(4)) {
      expect(r.coverage).toBeNull();
      expect(r.kupiecP).toBeNull();
      expect(r.verdict).toBeNull();
    }
  });
});

describe("the CRPS of a back-transformed forecast (seed-20 mutation sample, MUTATION.md §2)", () => {
  // λ = 0: the log-normal closed form of Baran & Lerch (2015, Q. J. R. Meteorol. Soc. 141:2289–2299),
  // CRPS = y(2Φ(z₀) − 1) − 2e^{μ+σ²/2}[Φ(z₀ − σ) + Φ(σ/√2) − 1], z₀ = (ln y − μ)/σ, evaluated with
  // mpmath 1.3 at 1,200 digits, rounded to doubles (the bracket cancels badly in doubles for wide fans).
  test.each([
    [0, 3, 2, 2.9103338377168315],
    [1, 5, 10, 297.329935007012],
    [2, 10, 1.5, 58900207732.0334],
    [0, 20, 1, 1.5091356495324477e42],
    [5, 50, 100, 9.09205199322015e271],
  ])("λ = 0, μ = %d, σ = %d, y = %d: the log-normal closed form to 1e-12", (mu, s, y, want) => {
    // (with 1 − Φ(z) in the upper tail, σ = 10 was off by 7e-7 and σ = 50 by 122 orders of magnitude)
    const got = crpsBacktransformed(mu, s, 0, y);
    expect(Math.abs(got - want) / want).toBeLessThan(1e-12);
  });
  test("λ = ½ and ¼: ∫(F(x) − 1{x ≥ y})² dx, the definition (Matheson & Winkler 1976), by mpmath quadrature at 30 digits", () => {
    expect(Math.abs(crpsBacktransformed(3, 2, 0.5, 20) / 10.10518209896114 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(crpsBacktransformed(3, 8, 0.25, 5) / 20.66786339750117 - 1)).toBeLessThan(1e-12);
  });
  test("a CRPS beyond the largest double is refused as unavailable, not returned as a smaller number", () => {
    // e^{μ+σ²/2} = e^{20005}: the closed form's terms are far past 1.8e308.
    expect(() => crpsBacktransformed(5, 200, 0, 1)).toThrow(expect.objectContaining({ code: "unavailable", message: expect.stringMatching(/too large to represent/) }));
  });
});

describe("the interval score's inputs (Gneiting & Raftery 2007, eq. 43: defined for lower ≤ upper and 0 < α < 1)", () => {
  test("a lower end above the upper end is refused, naming both", () => {
    expect(() => intervalScore(5, 3, 4, 0.05)).toThrow(/lower end \(5\) is above the upper end \(3\)/);
    expect(intervalScore(3, 3, 3, 0.05)).toBe(0);
  });
  test("α of 0 or 1 is refused", () => {
    for (const a of [0, 1, 1.5]) expect(() => intervalScore(1, 2, 1.5, a)).toThrow(/α must be strictly between 0 and 1/);
  });
});

describe("the backtest's first fitting window (common practice: two full seasons only for a seasonal method)", () => {
  test("a non-seasonal method at period 12 needs the stated minimum of 10 values, not two seasons; seasonal naive needs 24", () => {
    for (const m of ["naive", "mean", "drift", "ses", "holt"]) expect(practicalMinimum(m, 12)).toEqual({ length: 10, reason: "the stated minimum of 10 values" });
    expect(practicalMinimum("seasonal-naive", 12)).toEqual({ length: 24, reason: "two full seasons of 12" });
  });
  test("first = 1 is refused with the rule (at least 2), not read as a window of one value", () => {
    const y = Array.from({ length: 30 }, (_, i) => 100 + i); // INVENTED
    expect(() => backtest(y, 1, { method: "naive", lambda: "none", first: 1 })).toThrow(/first must be a whole number of at least 2/);
  });
});

describe("seed-21 mutation sample: calibration ties and the overlap note's ordinals", () => {
  test("two quantiles that are equal (a forecast with a point mass, or rounding) are accepted; only falling ones are refused", () => {
    const y = [10, 12, 11, 13, 9, 12]; // INVENTED
    const q = (v: number): number[] => y.map(() => v);
    const c = calibrationTable(y, [{ p: 0.1, cells: q(9.5) }, { p: 0.5, cells: q(11) }, { p: 0.9, cells: q(11) }]);
    // share at or below 11: 10, 11, 9 → 3 of 6 for both p = 0.5 and p = 0.9
    expect(c.rows.map((r) => r.hitRate)).toEqual([1 / 6, 0.5, 0.5]);
    expect(() => calibrationTable(y, [{ p: 0.5, cells: q(11) }, { p: 0.9, cells: q(10.9) }])).toThrow(/quantile \(10\.9\) is below the 0\.5 quantile/);
  });
  test("the overlap note says 'every 11th/12th/13th origin' and 'every 2nd/3rd/21st' (English ordinals)", () => {
    const strand = Array.from({ length: 60 }, (_, i) => (i % 7 === 0 ? 1 : 0)); // INVENTED hit sequence
    const word = (h: number): string => (/every (\d+\w\w) origin/.exec(overlapTests([strand], 0.1, h).adjustment) as RegExpExecArray)[1];
    expect([2, 3, 4, 11, 12, 13, 21, 22].map(word)).toEqual(["2nd", "3rd", "4th", "11th", "12th", "13th", "21st", "22nd"]);
  });
});

describe("seed-22 mutation sample: an input error's code, the first window's rule, the verdict's wording", () => {
  test("overlapping tests at step 0 are refused as an input error (a cell shows #VALUE!, not #NUM!)", () => {
    expect(() => overlapTests([[0, 1, 0]], 0.1, 0)).toThrow(expect.objectContaining({ code: "input" }));
  });
  test("first = 2 is a valid window length, refused only because naive needs 4 values here", () => {
    const y = Array.from({ length: 30 }, (_, i) => 100 + i); // INVENTED
    expect(() => backtest(y, 1, { method: "naive", lambda: "none", first: 2 })).toThrow(/first = 2 is too short for naive: it needs at least 4 values/);
  });
  test("conditional coverage rejects while neither part does, the clustering part larger: the verdict says so (Christoffersen 1998: LR_cc = LR_uc + LR_ind)", () => {
    const uc = { lr: 3.0, p: chiSquareSf(3.0, 1), df: 1 as const, note: "" }; // p = 0.083
    const ind = { lr: 3.5, p: chiSquareSf(3.5, 1), df: 1 as const, note: "" }; // p = 0.061
    const cc = { lr: 6.5, p: chiSquareSf(6.5, 2), df: 2 as const, note: "" }; // p = e^{−3.25} = 0.039
    const v = verdictOf({ n: 120, misses: 10, coverage: 110 / 120, nominal: 0.95, kupiec: uc, independence: ind, conditional: cc, zone: "yellow" });
    expect(v.code).toBe("misses-cluster");
    expect(v.text).toMatch(/Neither test alone rejects, but together they do, mostly through the clustering of misses\./);
  });
});
