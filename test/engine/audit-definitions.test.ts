// Two audit behaviours held to their definitions with more than one check each:
//  - Christoffersen's (1998) transition counts n_ij = #{t ≥ 2 : I_{t−1} = i, I_t = j}, counted here
//    independently by reading the hit sequence as text and counting overlapping pairs;
//  - interval ends are inclusive: an actual equal to an end is inside (a central interval is the
//    closed set [l, u]; Winkler's score has no penalty there, Winkler 1972), in the hit sequence, the
//    audit, the cell function and the backtest.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import { auditCoverage, backtest, christoffersenIndependence, hitSequence, transitions } from "../../src/engine";
import * as FW from "../../src/functions/functions";

/** Overlapping occurrences of a two-character pair in a text. */
function pairs(s: string, pair: string): number {
  let n = 0;
  for (let i = s.indexOf(pair); i >= 0; i = s.indexOf(pair, i + 1)) n++;
  return n;
}

describe("Christoffersen (1998) transition counts, counted from the definition", () => {
  test("a hand-counted sequence 0110010: pairs 01 11 10 00 01 10", () => {
    const t = transitions([0, 1, 1, 0, 0, 1, 0]);
    expect([t.n00, t.n01, t.n10, t.n11]).toEqual([1, 2, 2, 1]);
    expect(t.pi01).toBeCloseTo(2 / 3, 15);
    expect(t.pi11).toBeCloseTo(1 / 3, 15);
    expect(t.pi).toBeCloseTo(3 / 6, 15);
  });
  test("any 0/1 sequence: each count is its pair's overlapping count; they add to T − 1; rates as defined (fast-check, seed 19)", () => {
    fc.assert(fc.property(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: 2, maxLength: 60 }), (hits) => {
      const s = hits.join("");
      const t = christoffersenIndependence(hits);
      expect([t.n00, t.n01, t.n10, t.n11]).toEqual([pairs(s, "00"), pairs(s, "01"), pairs(s, "10"), pairs(s, "11")]);
      expect(t.n00 + t.n01 + t.n10 + t.n11).toBe(hits.length - 1);
      if (t.n00 + t.n01 > 0) expect(t.pi01).toBe(t.n01 / (t.n00 + t.n01));
      if (t.n10 + t.n11 > 0) expect(t.pi11).toBe(t.n11 / (t.n10 + t.n11));
      expect(t.pi).toBe((t.n01 + t.n11) / (hits.length - 1));
    }), { seed: 19, numRuns: 300 });
  });
  test("the audit's independence test counts the same transitions from intervals and actuals", () => {
    // misses at rows 2, 3 and 6 (0-based): hits 0011001 → 00 01 11 10 00 01
    const actual = [10, 10, 30, 30, 10, 10, 30];
    const a = auditCoverage(actual, actual.map(() => 5), actual.map(() => 20), 80);
    expect(a.hits).toEqual([0, 0, 1, 1, 0, 0, 1]);
    const ind = a.independence as unknown as { n00: number; n01: number; n10: number; n11: number };
    expect([ind.n00, ind.n01, ind.n10, ind.n11]).toEqual([2, 2, 1, 1]);
  });
});

describe("interval ends are inclusive (a closed interval [l, u]; common practice, README audit section)", () => {
  const actual = [90, 110, 100, 89.999, 110.001];
  const lower = [90, 90, 90, 90, 90];
  const upper = [110, 110, 110, 110, 110];
  test("hit sequence: an actual on either end is inside; just outside is a miss", () => {
    expect(hitSequence(actual, lower, upper).hits).toEqual([0, 0, 0, 1, 1]);
  });
  test("audit: coverage counts both ends as inside, and the score charges nothing for them (Winkler 1972)", () => {
    const a = auditCoverage(actual.slice(0, 3), lower.slice(0, 3), upper.slice(0, 3), 80);
    expect(a.misses).toBe(0);
    expect(a.coverage).toBe(1);
    expect(a.intervalScore).toBe(20);
  });
  test("FW.COVERAGE: n, misses and coverage with actuals on the ends", () => {
    const col = (xs: number[]): number[][] => xs.map((x) => [x]);
    const out = FW.COVERAGE(col(actual), col(lower), col(upper), 80) as number[][];
    expect(out[0].slice(0, 3)).toEqual([5, 2, 0.6]);
  });
  test("backtest: a constant history gives the interval [c, c], and the actual c is inside it", () => {
    const bt = backtest([5, 5, 5, 5, 5, 5, 5, 5], 2, { method: "naive", lambda: "none", first: 4 });
    expect(bt.rows.map((r) => r.coverage)).toEqual([1, 1]);
    expect(bt.rows.map((r) => r.intervalScore)).toEqual([0, 0]);
  });
});
