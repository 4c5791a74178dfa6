// The pane's Published forecast view model (pure, run in Node): the chosen columns go to the
// engine's publishedTotal unchanged (itself checked against numpy simulations in
// test/engine/totals-published.test.ts), and a partly blank row is refused naming its period.
import * as fs from "fs";
import * as path from "path";
import { publishedView } from "../../src/taskpane/views/published";
import { publishedTotal } from "../../src/engine";
import type { PaneData } from "../../src/taskpane/view-model";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fx: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "totals", "totals.json"), "utf8"));
const p = fx.localLevel.published;
const months = p.median.map((_: number, i: number) => `2027-${String(i + 1).padStart(2, "0")}`);
const data: PaneData = { source: "invented", names: ["median", "lower95", "upper95"], columns: [[...p.median, null], [...p.lower95, null], [...p.upper95, null]], rowLabels: [...months, "2028-01"], headerRows: 1 };

test("the total and each month's mean are the engine's; the readout states the assumption and the range", () => {
  const v = publishedView(data, 0, 1, 2, 95, "0", "implied");
  if (!v.ok) throw new Error(v.message);
  const t = publishedTotal(p.median, p.lower95, p.upper95, 95);
  expect(v.total.interval).toEqual(t.interval);
  expect(v.rows).toHaveLength(12);
  expect(v.rows[0].label).toBe("2027-01");
  expect(v.rows[5].mean).toBe(t.months[5].mean);
  const lines = Object.fromEntries(v.lines);
  expect(lines["months move"]).toMatch(/widening implies/);
  expect(lines["if independent"]).toMatch(/ to /);
  expect(lines["if comonotone"]).toMatch(/ to /);
});

test("a month with a blank lower end is refused, naming the period", () => {
  const bad: PaneData = { ...data, columns: [data.columns[0], [p.lower95[0], null, ...p.lower95.slice(2)], data.columns[2]] };
  const v = publishedView(bad, 0, 1, 2, 95, "0", "implied");
  expect(v.ok).toBe(false);
  if (!v.ok) expect(v.message).toBe("2027-02: the lower end is blank; every month needs a median, a lower and an upper end.");
});

test("a λ that is neither a number nor implied, and a level as a fraction", () => {
  const a = publishedView(data, 0, 1, 2, 95, "log", "implied");
  expect(a.ok ? "" : a.message).toMatch(/λ must be a number \(0 for a log-scale forecast\) or "implied"/);
  const b = publishedView(data, 0, 1, 2, 0.95, "0", "implied");
  expect(b.ok ? "" : b.message).toMatch(/in percent/);
});
