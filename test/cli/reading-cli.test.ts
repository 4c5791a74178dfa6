// The command line reads real exports through the shared reader (src/io): the period comes from
// the dates (and says so), forecasts carry their period labels, --delimiter and --decimal force the
// reading, the `reading` object reports what was decided, and bad exports end in one clear line.
// Files: the messy corpus made from open datasets (test/fixtures/messy/, R and statsmodels data).
import * as path from "path";
import { runCli } from "../helpers/cli";

const messy = (f: string): string => path.join(__dirname, "..", "fixtures", "messy", f);

describe("dates set the period and label the forecast", () => {
  test("a European monthly export forecasts the revenue column with period 12 from the dates; steps are 1961-01…", () => {
    const r = runCli(["fan", messy("eu-quoted-comma.csv"), "--horizon", "3", "--method", "seasonal-naive", "--lambda", "none", "--json"]);
    expect(r.err).toBe("");
    const j = JSON.parse(r.out);
    expect(Object.keys(j.series)).toEqual(["Umsatz"]);
    const s = j.series.Umsatz;
    expect([s.period, s.periodFrom]).toEqual([12, "dates"]);
    expect(s.steps.map((x: { period: string }) => x.period)).toEqual(["1961-01", "1961-02", "1961-03"]);
    // seasonal naive repeats the last year's months (AirPassengers 1960-01..03 were 417, 391, 419; R datasets) × 1000
    expect(s.steps.map((x: { mean: number }) => x.mean)).toEqual([417000, 391000, 419000]);
    expect(j.reading).toMatchObject({ delimiter: ",", dates: { column: "Monat", format: "mm.yyyy", frequency: "monthly" }, columns: { Umsatz: { decimal: ",", thousands: ["."] } } });
  });
  test("CSV rows of fan carry the period label", () => {
    const r = runCli(["fan", messy("tab-quarters.tsv"), "--horizon", "2", "--method", "naive", "--lambda", "none"]);
    const lines = r.out.trim().split("\n");
    expect(lines[0].split(",").slice(0, 3)).toEqual(["series", "h", "period"]);
    expect(lines.slice(1).map((l) => l.split(",")[2])).toEqual(["1987-Q1", "1987-Q2"]);
  });
  test("--period overrides the dates and says so", () => {
    const j = JSON.parse(runCli(["screen", messy("newest-first.csv"), "--period", "1", "--json"]).out);
    expect([j.series.gas.period, j.series.gas.periodFrom]).toEqual([1, "option"]);
  });
  test("yearly dates (a year column named period) give period 1, from the dates", () => {
    const j = JSON.parse(runCli(["lambda", path.join(__dirname, "..", "fixtures", "datasets", "nile.csv"), "--json"]).out);
    expect([j.series.value.period, j.series.value.periodFrom]).toEqual([1, "dates"]);
  });
});

describe("what was decided is reported", () => {
  test("a Total row left out: a note on stderr in CSV mode, in reading.notes with --json", () => {
    const csv = runCli(["screen", messy("total-average.csv")]);
    expect(csv.code).toBe(0);
    expect(csv.err.trim().split("\n")).toEqual(['fanwise: note: Line 146 ("Total") is not a period; left out.', 'fanwise: note: Line 147 ("Average") is not a period; left out.']);
    const j = JSON.parse(runCli(["screen", messy("total-average.csv"), "--json"]).out);
    expect(j.reading.leftOut).toEqual([{ line: 146, label: "Total" }, { line: 147, label: "Average" }]);
    expect(j.series.passengers.n).toBe(144);
  });
  test("a skipped month is named and counted as a blank, not closed up", () => {
    const j = JSON.parse(runCli(["screen", messy("missing-month.csv"), "--json"]).out);
    expect(j.reading.dates.skipped).toEqual(["1950-06"]);
    expect(j.series.passengers.blanks).toBe(1);
    expect(j.series.passengers.message).toMatch(/1950-06 \(no row in the file\)/);
  });
});

describe("--delimiter and --decimal", () => {
  test("--decimal , reads an ambiguous tab file; without it the refusal names the option", () => {
    const bad = runCli(["screen", messy("ambiguous-thousands.tsv")]);
    expect(bad.code).toBe(1);
    expect(bad.err.trim().split("\n")).toHaveLength(1);
    expect(bad.err).toMatch(/^fanwise: Column "lynx" has numbers like ".*" \(line \d+\) that read differently.*--decimal \. or --decimal ,/);
    const j = JSON.parse(runCli(["screen", messy("ambiguous-thousands.tsv"), "--decimal", ",", "--json"]).out);
    expect(j.series.lynx.max).toBe(6991); // lynx maximum (R datasets)
    expect(j.reading.columns.lynx).toMatchObject({ decimal: ",", decimalFrom: "option" });
  });
  test("--delimiter , on a semicolon file names the likely delimiter", () => {
    const r = runCli(["screen", messy("semicolon-one-column.csv"), "--delimiter", ","]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/semicolon-separated\. Read it with --delimiter ;/);
    expect(runCli(["screen", messy("semicolon-one-column.csv"), "--delimiter", ";"]).code).toBe(0);
    expect(runCli(["screen", messy("semicolon-one-column.csv"), "--delimiter", "pipe"]).err).toMatch(/--delimiter must be , or ; or tab/);
  });
});

describe("bad exports: one line, exit 1, saying what to do", () => {
  const cases: [string, RegExp][] = [
    ["duplicate-date.csv", /1950-08 appears twice in "month" \(line 21 and line 22\)/],
    ["irregular-dates.csv", /not equally spaced/],
    ["ambiguous-dates.csv", /day-first or month-first.*yyyy-mm-dd/],
  ];
  for (const [f, pattern] of cases) {
    test(f, () => {
      const r = runCli(["fan", messy(f), "--horizon", "2"]);
      expect(r.code).toBe(1);
      expect(r.err.trim().split("\n")).toHaveLength(1);
      expect(r.err).toMatch(pattern);
    });
  }
});
