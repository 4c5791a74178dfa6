// FW.TOTALFROMINTERVALS, FW.TOTALACROSS, FW.SMEARMEAN and FW.TOTAL's [from], called as Excel calls
// them (2-D ranges, null for omitted arguments), checked against the engine (itself checked against
// numpy simulations in test/engine/totals-*.test.ts) and against closed forms.
import * as fs from "fs";
import * as path from "path";
import { failure } from "../helpers/cell-failure";
import * as FW from "../../src/functions/functions";
import { createRandom, publishedTotal, totalForecast, fitForecast } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

const N = null as unknown as undefined;
const col = (xs: (number | string | null)[]): (number | string | null)[][] => xs.map((x) => [x]);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fx: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "totals", "totals.json"), "utf8"));


describe("FW.TOTALFROMINTERVALS", () => {
  const p = fx.localLevel.published;
  test("one row of 8: mean, median, low, high, then the independent and comonotone ends; the engine's numbers (numpy truth in the engine tests)", () => {
    const out = FW.TOTALFROMINTERVALS([["median"], ...col(p.median)], [["low 95"], ...col(p.lower95)], [["high 95"], ...col(p.upper95)], 95, N, N);
    const t = publishedTotal(p.median, p.lower95, p.upper95, 95);
    expect(out).toEqual([[t.mean, t.median, t.interval[0], t.interval[1], t.independent.interval[0], t.independent.interval[1], t.comonotone.interval[0], t.comonotone.interval[1]]]);
    expectClose(out[0][2] as number, fx.localLevel.truth.interval95[0], { rtol: 0.005 }, "low vs numpy truth");
  });
  test("rows blank in all three columns at the end are ignored (a longer selection)", () => {
    const a = FW.TOTALFROMINTERVALS([...col(p.median), [null]], [...col(p.lower80), [null]], [...col(p.upper80), [""]], 80, 0, "comonotone");
    const b = FW.TOTALFROMINTERVALS(col(p.median), col(p.lower80), col(p.upper80), 80, 0, "comonotone");
    expect(a).toEqual(b);
  });
  test('lambda "implied" and a correlation as dependence', () => {
    const out = FW.TOTALFROMINTERVALS(col(p.median), col(p.lower95), col(p.upper95), 95, "implied", 0.5);
    const t = publishedTotal(p.median, p.lower95, p.upper95, 95, { lambda: "implied", dependence: 0.5 });
    expect(out[0][2]).toBe(t.interval[0]);
  });
  test("bad input says what to fix", async () => {
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100, 100]), col([80, 110]), col([120, 130]), 80))).message).toMatch(/Month 2: Need lower < median < upper/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 0.8))).message).toMatch(/in percent: give 80 for an 80% interval, not 0\.8/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100, 100]), col([80]), col([120, 125]), 80))).message).toMatch(/one value per month/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100, 100]), col([0, 80]), col([120, 125]), 80))).message).toMatch(/Month 1: The interval's lower end must be > 0/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100, 100]), col([80, null]), col([120, 125]), 80))).message).toMatch(/lowers is blank in month 2/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, "auto"))).message).toMatch(/or "implied"; got "auto"/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, N, "strong"))).message).toMatch(/Unknown dependence "strong"/);
    expect((await failure(() => FW.TOTALFROMINTERVALS(col([100]), col([80]), col([120]), 80, N, 2))).message).toMatch(/from 0 \(independent months\) to 1/);
  });
});

