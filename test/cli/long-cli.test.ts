// --long SERIES_COL,PERIOD_COL,VALUE_COL: a long ("tidy") file, one row per series and period, is
// read through the shared reader like the wide file holding the same series, and every command
// that reads series gives byte-equal output for the two. Data: open datasets (test/fixtures/
// datasets: AirPassengers from R 4.2.2's datasets, elnino from statsmodels 0.13.5), written here in
// both shapes; the error cases are small invented files. In-process (main), no spawned CLI.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Workbook } from "exceljs";
import { main } from "../../src/cli/fanwise";
import { buildDemoWorkbook } from "../../src/demo/quillmere";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-long-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function file(name: string, content: string): string {
  const f = path.join(dir, name);
  fs.writeFileSync(f, content);
  return f;
}

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (s) => void (out += s), err: (s) => void (err += s) });
  return { code, out, err };
}

/** period → value of a dataset CSV (a # comment line, then period,value). */
function dataset(name: string): [string, string][] {
  const text = fs.readFileSync(path.join(__dirname, "..", "fixtures", "datasets", name), "utf8");
  return text.split("\n").filter((l) => l && !l.startsWith("#") && !l.startsWith("period,")).map((l) => l.split(",") as [string, string]);
}

// Three monthly series of different spans: AirPassengers 1949–1960, elnino 1950–1960 and 1955–1966
// (so the wide file has leading and trailing blanks, and the long file rows only where there are values).
const air = dataset("AirPassengers.csv");
const nino = dataset("elnino.csv");
const series: [string, [string, string][]][] = [
  ["air passengers", air],
  ["elnino 1950s", nino.filter(([p]) => p >= "1950-01" && p <= "1960-12")],
  ["elnino 1955-66", nino.filter(([p]) => p >= "1955-01" && p <= "1966-12")],
];
const periods = Array.from(new Set(series.flatMap(([, xs]) => xs.map(([p]) => p)))).sort();
const wide = file("wide.csv", [
  ["period", ...series.map(([n]) => n)].join(","),
  ...periods.map((p) => [p, ...series.map(([, xs]) => xs.find(([q]) => q === p)?.[1] ?? "")].join(",")),
].join("\n") + "\n");
// Long: series after series, each newest period first (row order carries nothing in a long file;
// series come in order of first appearance).
const longRows = series.flatMap(([n, xs]) => xs.slice().reverse().map(([p, v]) => `${n},${p},${v}`));
const long = file("long.csv", ["series,period,value", ...longRows].join("\n") + "\n");
const L = ["--long", "series,period,value"];

describe("a long file gives the same output as the wide file of the same series (AirPassengers, elnino)", () => {
  const commands: [string, string[]][] = [
    ["fan (auto method and λ)", ["fan", "--horizon", "12"]],
    ["fan CSV", ["fan", "--horizon", "6", "--method", "holt-winters", "--lambda", "0", "--levels", "50,95"]],
    ["screen", ["screen"]],
    ["lambda", ["lambda"]],
    ["total", ["total", "--horizon", "12", "--method", "seasonal-naive", "--lambda", "0", "--paths", "2000"]],
    ["backtest", ["backtest", "--horizon", "2", "--method", "seasonal-naive", "--lambda", "0", "--first", "100"]],
  ];
  test.each(commands)("%s: byte-equal JSON (and CSV) for --long and wide", async (_name, args) => {
    const json = !args.includes("--levels");
    const extra = json ? ["--json"] : [];
    const w = await run([args[0], wide, ...args.slice(1), ...extra]);
    const l = await run([args[0], long, ...args.slice(1), ...extra, ...L]);
    expect(l.err).toBe(w.err);
    expect(l.code).toBe(w.code);
    expect(w.out.length).toBeGreaterThan(200);
    expect(l.out).toBe(w.out);
    if (json) expect(Object.keys(JSON.parse(l.out).series)).toEqual(series.map(([n]) => n));
  }, 60000);
  test("--series picks by name in a long file as in a wide one", async () => {
    const w = await run(["screen", wide, "--series", "elnino 1955-66", "--json"]);
    const l = await run(["screen", long, "--series", "elnino 1955-66", "--json", ...L]);
    expect(l.out).toBe(w.out);
    expect(Object.keys(JSON.parse(l.out).series)).toEqual(["elnino 1955-66"]);
  });
  test("series come in order of first appearance in the file", async () => {
    const f = file("order.csv", "store,month,sales\nOld Quay,2024-01,5\nHarbour Street,2024-01,7\nOld Quay,2024-02,6\nHarbour Street,2024-02,8\n");
    const j = JSON.parse((await run(["screen", f, "--long", "store,month,sales", "--json"])).out);
    expect(Object.keys(j.series)).toEqual(["Old Quay", "Harbour Street"]);
  });
});

