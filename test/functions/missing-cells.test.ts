// A blank cell inside a series is a missing observation (README, "How Fanwise reads cells"): the
// cell functions hand it to the engine, whose gap handling is held to outside references in
// test/engine/missing.test.ts. Here: the cells give the engine's numbers, say how many were
// missing, and a blank does what "zeros as missing" does elsewhere.
import { isCellError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { fanTable, fitForecast, fitLambda } from "../../src/engine";
import { dataset } from "../helpers/reference";

const N = null as unknown as undefined;
const air = dataset("AirPassengers");
const withBlanks = air.map((v, i) => (i === 50 || i === 100 ? null : v));
const range = [["Passengers"], ...withBlanks.map((v) => [v])];

describe("a blank inside a series is a missing observation in every forecasting function", () => {
  test("FW.FAN gives the engine's fan for the series with its gaps (holt-winters, log scale)", async () => {
    const out = await FW.FAN(range, 12, "holt-winters", 0, N, 12, N);
    const t = fanTable(fitForecast(withBlanks, { method: "holt-winters", lambda: 0, period: 12 }), 12);
    expect(out).toHaveLength(12);
    out.forEach((row, i) => {
      expect(row[2]).toBe(t.rows[i].median.value);
      expect(row[6]).toBe(t.rows[i].intervals["95"][1].value);
      expect(row.every((c: unknown) => typeof c === "number" && Number.isFinite(c))).toBe(true);
    });
  });

  test("FW.MODELINFO says how many were missing", async () => {
    const out = await FW.MODELINFO(range, "holt-winters", 0, 12);
    expect(out).toContainEqual(["missing", 2]);
    expect(out).toContainEqual(["n", 144]);
  });

  test("FW.TOTAL and FW.QUANTILES compute from the gap-widened state (finite numbers)", async () => {
    const total = await FW.TOTAL(range, 12, "holt-winters", 0, 95, 12, 1);
    expect(total[0].every((c: unknown) => typeof c === "number" && Number.isFinite(c))).toBe(true);
    const q = await FW.QUANTILES(range, 3, [[0.1, 0.9]], "ses", 0, 1);
    expect(q.flat().every((c: unknown) => typeof c === "number" && Number.isFinite(c))).toBe(true);
  });

  test("a blank cell does what zeros read as missing do (the pane's and the command line's option)", async () => {
    const shop = [120, 131, 128, 0, 140, 151, 149, 158, 162, 171, 168, 180];
    const blank = shop.map((v) => (v === 0 ? null : v));
    const out = await FW.FAN(blank.map((v) => [v]), 3, "ses", 0, N, N, N);
    const t = fanTable(fitForecast(shop, { method: "ses", lambda: 0, zeros: "missing" }), 3);
    out.forEach((row, i) => expect(row[1]).toBe(t.rows[i].mean.value));
  });

  test("FW.FITLAMBDA chooses λ with the gaps in place", () => {
    const out = FW.FITLAMBDA(range, "guerrero", 12);
    const r = fitLambda(withBlanks.map((v) => (v === null ? NaN : v)), { method: "guerrero", period: 12 });
    expect(out[0][0]).toBe(r.lambda);
  });

  test("FW.SCREEN reports the blank as a missing observation, not a fault", () => {
    const out = FW.SCREEN(range, 12);
    expect(out[0][7]).toMatch(/2 blanks inside the series \(at position 51, position 101\) are missing observations/);
  });

  test("FW.SCREEN's advice for an isolated zero names what works in cells: a blank", () => {
    const out = FW.SCREEN([["Old Quay"], [120], [0], [130], [140], [150], [160]], N);
    expect(out[0][7]).toMatch(/read zeros as missing observations: leave those cells blank \(a blank inside a series is a missing observation\)\./);
  });

  test("too many blanks: #VALUE! with the numbers", async () => {
    const sparse = [10, null, 12, null, 11, null, 13, 14, 12, 15].map((v) => [v]);
    const out = await FW.FAN(sparse, 2, "naive", 0, N, N, N);
    expect(isCellError(out[0][1], "#VALUE!", /3 missing values among its 10 periods \(30%, rows 2, 4, 6\); at most 20%/)).toBe(true);
  });
});
