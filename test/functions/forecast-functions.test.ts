// FW.FAN / FW.QUANTILES / FW.TOTAL / FW.MODELINFO called as Excel calls them (2-D ranges, null for
// omitted arguments), checked against the engine and the reference fixtures.
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { cacheStats, clearForecastCache } from "../../src/functions/forecast-cache";
import { buildDemoWorkbook } from "../../src/demo/quillmere";
import { fanTable, fitForecast } from "../../src/engine";
import { check, dataset, expectClose } from "../helpers/reference";

const N = null as unknown as undefined;
const col = (xs: (number | string | null)[]): (number | string | null)[][] => xs.map((x) => [x]);

async function rejected(p: Promise<unknown>): Promise<ShimError> {
  try {
    await p;
  } catch (e) {
    return e as ShimError;
  }
  throw new Error("expected the call to fail");
}

const air = dataset("AirPassengers");
const airRange = [["Passengers"], ...air.map((v) => [v])];

describe("FW.FAN", () => {
  test("drift on the log scale reproduces the numpy reference (backtransform.bench.AirPassengers.drift)", async () => {
    const out = await FW.FAN(airRange, 24, "drift", 0, N, N, N);
    const ref = check("backtransform.bench.AirPassengers.drift").expected;
    expect(out).toHaveLength(24);
    expect(out[0]).toHaveLength(1 + 2 + 4);
    out.forEach((row, i) => {
      expect(row[0]).toBe(i + 1);
      // the default mean is exact wherever it exists (issue 12 §1): scipy's quadrature value
      expectClose(row[1], ref[i].mean_exact_quad, { rtol: 1e-9 }, "mean");
      expectClose(row[2], ref[i].median, { rtol: 1e-11 }, "median");
      expectClose(row[3], ref[i].quantiles["0.1"], { rtol: 1e-11 }, "low 80");
      expectClose(row[6], ref[i].quantiles["0.975"], { rtol: 1e-11 }, "high 95");
    });
  });
  test("the same numbers as the engine's fan table for auto, with a header row on request", async () => {
    const out = await FW.FAN(airRange, 6, N, N, [["95,80"]], 12, true);
    expect(out[0]).toEqual(["step", "Passengers mean", "Passengers median", "Passengers low 80%", "Passengers high 80%", "Passengers low 95%", "Passengers high 95%"]);
    const t = fanTable(fitForecast(air, { period: 12 }), 6);
    expect(out[1][2]).toBe(t.rows[0].median.value);
    expect(out[6][5]).toBe(t.rows[5].intervals["95"][0].value);
  });
  test("several columns forecast side by side; a flagged series gets its message in its own cells", async () => {
    const wb = buildDemoWorkbook();
    const cols = [wb.columns[0], wb.columns[2]];
    const range = [cols.map((c) => c.name), ...wb.months.map((_, i) => cols.map((c) => c.values[i]))];
    const out = await FW.FAN(range, 3, "naive", 0, N, 12, N);
    expect(out[0]).toHaveLength(1 + 6 + 6);
    expect(typeof out[0][1]).toBe("number");
    expect(isCellError(out[0][7], "#VALUE!", /Old Quay has 1 zero/)).toBe(true);
  });
  test("a leading-blank column (a shop that opened late) is trimmed, not refused", async () => {
    const wb = buildDemoWorkbook();
    const lark = wb.columns[5];
    const out = await FW.FAN(col(lark.values), 2, "naive", 0, N, N, N);
    expectClose(out[0][2], lark.values[lark.values.length - 1] as number, { rtol: 1e-14 }, "naive median = last value");
  });
  test("bad arguments: horizon as text, levels as text that is not numbers, a level of 100, a misspelt method", async () => {
    expect(isCellError(await rejected(FW.FAN(airRange, "12" as unknown as number)), "#VALUE!", /horizon must be a number/)).toBe(true);
    expect(isCellError(await rejected(FW.FAN(airRange, 3, N, N, [["abc"]])), "#VALUE!", /"abc" is not a number/)).toBe(true);
    expect(isCellError(await rejected(FW.FAN(airRange, 3, N, N, [[100]])), "#VALUE!", /between 0 and 100/)).toBe(true);
    expect(isCellError(await rejected(FW.FAN(airRange, 3, "holtwinters")), "#VALUE!", /"holt-winters"/)).toBe(true);
    expect(isCellError(await rejected(FW.FAN(airRange, 0)), "#VALUE!", /at least 1/)).toBe(true);
    const ok = await FW.FAN(airRange, 3, N, "AUTO", [["80;95"]]);
    expect(ok).toHaveLength(3);
  });
  test("the exact-mean gap for λ < 0 never shows as NaN: every cell is a number or an error", async () => {
    const out = await FW.FAN(airRange, 240, "drift", -1, N, N, N);
    for (const row of out) for (const v of row) expect(typeof v === "number" ? Number.isFinite(v) : v instanceof ShimError).toBe(true);
  });
});

