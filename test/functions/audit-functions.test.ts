// FW.COVERAGE / FW.INTERVALSCORE / FW.PINBALL / FW.BACKTEST as Excel calls them, against the
// scipy coverage fixtures and the engine.
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { buildDemoWorkbook } from "../../src/demo/quillmere";
import { backtest } from "../../src/engine";
import { check, dataset, expectClose } from "../helpers/reference";

const col = (xs: (number | string | null)[]): (number | string | null)[][] => xs.map((x) => [x]);

describe("FW.COVERAGE", () => {
  test("reproduces the fixture's Kupiec and Christoffersen p-values for a constructed hit sequence (coverage.n250_miss17_clustered)", () => {
    const c = check("coverage.n250_miss17_clustered");
    const hits = (c.inputs.hits as string).split("").map(Number);
    const actual = hits.map((h) => (h ? 120 : 100));
    const out = FW.COVERAGE(col(actual), col(hits.map(() => 90)), col(hits.map(() => 110)), 95);
    const [n, misses, coverage, pUc, pInd, pCc] = out[0] as number[];
    expect([n, misses]).toEqual([250, 17]);
    expectClose(coverage, 1 - 17 / 250, { rtol: 1e-15 }, "coverage");
    expectClose(pUc, c.expected.p_value_uc, { rtol: 1e-10 }, "Kupiec p");
    expectClose(pInd, c.expected.p_value_ind, { rtol: 1e-10 }, "independence p");
    expectClose(pCc, c.expected.p_value_cc, { rtol: 1e-10 }, "conditional p");
  });
  test("on the demo's forecast log (invented): 36 rows, 9 misses of the 80% intervals", () => {
    const log = buildDemoWorkbook().forecastLog;
    const out = FW.COVERAGE(col(log.map((r) => r.actual)), col(log.map((r) => r.lower80)), col(log.map((r) => r.upper80)), 80);
    expect(out[0].slice(0, 2)).toEqual([36, 9]);
  });
  test("bad input: unequal lengths, low > high naming the row, a level outside (0, 100), fewer than 2 rows", () => {
    const err = (f: () => unknown): ShimError => { try { f(); } catch (e) { return e as ShimError; } throw new Error("no error"); };
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0]], [[3], [4]], 80)), "#VALUE!", /same number of rows/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0], [5]], [[3], [4]], 80)), "#VALUE!", /Row 2: the lower end \(5\) is above/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0], [1]], [[3], [4]], 100)), "#VALUE!", /between 0 and 100/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [null]], [[0], [1]], [[3], [4]], 80)), "#VALUE!", /At least 2 rows/)).toBe(true);
  });
});

describe("FW.INTERVALSCORE and FW.PINBALL (source: coverage.interval_score fixture)", () => {
  const e = check("coverage.interval_score").expected.filter((x: { alpha: number }) => x.alpha === 0.05);
  test("mean interval score of the fixture's 95% rows", () => {
    const mean = e.reduce((s: number, x: { interval_score: number }) => s + x.interval_score, 0) / e.length;
    const v = FW.INTERVALSCORE(col(e.map((x: { actual: number }) => x.actual)), col(e.map((x: { lower: number }) => x.lower)), col(e.map((x: { upper: number }) => x.upper)), 95);
    expectClose(v, mean, { rtol: 1e-14 }, "mean IS");
  });
  test("mean pinball loss at p = 0.975 of the upper ends", () => {
    const mean = e.reduce((s: number, x: { pinball_upper: number }) => s + x.pinball_upper, 0) / e.length;
    expectClose(FW.PINBALL(col(e.map((x: { actual: number }) => x.actual)), col(e.map((x: { upper: number }) => x.upper)), 0.975), mean, { rtol: 1e-13 }, "mean pinball");
  });
});

describe("FW.BACKTEST", () => {
  test("one row per step ahead, equal to the engine's backtest", async () => {
    const air = dataset("AirPassengers");
    const out = await FW.BACKTEST(col(air), 3, "naive", 0, 80, null as unknown as number, 100);
    const b = backtest(air, 3, { method: "naive", lambda: 0, level: 80, first: 100 });
    expect(out).toHaveLength(3);
    out.forEach((row, i) => {
      expect(row[0]).toBe(i + 1);
      expect(row[1]).toBe(b.rows[i].origins);
      expect(row[2]).toBe(b.rows[i].coverage);
      expect(row[4]).toBe(b.rows[i].meanErrorOfMean);
    });
  });
  test("a first origin that leaves no room for the horizon is refused with the numbers", async () => {
    let e: unknown = null;
    try { await FW.BACKTEST(col([1, 2, 3, 4, 5, 6, 7, 8]), 5, "naive", 0, 80, null as unknown as number, 6); } catch (x) { e = x; }
    expect(isCellError(e, "#VALUE!", /no room for 5 steps/)).toBe(true);
  });
});
