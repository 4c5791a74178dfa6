// The pane's totals (pure, run in Node): the "total over" sentence and the series check's total
// row carry the engine's numbers (the engine is checked against numpy and closed forms in
// test/engine/totals-*.test.ts); a single series gets a clear message.
import { acrossRowView, totalOverSentence } from "../../src/taskpane/views/totals";
import { createRandom, fitForecast, totalAcross, totalForecast } from "../../src/engine";
import type { PaneData } from "../../src/taskpane/view-model";

const rng = createRandom(3);
let a = Math.log(40000);
let b = Math.log(20000);
const rows: number[][] = [];
for (let t = 0; t < 48; t++) {
  const z = rng.normal();
  a += 0.05 * z;
  b += 0.04 * (0.6 * z + 0.8 * rng.normal());
  rows.push([Math.exp(a), Math.exp(b)]);
}
const data: PaneData = { source: "invented shops", names: ["North", "South"], columns: [rows.map((r) => r[0]), rows.map((r) => r[1])], headerRows: 1 };
const money = (x: number): string => Math.round(x).toLocaleString("en-GB");

test("total over steps 8–19: the engine's window total, in words", () => {
  const f = fitForecast(data.columns[0], { method: "naive", lambda: 0 });
  const t = totalForecast(f, 19, { from: 8, level: 95, paths: 5000, seed: 1 });
  const s = totalOverSentence(f, 8, 19, 95);
  expect(s).toContain(`Total of steps 8–19: mean ${money(t.mean.value as number)}; median ${money(t.median)}; 95% interval ${money(t.interval[0])} to ${money(t.interval[1] as number)}`);
  expect(totalOverSentence(f, 20, 19, 95)).toMatch(/from \(20\) is after horizon \(19\)/);
  // with the data's dates (a history ending in May 2025): steps 8–19 are January to December 2026
  const after = (h: number): string => { const m = 4 + h; return `${2025 + Math.floor(m / 12)}-${String((m % 12) + 1).padStart(2, "0")}`; };
  expect(totalOverSentence(f, 8, 19, 95, after)).toContain("Total of steps 8–19 (2026-01 to 2026-12): mean");
});

test("the series check's total row: the engine's joint total across the selected series", () => {
  const v = acrossRowView(data, { method: "naive", lambda: 0, period: 1, from: 1, horizon: 12, level: 95 });
  if (!v.ok) throw new Error(v.message);
  const t = totalAcross(data.columns.map((c, j) => fitForecast(c, { method: "naive", lambda: 0, label: data.names[j], firstRow: 2 })), 12, { level: 95, paths: 5000, seed: 1 });
  expect(v.label).toBe("All 2 series, steps 1–12");
  expect(v.text).toBe(`mean ${money(t.mean as number)}; 95% interval ${money(t.interval[0])} to ${money(t.interval[1] as number)} (if independent: ${money(t.independent.interval[0])} to ${money(t.independent.interval[1] as number)})`);
  const one = acrossRowView({ ...data, names: ["North"], columns: [data.columns[0]] }, { method: "naive", lambda: 0, period: 1, from: 1, horizon: 12, level: 95 });
  expect(one.ok ? "" : one.message).toBe("Select several series for a total across them.");
});
