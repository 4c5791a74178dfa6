// Workbooks in and out, and charts from the command line. Workbooks are written here with the
// same general-purpose library fanwise reads them with (exceljs), the way a spreadsheet program
// stores them (numbers as numbers, months as dates); the checks compare with the CSV path and
// with fanwise's own JSON. Charts: the SVG is parsed as XML, the PNG decoded by the PNG
// specification's filters (test/helpers/png.ts) and a few pixels compared with the chart's
// colours (DESIGN.md, "The pane's look"); ImageMagick's own SVG renderer is a second renderer.
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Workbook } from "exceljs";
import { parseStringPromise } from "xml2js";
import { main } from "../../src/cli/fanwise";
import { buildDemoWorkbook, demoForecastLogCsv, demoMonthlyCsv } from "../../src/demo/quillmere";
import { COLORS } from "../../src/chart/fan-chart";
import { colourDistance, readPng } from "../helpers/png";

interface Run { code: number; out: string; err: string }
async function run(args: string[]): Promise<Run> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (s) => void (out += s), err: (s) => void (err += s) });
  return { code, out, err };
}

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-xlsx-"));
const at = (name: string): string => path.join(dir, name);
const demo = buildDemoWorkbook(); // invented data (Quillmere Cycle Works is fictional)
const CSV = at("quillmere-monthly.csv");
const LOG = at("quillmere-forecast-log.csv");
const BOOK = at("quillmere.xlsx");

beforeAll(async () => {
  fs.writeFileSync(CSV, demoMonthlyCsv(demo));
  fs.writeFileSync(LOG, demoForecastLogCsv(demo));
  const wb = new Workbook();
  const sales = wb.addWorksheet("Sales");
  sales.addRow(["month", ...demo.columns.map((c) => c.name)]);
  demo.months.forEach((m, i) => sales.addRow([new Date(Date.UTC(Number(m.slice(0, 4)), Number(m.slice(5, 7)) - 1, 1)), ...demo.columns.map((c) => c.values[i])]));
  sales.getColumn(1).numFmt = "mmm yyyy";
  const log = wb.addWorksheet("Forecast log");
  log.addRow(["month", "series", "median", "lower80", "upper80", "lower95", "upper95", "actual"]);
  for (const r of demo.forecastLog) log.addRow([r.month, r.series, r.median, r.lower80, r.upper80, r.lower95, r.upper95, r.actual]);
  wb.addWorksheet("About").addRow([demo.notice]);
  await wb.xlsx.writeFile(BOOK);
});

/** A fan JSON without the period labels, the places in messages, and what differs in how the file was read (its delimiter, the dates' written form). */
function numbersOnly(j: { reading?: { delimiter?: string; delimiterFrom?: string; dates?: { format?: string } | null }; series: Record<string, { steps?: { period?: string }[]; error?: string }> }): unknown {
  if (j.reading) {
    delete j.reading.delimiter;
    delete j.reading.delimiterFrom;
    if (j.reading.dates) delete j.reading.dates.format;
  }
  for (const s of Object.values(j.series)) {
    for (const st of s.steps ?? []) delete st.period;
    if (s.error) s.error = s.error.replace(/line \d+|row \d+ of sheet "Sales"/g, "PLACE");
  }
  return j;
}

