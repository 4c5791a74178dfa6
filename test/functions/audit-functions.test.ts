// FW.COVERAGE / FW.INTERVALSCORE / FW.PINBALL / FW.BACKTEST as Excel calls them, against the
// scipy coverage fixtures and the engine.
import * as fs from "fs";
import * as path from "path";
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
    expect(out[0]).toHaveLength(10);
    expect(out[0][9]).toMatch(/^(Too many misses|Misses cluster|Intervals too wide \(too few misses\)|Consistent with the promised coverage)$/);
  });
  test("bad input: unequal lengths, low > high naming the row, a level outside (0, 100), fewer than 2 rows", () => {
    const err = (f: () => unknown): ShimError => { try { f(); } catch (e) { return e as ShimError; } throw new Error("no error"); };
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0]], [[3], [4]], 80)), "#VALUE!", /same number of rows/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0], [5]], [[3], [4]], 80)), "#VALUE!", /Row 2: the lower end \(5\) is above/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [2]], [[0], [1]], [[3], [4]], 100)), "#VALUE!", /between 0 and 100/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE([[1], [null]], [[0], [1]], [[3], [4]], 80)), "#VALUE!", /At least 2 rows/)).toBe(true);
  });
});

describe("FW.CALIBRATION (source: test/fixtures/audit-log/make_audit_log.py, scipy chi2/beta.ppf computed directly)", () => {
  const FIX = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/audit-log/audit_log.json"), "utf8"));
  const rows: Record<string, number>[] = FIX.groups.rows;
  const probs = [0.1, 0.25, 0.5, 0.75, 0.9];
  const q = rows.map((r) => probs.map((p) => r[`q${100 * p}`]));
  const y = col(rows.map((r) => r.actual));
  test("five quantile columns: share at or below, Clopper–Pearson 95% bounds, Kupiec p and pinball per probability", () => {
    for (const ps of [[probs], "0.1, 0.25, 0.5, 0.75, 0.9", [["0.1,0.25,0.5,0.75,0.9"]]]) {
      const out = FW.CALIBRATION(y, q, ps as never) as number[][];
      expect(out).toHaveLength(5);
      out.forEach((r, k) => {
        const e = FIX.calibration.expected.rows[k];
        expect(r.slice(0, 2)).toEqual([e.p, e.n]);
        expectClose(r[2], e.hit_rate, { rtol: 1e-12 }, "share at or below");
        expectClose(r[3], e.cp_low, { rtol: 1e-9 }, "Clopper–Pearson low");
        expectClose(r[4], e.cp_high, { rtol: 1e-9 }, "Clopper–Pearson high");
        expectClose(r[5], e.kupiec_p, { rtol: 1e-10 }, "Kupiec p");
        expectClose(r[6], e.pinball, { rtol: 1e-12 }, "pinball");
      });
    }
  });
  test("bad input says what to fix: probabilities out of order, a count that does not match the columns, a quantile row that falls, text probabilities", () => {
    const err = (f: () => unknown): ShimError => { try { f(); } catch (e) { return e as ShimError; } throw new Error("no error"); };
    expect(isCellError(err(() => FW.CALIBRATION(y, q, [[0.9, 0.75, 0.5, 0.25, 0.1]])), "#VALUE!", /out of order: p = 0.75 comes after p = 0.9/)).toBe(true);
    expect(isCellError(err(() => FW.CALIBRATION(y, q, [[0.1, 0.9]])), "#VALUE!", /quantiles has 5 columns but 2 probabilities were given/)).toBe(true);
    expect(isCellError(err(() => FW.CALIBRATION([[100], [100]], [[90, 110], [120, 80]], [[0.1, 0.9]])), "#VALUE!", /Row 2: the 0.9 quantile \(80\) is below the 0.1 quantile \(120\)/)).toBe(true);
    expect(isCellError(err(() => FW.CALIBRATION(y, q, [["ten percent"]])), "#VALUE!", /probs must be numbers strictly between 0 and 1/)).toBe(true);
    expect(isCellError(err(() => FW.CALIBRATION([[1], [2]], [[1], [2], [3]], [[0.5]])), "#VALUE!", /same number of rows; they have 2 and 3/)).toBe(true);
  });
});

describe("FW.INTERVALSCORE and FW.PINBALL (source: coverage.interval_score fixture)", () => {
  const e = check("coverage.interval_score").expected.filter((x: { alpha: number }) => x.alpha === 0.05);
  test("mean interval score of the fixture's 95% rows", () => {
    const mean = e.reduce((s: number, x: { interval_score: number }) => s + x.interval_score, 0) / e.length;
    const v = FW.INTERVALSCORE(col(e.map((x: { actual: number }) => x.actual)), col(e.map((x: { lower: number }) => x.lower)), col(e.map((x: { upper: number }) => x.upper)), 95);
    expect(v).toHaveLength(1);
    expectClose(v[0][0] as number, mean, { rtol: 1e-14 }, "mean IS");
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
      expect(row[6]).toBe(b.rows[i].kupiecP);
      expect(row[7]).toBe(b.rows[i].verdict?.headline);
    });
  });
  test("a first origin that leaves no room for the horizon is refused with the numbers", async () => {
    let e: unknown = null;
    try { await FW.BACKTEST(col([1, 2, 3, 4, 5, 6, 7, 8]), 5, "naive", 0, 80, null as unknown as number, 6); } catch (x) { e = x; }
    expect(isCellError(e, "#VALUE!", /no room for 5 steps/)).toBe(true);
  });
});

