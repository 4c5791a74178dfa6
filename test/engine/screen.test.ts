// Series screening: the counts are checked by hand on small inputs; the λ it suggests is the
// λ lambda "auto" uses (models/lambda-choice.ts; checked in lambda-model.test.ts).
import { cleanSeries, screenSeries } from "../../src/engine";
import { fitForecast } from "../../src/engine";
import { dataset } from "../helpers/reference";

describe("screenSeries counts what a user needs to know", () => {
  test("numbers, blanks (leading, trailing, interior), text, minimum and values ≤ 0", () => {
    const r = screenSeries([null, "", 5, 6, null, "n/a", 7, true, 8, null], { label: "Shop" });
    expect(r.n).toBe(4);
    expect(r.blanks).toBe(4);
    expect(r.leadingBlanks).toBe(2);
    expect(r.trailingBlanks).toBe(1);
    expect(r.interiorGaps).toEqual([5]);
    expect(r.textCells).toBe(2);
    expect(r.min).toBe(5);
    expect(r.nonPositive).toBe(0);
    expect(r.missing).toBe(1);
    // 4 observed values are too few for the λ rule lambda "auto" uses (the smoothing fit needs 5)
    expect(r.fix).toBe("too-short");
    expect(r.message).toMatch(/needs at least 5 observed values/);
    expect(r.message).toMatch(/1 blank inside the series \(at position 5\) is a missing observation/);
  });
  test("one blank inside a longer series is a missing observation, and λ is still suggested", () => {
    const r = screenSeries([50, 62, null, 71, 80, 76, 90, 95, 88, 97, 104, 99], { label: "Shop" });
    expect(r.missing).toBe(1);
    expect(r.fix).toBe("none");
    expect(r.suggestedLambda).not.toBeNull();
    expect(r.message).toMatch(/1 blank inside the series \(at position 3\) is a missing observation/);
  });
  test("too many blanks inside the series (over 20%) ask to fill some", () => {
    const r = screenSeries([5, null, 6, null, 7, 8, 9, 10], { label: "Shop" });
    expect(r.fix).toBe("fill-gaps");
    expect(r.message).toMatch(/2 blanks inside the series \(25% of 8 periods, at position 2, position 4\): at most 20% may be missing/);
  });
  test("zeros in a row make Box-Cox unusable and suggest a shift", () => {
    const r = screenSeries([120, 0, 0, 130, 140, 150, 160, 170, 165, 180], { label: "Old Quay" });
    expect(r.boxCoxUsable).toBe(false);
    expect(r.zerosIsolated).toBe(false);
    expect(r.fix).toBe("shift");
    // shift "auto" = −min + half the smallest step above it (autoShift): 0 + 120/2
    expect(r.shift).toBe(60);
    expect(r.message).toMatch(/Not Box-Cox ready: Old Quay has 2 zeros \(minimum 0, first at position 2\).*shift "auto", which adds 60/);
  });
  test("an isolated zero month (a closed month) suggests reading zeros as missing, naming the face's option", () => {
    const r = screenSeries([120, 0, 130, 140, 150, 160], { label: "Old Quay" });
    expect(r.zerosIsolated).toBe(true);
    expect(r.fix).toBe("zeros-missing");
    expect(r.message).toMatch(/If that period was closed, read zeros as missing observations: leave those cells blank \(cells\), add --zeros missing \(command line\), or tick "Treat zeros as missing" \(pane\)\. Otherwise use shift "auto", which adds 60/);
    const cli = screenSeries([120, 0, 130, 140, 150, 160], { label: "Old Quay", zerosOption: "add --zeros missing" });
    expect(cli.message).toMatch(/read zeros as missing observations: add --zeros missing\./);
  });
  test("with zeros read as missing, the same series is Box-Cox ready with one missing observation", () => {
    const r = screenSeries([120, 0, 130, 140, 150, 160], { label: "Old Quay", zeros: "missing" });
    expect(r.boxCoxUsable).toBe(true);
    expect(r.missing).toBe(1);
    expect(r.zeros).toBe(1);
    expect(r.message).toMatch(/1 missing value inside the series \(at position 2\) is a missing observation/);
  });
  test("a negative month suggests Yeo-Johnson (or a shift past the minimum)", () => {
    const r = screenSeries([120, -30, 130, 140, 150, 160], { label: "Parts" });
    expect(r.fix).toBe("yeo-johnson");
    expect(r.shift).toBe(105); // 30 + (120 − (−30))/2
    expect(r.message).toMatch(/1 negative value.*transform "yeo-johnson"/);
  });
  test("too short to choose λ", () => {
    const r = screenSeries([3, 4, 5]);
    expect(r.fix).toBe("too-short");
    expect(r.message).toMatch(/at least 4/);
  });
  test("no numbers at all", () => {
    expect(screenSeries([null, "x"]).fix).toBe("no-numbers");
  });
  test("a constant series needs no transform", () => {
    const r = screenSeries([5, 5, 5, 5, 5]);
    expect(r.fix).toBe("constant");
    expect(r.suggestedLambda).toBe(1);
  });
  test("the suggested λ is exactly the λ a forecast with lambda \"auto\" uses, inside the interval shown (issue 12 §2; AirPassengers, R datasets)", () => {
    const y = dataset("AirPassengers");
    const r = screenSeries(y, { period: 12 });
    expect(r.suggestedLambda).toBe(fitForecast(y, { period: 12 }).lambda);
    expect(r.suggestedLambda).toBe(0);
    const [lo, hi] = r.lambda?.interval as [number, number];
    expect(lo).toBeLessThanOrEqual(0);
    expect(hi).toBeGreaterThanOrEqual(0);
    expect(r.boxCoxUsable).toBe(true);
  });
  test("zeros: the advice names the argument that works (shift \"auto\", transform \"yeo-johnson\")", () => {
    const r = screenSeries([3, 0, 5, 6, 4, 7]);
    expect(r.message).toMatch(/shift "auto", which adds 1\.5 \(command line: --shift auto\)/);
    expect(r.message).toMatch(/transform "yeo-johnson"/);
    expect(r.shift).toBe(1.5);
  });
  test("refuses a period that is not a whole number ≥ 1", () => {
    expect(() => screenSeries([1, 2, 3, 4], { period: 0 })).toThrow(/period/);
    expect(() => screenSeries([1, 2, 3, 4], { period: 2.5 })).toThrow(/period/);
  });
});

describe("cleanSeries trims the ends and marks interior gaps as missing", () => {
  test("leading and trailing blanks are trimmed and counted", () => {
    const c = cleanSeries([null, null, 3, 4, 5, ""]);
    expect(c.values).toEqual([3, 4, 5]);
    expect(c.leadingBlanks).toBe(2);
    expect(c.trailingBlanks).toBe(1);
  });
  test("an interior blank is a missing observation (NaN at its place); too many are refused, naming the rows", () => {
    expect(cleanSeries([3, 4, null, 5, 6, 7], "Millbrook", 2).values).toEqual([3, 4, NaN, 5, 6, 7]);
    expect(() => cleanSeries([3, null, 5], "Millbrook", 2)).toThrow(/Millbrook has 1 missing value among its 3 periods \(33%, rows 3\)/);
  });
  test("interior text is refused, naming its row", () => {
    expect(() => cleanSeries([3, "closed", 5], "Millbrook")).toThrow(/text \("closed"\) in row 2/);
  });
});
