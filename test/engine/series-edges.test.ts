// Edges of the series checks that the mutation run (MUTATION.md §2) found unguarded.
import { cleanSeries, isHeaderRow, requirePositiveSeries, screenSeries } from "../../src/engine";

describe("zeros read as closed periods only when each sits alone between positive values", () => {
  // INVENTED monthly sales of a shop; a zero is a month it was closed.
  const base = [120, 131, 128, 140, 152, 149, 160, 171, 166, 178, 185, 190, 198, 204, 199, 210, 221, 230];
  test("one zero between positive months: the suggested fix is to read zeros as missing", () => {
    const y = base.slice();
    y[7] = 0;
    expect(screenSeries(y, { label: "Shop" }).fix).toBe("zeros-missing");
  });
  test("two zeros together are not a closed month: the fix is a shift, not zeros as missing", () => {
    const y = base.slice();
    y[7] = 0;
    y[8] = 0;
    expect(screenSeries(y, { label: "Shop" }).fix).toBe("shift");
  });
  test("a zero first or last is not a closed month either", () => {
    expect(screenSeries([0, ...base.slice(1)], { label: "Shop" }).fix).toBe("shift");
    expect(screenSeries([...base.slice(0, -1), 0], { label: "Shop" }).fix).toBe("shift");
  });
});

describe("counts in messages agree in number (common practice)", () => {
  test("a one-value series is 'it has 1 value', two are '2 values'", () => {
    expect(() => requirePositiveSeries([5], 3, "the series", "a forecast")).toThrow(/it has 1 value, at least 3/);
    expect(() => requirePositiveSeries([5, 6], 3, "the series", "a forecast")).toThrow(/it has 2 values, at least 3/);
  });
});

describe("zeros read as missing at the very end leave nothing to forecast from: the message names the rows", () => {
  test("one trailing zero: 'row 6 is a zero'; two: 'rows 5, 6 are zeros' (rows counted from the first row, 1)", () => {
    expect(() => cleanSeries([5, 6, 7, 8, 0], "Shop", 2, { zeros: "missing" })).toThrow(/row 6 is a zero, read as missing, after the last observed value \(row 5\)/);
    expect(() => cleanSeries([5, 6, 7, 0, 0], "Shop", 2, { zeros: "missing" })).toThrow(/rows 5, 6 are zeros, read as missing, after the last observed value \(row 4\)/);
  });
});

describe("seed-20 mutation sample: option checks, the header rule, where the first bad value is", () => {
  test("an unknown zeros rule is refused, naming the two that exist", () => {
    expect(() => cleanSeries([5, 6, 7], "Shop", 1, { zeros: "drop" as never })).toThrow(/zeros must be "keep" or "missing"; got "drop"/);
  });
  test("the header rule: a row of text names series; a row with a number, or all blank, does not (common practice of spreadsheet tables)", () => {
    expect(isHeaderRow(["Harbour Street", "Old Quay"])).toBe(true);
    expect(isHeaderRow(["Harbour Street", null])).toBe(true);
    expect(isHeaderRow(["Shop", 5])).toBe(false);
    expect(isHeaderRow([null, " "])).toBe(false);
    expect(isHeaderRow([true, "Shop"])).toBe(false);
  });
  test("Box-Cox's refusal points at the first value ≤ 0, a zero as much as a negative", () => {
    expect(() => requirePositiveSeries([3, 0, 5, -1, 4], 2, "Shop", "a forecast")).toThrow(/1 zero and 1 negative value \(first at position 2\)/);
    expect(() => requirePositiveSeries([3, 4, 0, 5], 2, "Shop", "a forecast")).toThrow(/1 zero \(first at position 3\)/);
  });
});

describe("seed-21 mutation sample: the screen's figures and its 20% rule", () => {
  test("the maximum is the largest value, wherever it is", () => {
    const s = screenSeries([3, 9, 4, 2], { label: "Shop" });
    expect([s.min, s.max]).toEqual([2, 9]);
  });
  test("one value: 'too short to forecast: it has 1 value' — singular", () => {
    expect(screenSeries([5], { label: "Shop" }).message).toMatch(/Shop is too short: 1 value;/);
  });
  test("at most 20% of the periods may be missing (METHODS §8): 2 blanks in 10 periods pass, 3 do not", () => {
    // INVENTED monthly sales
    const two = [120, null, 131, 128, null, 140, 152, 149, 160, 171];
    const three = [120, null, 131, null, null, 140, 152, 149, 160, 171];
    expect(screenSeries(two, { label: "Shop" }).fix).not.toBe("fill-gaps");
    expect(screenSeries(three, { label: "Shop" }).fix).toBe("fill-gaps");
  });
});

describe("seed-22 mutation sample", () => {
  test("an omitted cell (undefined, as some hosts pass it) in a header row of text is blank, not a number", () => {
    expect(isHeaderRow(["Harbour Street", undefined])).toBe(true);
  });
  test("a value that is not a finite number is an input error (#VALUE! in a cell)", () => {
    expect(() => requirePositiveSeries([3, Number.NaN, 5], 2, "Shop", "a forecast")).toThrow(expect.objectContaining({ code: "input" }));
  });
});
