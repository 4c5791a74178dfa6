// The command line end to end on the fixture CSVs, with λ held to scipy 1.10.1 / statsmodels
// 0.13.5 reference values, and its error behaviour (one line on stderr, exit 1).
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";
import { check, datasetPath, expectClose } from "../helpers/reference";

describe("fanwise lambda", () => {
  test("--json on AirPassengers matches scipy's MLE and its 95% interval", () => {
    const r = runCli(["lambda", datasetPath("AirPassengers"), "--method", "mle", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const e = check("lambda.mle.AirPassengers").expected;
    const s = j.series.value;
    expect(Object.keys(j.series)).toEqual(["value"]); // the period column is a label, not a series
    expect(s.method).toBe("mle");
    expectClose(s.lambda, e.lambda_boxcox_normmax, { atol: 1e-6 }, "lambda");
    expectClose(s.interval[0], e.ci95[0], { atol: 1e-6 }, "low");
    expectClose(s.interval[1], e.ci95[1], { atol: 1e-6 }, "high");
    expectClose(s.loglik, e.llf_at_lambda, { rtol: 1e-10 }, "loglik");
  });
  test("Guerrero with --period 12 matches statsmodels (window 12)", () => {
    const r = runCli(["lambda", datasetPath("AirPassengers"), "--method", "guerrero", "--period", "12", "--json"]);
    expectClose(JSON.parse(r.out).series.value.lambda, check("lambda.guerrero.AirPassengers").expected.window12_sd.lambda_tight, { atol: 1e-6 }, "lambda");
  });
  test("a year column named 'period' is a label even though it holds numbers", () => {
    const r = runCli(["lambda", datasetPath("nile"), "--json"]);
    expect(Object.keys(JSON.parse(r.out).series)).toEqual(["value"]);
  });
  test("CSV output has a header and one row per series", () => {
    const r = runCli(["lambda", datasetPath("lynx")]);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split("\n");
    expect(lines[0]).toBe("series,lambda,method,interval_low,interval_high,readable_lambda,loglik,on_bound,note");
    expect(lines).toHaveLength(2);
  });
  test("--bounds narrows the search; when the likelihood rises past a bound the search is widened and says so", () => {
    // UKgas's i.i.d. profile maximum is near −0.29 (statsmodels, test above for lynx's method), below the 0 to 2 range.
    const r = runCli(["lambda", datasetPath("UKgas"), "--method", "mle", "--bounds", "0,2", "--json"]);
    const s = JSON.parse(r.out).series.value;
    expect(s.note).toMatch(/rises past the 0 to 2 search range, so the search was widened/);
    expect(s.lambda).toBeLessThan(0);
    expect(s.onBound).toBeNull();
  });
});

describe("fanwise screen", () => {
  test("every fixture CSV screens as Box-Cox ready (they are positive series)", () => {
    for (const name of ["AirPassengers", "UKgas", "airmiles", "lynx", "nile", "elnino", "macrodata_realgdp", "copper_worldconsumption"]) {
      const r = runCli(["screen", datasetPath(name), "--json"]);
      expect(r.code).toBe(0);
      expect(JSON.parse(r.out).series.value.boxCoxUsable).toBe(true);
    }
  });
});

describe("fanwise demo", () => {
  test("writes the invented workbook, and its zero and credit months are flagged by screen and lambda", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-demo-"));
    const d = runCli(["demo", "--out", dir]);
    expect(d.code).toBe(0);
    expect(d.out).toMatch(/invented/i);
    const csv = path.join(dir, "quillmere-monthly.csv");
    expect(fs.readFileSync(csv, "utf8").split("\n")[0]).toMatch(/^# Invented demo data/);
    expect(fs.existsSync(path.join(dir, "quillmere-forecast-log.csv"))).toBe(true);
    const s = JSON.parse(runCli(["screen", csv, "--period", "12", "--json"]).out).series;
    expect(s["Old Quay"].boxCoxUsable).toBe(false);
    expect(s["Old Quay"].fix).toBe("zeros-missing"); // one closed month between open ones: read it as missing
    expect(s["Parts costs (net)"].fix).toBe("yeo-johnson");
    expect(s["Larkfield"].leadingBlanks).toBe(27);
    expect(s["Harbour Street"].boxCoxUsable).toBe(true);
    const l = runCli(["lambda", csv, "--period", "12", "--json"]);
    expect(l.code).toBe(3); // some series failed (Old Quay, Parts costs), the others computed
    expect(JSON.parse(l.out).series["Old Quay"].error).toMatch(/line 40/);
    expect(l.err).toMatch(/Old Quay/);
  });
});

describe("fanwise errors: one line on stderr, exit 1, no stack trace", () => {
  const cases: [string, string[], RegExp][] = [
    ["missing file", ["lambda", "no-such-file.csv"], /File not found: no-such-file.csv/],
    ["no file", ["screen"], /Give the CSV or \.xlsx file to read/],
    ["unknown flag", ["lambda", datasetPath("nile"), "--lamda", "0"], /Unknown option --lamda/],
    ["bad method", ["lambda", datasetPath("nile"), "--method", "best"], /--method must be auto, model, guerrero or mle/],
    ["bad period", ["screen", datasetPath("nile"), "--period", "1.5"], /--period must be a whole number/],
    ["bad bounds", ["lambda", datasetPath("nile"), "--bounds", "2"], /--bounds must be two numbers/],
    ["unknown command", ["forecast"], /unknown command "forecast"/],
  ];
  for (const [what, args, pattern] of cases) {
    test(what, () => {
      const r = runCli(args);
      expect(r.code).toBe(1);
      expect(r.err).toMatch(pattern);
      expect(r.err.trim().split("\n")).toHaveLength(1);
      expect(r.err).not.toMatch(/\n\s+at /);
    });
  }
  test("malformed CSVs", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-csv-"));
    const write = (name: string, body: string | Buffer): string => {
      const p = path.join(dir, name);
      fs.writeFileSync(p, body);
      return p;
    };
    const unequal = runCli(["screen", write("unequal.csv", "month,a,b\n2024-01,1,2\n2024-02,3\n")]);
    expect(unequal.code).toBe(1);
    expect(unequal.err).toMatch(/Line 3 has 2 fields but the header has 3/);
    const binary = runCli(["screen", write("junk.csv", Buffer.from([0, 1, 2, 255, 0, 10]))]);
    expect(binary.code).toBe(1);
    expect(binary.err).toMatch(/not text/);
    const empty = runCli(["screen", write("empty.csv", "")]);
    expect(empty.err).toMatch(/no rows/);
    const quoted = runCli(["screen", write("quoted.csv", '\ufeffmonth,"Sales, net"\r\n2024-01,"1,200"\r\n2024-02,1300\r\n2024-03,1250\r\n2024-04,1400\r\n'), "--json"]);
    expect(quoted.code).toBe(0);
    const s = JSON.parse(quoted.out).series["Sales, net"];
    expect(s.n).toBe(4);
    expect(s.min).toBe(1200);
    const open = runCli(["screen", write("open.csv", 'a\n"1\n')]);
    expect(open.err).toMatch(/never closed/);
  });
});