describe("reading .xlsx", () => {
  test("the demo workbook as .xlsx gives the same numbers as the demo CSV (fan, screen)", async () => {
    const args = ["--horizon", "6", "--period", "12", "--json", "--series", "Harbour Street,Millbrook,Old Quay"];
    const x = await run(["fan", BOOK, ...args]);
    const c = await run(["fan", CSV, ...args]);
    expect(x.code).toBe(3); // Old Quay has a zero month: not Box-Cox ready, in both
    expect(c.code).toBe(3);
    const xj = JSON.parse(x.out);
    expect(xj.series["Harbour Street"].steps[0].period).toBe("2026-01"); // the month after the last date (first-of-month date cells read as a monthly calendar, labelled as the CSV's are)
    expect(numbersOnly(xj)).toEqual(numbersOnly(JSON.parse(c.out)));
    expect(x.err).toMatch(/Old Quay has 1 zero \(minimum 0, first at row 39 of sheet "Sales"\)/); // 2023-02 is the 38th month, under a header in row 1
    const sx = await run(["screen", BOOK, "--period", "12", "--json"]);
    const sc = await run(["screen", CSV, "--period", "12", "--json"]);
    const strip = (j: { series: Record<string, { message: string }> }) => Object.fromEntries(Object.entries(j.series).map(([k, v]) => [k, { ...v, message: v.message.replace(/line \d+|row \d+ of sheet "Sales"/g, "PLACE") }]));
    expect(strip(JSON.parse(sx.out))).toEqual(strip(JSON.parse(sc.out)));
  });
  test("a second sheet by --sheet: the forecast log audits as from CSV; an unknown sheet lists the sheets", async () => {
    const a = ["--actual", "actual", "--lower", "lower80", "--upper", "upper80", "--level", "80", "--json"];
    const x = await run(["audit", BOOK, "--sheet", "Forecast log", ...a]);
    const c = await run(["audit", LOG, ...a]);
    expect(x.code).toBe(0);
    expect(JSON.parse(x.out)).toEqual(JSON.parse(c.out));
    const bad = await run(["audit", BOOK, "--sheet", "Log", ...a]);
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/--sheet: no sheet named "Log" in .*quillmere\.xlsx\. Sheets: Sales, Forecast log, About\./);
  });
  test("--range reads only those cells (header row first)", async () => {
    // B1:C25: Harbour Street and Millbrook, the first 24 months; no month column, so no periods.
    const r = await run(["screen", BOOK, "--range", "B1:C25", "--json"]);
    const s = JSON.parse(r.out).series;
    expect(Object.keys(s)).toEqual(["Harbour Street", "Millbrook"]);
    expect(s["Harbour Street"].n).toBe(24);
    expect(s["Harbour Street"].min).toBe(Math.min(...(demo.columns[0].values.slice(0, 24) as number[])));
    const bad = await run(["screen", BOOK, "--range", "B1-C25"]);
    expect(bad.err).toMatch(/--range must be two cell addresses with a colon, header row first, e\.g\. --range B2:H74; got "B1-C25"/);
  });
  test("merged header cells over two rows are joined into the column names, and the user is told", async () => {
    const wb = new Workbook();
    const ws = wb.addWorksheet("Regions");
    ws.getCell("A1").value = "month";
    ws.mergeCells("A1:A2");
    ws.getCell("B1").value = "Revenue";
    ws.mergeCells("B1:C1");
    ws.getCell("B2").value = "North";
    ws.getCell("C2").value = "South";
    for (let i = 0; i < 12; i++) ws.addRow([`2024-${String(i + 1).padStart(2, "0")}`, 100 + i, 200 + 2 * i]);
    const f = at("merged.xlsx");
    await wb.xlsx.writeFile(f);
    const r = await run(["screen", f, "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series;
    expect(Object.keys(s)).toEqual(["Revenue North", "Revenue South"]);
    expect(s["Revenue North"].n).toBe(12);
    expect(s["Revenue South"].min).toBe(200);
    expect(r.err).toMatch(/^fanwise: note: Sheet "Regions": the header spans rows 1–2 \(merged cells\); columns read as "month", "Revenue North", "Revenue South"/);
  });
  test("a formula is read by its saved result; one with no saved result is a blank, and the user is told where", async () => {
    const wb = new Workbook();
    const ws = wb.addWorksheet("Calc");
    ws.addRow(["month", "sales"]);
    for (let i = 0; i < 10; i++) ws.addRow([`2024-${String(i + 1).padStart(2, "0")}`, 100 + i]);
    ws.getCell("B4").value = { formula: "B3+1", result: 777 } as never;
    ws.getCell("B11").value = { formula: "B10+1" } as never; // saved without calculating
    const f = at("formula.xlsx");
    await wb.xlsx.writeFile(f);
    const r = await run(["screen", f, "--json"]);
    const s = JSON.parse(r.out).series.sales;
    expect(s.max).toBe(777);
    expect(s.n).toBe(9);
    expect(s.trailingBlanks).toBe(1);
    expect(r.err).toMatch(/Sheet "Calc": 1 formula cell has no saved result \(B11\); read as blank\. Open the workbook in a spreadsheet program and save it/);
  });
  test("a password-protected (encrypted) workbook, a damaged one and a non-workbook are refused with what to do", async () => {
    // Office saves an encrypted workbook as an OLE compound file (signature D0 CF 11 E0 A1 B1 1A E1,
    // [MS-CFB] §2.2), not as a zip package; old .xls files share the signature.
    const enc = at("secret.xlsx");
    fs.writeFileSync(enc, Buffer.concat([Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), Buffer.alloc(4096, 7)]));
    const e = await run(["fan", enc, "--horizon", "3"]);
    expect(e.code).toBe(1);
    expect(e.err).toMatch(/secret\.xlsx is password-protected \(encrypted\) or an old-style \.xls workbook.*Save a copy without a password as \.xlsx/);
    const good = fs.readFileSync(BOOK);
    const cut = at("damaged.xlsx");
    fs.writeFileSync(cut, good.subarray(0, Math.floor(good.length / 2)));
    const d = await run(["screen", cut]);
    expect(d.code).toBe(1);
    expect(d.err).toMatch(/damaged\.xlsx could not be read as a workbook \(.*\)\. It may be damaged/);
    expect(d.err.trim().split("\n")).toHaveLength(1);
    const txt = at("notes.xlsx");
    fs.writeFileSync(txt, "month,sales\n2024-01,5\n");
    expect((await run(["screen", txt])).err).toMatch(/notes\.xlsx is not an \.xlsx workbook .*If it is a CSV file, give it a \.csv name/);
  });
});

