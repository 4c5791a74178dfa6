// Missing observations on the command line: a blank inside a column and --zeros missing. The
// numbers are the engine's (held to outside references in test/engine/missing.test.ts); here the
// command reads the file right, says how many were missing, names the file's lines, and its
// advice names the option that works.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";
import { fitForecast, fanTable } from "../../src/engine";

// invented monthly revenue of one shop (Quillmere scenario), closed in month 9
const months = Array.from({ length: 36 }, (_, t) => `${2021 + Math.floor(t / 12)}-${String((t % 12) + 1).padStart(2, "0")}`);
const revenue = months.map((_, t) => Math.round(30000 + 400 * t + 6000 * Math.sin((2 * Math.PI * t) / 12) + ((t * 37) % 11) * 150));
revenue[8] = 0;

function writeCsv(rows: string[]): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-missing-"));
  const file = path.join(dir, "shop.csv");
  fs.writeFileSync(file, ["month,Brook Lane", ...rows].join("\n") + "\n");
  return file;
}

describe("fanwise with missing observations", () => {
  test("screen suggests --zeros missing for an isolated zero, naming the line", () => {
    const file = writeCsv(months.map((m, t) => `${m},${revenue[t]}`));
    const r = runCli(["screen", file, "--period", "12", "--json"]);
    const s = JSON.parse(r.out).series["Brook Lane"];
    expect(s.fix).toBe("zeros-missing");
    expect(s.zerosIsolated).toBe(true);
    expect(s.message).toMatch(/first at line 10\).*read zeros as missing observations: add --zeros missing\./);
  });

  test("fan --zeros missing forecasts the series with that month missing: the engine's numbers, the count and the line", () => {
    const file = writeCsv(months.map((m, t) => `${m},${revenue[t]}`));
    const r = runCli(["fan", file, "--period", "12", "--horizon", "3", "--method", "holt", "--lambda", "0", "--zeros", "missing", "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series["Brook Lane"];
    expect(s.missing).toBe(1);
    expect(s.notes.join(" ")).toMatch(/1 missing observation inside the series \(line 10\) of 36 periods/);
    const t = fanTable(fitForecast(revenue.map((v) => (v === 0 ? null : v)), { method: "holt", lambda: 0, period: 12 }), 3);
    s.steps.forEach((st: { median: number; mean: number }, i: number) => {
      expect(st.median).toBeCloseTo(t.rows[i].median.value as number, 6);
      expect(st.mean).toBeCloseTo(t.rows[i].mean.value as number, 6);
    });
  });

  test("a blank cell inside a column is a missing observation without any option", () => {
    const file = writeCsv(months.map((m, t) => `${m},${t === 8 ? "" : revenue[t]}`));
    const r = runCli(["total", file, "--period", "12", "--horizon", "12", "--method", "ses", "--lambda", "0", "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series["Brook Lane"];
    expect(s.missing).toBe(1);
    expect(Number.isFinite(s.median) && Number.isFinite(s.interval[0]) && Number.isFinite(s.interval[1])).toBe(true);
  });

  test("a closing zero read as missing is refused, naming the lines and what to do", () => {
    const closing = revenue.slice();
    closing[8] = revenue[8 - 1];
    closing[35] = 0;
    const file = writeCsv(months.map((m, t) => `${m},${closing[t]}`));
    const r = runCli(["fan", file, "--period", "12", "--horizon", "3", "--zeros", "missing"]);
    expect(r.err).toMatch(/The last value of Brook Lane is missing: line 37 is a zero, read as missing, after the last observed value \(line 36\)/);
  });

  test("--zeros takes keep or missing only", () => {
    const file = writeCsv(months.map((m, t) => `${m},${revenue[t]}`));
    const r = runCli(["fan", file, "--horizon", "3", "--zeros", "blank"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--zeros/);
  });
});
