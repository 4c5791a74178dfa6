// One reader for CSV and workbooks (the shared src/io reader behind the command line): an .xlsx
// sheet with a Total row, a skipped month and a text cell in a European number format is read
// like the same export as CSV; a series that ends early gets the periods after its own last value;
// --zeros missing works on a semicolon export read by the shared reader. Data: AirPassengers
// (R datasets, as in test/fixtures/messy/truth.json); the workbook is written with the
// general-purpose library fanwise reads it with (exceljs), dates as date cells.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Workbook } from "exceljs";
import { main } from "../../src/cli/fanwise";

interface Run { code: number; out: string; err: string }
async function run(args: string[]): Promise<Run> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (s) => void (out += s), err: (s) => void (err += s) });
  return { code, out, err };
}

const truth = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "messy", "truth.json"), "utf8")) as { cases: { file: string; series: Record<string, (number | null)[]> }[] };
const AIR = truth.cases.find((c) => c.file === "us-dates.csv")?.series.Passengers as number[];
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-merged-"));
const at = (name: string): string => path.join(dir, name);
const month = (i: number): string => `${1949 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, "0")}`;
const SKIP = 17; // 1950-06, as in the corpus' missing-month.csv
const TEXT = 30; // 1951-07 written as text "199,0" (a European decimal comma)

beforeAll(async () => {
  const wb = new Workbook();
  const ws = wb.addWorksheet("Sales");
  ws.addRow(["Month", "Passengers"]);
  AIR.forEach((v, i) => {
    if (i !== SKIP) ws.addRow([new Date(Date.UTC(1949, i, 1)), i === TEXT ? `${v},0` : v]);
  });
  ws.addRow(["Total", AIR.reduce((a, b) => a + b, 0)]);
  ws.getColumn(1).numFmt = "mmm yyyy";
  await wb.xlsx.writeFile(at("air.xlsx"));
  // The same export as a semicolon CSV with a decimal comma and a Summe row.
  const lines = ["Monat;Passengers", ...AIR.map((v, i) => (i === SKIP ? null : `${month(i).slice(5)}.${month(i).slice(0, 4)};${v},0`)).filter((l): l is string => l !== null), "Summe;"];
  fs.writeFileSync(at("air.csv"), lines.join("\n") + "\n");
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("a workbook goes through the shared reader", () => {
  test("Total row left out, the skipped month a missing observation at its place, text '199,0' read as 199: the same forecast as the CSV export", async () => {
    const args = ["--horizon", "3", "--json", "--method", "seasonal-naive", "--lambda", "0"]; // a quick model: the check is the reading
    const x = await run(["fan", at("air.xlsx"), ...args]);
    const c = await run(["fan", at("air.csv"), ...args]);
    expect(x.code).toBe(0);
    expect(c.code).toBe(0);
    const xj = JSON.parse(x.out);
    const cj = JSON.parse(c.out);
    expect(xj.reading.delimiterFrom).toBe("workbook");
    expect(xj.reading.dates).toMatchObject({ column: "Month", frequency: "monthly", first: "1949-01", last: "1960-12", skipped: ["1950-06"] });
    expect(xj.reading.leftOut).toEqual([{ line: 145, label: "Total" }]); // the sheet's row 145: header in row 1, 143 months below
    expect(xj.reading.notes[0]).toBe('Row 145 of sheet "Sales" ("Total") is not a period; left out.');
    const s = xj.series.Passengers;
    expect([s.period, s.periodFrom, s.missing]).toEqual([12, "dates", 1]);
    expect(s.steps.map((st: { period: string }) => st.period)).toEqual(["1961-01", "1961-02", "1961-03"]);
    // the same series read from the CSV export gives the same numbers
    expect(s.steps.map((st: { mean: number }) => st.mean)).toEqual(cj.series.Passengers.steps.map((st: { mean: number }) => st.mean));
    expect(s.sigma).toBe(cj.series.Passengers.sigma);
  });
  test("--delimiter on a workbook is a usage error naming why", async () => {
    const r = await run(["fan", at("air.xlsx"), "--horizon", "2", "--delimiter", ";"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--delimiter is for CSV files; .*air\.xlsx is an \.xlsx workbook/);
  });
});

describe("periods of each series' steps", () => {
  test("a series whose last two months are blank is forecast from its last value: its steps are dated from there, not from the file's end", async () => {
    const lines = ["month,A,B", ...AIR.map((v, i) => `${month(i)},${v},${i >= AIR.length - 2 ? "" : v}`)];
    fs.writeFileSync(at("early.csv"), lines.join("\n") + "\n");
    const r = await run(["fan", at("early.csv"), "--horizon", "2", "--json", "--method", "naive", "--lambda", "0"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.series.A.steps.map((s: { period: string }) => s.period)).toEqual(["1961-01", "1961-02"]);
    expect(j.series.B.steps.map((s: { period: string }) => s.period)).toEqual(["1960-11", "1960-12"]);
    // naive on the log scale (common practice, a random walk): every step's median is the last observed value
    expect(j.series.B.steps[0].median).toBeCloseTo(AIR[AIR.length - 3], 9);
    const t = await run(["total", at("early.csv"), "--horizon", "3", "--from", "2", "--json", "--method", "naive", "--lambda", "0"]);
    const tj = JSON.parse(t.out);
    expect([tj.series.B.firstPeriod, tj.series.B.lastPeriod]).toEqual(["1960-12", "1961-01"]);
    expect([tj.series.A.firstPeriod, tj.series.A.lastPeriod]).toEqual(["1961-02", "1961-03"]);
  });
});

describe("--zeros missing with the shared reader", () => {
  test("a closed month (0) in a semicolon export with a Summe row: refused with the option named, then read as a missing observation", async () => {
    const lines = ["Monat;Umsatz", ...AIR.map((v, i) => `${month(i).slice(5)}.${month(i).slice(0, 4)};${i === 74 ? "0" : `${v},00`}`), "Summe;1.000,00"];
    fs.writeFileSync(at("closed.csv"), lines.join("\n") + "\n");
    const keep = await run(["fan", at("closed.csv"), "--horizon", "2"]);
    expect(keep.code).toBe(1);
    expect(keep.out).toMatch(/1 zero \(minimum 0, first at line 76\).*add --zeros missing/);
    const miss = await run(["fan", at("closed.csv"), "--horizon", "2", "--zeros", "missing", "--json", "--method", "ses", "--lambda", "0"]);
    expect(miss.code).toBe(0);
    const s = JSON.parse(miss.out).series.Umsatz;
    expect(s.missing).toBe(1);
    expect(s.period).toBe(12);
    expect(miss.err).toBe("");
    expect(JSON.parse(miss.out).reading.leftOut).toEqual([{ line: 146, label: "Summe" }]);
  });
});