describe("how a long file is read, and what is refused (invented Quillmere shop data)", () => {
  test("a period with no row inside a series is a missing observation at its place, said in a note", async () => {
    const f = file("gap.csv", "store,month,sales\nHarbour Street,2024-01,120\nHarbour Street,2024-02,130\nOld Quay,2024-01,80\nOld Quay,2024-02,82\nOld Quay,2024-03,85\nHarbour Street,2024-04,150\nOld Quay,2024-04,88\nHarbour Street,2024-05,151\nOld Quay,2024-05,90\n");
    const r = await run(["screen", f, "--long", "store,month,sales", "--json"]);
    const j = JSON.parse(r.out);
    expect(j.series["Harbour Street"]).toMatchObject({ n: 4, blanks: 1, missing: 1 });
    expect(j.series["Old Quay"]).toMatchObject({ n: 5, blanks: 0 });
    expect(j.reading.notes).toEqual(["No row for some periods inside a series: Harbour Street (2024-03). Each is a missing observation (blank) at its place."]);
    expect(j.reading.dates.skipped).toEqual([]);
    const csv = await run(["screen", f, "--long", "store,month,sales"]);
    expect(csv.err).toMatch(/^fanwise: note: No row for some periods inside a series: Harbour Street \(2024-03\)/);
  });
  test("a duplicate (same series and period) is refused, naming both lines", async () => {
    const f = file("dup.csv", "store,month,sales\nOld Quay,2024-01,5\nOld Quay,2024-02,6\nHarbour Street,2024-01,7\nOld Quay,2024-02,9\n");
    const r = await run(["fan", f, "--long", "store,month,sales", "--horizon", "2"]);
    expect(r.code).toBe(1);
    expect(r.err).toBe('fanwise: Series "Old Quay" has two rows for the period 2024-02 (line 3 and line 5). Keep one row per series and period: remove or add up the duplicate.\n');
  });
  test("rows without a series name (a total row) and a period that is not one are left out with notes naming the lines; a series named Total is flagged", async () => {
    const f = file("totals.csv", [
      "store,month,sales",
      ...["01", "02", "03", "04", "05", "06"].flatMap((m, k) => [`Harbour Street,2024-${m},${120 + k}`, `Old Quay,2024-${m},${80 + 2 * k}`, `,2024-${m},${200 + 3 * k}`]),
      "Old Quay,Total,510",
      "Total,2024-06,215",
    ].join("\n") + "\n");
    const r = await run(["screen", f, "--long", "store,month,sales"]);
    expect(r.code).toBe(0);
    expect(r.err.trim().split("\n")).toEqual([
      'fanwise: note: Line 20 ("Total") is not a period; left out.',
      'fanwise: note: Lines 4, 7, 10, 13, 16 and 1 more have no series name in "store"; left out (a total row has none; give each a series name to forecast them).',
      'fanwise: note: Series "Total" looks like a total of the others; it is read as a series of its own (leave it out with --series if it is one).',
    ]);
    const j = JSON.parse((await run(["screen", f, "--long", "store,month,sales", "--json"])).out);
    expect(Object.keys(j.series)).toEqual(["Harbour Street", "Old Quay", "Total"]);
    expect(j.series["Old Quay"].n).toBe(6);
    expect(j.reading.leftOut).toEqual([{ line: 20, label: "Total" }]);
  });
  test("a total row with a series name but no period (Summe;;99.999,00) is left out with its series, not read as an empty series; a gap is named without doubled parentheses", async () => {
    // Invented: two shops, semicolons and decimal commas as a German export writes them, one month
    // missing for one shop, and a grand-total row at the bottom with a name but no period.
    const months = ["01", "02", "03", "04", "05", "06", "07", "08"];
    const f = file("summe.csv", [
      "Filiale;Monat;Umsatz",
      ...months.map((m, k) => `Hafen;${m}.2024;"${(1120 + 10 * k).toLocaleString("de-DE")},00"`),
      ...months.filter((m) => m !== "04").map((m, k) => `Mühlweg;${m}.2024;"${800 + 5 * k},50"`),
      'Summe;;"99.999,00"',
    ].join("\n") + "\n");
    const r = await run(["fan", f, "--long", "Filiale,Monat,Umsatz", "--horizon", "1", "--method", "naive"]);
    expect(r.code).toBe(0);
    expect(r.err.trim().split("\n")).toEqual([
      "fanwise: note: Line 17 (no period label) is not a period; left out.",
      'fanwise: note: Series "Summe" has no row with a period (line 17: left out above), so it is not read (a total row is not a series).',
      "fanwise: note: No row for some periods inside a series: Mühlweg (2024-04). Each is a missing observation (blank) at its place.",
    ]);
    const rows = r.out.trim().split("\n").slice(1);
    expect(rows.map((l) => l.split(",")[0])).toEqual(["Hafen", "Mühlweg"]);
    // naive: the median of the next month is the last value (Hafen 1,190.00; Mühlweg 830.50).
    expect(rows.map((l) => Number(l.split(",")[6]))).toEqual([1190, 830.5]);
    expect(r.out).toContain("(04.2024: no row for Mühlweg)");
    expect(r.out).not.toMatch(/\([^()]*\([^()]*\)\)/);
    const j = JSON.parse((await run(["screen", f, "--long", "Filiale,Monat,Umsatz", "--json"])).out);
    expect(Object.keys(j.series)).toEqual(["Hafen", "Mühlweg"]);
    // Only a total row: too short to forecast, said so (no period column to leave it out by).
    const only = file("only-summe.csv", 'Filiale;Monat;Umsatz\nSumme;;"99.999,00"\n');
    const o = await run(["fan", only, "--long", "Filiale,Monat,Umsatz", "--horizon", "1"]);
    expect(o.code).toBe(1);
    expect(o.err).toMatch(/^fanwise: Summe: Summe is too short to forecast: it has 1 value/);
  });
  test("a wrong column name lists the file's columns (and a near miss)", async () => {
    const f = file("cols.csv", "store,month,sales,currency\nOld Quay,2024-01,5,EUR\n");
    const r = await run(["screen", f, "--long", "store,Month,sales"]);
    expect(r.code).toBe(1);
    expect(r.err).toBe('fanwise: --long: no column named "Month" (the period column) — did you mean "month"? names are matched exactly. The file\'s columns: store, month, sales, currency. Give --long SERIES_COL,PERIOD_COL,VALUE_COL with three of them.\n');
    const ok = JSON.parse((await run(["screen", f, "--long", "store,month,sales", "--json"])).out);
    expect(ok.reading.ignored).toEqual(["currency"]);
  });
  test("--long needs three different names", async () => {
    for (const v of ["store,month", "store,month,sales,x", "store,,sales"]) {
      const r = await run(["screen", "x.csv", "--long", v]);
      expect([r.code, r.err]).toEqual([1, `fanwise: --long needs three column names separated by commas — the series, the period and the value column — e.g. --long store,month,sales; got "${v}".\n`]);
    }
    const same = await run(["screen", "x.csv", "--long", "store,month,store"]);
    expect(same.err).toMatch(/names the same column twice/);
  });
  test("a value that cannot be read names the series, the value column and the long file's line", async () => {
    const f = file("bad.csv", "store;month;sales\nOld Quay;2024-01;1.234,5\nOld Quay;2024-02;1.240,0\nHarbour Street;2024-01;7,5\nHarbour Street;2024-02;7.5\nHarbour Street;2024-03;7,7\nOld Quay;2024-03;1.250,0\n");
    const r = await run(["fan", f, "--long", "store,month,sales", "--horizon", "1", "--method", "naive", "--lambda", "0", "--json"]);
    const j = JSON.parse(r.out);
    expect(j.series["Old Quay"].steps[0].median).toBeCloseTo(1250, 9);
    expect(j.series["Harbour Street"].error).toBe('Series "Harbour Street" (column "sales") has a value that cannot be read as a number with the decimal mark "," (line 5: "7.5"). Correct it, or force the mark with --decimal ..');
    expect(r.code).toBe(3);
  });
  test("a value ≤ 0 is named by its line in the long file", async () => {
    const f = file("neg.csv", "store,month,sales\n" + ["01", "02", "03", "04", "05", "06"].flatMap((m, k) => [`Old Quay,2024-${m},${k === 4 ? 0 : 80 + k}`, `Harbour Street,2024-${m},${120 + k}`]).join("\n") + "\n");
    const r = await run(["fan", f, "--long", "store,month,sales", "--horizon", "1", "--method", "naive", "--json"]);
    expect(JSON.parse(r.out).series["Old Quay"].error).toMatch(/first at line 10\b/);
  });
});

