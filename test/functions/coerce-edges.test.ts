// Edges of the cell layer's argument reading that the mutation run (MUTATION.md §2) found unguarded.
// Rule (common practice in spreadsheet functions): an argument that takes one value accepts one
// cell, and a larger range is refused by name rather than read as its first cell.
import { optionalNumber, readLevels } from "../../src/functions/coerce";

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
