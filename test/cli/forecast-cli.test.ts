// fanwise fan / total end to end: JSON against the engine and the fixtures, and the demo's
// flagged series carrying their message instead of a forecast.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";
import { check, num, datasetPath, expectClose } from "../helpers/reference";

describe("fanwise fan", () => {
  test("drift on log AirPassengers reproduces the numpy reference fan (bench.AirPassengers.log / backtransform.bench.*)", () => {
    const r = runCli(["fan", datasetPath("AirPassengers"), "--horizon", "24", "--method", "drift", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series.value;
    expect(s.method).toBe("drift");
    expect(s.lambda).toBe(0);
    const ref = check("backtransform.bench.AirPassengers.drift").expected;
    s.steps.forEach((st: { h: number; mean: number; median: number; intervals: Record<string, [number, number]> }, i: number) => {
      expect(st.h).toBe(i + 1);
      expectClose(st.median, ref[i].median, { rtol: 1e-11 }, `median ${i + 1}`);
      // the default mean is the exact one (issue 12 §1): scipy's quadrature value
      expectClose(st.mean, num(ref[i].mean_exact_quad), { rtol: 1e-9 }, `mean ${i + 1}`);
      expectClose(st.intervals["95"][0], ref[i].quantiles["0.025"], { rtol: 1e-11 }, `low95 ${i + 1}`);
      expectClose(st.intervals["80"][1], ref[i].quantiles["0.9"], { rtol: 1e-11 }, `high80 ${i + 1}`);
    });
  });
  test("the demo workbook: a sensible table for every series, the flagged ones with their message instead", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-fan-"));
    expect(runCli(["demo", "--out", dir]).code).toBe(0);
    const csv = path.join(dir, "quillmere-monthly.csv");
    const r = runCli(["fan", csv, "--horizon", "12", "--period", "12"]);
    expect(r.code).toBe(3); // two flagged series failed, the other six computed
    const lines = r.out.trim().split("\n");
    expect(lines[0]).toBe("series,h,period,method,lambda,mean,median,low80,high80,low95,high95,note");
    const bySeries = new Map<string, string[][]>();
    for (const l of lines.slice(1)) {
      const name = l.startsWith('"') ? l.slice(1, l.indexOf('"', 1)) : l.split(",")[0];
      bySeries.set(name, [...(bySeries.get(name) ?? []), l.split(",")]);
    }
    for (const name of ["Harbour Street", "Millbrook", "Station Road", "Fenwick Green", "Larkfield", "Service hours"]) {
      const rows = bySeries.get(name) ?? [];
      expect(rows).toHaveLength(12);
      for (const row of rows) {
        const [mean, median, lo80, hi80, lo95, hi95] = row.slice(5, 11).map(Number);
        expect(lo95).toBeLessThanOrEqual(lo80);
        expect(lo80).toBeLessThanOrEqual(median);
        expect(median).toBeLessThanOrEqual(hi80);
        expect(hi80).toBeLessThanOrEqual(hi95);
        expect(mean).toBeGreaterThan(lo80);
        expect(mean).toBeLessThan(hi80);
      }
    }
    expect(bySeries.get("Old Quay")?.[0].join(",")).toMatch(/Not Box-Cox ready: Old Quay has 1 zero/);
    expect((bySeries.get("Parts costs (net)") ?? bySeries.get("Parts costs (net)"))).toBeDefined();
    expect(r.err).toMatch(/Parts costs \(net\): Not Box-Cox ready/);
    expect(fs.readFileSync(path.join(dir, "quillmere-fan.svg"), "utf8")).toMatch(/^<svg[\s\S]*mean[\s\S]*95% band[\s\S]*<\/svg>$/);
  });
  test("two runs print byte-identical output (determinism across processes)", () => {
    const args = ["total", datasetPath("AirPassengers"), "--horizon", "12", "--period", "12", "--json"];
    const a = runCli(args);
    const b = runCli(args);
    expect(a.code).toBe(0);
    expect(a.out).toBe(b.out);
  });
  test("errors: a missing horizon, a bad level list, a misspelt method", () => {
    expect(runCli(["fan", datasetPath("nile")]).err).toMatch(/--horizon is required/);
    expect(runCli(["fan", datasetPath("nile"), "--horizon", "5", "--levels", "80,abc"]).err).toMatch(/"abc" is not a number/);
    const m = runCli(["fan", datasetPath("nile"), "--horizon", "5", "--method", "hw", "--json"]);
    expect(m.code).toBe(1); // a misspelt method is a usage error, not a per-series note
    expect(m.out).toBe("");
    expect(m.err).toMatch(/--method must be one of mean, naive, .*; got "hw"/);
    expect(runCli(["fan", datasetPath("nile"), "--horizon", "0"]).code).toBe(1);
  });
});

describe("fanwise total", () => {
  test("mean = sum of per-step means; median and interval from seeded paths with a Monte Carlo error", () => {
    const r = runCli(["total", datasetPath("AirPassengers"), "--horizon", "12", "--method", "holt-winters", "--lambda", "0", "--period", "12", "--json"]);
    const t = JSON.parse(r.out).series.value;
    const fan = JSON.parse(runCli(["fan", datasetPath("AirPassengers"), "--horizon", "12", "--method", "holt-winters", "--lambda", "0", "--period", "12", "--json"]).out).series.value;
    const sum = fan.steps.reduce((s: number, st: { mean: number }) => s + st.mean, 0);
    expectClose(t.mean, sum, { rtol: 1e-12 }, "sum of means");
    expect(t.level).toBe(95);
    expect(t.paths).toBe(10000);
    expect(Math.abs(t.simulatedMean - t.mean)).toBeLessThan(5 * t.monteCarloError + 1e-3 * t.mean);
    expect(t.interval[0]).toBeLessThan(t.median);
    expect(t.interval[1]).toBeGreaterThan(t.median);
  });
});

describe("fanwise audit / backtest", () => {
  test("audit on the demo's forecast log prints the stable JSON keys", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-audit-"));
    runCli(["demo", "--out", dir]);
    const r = runCli(["audit", path.join(dir, "quillmere-forecast-log.csv"), "--actual", "actual", "--lower", "lower80", "--upper", "upper80", "--level", "80", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    for (const k of ["n", "misses", "coverage", "kupiec", "independence", "conditional", "binomialTail", "intervalScore"]) expect(j).toHaveProperty(k);
    expect(Object.keys(j.kupiec)).toEqual(["lr", "p"]);
    expect([j.n, j.misses]).toEqual([36, 9]);
    const bad = runCli(["audit", path.join(dir, "quillmere-forecast-log.csv"), "--actual", "actuals", "--lower", "lower80", "--upper", "upper80", "--level", "80"]);
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/No column named "actuals"/);
  });
  test("backtest prints one row per step ahead and refuses a horizon with no room", () => {
    const r = runCli(["backtest", datasetPath("airmiles"), "--horizon", "2", "--method", "drift", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series.value;
    expect(s.steps).toHaveLength(2);
    expect(s.steps[0].origins).toBe(24 - s.first);
    const none = runCli(["backtest", datasetPath("airmiles"), "--horizon", "3", "--method", "drift", "--lambda", "0", "--first", "23", "--json"]);
    expect(JSON.parse(none.out).series.value.error).toMatch(/no room for 3 steps/);
  });
});