describe("FW.QUANTILES", () => {
  test("horizon × probs, equal to the fixture quantiles for drift (backtransform.bench.airmiles.drift)", async () => {
    const miles = dataset("airmiles");
    const out = await FW.QUANTILES(col(miles), 10, [[0.025, 0.5, 0.975]], "drift", 0, N);
    const ref = check("backtransform.bench.airmiles.drift").expected;
    out.forEach((row, i) => {
      expectClose(row[0], ref[i].quantiles["0.025"], { rtol: 1e-11 }, "q0.025");
      expectClose(row[1], ref[i].median, { rtol: 1e-11 }, "median");
      expectClose(row[2], ref[i].quantiles["0.975"], { rtol: 1e-11 }, "q0.975");
    });
  });
  test("probs containing 0 or 1 are refused", async () => {
    expect(isCellError(await rejected(FW.QUANTILES(airRange, 3, [[0, 0.5]])), "#VALUE!", /between 0 and 1/)).toBe(true);
    expect(isCellError(await rejected(FW.QUANTILES(airRange, 3, [[1]])), "#VALUE!", /between 0 and 1/)).toBe(true);
  });
});

describe("FW.TOTAL", () => {
  test("mean is the sum of FW.FAN's means; the same seed gives the same answer", async () => {
    const fan = await FW.FAN(airRange, 12, "holt-winters", 0, N, 12, N);
    const sum = fan.reduce((s, r) => s + (r[1] as number), 0);
    const [t] = await FW.TOTAL(airRange, 12, "holt-winters", 0, N, 12, N);
    expectClose(t[0], sum, { rtol: 1e-12 }, "mean");
    expect(t[2]).toBeLessThan(t[1]);
    expect(t[3]).toBeGreaterThan(t[1]);
    expect(await FW.TOTAL(airRange, 12, "holt-winters", 0, N, 12, N)).toEqual([t]);
    const other = await FW.TOTAL(airRange, 12, "holt-winters", 0, N, 12, 2);
    expect(other[0][1]).not.toBe(t[1]);
  });
});

