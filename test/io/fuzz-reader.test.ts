// The shared reader against random tables built from the hard parts of real exports (dates in
// every form, separators, currency, percent, negatives, totals rows, delimiters, quotes). The one
// rule (the project's error contract, common practice): it reads a table or throws an `input`
// EngineError with a message — never another exception, and never a NaN or an infinity in a series.
import fc from "fast-check";
import { isEngineError } from "../../src/engine";
import { readCsvText } from "../../src/io";

const cell = fc.oneof(
  fc.constantFrom("", "Total", "Summe", "n/a", "-", "(1,850)", "1.850-", "\u22125", "12.5%", "$1,234.50", "1.234,56 €", "CHF 1'234.50", "1\u00a0234,5",
    "1,234", "1.234", "1,5", "0.5", "1e5", "2024-01", "2024-02", "2024-01-31", "31.01.2024", "01/02/2024", "13/02/2024", "02/13/2024", "Jan-24", "Q1 2024",
    "2024Q2", "2024", "45292", "01.1995", "\"", "\"a;b\"", "\"1,5\""),
  fc.integer({ min: -5000, max: 5000 }).map(String),
  fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((x) => x.toFixed(2)),
);
const table = fc.record({
  header: fc.constantFrom("month", "Monat", "date", "Date", "year", "period", "t", "shop", ""),
  width: fc.integer({ min: 1, max: 3 }),
  rows: fc.integer({ min: 1, max: 14 }),
  delim: fc.constantFrom(",", ";", "\t"),
  sep: fc.boolean(),
  months: fc.boolean(),
}).chain((t) => fc.array(fc.array(cell, { minLength: t.width, maxLength: t.width }), { minLength: t.rows, maxLength: t.rows }).map((body) => {
  const lines = body.map((r, i) => [t.months ? `2020-${String((i % 12) + 1).padStart(2, "0")}` : `r${i}`, ...r].join(t.delim));
  return `${t.sep ? `sep=${t.delim}\n` : ""}${[t.header, ...Array.from({ length: t.width }, (_, j) => `s${j}`)].join(t.delim)}\n${lines.join("\n")}\n`;
}));

test("random exports: a table or an input EngineError, never NaN (fast-check, seed 11, 1,500 runs)", () => {
  let read = 0;
  fc.assert(fc.property(table, fc.constantFrom(undefined, ",", ".") as fc.Arbitrary<"," | "." | undefined>, (text, decimal) => {
    try {
      const t = readCsvText(text, { decimal });
      for (let j = 0; j < t.names.length; j++) {
        try {
          for (const c of t.column(j)) if (typeof c === "number") expect(Number.isFinite(c)).toBe(true);
          read++;
        } catch (e) {
          if (!isEngineError(e) || e.code !== "input" || e.message.length < 20) throw e;
        }
      }
    } catch (e) {
      if (!isEngineError(e) || e.code !== "input" || e.message.length < 20) throw e;
    }
  }), { numRuns: 1500, seed: 11 });
  expect(read).toBeGreaterThan(100); // the generator reaches the reading paths
});
