// The cell layer's fit cache must never hand back a model fitted with other options: after a call
// that fills the cache, a call that changes only λ, or only the period, must give exactly what an
// uncached engine call gives (common practice: a cache is invisible in the results).
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { cachedForecast, clearForecastCache } from "../../src/functions/forecast-cache";
import { describeForecaster, fanTable, fitForecast, totalForecast } from "../../src/engine";
import { dataset } from "../helpers/reference";

const N = null as unknown as undefined;
const air = dataset("AirPassengers").slice(0, 72);
const range = [["Passengers"], ...air.map((v) => [v])];

/** The engine's own fan row values, as FW.FAN lays them out for one series and the default levels. */
function engineFan(lambda: number, period: number, method: string, H: number): number[][] {
  const f = fitForecast(air, { method, lambda, period });
  return fanTable(f, H).rows.map((r) => [r.h, r.mean.value as number, r.median.value as number,
    r.intervals["80"][0].value as number, r.intervals["80"][1].value as number, r.intervals["95"][0].value as number, r.intervals["95"][1].value as number]);
}

beforeEach(() => clearForecastCache());

describe("the fit cache keys on every option (compared with uncached engine calls)", () => {
  test("FW.FAN: only λ changes → the second answer is the engine's at the new λ", async () => {
    const first = await FW.FAN(range, 6, "naive", 0, N, N, N);
    expect(first).toEqual(engineFan(0, 1, "naive", 6));
    const second = await FW.FAN(range, 6, "naive", 0.5, N, N, N);
    expect(second).toEqual(engineFan(0.5, 1, "naive", 6));
    expect(second[0][1]).not.toBe(first[0][1]); // naive medians agree at any λ; the means do not
  });
  test("FW.FAN: only the period changes → the second answer is the engine's at the new period", async () => {
    const first = await FW.FAN(range, 8, "seasonal-naive", 0, N, 12, N);
    expect(first).toEqual(engineFan(0, 12, "seasonal-naive", 8));
    const second = await FW.FAN(range, 8, "seasonal-naive", 0, N, 4, N);
    expect(second).toEqual(engineFan(0, 4, "seasonal-naive", 8));
    expect(second.map((r) => r[2])).not.toEqual(first.map((r) => r[2]));
  });
  test("FW.MODELINFO and FW.TOTAL after FW.FAN at another λ: λ as given, total as the engine's", async () => {
    await FW.FAN(range, 3, "drift", 0, N, N, N);
    const info = await FW.MODELINFO(range, "drift", 0.25, N);
    expect(info).toEqual(describeForecaster(fitForecast(air, { method: "drift", lambda: 0.25, label: "Passengers" })));
    const total = await FW.TOTAL(range, 12, "drift", 1, 90, N, 4);
    const t = totalForecast(fitForecast(air, { method: "drift", lambda: 1 }), 12, { level: 90, seed: 4 });
    expect(total).toEqual([[t.mean.value, t.median, t.interval[0], t.interval[1]]]);
  });
  test("cachedForecast: same cells, λ or period or method changed → a model with those options", () => {
    const a = cachedForecast(air, { method: "seasonal-naive", lambda: 0, period: 12 });
    const b = cachedForecast(air, { method: "seasonal-naive", lambda: 0.5, period: 12 });
    const c = cachedForecast(air, { method: "seasonal-naive", lambda: 0, period: 6 });
    const d = cachedForecast(air, { method: "naive", lambda: 0, period: 12 });
    expect([a.lambda, b.lambda, c.lambda]).toEqual([0, 0.5, 0]);
    expect([a.period, c.period]).toEqual([12, 6]);
    expect(d.method).toBe("naive");
    expect(c.forecast(6)).toEqual(fitForecast(air, { method: "seasonal-naive", lambda: 0, period: 6 }).forecast(6));
    expect(cachedForecast(air, { method: "seasonal-naive", lambda: 0, period: 12 })).toBe(a); // and a true repeat is a hit
  });
});