describe("FW.COVERAGE and FW.INTERVALSCORE by group, step and level (scipy 1.10.1 values: test/fixtures/audit-log)", () => {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const FIX: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "audit-log", "audit_log.json"), "utf8"));
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const rows: any[] = FIX.groups.rows;
  const pair = (level: number, side: string) => rows.map((r) => [r[`${side}${level}`]]);
  const both = (side: string) => rows.map((r) => [r[`${side}80`], r[`${side}95`]]);
  test("two levels and three shops: one row per shop and level plus the pooled rows, keyed by group and level", () => {
    const out = FW.COVERAGE(col(rows.map((r) => r.actual)), both("lower"), both("upper"), "80,95", col(rows.map((r) => r.series)));
    expect(out).toHaveLength(FIX.groups.expected.length);
    out.forEach((row, i) => {
      const e = FIX.groups.expected[i];
      expect(row.slice(0, 4)).toEqual([e.group, e.level, e.n, e.misses]);
      expectClose(row[5] as number, e.p_uc, { rtol: 1e-10 }, "Kupiec p");
      expectClose(row[6] as number, e.p_ind, { rtol: 1e-10 }, "independence p");
      expectClose(row[7] as number, e.p_cc, { rtol: 1e-10 }, "conditional p");
      expectClose(row[9] as number, e.interval_score, { rtol: 1e-10 }, "interval score");
      if (row[11] !== "Consistent with the promised coverage") expect(row[10]).not.toBe("green");
    });
    expect(out[1][11]).toBe("Too many misses");
    expect(out[2][11]).toBe("Intervals too wide (too few misses)");
    const is = FW.INTERVALSCORE(col(rows.map((r) => r.actual)), pair(80, "lower"), pair(80, "upper"), 80, col(rows.map((r) => r.series)));
    expect(is.map((r) => r[0])).toEqual(["Harbour Street", "Mill Lane", "Old Quay", "all groups"]);
    expectClose(is[3][1] as number, FIX.groups.expected[3].interval_score, { rtol: 1e-10 }, "pooled score");
  });
  test("by step: the horizons argument gives rows keyed by group and step", () => {
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const hr: any[] = FIX.horizons.rows;
    const out = FW.COVERAGE(col(hr.map((r) => r.actual)), col(hr.map((r) => r.lower80)), col(hr.map((r) => r.upper80)), 80, col(hr.map((r) => r.series)), col(hr.map((r) => r.h)));
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const e80 = FIX.horizons.expected.filter((e: any) => e.level === 80);
    expect(out.map((r) => r.slice(0, 3))).toEqual(e80.map((e: { group: string; h: number; n: number }) => [e.group, e.h, e.n]));
    out.forEach((r, i) => expectClose(r[6] as number, e80[i].p_ind, { rtol: 1e-10 }, "adjusted independence p"));
  });
  test("bad input through the cells: a blank group, a fractional horizon, too few level columns, 95/80 swapped", () => {
    const err = (f: () => unknown): ShimError => { try { f(); } catch (e) { return e as ShimError; } throw new Error("no error"); };
    const y = col([100, 104, 98, 110]), lo = col([95, 95, 95, 95]), hi = col([105, 105, 105, 105]);
    expect(isCellError(err(() => FW.COVERAGE(y, lo, hi, 80, col(["A", null, "B", "B"]))), "#VALUE!", /Row 2: the group \(series name\) is blank/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE(y, lo, hi, 80, null as unknown as unknown[][], col([1, 2, 2.5, 3]))), "#VALUE!", /Row 3: the horizon 2.5 is not a whole number/)).toBe(true);
    expect(isCellError(err(() => FW.COVERAGE(y, lo, hi, "80,95")), "#VALUE!", /lower needs one column per level: 2 levels were given/)).toBe(true);
    const lo2 = [[95, 90], [95, 90], [95, 90], [95, 90]], hi2 = [[105, 110], [105, 110], [105, 110], [105, 110]];
    expect(isCellError(err(() => FW.COVERAGE(y, lo2, hi2, [[95, 80]])), "#VALUE!", /the 95% interval \(95 to 105\) does not contain the 80% interval/)).toBe(true);
    expect(FW.COVERAGE(y, lo2, hi2, [[80, 95]]).map((r) => r[0])).toEqual([80, 95]);
  });
});