describe("FW.TOTALACROSS", () => {
  // two invented Quillmere shops (seeded log random walks with correlated errors)
  const rng = createRandom(11);
  const a: number[] = [];
  const b: number[] = [];
  let wa = Math.log(40000);
  let wb = Math.log(25000);
  for (let t = 0; t < 60; t++) {
    const z1 = rng.normal();
    const z2 = 0.8 * z1 + 0.6 * rng.normal();
    wa += 0.05 * z1;
    wb += 0.06 * z2;
    a.push(Math.exp(wa));
    b.push(Math.exp(wb));
  }
  const range = [["Harbour St", "Mill Lane"], ...a.map((v, i) => [v, b[i]])];
  test("one row: mean (Σ of each shop's FW.TOTAL mean), median, low, high, then the ends under independence", async () => {
    const out = await FW.TOTALACROSS(range, 12, "naive", 0, 95, N, N, N);
    expect(out).toHaveLength(1);
    expect(out[0]).toHaveLength(6);
    const sum = [a, b].reduce((s, x) => s + (totalForecast(fitForecast(x, { method: "naive", lambda: 0 }), 12, { mean: "exact" }).mean.value as number), 0);
    expectClose(out[0][0] as number, sum, { rtol: 1e-12 }, "Σ means");
    expect(out[0][2]).toBeLessThan(out[0][4] as number);
    expect(out[0][3]).toBeGreaterThan(out[0][5] as number);
  });
  test("[from] sums steps from..horizon only", async () => {
    const out = await FW.TOTALACROSS(range, 19, "naive", 0, 95, N, N, 8);
    const sum = [a, b].reduce((s, x) => s + (totalForecast(fitForecast(x, { method: "naive", lambda: 0 }), 19, { mean: "exact", from: 8 }).mean.value as number), 0);
    expectClose(out[0][0] as number, sum, { rtol: 1e-12 }, "Σ window means");
  });
  test("a single series is refused with a clear message", async () => {
    expect((await failure(FW.TOTALACROSS(col(a), 12, "naive", 0))).message).toMatch(/FW.TOTALACROSS adds up several series, one per column; the range has 1. For one series use FW.TOTAL/);
  });
  test("a window whose from exceeds horizon", async () => {
    expect((await failure(FW.TOTALACROSS(range, 6, "naive", 0, N, N, N, 7))).message).toMatch(/from \(7\) is after horizon \(6\)/);
  });
  test("series of different lengths are aligned on the latest common period (the later values of the longer one are not used)", async () => {
    const cut = [["Harbour St", "Mill Lane"], ...a.map((v, i) => [v, i < 58 ? b[i] : null])];
    const same = [["Harbour St", "Mill Lane"], ...a.slice(0, 58).map((v, i) => [v, b[i]])];
    expect(await FW.TOTALACROSS(cut, 6, "naive", 0)).toEqual(await FW.TOTALACROSS(same, 6, "naive", 0));
  });
});

describe("FW.SMEARMEAN", () => {
  test("Duan's smearing mean against numpy (test/fixtures/totals/make_totals.py), one result per mu; blanks in residuals skipped", () => {
    const cases = (fx.smearing.cases as { mu: number; lambda: number; mean: number }[]).filter((c) => c.lambda === 0);
    const out = FW.SMEARMEAN(cases.map((c) => [c.mu]), [...col(fx.smearing.residuals), [null]], 0);
    cases.forEach((c, i) => expectClose(out[i][0] as number, c.mean, { rtol: 1e-13 }, `mu ${c.mu}`));
  });
  test("bad input", async () => {
    expect((await failure(() => FW.SMEARMEAN([[1]], col([0.1, "x"]), 0))).message).toMatch(/residuals row 2, column 1 is not a number/);
    expect((await failure(() => FW.SMEARMEAN([[1]], col([0.1]), 0))).message).toMatch(/at least 2 residuals/);
    expect((await failure(() => FW.SMEARMEAN([[1]], col([0.5, 1.5]), -0.5))).message).toMatch(/reaches the pole/);
  });
});

describe("FW.TOTAL [from]", () => {
  const air = dataset("AirPassengers").slice(0, 89);
  const range = [["Passengers"], ...air.map((v) => [v])];
  test("steps 8..19 (next calendar year after a May history end) are the engine's window total", async () => {
    const out = await FW.TOTAL(range, 19, "ses", 0, 95, N, N, 8);
    const t = totalForecast(fitForecast(air, { method: "ses", lambda: 0 }), 19, { level: 95, from: 8 });
    expect(out).toEqual([[t.mean.value, t.median, t.interval[0], t.interval[1]]]);
  });
  test("from after horizon is refused for the whole call", async () => {
    expect((await failure(FW.TOTAL(range, 12, "ses", 0, 95, N, N, 13))).message).toMatch(/from \(13\) is after horizon \(12\)/);
  });
});
