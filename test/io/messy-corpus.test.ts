// The messy corpus (test/fixtures/messy/, made by make-messy.js from the open datasets in
// test/fixtures/datasets/): every file is read by the file reader (the command line's) and by the
// text reader (the pane's paste box) and must give the clean truth beside it, or a clear refusal —
// never a different series. Truth: the datasets' published values (R 4.2.2 datasets, statsmodels
// 0.13.5 datasets; see test/fixtures/README.md), exported by the generator.
import * as fs from "fs";
import * as path from "path";
import { readCsvFile } from "../../src/cli/csv-file";
import { readCsvText, readTable, SeriesTable } from "../../src/io";

interface Case {
  file: string;
  source: string;
  expect: "series" | "refusal";
  message?: string;
  names?: string[];
  series?: Record<string, (number | null)[]>;
  period?: number;
  frequency?: string;
  first?: string;
  last?: string;
  leftOut?: number[];
  skipped?: string[];
  reversed?: boolean;
  forcedComma?: string;
}

const dir = path.join(__dirname, "..", "fixtures", "messy");
const truth = JSON.parse(fs.readFileSync(path.join(dir, "truth.json"), "utf8")) as { cases: Case[] };

function check(t: SeriesTable, c: Case): void {
  expect(t.names).toEqual(c.names);
  for (const [name, values] of Object.entries(c.series ?? {})) expect(t.column(t.names.indexOf(name))).toEqual(values);
  expect(t.period).toBe(c.period);
  expect(t.periodFrom).toBe("dates");
  expect(t.reading.dates).toMatchObject({ frequency: c.frequency, first: c.first, last: c.last, skipped: c.skipped ?? [], reversed: c.reversed ?? false });
  expect(t.reading.leftOut.map((l) => l.line)).toEqual(c.leftOut ?? []);
  for (const l of c.leftOut ?? []) expect(t.reading.notes.join(" ")).toContain(`Line ${l} (`);
  for (const s of c.skipped ?? []) expect(t.reading.notes.join(" ")).toMatch(new RegExp(`No row for ${s}.*missing observation`));
}

test("the corpus has a file for every way of exporting the issue lists", () => {
  expect(truth.cases.length).toBeGreaterThanOrEqual(25);
});

describe.each(truth.cases)("$file ($source)", (c) => {
  const file = path.join(dir, c.file);
  if (c.expect === "series") {
    test("the file reader gives the truth", () => check(readTable(readCsvFile(file)), c));
    test("the text reader (paste box) gives the same", () => check(readCsvText(fs.readFileSync(file, "utf8")), c));
  } else {
    test("the file reader refuses it, saying why", () => {
      expect(() => readTable(readCsvFile(file)).column(0)).toThrow(new RegExp(c.message as string));
    });
    test("the text reader refuses it the same way", () => {
      expect(() => readCsvText(fs.readFileSync(file, "utf8")).column(0)).toThrow(new RegExp(c.message as string));
    });
  }
  if (c.forcedComma) {
    test(`read with the wrong delimiter (comma), the message names the ${c.forcedComma}`, () => {
      expect(() => readTable(readCsvFile(file, { delimiter: "," })).column(0)).toThrow(new RegExp(`${c.forcedComma}.*--delimiter ;`));
    });
  }
});