describe("writing .xlsx (--out)", () => {
  test("fan --out results.xlsx: the table read back equals the JSON output, with settings, cautions and one chart per computed series", async () => {
    const args = ["fan", BOOK, "--horizon", "12", "--period", "12", "--series", "Harbour Street,Old Quay,Station Road"];
    const out = at("results.xlsx");
    const w = await run([...args, "--out", out]);
    expect(w.code).toBe(3);
    expect(w.out).toBe(`Wrote ${out}\n`);
    const j = JSON.parse((await run([...args, "--json"])).out).series;
    const wb = new Workbook();
    await wb.xlsx.readFile(out);
    const ws = wb.getWorksheet("fanwise fan");
    expect(ws).toBeDefined();
    if (!ws) return;
    const header = (ws.getRow(1).values as unknown[]).slice(1);
    expect(header).toEqual(["series", "h", "period", "method", "lambda", "mean", "median", "low80", "high80", "low95", "high95", "note"]);
    const col = (name: string) => header.indexOf(name) + 1;
    let row = 2;
    for (const name of ["Harbour Street", "Station Road"]) {
      j[name].steps.forEach((st: { h: number; period: string; mean: number; median: number; intervals: Record<string, [number, number]> }) => {
        const r = ws.getRow(row++);
        expect(r.getCell(col("series")).value).toBe(name);
        expect(r.getCell(col("h")).value).toBe(st.h);
        expect(r.getCell(col("period")).value).toBe(st.period);
        expect(r.getCell(col("mean")).value).toBe(st.mean); // full precision, not the printed digits
        expect(r.getCell(col("median")).value).toBe(st.median);
        expect(r.getCell(col("low80")).value).toBe(st.intervals["80"][0]);
        expect(r.getCell(col("high95")).value).toBe(st.intervals["95"][1]);
      });
      if (name === "Harbour Street") {
        expect(ws.getRow(row).getCell(1).value).toBe("Old Quay");
        expect(String(ws.getRow(row).getCell(col("note")).value)).toMatch(/Not Box-Cox ready/);
        row++;
      }
    }
    expect(ws.getRow(2).getCell(col("mean")).numFmt).toBe("#,##0.00");
    const texts = ws.getColumn(1).values.map(String);
    expect(texts).toContain("Settings");
    expect(texts.some((t) => /^fanwise fan .*--horizon 12 --period 12/.test(String(ws.getCell(texts.indexOf("command"), 2).value)) || t === "command")).toBe(true);
    expect(texts.some((t) => /^Old Quay: Not Box-Cox ready/.test(t))).toBe(true);
    expect(texts.some((t) => /^Forecasts are estimates from past patterns/.test(t))).toBe(true);
    expect(ws.getImages()).toHaveLength(2); // Harbour Street and Station Road; Old Quay has no fan
  });
  test("total --out .xlsx and .json write the same numbers as --json", async () => {
    const args = ["total", CSV, "--horizon", "12", "--period", "12", "--series", "Millbrook", "--paths", "500"];
    const j = JSON.parse((await run([...args, "--json"])).out).series.Millbrook;
    expect((await run([...args, "--out", at("total.json")])).code).toBe(0);
    expect(JSON.parse(fs.readFileSync(at("total.json"), "utf8")).series.Millbrook).toEqual(j);
    await run([...args, "--out", at("total.xlsx")]);
    const wb = new Workbook();
    await wb.xlsx.readFile(at("total.xlsx"));
    const ws = wb.worksheets[0];
    const header = (ws.getRow(1).values as unknown[]).slice(1);
    const cell = (name: string) => ws.getRow(2).getCell(header.indexOf(name) + 1).value;
    expect([cell("mean"), cell("median"), cell("low"), cell("high"), cell("mc_std_error")]).toEqual([j.mean, j.median, j.interval[0], j.interval[1], j.monteCarloError]);
    expect((await run([...args, "--out", at("total.txt")])).err).toMatch(/--out must name a \.xlsx, \.csv or \.json file/);
  });
});

