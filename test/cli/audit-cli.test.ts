// fanwise audit by series, step and level, with quantiles, a chart and a report; fanwise backtest's
// per-step tests. Numbers are held to scipy 1.10.1 (test/fixtures/audit-log/make_audit_log.py); the
// report is opened in Chromium (every request off 127.0.0.1 refused and recorded) and read
// through the DOM, and its numbers compared with the JSON output's.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";
import { datasetPath, expectClose } from "../helpers/reference";
import { isolatedBrowser, serve } from "../helpers/browser";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const FIX: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "audit-log", "audit_log.json"), "utf8"));
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-audit-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function writeLog(name: string, rows: any[], withMonth = false): string {
  const cols = ["series", "h", "actual", "lower80", "upper80", "lower95", "upper95", "q10", "q25", "q50", "q75", "q90"];
  const lines = ["# Invented Quillmere forecast log (seeded; see make_audit_log.py)", [...(withMonth ? ["month"] : []), ...cols].join(",")];
  rows.forEach((r, i) => lines.push([...(withMonth ? [`${2020 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, "0")}`] : []), ...cols.map((c) => String(r[c]))].join(",")));
  const f = path.join(dir, name);
  fs.writeFileSync(f, lines.join("\n") + "\n");
  return f;
}

const groupsFile = writeLog("groups.csv", FIX.groups.rows, true);
const horizonsFile = writeLog("horizons.csv", FIX.horizons.rows);
const TWO = ["--actual", "actual", "--lower", "lower80,lower95", "--upper", "upper80,upper95", "--level", "80,95"];

