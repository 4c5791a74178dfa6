// Edges of the cell layer's argument reading that the mutation run (MUTATION.md §2) found unguarded.
// Rule (common practice in spreadsheet functions): an argument that takes one value accepts one
// cell, and a larger range is refused by name rather than read as its first cell.
import { optionalNumber, readLevels } from "../../src/functions/coerce";
import * as FW from "../../src/functions/functions";

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