describe("fanwise chart", () => {
  const common = ["--horizon", "12", "--period", "12", "--levels", "50,80,95", "--series", "Harbour Street"];
  let svg = "";
  beforeAll(async () => {
    const r = await run(["chart", BOOK, ...common, "--out", at("fan.svg")]);
    expect(r.code).toBe(0);
    svg = fs.readFileSync(at("fan.svg"), "utf8");
  });
  /** The points of a path's d attribute. */
  const pointsOf = (d: string): [number, number][] => Array.from(d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g), (m) => [Number(m[1]), Number(m[2])] as [number, number]);
  const pathD = (cls: string): string => (new RegExp(`<path class="${cls}" d="([^"]+)"`).exec(svg) ?? [])[1] ?? "";

  test("the SVG parses as XML; lines are open paths (no polyline, no Z), bands closed paths; dates on the axis", async () => {
    const doc = await parseStringPromise(svg);
    expect(doc.svg.$.width).toBe("720");
    const paths: { $: { class?: string; d: string } }[] = doc.svg.path;
    const byClass = (c: string) => paths.filter((p) => p.$.class === c);
    for (const c of ["history", "mean", "median"]) {
      expect(byClass(c)).toHaveLength(1);
      expect(byClass(c)[0].$.d).not.toMatch(/[Zz]/);
    }
    for (const l of [50, 80, 95]) expect(byClass(`band band-${l}`)[0].$.d).toMatch(/ Z$/);
    expect(svg).not.toMatch(/<polyline|<polygon/);
    const texts: string[] = (doc.svg.text ?? []).map((t: { _?: string } | string) => (typeof t === "string" ? t : t._ ?? ""));
    expect(texts).toContain("2025-12"); // the last month of history, at the forecast origin (monthly calendar labels)
    expect(texts).toContain("2026-12"); // the last forecast month
    expect(pointsOf(pathD("mean"))).toHaveLength(13); // the origin and 12 steps
  });

  test("the PNG: its size, and the colours of the bands and the mean line at points taken from the SVG", async () => {
    const r = await run(["chart", BOOK, ...common, "--out", at("fan.png")]);
    expect(r.code).toBe(0);
    const png = readPng(fs.readFileSync(at("fan.png")));
    expect([png.width, png.height]).toEqual([720, 360]);
    const mean = pointsOf(pathD("mean"));
    const band = (l: number) => pointsOf(pathD(`band band-${l}`));
    const k = 6; // step 6: the bands are wide there
    const [x, yMean] = mean[k];
    expect(colourDistance(png.pixel(x, yMean), COLORS.mean)).toBeLessThan(60);
    // Between the 95% and the 80% upper ends: the 95% colour; between 80% and 50%: the 80% colour;
    // between the 50% upper end and the mean (clear of the 2 px line): the 50% colour.
    const upper = (l: number) => band(l)[k][1];
    expect(colourDistance(png.pixel(x + 3, (upper(95) + upper(80)) / 2), COLORS.band95)).toBeLessThan(40);
    expect(colourDistance(png.pixel(x + 3, (upper(80) + upper(50)) / 2), COLORS.band80)).toBeLessThan(40);
    expect(colourDistance(png.pixel(x + 3, upper(50) + 0.3 * (yMean - upper(50))), COLORS.band50)).toBeLessThan(40);
    expect(colourDistance(png.pixel(4, 4), COLORS.paper)).toBeLessThan(10);
  });

  const convert = ["/usr/bin/convert", "/usr/local/bin/convert"].find((p) => fs.existsSync(p));
  (convert ? test : test.skip)("a second renderer (ImageMagick's own SVG renderer, MSVG) draws no line back from the last history point to the first", () => {
    const out = at("fan-msvg.png");
    const r = spawnSync(convert as string, [`MSVG:${at("fan.svg")}`, `PNG32:${out}`], { encoding: "utf8" });
    expect(r.status).toBe(0);
    const png = readPng(fs.readFileSync(out));
    const h = pointsOf(pathD("history"));
    const [x0, y0] = h[0];
    const [x1, y1] = h[h.length - 1];
    // Sample the chord between the first and last history points: a closed line would be dark
    // (#3b3b3b) along all of it; the real history crosses it only at a few places.
    let dark = 0;
    const n = 40;
    for (let i = 1; i < n; i++) {
      const p = png.pixel(x0 + ((x1 - x0) * i) / n, y0 + ((y1 - y0) * i) / n);
      if (colourDistance(p, COLORS.history) < 80) dark++;
    }
    expect(dark).toBeLessThan(n * 0.3);
    // and the history line itself is drawn: its second point is dark
    expect(colourDistance(png.pixel(h[1][0], h[1][1]), COLORS.history)).toBeLessThan(120);
  });

  test("usage: --out must be .svg or .png; several --series are refused (a chart draws one)", async () => {
    expect((await run(["chart", BOOK, "--horizon", "3", "--out", at("x.jpg")])).err).toMatch(/--out must name an \.svg or \.png file, e\.g\. --out fan\.png; got/);
    expect((await run(["chart", BOOK, "--horizon", "3"])).err).toMatch(/--out is required: where to write the chart/);
    const two = await run(["chart", BOOK, "--horizon", "3", "--series", "Millbrook,Larkfield", "--out", at("y.svg")]);
    expect(two.code).toBe(1);
    expect(two.err).toMatch(/A chart draws one series; --series named 2/);
  });
});