describe("fanwise audit against scipy", () => {
  test("--by series --horizon-col h at 80 and 95: every row's tests equal the reference (rtol 1e-10)", () => {
    const r = runCli(["audit", horizonsFile, ...TWO, "--by", "series", "--horizon-col", "h", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.rows).toHaveLength(FIX.horizons.expected.length);
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    j.rows.forEach((row: any, i: number) => {
      const e = FIX.horizons.expected[i];
      expect([row.group, row.h, row.level, row.n, row.misses]).toEqual([e.group, e.h, e.level, e.n, e.misses]);
      expectClose(row.kupiec.p, e.p_uc, { rtol: 1e-10 }, "Kupiec p");
      if (row.independence.p === null) expect([e.p_ind, e.LR_ind]).toEqual([1, 0]); // nothing to test: shown as n/a
      else expectClose(row.independence.p, e.p_ind, { rtol: 1e-10 }, "independence p");
      expectClose(row.conditional.p, e.p_cc, { rtol: 1e-10 }, "conditional p");
      if (row.verdictCode !== "consistent") expect(row.zone).not.toBe("green");
    });
    expect(j.notes.join(" ")).toMatch(/every h-th origin/);
  });
  test("CSV: one line per row with zone, verdict and the details", () => {
    const r = runCli(["audit", groupsFile, ...TWO, "--by", "series"]);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split("\n");
    expect(lines[0]).toBe("group,h,level,n,misses,above,below,coverage,coverage_low,coverage_high,kupiec_lr,kupiec_p,independence_lr,independence_p,conditional_lr,conditional_p,binomial_tail,interval_score,zone,verdict,details");
    expect(lines).toHaveLength(1 + FIX.groups.expected.length);
    expect(lines[2]).toMatch(/^Mill Lane,,80,45,20,.*,(yellow|red),Too many misses,"Too many misses\. 25 of 45 inside/);
  });
  test("--quantiles gives the calibration table (hit rates and pinball loss equal the reference)", () => {
    const r = runCli(["audit", groupsFile, "--actual", "actual", "--quantiles", "q10=0.1,q25=0.25,q50=0.5,q75=0.75,q90=0.9", "--json"]);
    expect(r.code).toBe(0);
    const q = JSON.parse(r.out).calibration.quantiles;
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    q.forEach((x: any, k: number) => {
      const e = FIX.calibration.expected.rows[k];
      expect(x.atOrBelow).toBe(e.at_or_below);
      expectClose(x.pinball, e.pinball, { rtol: 1e-10 }, "pinball");
      expectClose(x.kupiec.p, e.kupiec_p, { rtol: 1e-10 }, "Kupiec p");
    });
  });
  test("bad input: levels and columns that do not pair up, an unknown --by column, quantiles out of order, fractional steps", () => {
    const a = runCli(["audit", groupsFile, "--actual", "actual", "--lower", "lower80", "--upper", "upper80,upper95", "--level", "80,95"]);
    expect(a.code).toBe(1);
    expect(a.err).toMatch(/one --lower and one --upper column per level: --level has 2 \(80, 95\), --lower 1, --upper 2/);
    expect(runCli(["audit", groupsFile, ...TWO, "--by", "shop"]).err).toMatch(/No column named "shop" \(for --by\)/);
    expect(runCli(["audit", groupsFile, "--actual", "actual", "--quantiles", "q90=0.9,q10=0.1"]).err).toMatch(/out of order: p = 0.1 comes after p = 0.9/);
    const swapped = runCli(["audit", groupsFile, "--actual", "actual", "--lower", "lower95,lower80", "--upper", "upper95,upper80", "--level", "80,95"]);
    expect(swapped.err).toMatch(/Line 3: the 95% interval .* does not contain the 80% interval/); // the comment line is line 1
    const frac = path.join(dir, "frac.csv");
    fs.writeFileSync(frac, "series,h,actual,lower80,upper80\nA,1,10,9,11\nA,1.5,10,9,11\n");
    expect(runCli(["audit", frac, "--actual", "actual", "--lower", "lower80", "--upper", "upper80", "--level", "80", "--horizon-col", "h"]).err).toMatch(/Line 3: the horizon 1.5 is not a whole number/);
  });
  test("--chart writes the calibration chart: one error bar per level, no script", () => {
    const svg = path.join(dir, "cal.svg");
    const r = runCli(["audit", groupsFile, ...TWO, "--by", "series", "--chart", svg]);
    expect(r.code).toBe(0);
    const s = fs.readFileSync(svg, "utf8");
    expect(s.startsWith("<svg")).toBe(true);
    expect((s.match(/class="error-bar"/g) ?? []).length).toBe(2);
    expect(s).not.toMatch(/<script/i);
  });
});

describe("fanwise audit --report: one self-contained page", () => {
  const report = path.join(dir, "audit.html");
  let json: { rows: { group: string; level: number; n: number; misses: number; coverage: number; kupiec: { p: number }; independence: { p: number | null }; conditional: { p: number }; binomialTail: number; intervalScore: number; zone: string; headline: string }[] };
  beforeAll(() => {
    const r = runCli(["audit", groupsFile, ...TWO, "--by", "series", "--report", report, "--json"]);
    expect(r.code).toBe(0);
    json = JSON.parse(r.out);
  });
  test("the file holds no script, no link, no outside URL, and a CSP that allows nothing outside", () => {
    const html = fs.readFileSync(report, "utf8");
    expect(html).not.toMatch(/<script|<link|<iframe|<img|<object|<embed|@import|url\(/i);
    expect(html).not.toMatch(/https?:|\/\/[a-z]/i);
    expect(html).toMatch(/Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'"/);
  });
  test("opened in Chromium: no request leaves the page, the DOM has no script, and the header names the file, its SHA-256 and the date", async () => {
    const srv = await serve({ "/audit.html": report });
    const { browser, context, offSite } = await isolatedBrowser();
    try {
      const page = await context.newPage();
      await page.goto(`${srv.url}/audit.html`);
      const dom = await page.evaluate(() => ({
        scripts: document.querySelectorAll("script").length,
        withSrc: document.querySelectorAll("[src],[href]").length,
        file: document.getElementById("file-name")?.textContent,
        sha: document.getElementById("sha256")?.textContent,
        date: document.getElementById("date")?.textContent,
        svgs: document.querySelectorAll("svg").length,
        legend: Array.from(document.querySelectorAll("svg text.legend")).map((t) => t.textContent),
        rows: Array.from(document.querySelectorAll("#verdicts tbody tr")).map((tr) => Array.from(tr.querySelectorAll("td")).map((td) => ({ text: td.textContent ?? "", value: td.getAttribute("data-value") }))),
        sections: Array.from(document.querySelectorAll("h2")).map((h) => h.textContent),
      }));
      expect(offSite).toEqual([]);
      expect(srv.requests).toEqual(["GET /audit.html"]);
      expect(dom.scripts).toBe(0);
      expect(dom.withSrc).toBe(0);
      expect(dom.file).toBe("groups.csv");
      const crypto = await import("crypto");
      expect(dom.sha).toBe(crypto.createHash("sha256").update(fs.readFileSync(groupsFile)).digest("hex"));
      expect(dom.date).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ by fanwise audit$/);
      expect(dom.svgs).toBe(1 + 6); // calibration chart + a strip per shop and level
      expect(dom.legend).toEqual(expect.arrayContaining(["hit (inside)", "miss above", "miss below"]));
      expect(dom.sections).toEqual(["Verdicts", "Charts", "How the verdict is reached", "How the data were read", "Cautions"]);
      // the report's numbers are the JSON's numbers (full precision in data-value; shown rounded)
      expect(dom.rows).toHaveLength(json.rows.length);
      dom.rows.forEach((cells, i) => {
        const e = json.rows[i];
        expect(cells[0].text).toBe(e.group);
        const v = (k: number): number => Number(cells[k].value);
        expect([v(2), v(3), v(4)]).toEqual([e.level, e.n, e.misses]);
        expect(v(7)).toBe(e.coverage);
        expect(v(9)).toBe(e.kupiec.p);
        if (e.independence.p === null) expect(cells[10].text).toBe("n/a"); else expect(v(10)).toBe(e.independence.p);
        expect(v(11)).toBe(e.conditional.p);
        expect(v(12)).toBe(e.binomialTail);
        expect(v(13)).toBe(e.intervalScore);
        expect(cells[7].text).toBe(`${(100 * e.coverage).toFixed(1)}%`);
        expect(cells[14].text).toBe(e.zone);
        expect(cells[15].text.startsWith(e.headline)).toBe(true);
      });
    } finally {
      await browser.close();
      await srv.close();
    }
  }, 60000);
});

describe("fanwise backtest concludes", () => {
  test("per step: Kupiec p, independence p, zone and verdict; the note says which origins were used and why", () => {
    const r = runCli(["backtest", datasetPath("AirPassengers"), "--horizon", "2", "--method", "seasonal-naive", "--lambda", "0", "--period", "12"]);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split("\n");
    expect(lines[0]).toBe("series,h,origins,coverage,interval_score,mean_error_of_mean,mean_error_of_median,kupiec_p,independence_p,zone,verdict,note");
    expect(lines[1]).toMatch(/^value,1,120,.*,(green|yellow|red),(Too many misses|Misses cluster|Intervals too wide \(too few misses\)|Consistent with the promised coverage),"?Origins after 24 to 143 values \(120 refits\): the first fit uses 24 values \(two full seasons of 12\)/);
    const j = JSON.parse(runCli(["backtest", datasetPath("AirPassengers"), "--horizon", "2", "--method", "seasonal-naive", "--lambda", "0", "--period", "12", "--json"]).out).series.value;
    expect(j.origins).toEqual({ first: 24, last: 143, count: 120 });
    expect(j.steps[1].verdict).toMatch(/every 2nd origin/);
  });
});
