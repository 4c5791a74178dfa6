// Edges of the cell layer's argument reading that the mutation run (MUTATION.md §2) found unguarded.
// Rule (common practice in spreadsheet functions): an argument that takes one value accepts one
// cell, and a larger range is refused by name rather than read as its first cell.
import { describeValue, optionalBoolean, optionalKeyword, optionalNumber, readLevels } from "../../src/functions/coerce";
import { levelList } from "../../src/functions/audit-args";
import * as FW from "../../src/functions/functions";
import { ShimError } from "../helpers/custom-functions-shim";
import { failure } from "../helpers/cell-failure";

describe("single-value arguments", () => {
  test("a 1×1 range is its cell; a 2×1 or 1×2 range is refused naming the argument", () => {
    expect(optionalNumber([[12]], "horizon", 6)).toBe(12);
    expect(() => optionalNumber([[12], [13]], "horizon", 6)).toThrow(/horizon must be a single cell/);
    expect(() => optionalNumber([[12, 13]], "horizon", 6)).toThrow(/horizon must be a single cell/);
  });
  test("levels that are not finite are refused with what to give", () => {
    expect(() => readLevels(Number.POSITIVE_INFINITY)).toThrow(/levels is not a finite number; give percentages like 80 and 95/);
    expect(readLevels(90)).toEqual([90]);
  });
});

describe("FW.PINBALL skips rows where either value is blank (pinball loss, Koenker & Bassett 1978)", () => {
  test("actuals 10, blank, 30 against quantile 20 at p = 0.9: mean of 0.1·10 and 0.9·10 = 5", () => {
    // loss(q, y, p) = p·(y − q) when y ≥ q, (1 − p)·(q − y) when y < q:
    // y = 10: 0.1·10 = 1; y = 30: 0.9·10 = 9; the blank row is left out → (1 + 9)/2 = 5.
    expect(FW.PINBALL([[10], [""], [30]], [[20], [20], [20]], 0.9)).toBeCloseTo(5, 12);
    expect(FW.PINBALL([[10], [null], [30]], [[20], [""], [20]], 0.9)).toBeCloseTo(5, 12);
  });
});


describe("seed-20 mutation sample: what the cell layer says about blank and oversized arguments", () => {
  const col = (xs: (number | string | null)[]): (number | string | null)[][] => xs.map((x) => [x]);
  test("FW.TOTALFROMINTERVALS with three blank columns says they hold no numbers", async () => {
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([null, ""]), col([null, null]), col(["", null]), 80))).message)
      .toBe("medians, lowers and uppers hold no numbers; select the published forecast's three columns.");
  });
  test("FW.TOTALFROMINTERVALS refuses a 2-cell range as λ or dependence, naming it, rather than reading its first cell", async () => {
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, [[0], [1]]))).message).toMatch(/lambda must be a single cell/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, [[0]], [["comonotone", "independent"]]))).message).toMatch(/dependence must be a single cell/);
    // a 1×1 range is its cell
    expect(FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, [[0]], [["comonotone"]])).toEqual(FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, 0, "comonotone"));
  });
  test("a blank level (Excel passes an omitted argument as null) is 'blank', not an unreadable value", () => {
    for (const v of [null, undefined, ""]) expect(() => levelList(v)).toThrow(/level must be a percentage like 80, .*; it is blank\./);
  });
  test("keywords are matched with surrounding spaces trimmed and case ignored", () => {
    expect(optionalKeyword(" Exact ", "mean", ["auto", "exact", "taylor"] as const, "auto")).toBe("exact");
    expect(optionalKeyword("TAYLOR\t", "mean", ["auto", "exact", "taylor"] as const, "auto")).toBe("taylor");
  });
});

describe("seed-21 mutation sample: booleans, blank verdicts, long text in messages", () => {
  test("a flag given as 1 or 0 (how some sheets store TRUE and FALSE) is read as TRUE or FALSE; 2 is refused", () => {
    expect(optionalBoolean(1, "header", false)).toBe(true);
    expect(optionalBoolean(0, "header", true)).toBe(false);
    expect(() => optionalBoolean(2, "header", true)).toThrow(/header must be TRUE or FALSE/);
  });
  test("FW.BACKTEST leaves every statistic of a step no origin reached empty", async () => {
    // INVENTED series (a shop's monthly sales with a gentle trend); month 25 missing, as in test/engine/audit-edges.test.ts
    const y: Array<number | null> = Array.from({ length: 30 }, (_, i) => 200 + 2 * i + 5 * Math.sin(i));
    y[24] = null;
    const out = (await FW.BACKTEST(y.map((v) => [v]), 5, "naive", "none", 80, 1, 25)) as unknown[][];
    // step 5: no origin, so coverage, score, mean errors, Kupiec p and verdict are all empty cells
    expect(out[4]).toEqual([5, 0, "", "", "", "", "", ""]);
  });
  test("a text cell where a number belongs is quoted in the message, cut to 20 characters", () => {
    const v = FW.BTMEAN([["a very long piece of text in a cell"]], [[0.5]], 0, "exact") as unknown[][];
    expect((v[0][0] as ShimError).message).toBe('mu is not a number here ("a very long piece o).');
  });
});

describe("seed-22 mutation sample: how a wrong argument is described", () => {
  test("a number where a keyword belongs is named in the message (no crash)", () => {
    expect(() => optionalKeyword(5, "mean", ["auto", "exact", "taylor"] as const, "auto")).toThrow('mean must be one of "auto", "exact", "taylor"; got 5.');
  });
  test("a range is described as a range, a boolean as TRUE/FALSE (as Excel shows them)", () => {
    expect(describeValue([[1], [2]])).toBe("a range of 2×1 cells");
    expect(describeValue(true)).toBe("TRUE");
    expect(describeValue(false)).toBe("FALSE");
  });
});
