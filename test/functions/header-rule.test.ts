// The header rule (README, "How Fanwise reads cells"): a first row is a header only when its
// non-blank cells are all text. A row with a number in it is data, so ["Shop", 5] is not a header
// and the 5 stays in its series (common practice: a header names columns; a number is a value).
import "../helpers/custom-functions-shim";
import { isHeaderRow } from "../../src/engine";
import { readSeries } from "../../src/functions/coerce";
import * as FW from "../../src/functions/functions";
import { isCellError } from "../helpers/custom-functions-shim";

describe("the header rule", () => {
  test('["Shop", 5] is not a header; ["Shop", null], ["Shop", "Mill"] and ["Shop", ""] are', () => {
    expect(isHeaderRow(["Shop", 5])).toBe(false);
    expect(isHeaderRow([5, "Shop"])).toBe(false);
    expect(isHeaderRow(["Shop", true])).toBe(false);
    expect(isHeaderRow(["Shop", null])).toBe(true);
    expect(isHeaderRow(["Shop", "Mill"])).toBe(true);
    expect(isHeaderRow(["Shop", ""])).toBe(true);
    expect(isHeaderRow([null, ""])).toBe(false);
    expect(isHeaderRow([" ", null])).toBe(false);
  });
  test('a range whose first row is ["Shop", 5] keeps the 5 as the first value of column B', () => {
    const s = readSeries([["Shop", 5], [1, 6], [2, 7], [3, 8]]);
    expect(s.headerRows).toBe(0);
    expect(s.names).toEqual(["column A", "column B"]);
    expect(s.series[1]).toEqual([5, 6, 7, 8]);
  });
  test("in a cell function: column B's forecast uses all four values (naive, no transform: the last, 8; σ̂ = 1)", async () => {
    const out = await FW.FAN([["Shop", 5], [1, 6], [2, 7], [3, 8]], 1, "naive", "none", null as never, null as never, true);
    // column A starts with text above its numbers: refused or trimmed, but never column B's 5 taken as a name
    expect(out[0]).not.toContain("5 median");
    expect(out[0]).toContain("column B median");
    const j = out[0].indexOf("column B median");
    expect(out[1][j]).toBe(8);
    const low80 = out[1][out[0].indexOf("column B low 80%")];
    expect(isCellError(low80)).toBe(false);
    expect(low80).toBeCloseTo(8 - 1.2815515655446004, 12); // σ̂ = 1 from the three unit steps; z₀.₉ from tables
  });
  test("a real header names the series and is not read as data", () => {
    const s = readSeries([["Harbour Street", "Mill Lane"], [1, 6], [2, 7]]);
    expect(s.headerRows).toBe(1);
    expect(s.names).toEqual(["Harbour Street", "Mill Lane"]);
    expect(s.series).toEqual([[1, 2], [6, 7]]);
  });
});
