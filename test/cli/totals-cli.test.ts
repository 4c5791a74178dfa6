// fanwise published and fanwise total --from/--to/--across end to end (issue 13): the JSON equals
// the engine's results (themselves checked against numpy simulations in test/engine/totals-*),
// and bad input ends in one line on stderr naming what to fix.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";
import { datasetPath, dataset, expectClose } from "../helpers/reference";
import { alignSeries, fitForecast, publishedTotal, totalAcross, totalForecast } from "../../src/engine";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-totals-"));
function file(name: string, content: string): string {
  const f = path.join(dir, name);
  fs.writeFileSync(f, content);
  return f;
}
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fx: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "totals", "totals.json"), "utf8"));
const p = fx.localLevel.published;
const published = file("published.csv", "# Invented: a log-scale forecast of about 100,000 a month\nmonth,median,lower80,upper80,lower95,upper95\n"
  + p.median.map((m: number, i: number) => `2027-${String(i + 1).padStart(2, "0")},${m},${p.lower80[i]},${p.upper80[i]},${p.lower95[i]},${p.upper95[i]}`).join("\n") + "\n,,,,,\n");

describe("fanwise published", () => {
  test("JSON: each month's μ, σ, mean and implied λ, then the total: the engine's numbers", () => {
    const r = runCli(["published", published, "--median", "median", "--lower", "lower95", "--upper", "upper95", "--level", "95", "--json"]);
    expect(r.err).toBe("");
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const t = publishedTotal(p.median, p.lower95, p.upper95, 95);
    expect(j.months).toHaveLength(12);
    expect(j.months[0].line).toBe(3);
    expect(j.months[3].mu).toBe(t.months[3].mu);
    expect(j.months[3].sigma).toBe(t.months[3].sigma);
    expect(j.months[3].mean).toBe(t.months[3].mean);
    expect(j.months[3].impliedLambda).toBe(t.months[3].impliedLambda);
    expect(j.total.mean).toBe(t.mean);
    expect(j.total.interval).toEqual(t.interval);
    expect(j.total.independent).toEqual(t.independent.interval);
    expect(j.total.comonotone).toEqual(t.comonotone.interval);
    expect(j.total.used).toBe("local-level");
    expectClose(j.total.interval[0], fx.localLevel.truth.interval95[0], { rtol: 0.005 }, "low end vs the numpy truth");
  });
  test("CSV: one row per month, then a total row with its assumption in words", () => {
    const r = runCli(["published", published, "--median", "median", "--lower", "lower80", "--upper", "upper80", "--level", "80", "--lambda", "implied", "--dependence", "comonotone"]);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split("\n");
    expect(lines[0]).toMatch(/^row,line,median,lower,upper,mu,sigma,mean,implied_lambda,low,high,independent_low,independent_high,comonotone_low,comonotone_high,note$/);
    expect(lines).toHaveLength(14);
    expect(lines[13]).toMatch(/^total,/);
    expect(lines[13]).toMatch(/80% interval; dependence comonotone; λ 0 \(implied\)/);
  });
  test("bad input: an interval in the wrong order names the month and the line; a level as a fraction; a missing column", () => {
    let r = runCli(["published", published, "--median", "median", "--lower", "upper95", "--upper", "lower95", "--level", "95"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/Month 1 \(line 3\): Need lower < median < upper/);
    r = runCli(["published", published, "--median", "median", "--lower", "lower95", "--upper", "upper95", "--level", "0.95"]);
    expect(r.err).toMatch(/level is in percent: give 95/);
    r = runCli(["published", published, "--median", "median", "--lower", "low", "--upper", "upper95", "--level", "95"]);
    expect(r.err).toMatch(/No column named "low" \(for --lower\)/);
    r = runCli(["published", published, "--median", "median", "--lower", "lower95", "--upper", "upper95", "--level", "95", "--dependence", "strong"]);
    expect(r.err).toMatch(/Unknown dependence "strong"/);
    const gap = file("gap.csv", "median,lower,upper\n100,80,120\n100,,125\n");
    r = runCli(["published", gap, "--median", "median", "--lower", "lower", "--upper", "upper", "--level", "80"]);
    expect(r.err).toMatch(/Line 3: --lower column "lower" is blank/);
    const zero = file("zero.csv", "median,lower,upper\n100,0,120\n");
    r = runCli(["published", zero, "--median", "median", "--lower", "lower", "--upper", "upper", "--level", "80"]);
    expect(r.err).toMatch(/Month 1 \(line 2\): The interval's lower end must be > 0/);
  });
});

describe("fanwise total --from/--to and --across", () => {
  test("--from 8 --to 19: the engine's window total (R datasets AirPassengers, SES on ln y)", () => {
    const r = runCli(["total", datasetPath("AirPassengers"), "--from", "8", "--to", "19", "--method", "ses", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out).series.value;
    const t = totalForecast(fitForecast(dataset("AirPassengers"), { method: "ses", lambda: 0 }), 19, { from: 8 });
    expect(j.from).toBe(8);
    expect(j.mean).toBe(t.mean.value);
    expect(j.interval).toEqual(t.interval);
  });
  test("a window that is empty, or --horizon and --to that disagree", () => {
    let r = runCli(["total", datasetPath("AirPassengers"), "--from", "13", "--horizon", "12"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/from \(13\) is after horizon \(12\)/);
    r = runCli(["total", datasetPath("AirPassengers"), "--horizon", "12", "--to", "19"]);
    expect(r.err).toMatch(/--horizon 12 and --to 19 disagree/);
    r = runCli(["total", datasetPath("AirPassengers")]);
    expect(r.err).toMatch(/--horizon is required/);
  });
  test("periods instead of steps: --from 1961-08 --to 1962-07 is steps 8..19 after AirPassengers' last month (1960-12), the same numbers", () => {
    const byStep = JSON.parse(runCli(["total", datasetPath("AirPassengers"), "--from", "8", "--to", "19", "--method", "ses", "--lambda", "0", "--json"]).out).series.value;
    const r = runCli(["total", datasetPath("AirPassengers"), "--from", "1961-08", "--to", "Jul 1962", "--method", "ses", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out).series.value;
    expect([j.from, j.horizon, j.firstPeriod, j.lastPeriod]).toEqual([8, 19, "1961-08", "1962-07"]);
    expect(j.mean).toBe(byStep.mean);
    expect(j.interval).toEqual(byStep.interval);
  });
  test("periods count from each series' own last value: a series two months short sums the same calendar months over its steps 3..14 (invented shops)", () => {
    const f = file("dated-shops.csv", "# Invented Quillmere shops\nmonth,North,South\n" + Array.from({ length: 40 }, (_, i) => `${2022 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, "0")},${(1000 * Math.exp(0.01 * i)).toFixed(1)},${i >= 38 ? "" : (800 * Math.exp(0.005 * i)).toFixed(1)}`).join("\n") + "\n");
    const r = runCli(["total", f, "--from", "2025-05", "--to", "2026-04", "--method", "naive", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series;
    expect([s.North.from, s.North.horizon, s.North.firstPeriod, s.North.lastPeriod]).toEqual([1, 12, "2025-05", "2026-04"]);
    expect([s.South.from, s.South.horizon, s.South.firstPeriod, s.South.lastPeriod]).toEqual([3, 14, "2025-05", "2026-04"]);
  });
  test("bad periods say what to write: before the last value, another frequency, a file without dates", () => {
    let r = runCli(["total", datasetPath("AirPassengers"), "--from", "1960-06", "--to", "1961-12"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--from 1960-06 is not after value's last value \(1960-12\); a window starts at 1961-01 at the earliest/);
    r = runCli(["total", datasetPath("AirPassengers"), "--from", "1961Q1", "--to", "1961-12"]);
    expect(r.err).toMatch(/--from "1961Q1" is not a monthly period; write it like the file's dates, e.g\. 1961-01/);
    const plain = file("plain.csv", "sales\n" + Array.from({ length: 24 }, (_, i) => 100 + i).join("\n") + "\n");
    r = runCli(["total", plain, "--from", "2026-01", "--to", "2026-12"]);
    expect(r.err).toMatch(/--from 2026-01 names a period, but the file has no column of dates/);
    r = runCli(["total", datasetPath("AirPassengers"), "--from", "1.5", "--to", "12"]);
    expect(r.err).toMatch(/--from must be a whole number of at least 1 or a period such as 2026-01; got "1.5"/);
  });
  const shops = file("shops.csv", "# Invented Quillmere shops\nmonth,North,South\n" + Array.from({ length: 40 }, (_, i) => `m${i + 1},${(1000 * Math.exp(0.02 * Math.sin(i) + 0.01 * i)).toFixed(1)},${i >= 38 ? "" : (800 * Math.exp(0.03 * Math.cos(i * 1.3) + 0.005 * i)).toFixed(1)}`).join("\n") + "\n");
  test("--across adds an 'all series' row: the engine's joint total, with the alignment said", () => {
    const r = runCli(["total", shops, "--horizon", "6", "--method", "naive", "--lambda", "0", "--across", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out).across;
    const text = fs.readFileSync(shops, "utf8").split("\n").filter((l) => l && !l.startsWith("#")).slice(1).map((l) => l.split(","));
    const cols = [1, 2].map((k) => text.map((row) => (row[k] === "" ? null : Number(row[k]))));
    const a = alignSeries(cols, ["North", "South"], 1);
    const t = totalAcross(a.columns.map((c, k) => fitForecast(c, { method: "naive", lambda: 0, label: ["North", "South"][k] })), 6, { mean: "auto" }); // the CLI default mean is auto (exact at λ = 0)
    expect(j.name).toBe("all series");
    expect(j.mean).toBe(t.mean);
    expect(j.interval).toEqual(t.interval);
    expect(j.independent).toEqual(t.independent.interval);
    expect(j.estimator).toMatch(/Pearson correlation/);
    expect(j.notes.join(" ")).toMatch(/North has values after line 40, the latest period every series has; it is cut there/);
    const csv = runCli(["total", shops, "--horizon", "6", "--method", "naive", "--lambda", "0", "--across"]);
    expect(csv.out.trim().split("\n").pop()).toMatch(/^all series,1,6,joint,per series,.*If the series were independent: /);
  });
  test("--across on a file with one series says to leave it out", () => {
    const r = runCli(["total", datasetPath("AirPassengers"), "--horizon", "6", "--across"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--across adds up several series; the file has one \(value\)/);
  });
});
