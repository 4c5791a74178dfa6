// The pane's coverage-audit view model (pure, in Node): a group choice, the verdict and its colour,
// the strip with dates, and the calibration chart over every level found by name. Numbers come
// from the engine, which test/engine/audit-log.test.ts holds to scipy; here: what the pane shows.
import { auditLogView, groupChoices, otherLevels } from "../../src/taskpane/audit-view";
import { pastedData } from "../../src/taskpane/paste";
import { selectionData } from "../../src/taskpane/excel-io";

// An invented two-shop log (common practice: a small hand-made table): Mill Lane's intervals are
// far too narrow, Harbour Street's honest-looking.
function log(): string {
  const lines = ["month,series,lower80,upper80,lower95,upper95,actual"];
  for (let i = 0; i < 24; i++) {
    const m = `2024-${String((i % 12) + 1).padStart(2, "0")}`;
    lines.push(`${m},Harbour Street,90,110,85,115,${[100, 104, 96, 113, 99, 101][i % 6]}`);
    lines.push(`${m},Mill Lane,98,102,96,104,${[100, 110, 92, 105, 99, 94][i % 6]}`);
  }
  return lines.join("\n");
}

test("the series column is offered (label columns first) and picked by its name", () => {
  const d = pastedData(log());
  const g = groupChoices(d);
  expect(g.options.map((o) => o[1])).toEqual(["(none: one series)", "month", "series", "lower80", "upper80", "lower95", "upper95", "actual"]);
  expect(g.pick).toBe("l:1");
});

test("other levels are found by name: lower80/upper80 chosen → the 95 pair too", () => {
  expect(otherLevels(["actual", "lower80", "upper80", "lower95", "upper95"], 1, 2)).toEqual([{ level: 95, lower: 3, upper: 4 }]);
  expect(otherLevels(["actual", "low", "high"], 1, 2)).toEqual([]);
});

test("by series: a choice per shop plus the pooled row; each shows its verdict, zone, dated strip and calibration chart", () => {
  const d = pastedData(log());
  const c = { actual: d.names.indexOf("actual"), lower: d.names.indexOf("lower80"), upper: d.names.indexOf("upper80"), level: 80, group: "l:1" };
  const harbour = auditLogView(d, c);
  if (!harbour.ok) throw new Error(harbour.message);
  expect(harbour.choices).toEqual(["Harbour Street", "Mill Lane", "all groups"]);
  expect(harbour.shown).toBe("Harbour Street");
  expect(harbour.row.n).toBe(24);
  expect(harbour.strip).toContain("2024-01");
  expect(harbour.strip).toContain("miss above");
  expect((harbour.calibration.match(/class="error-bar"/g) ?? []).length).toBe(2);
  const mill = auditLogView(d, { ...c, show: "Mill Lane" });
  if (!mill.ok) throw new Error(mill.message);
  expect(mill.row.verdict.headline).toBe("Too many misses");
  expect(mill.colour).not.toBe("green");
  expect(mill.lines.find(([k]) => k === "zone")?.[1]).toBe(mill.colour);
  const all = auditLogView(d, { ...c, show: "all groups" });
  if (!all.ok) throw new Error(all.message);
  expect(all.row.pooled).toBe(true);
  expect(all.row.n).toBe(48);
  expect(all.notes.join(" ")).toMatch(/clustering is tested within each series only/);
});

test("without a series column the whole log is one sequence; a swapped pair says what to fix", () => {
  const d = pastedData(log());
  const one = auditLogView(d, { actual: d.names.indexOf("actual"), lower: d.names.indexOf("lower80"), upper: d.names.indexOf("upper80"), level: 80, group: "" });
  expect(one.ok && one.choices.length === 0 && one.row.n === 48).toBe(true);
  const bad = auditLogView(d, { actual: d.names.indexOf("actual"), lower: d.names.indexOf("upper80"), upper: d.names.indexOf("lower80"), level: 80, group: "" });
  expect(bad.ok).toBe(false);
  if (!bad.ok) expect(bad.message).toMatch(/lower end .* is above the upper end/);
});

test("the same log selected in Excel (text month labels, a series column of shop names): the series column is a group choice, not a series, and the audit is the pasted one's", () => {
  const rows = log().split("\n").map((l) => l.split(","));
  const values = rows.map((r, i) => r.map((v, j) => (i === 0 || j < 2 ? v : Number(v))));
  const types = values.map((r) => r.map((v) => (typeof v === "number" ? "Double" : "String")));
  const d = selectionData(`Sheet1!A1:G${rows.length}`, values, types);
  expect(d.names).toEqual(["lower80", "upper80", "lower95", "upper95", "actual"]);
  expect(d.labelColumns?.map((l) => l.name)).toEqual(["series"]);
  expect(d.rangeColumns).toEqual([2, 3, 4, 5, 6]); // formulas still point at the right sheet columns
  const g = groupChoices(d);
  expect(g.pick).toBe("l:0");
  const c = { actual: d.names.indexOf("actual"), lower: d.names.indexOf("lower80"), upper: d.names.indexOf("upper80"), level: 80, group: g.pick, show: "Mill Lane" };
  const fromExcel = auditLogView(d, c);
  const p = pastedData(log());
  const fromPaste = auditLogView(p, { actual: p.names.indexOf("actual"), lower: p.names.indexOf("lower80"), upper: p.names.indexOf("upper80"), level: 80, group: "l:1", show: "Mill Lane" });
  if (!fromExcel.ok || !fromPaste.ok) throw new Error("audit refused");
  expect(fromExcel.choices).toEqual(["Harbour Street", "Mill Lane", "all groups"]);
  expect(fromExcel.row).toEqual(fromPaste.row);
});