describe("a long sheet of a workbook (the invented Quillmere demo data)", () => {
  test("reads like the wide sheet of the same series: byte-equal fan JSON", async () => {
    const demo = buildDemoWorkbook();
    const date = (m: string): Date => new Date(Date.UTC(Number(m.slice(0, 4)), Number(m.slice(5, 7)) - 1, 1));
    const write = async (name: string, fill: (ws: ReturnType<Workbook["addWorksheet"]>) => void): Promise<string> => {
      const wb = new Workbook();
      fill(wb.addWorksheet("Sales"));
      const f = path.join(dir, name);
      await wb.xlsx.writeFile(f);
      return f;
    };
    const wideBook = await write("wide.xlsx", (ws) => {
      ws.addRow(["month", ...demo.columns.map((c) => c.name)]);
      demo.months.forEach((m, i) => ws.addRow([date(m), ...demo.columns.map((c) => c.values[i])]));
    });
    const longBook = await write("long.xlsx", (ws) => {
      ws.addRow(["series", "month", "value"]);
      for (const c of demo.columns) demo.months.forEach((m, i) => ws.addRow([c.name, date(m), c.values[i]]));
    });
    const args = ["--horizon", "6", "--method", "ses", "--lambda", "0", "--json"];
    const w = await run(["fan", wideBook, ...args]);
    const l = await run(["fan", longBook, ...args, "--long", "series,month,value"]);
    const places = (s: string): string => s.replace(/row \d+ of sheet/g, "row N of sheet");
    expect(Object.keys(JSON.parse(l.out).series)).toEqual(demo.columns.map((c) => c.name));
    expect(places(l.out)).toBe(places(w.out));
    expect(places(l.err)).toBe(places(w.err));
  }, 60000);
});