describe("FW.MODELINFO", () => {
  test("two columns: label and value, including method, λ, σ, AICc and n", async () => {
    const out = await FW.MODELINFO(airRange, "ses", 0, N);
    const map = new Map(out.map((r) => [r[0], r[1]]));
    expect(map.get("method")).toBe("ses");
    expect(map.get("lambda")).toBe(0);
    expect(map.get("n")).toBe(144);
    expect(typeof map.get("AICc")).toBe("number");
    // ses on log AirPassengers: statsmodels 0.13.5 llf 118.538 (ets.AirPassengers.log.ANN)
    expectClose(map.get("loglik (transformed scale)") as number, check("ets.AirPassengers.log.ANN").expected.llf, { atol: 1e-6 }, "loglik");
    // on the original scale the Jacobian (λ − 1)·Σ ln y is added (Box & Cox 1964; METHODS §7)
    const jac = -air.reduce((a, v) => a + Math.log(v), 0);
    expectClose(map.get("loglik") as number, check("ets.AirPassengers.log.ANN").expected.llf + jac, { atol: 1e-6 }, "loglik (original scale)");
    expect(map.get("mean shown")).toBe("exact");
  });
  test("transform, shift and mean arguments (issue 11 §5, issue 12 §1)", async () => {
    const withZero = [["Shop"], [120], [0], [130], [140], [150], [160], [155], [170]];
    expect(isCellError((await FW.FAN(withZero, 2, "naive", 0, N, N, N))[0][1], "#VALUE!", /shift "auto"/)).toBe(true);
    const shifted = await FW.FAN(withZero, 2, "naive", 0, N, N, N, N, "auto", N);
    const moved = await FW.FAN(withZero.map((r, i) => (i === 0 ? r : [(r[0] as number) + 60])), 2, "naive", 0, N, N, N);
    expectClose(shifted[0][2] as number, (moved[0][2] as number) - 60, { rtol: 1e-12 }, "median, shift auto = 60");
    const yj = await FW.FAN(withZero, 2, "naive", 0.5, N, N, N, "yeo-johnson", N, N);
    expect(typeof yj[0][1]).toBe("number");
    const taylor = await FW.FAN(airRange, 12, "naive", 0, N, N, N, N, N, "taylor");
    const exact = await FW.FAN(airRange, 12, "naive", 0, N, N, N, N, N, N);
    expect(exact[11][1] as number).toBeGreaterThan(taylor[11][1] as number); // e^(σ²/2) > 1 + σ²/2
    // a window after the horizon is refused, naming from (the window itself: test/functions totals tests)
    expect(isCellError(await rejected(FW.TOTAL(airRange, 12, "naive", 0, N, N, N, 13 as never)), "#VALUE!", /from \(13\) is after horizon/)).toBe(true);
  });
});

describe("work done once", () => {
  test("FAN, TOTAL, MODELINFO and QUANTILES on the same range and options fit the model once", async () => {
    clearForecastCache();
    await FW.FAN(airRange, 12, "auto", "auto", N, 12, N);
    await FW.TOTAL(airRange, 12, "auto", "auto", N, 12, N);
    await FW.MODELINFO(airRange, "auto", "auto", 12);
    await FW.QUANTILES(airRange, 12, [[0.5]], "auto", "auto", 12);
    expect(cacheStats().misses).toBe(1);
    expect(cacheStats().hits).toBe(3);
  });
  test("the cache is bounded", async () => {
    clearForecastCache();
    for (let i = 0; i < 80; i++) await FW.MODELINFO(col([10 + i, 12, 11, 13, 12, 14]), "naive", 0, N);
    expect(cacheStats().size).toBeLessThanOrEqual(64);
  });
});

describe("argument shapes Excel passes", () => {
  test("a single row is one series; a single cell is a one-value series", async () => {
    const row = [[100, 110, 121, 133.1, 146.41]];
    const byRow = await FW.FAN(row, 1, "drift", 0, N, N, N);
    const byCol = await FW.FAN(row[0].map((v) => [v]), 1, "drift", 0, N, N, N);
    expect(byRow).toEqual(byCol);
    expect(FW.SCREEN([[7]])[0][0]).toBe(1);
    expect(FW.BOXCOX(100 as never, 0)[0][0]).toBeCloseTo(Math.log(100), 15);
  });
  test("a header row names the series in FW.FAN's header and is not a value", async () => {
    const out = await FW.FAN([["Shop A", "Shop B"], [1, 10], [2, 20], [3, 30], [4, 40]], 1, "naive", 0, N, N, true);
    expect(out[0][1]).toBe("Shop A mean");
    expect(out[0][7]).toBe("Shop B mean");
    expect(out[1][2]).toBeCloseTo(4, 12);
    expect(out[1][8]).toBeCloseTo(40, 12);
  });
});
