// ARIMA through every forecasting face in cells: FW.FAN / FW.MODELINFO / FW.TOTAL / FW.BACKTEST
// accept "arima" and explicit orders; medians are the back-transformed means of the transformed
// scale (quantiles map exactly through a monotone inverse: Box & Cox 1964); the coefficients and
// standard errors agree with statsmodels 0.13.5 SARIMAX (test/fixtures/arima/arima.json).
import * as fs from "fs";
import * as path from "path";
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { fitForecast } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;
const fixture: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/arima/arima.json"), "utf8"));
const N = null as unknown as undefined;
const air = dataset("AirPassengers");
const airRange = [["Passengers"], ...air.map((v) => [v])];

describe("ARIMA in cells", () => {
  test("FW.FAN with arima:0,1,1/0,1,1 on the log scale: medians are exp of statsmodels' forecast means (1e-4: our own fit)", async () => {
    const c = fixture.cases.find((x: Json) => x.id === "air_log_airline");
    const out = await FW.FAN(airRange, 12, "arima:0,1,1/0,1,1", 0, N, 12, N);
    expect(out).toHaveLength(12);
    out.forEach((row, i) => {
      // our own fit's parameters are statsmodels' to ~1e-4, so the medians agree closely
      expectClose(row[2] as number, Math.exp(c.forecast_mean[i]), { rtol: 1e-4 }, `median h=${i + 1}`);
      // exact log-normal mean above the median (METHODS §4)
      expect(row[1] as number).toBeGreaterThan(row[2] as number);
    });
  });
  test("FW.MODELINFO lists the order, the coefficients with standard errors near statsmodels' numerical-Hessian ones (5%)", async () => {
    const c = fixture.cases.find((x: Json) => x.id === "air_log_airline");
    const out = await FW.MODELINFO(airRange, "arima:0,1,1/0,1,1", 0, 12);
    const get = (k: string): unknown => out.find((r) => r[0] === k)?.[1];
    expect(get("method")).toBe("arima:0,1,1/0,1,1");
    expect(get("model")).toBe("ARIMA(0,1,1)(0,1,1)[12]");
    expectClose(get("ma1") as number, c.params["ma.L1"], { atol: 1e-3 }, "ma1");
    expectClose(get("sma1") as number, c.params["ma.S.L12"], { atol: 1e-3 }, "sma1");
    expectClose(get("ma1 standard error") as number, c.bse_approx["ma.L1"], { rtol: 0.05 }, "ma1 s.e.");
    expectClose(get("sma1 standard error") as number, c.bse_approx["ma.S.L12"], { rtol: 0.05 }, "sma1 s.e.");
  });
  test("a seasonal order without a period is refused with what to give", async () => {
    const out = await FW.FAN(airRange, 12, "arima:0,1,1/0,1,1", 0, N, N, N).catch((e: ShimError) => e);
    const flat = Array.isArray(out) ? out.flat() : [out];
    expect(flat.some((v) => isCellError(v, undefined, /give the period/))).toBe(true);
  });
  test("an order with a typo is refused with the syntax", async () => {
    const err = await FW.FAN(airRange, 12, "arima:0,1", 0, N, 12, N).catch((e: ShimError) => e);
    expect(String((err as { message?: string }).message ?? JSON.stringify(err))).toMatch(/three whole numbers/);
  });
  test("FW.TOTAL with an ARIMA: the mean of the total equals the sum of FW.FAN's means (METHODS §4: means add)", async () => {
    const fan = await FW.FAN(airRange, 12, "arima:0,1,1/0,1,1", 0, N, 12, N);
    const sum = fan.reduce((s, r) => s + (r[1] as number), 0);
    const total = await FW.TOTAL(airRange, 12, "arima:0,1,1/0,1,1", 0, 95, 12, 1);
    expectClose(total[0][0] as number, sum, { rtol: 1e-9 }, "mean of the total");
  });
});

describe("ARIMA through the engine's forecaster", () => {
  test("automatic ARIMA on log UKgas (quarterly) takes a seasonal difference and says how it chose", () => {
    const f = fitForecast(dataset("UKgas"), { method: "arima", lambda: 0, period: 4 });
    expect(f.method).toMatch(/^arima:\d,\d,\d\/\d,1,\d/);
    expect(f.notes.join(" ")).toMatch(/Canova–Hansen/);
    expect(f.notes.join(" ")).toMatch(/Stepwise search by AICc/);
  });
});
