// The pane's view model with missing observations and the "Treat zeros as missing" box: the check
// names the box when zeros are isolated, the fan reads zeros as missing when it is ticked (the
// engine's forecast, held to outside references in test/engine/missing.test.ts), and the formula
// it writes gives the same forecast in cells (a blank is a missing observation there).
import { checkRow, fanFormula, fanView, PaneData } from "../../src/taskpane/view-model";
import { fanTable, fitForecast } from "../../src/engine";

// invented monthly revenue (Quillmere scenario): closed in month 8
const shop = [120, 131, 128, 135, 140, 151, 149, 0, 162, 171, 168, 180, 176, 188, 190, 197];
const data: PaneData = { source: "test", names: ["Brook Lane"], columns: [shop], headerRows: 0 };
const controls = { series: 0, method: "ses", lambda: "0", horizon: 3, period: 1, levels: "80,95" };

describe("Treat zeros as missing, in the pane", () => {
  test("the check names the pane's option for an isolated zero", () => {
    const row = checkRow(data, 0, 1);
    expect(row.badge).toBe("not Box-Cox ready");
    expect(row.reason).toMatch(/read zeros as missing observations: tick "Treat zeros as missing" in the fan controls\./);
  });

  test("ticked, the check counts one missing observation and the series is ready", () => {
    const row = checkRow(data, 0, 1, "missing");
    expect(row.missing).toBe(1);
    expect(row.badge).toBeNull();
    expect(row.ready).toBe(true);
  });

  test("ticked, the fan is the engine's forecast with that month missing, and says so", () => {
    const view = fanView(data, { ...controls, zeros: "missing" });
    if (!view.ok) throw new Error(view.message);
    const t = fanTable(fitForecast(shop.map((v) => (v === 0 ? null : v)), { method: "ses", lambda: 0 }), 3);
    view.fan.rows.forEach((r, i) => expect(r.median.value).toBe(t.rows[i].median.value));
    expect(view.notes.join(" ")).toMatch(/1 zero read as a missing observation.*1 missing observation inside the series \(row 8\)/);
    const off = fanView(data, controls);
    expect(off.ok).toBe(false);
  });

  test("the formula written to the sheet blanks the zeros, so the cells read them as missing too", () => {
    expect(fanFormula("Sheet1!B2:B17", { ...controls, zeros: "missing" })).toBe('=FW.FAN(IF(Sheet1!B2:B17=0,"",Sheet1!B2:B17),3,"ses",0,"80,95",1)');
    expect(fanFormula("Sheet1!B2:B17", controls)).toBe('=FW.FAN(Sheet1!B2:B17,3,"ses",0,"80,95",1)');
  });

  test("a blank month is a missing observation without the box", () => {
    const blank: PaneData = { ...data, columns: [shop.map((v) => (v === 0 ? null : v))] };
    const row = checkRow(blank, 0, 1);
    expect(row.missing).toBe(1);
    expect(row.badge).toBeNull();
    const view = fanView(blank, controls);
    expect(view.ok).toBe(true);
  });
});

describe("a series that ends before the selection's last row (trailing blanks)", () => {
  // invented: two shops by month; Old Quay's last two months are not in yet
  const months = ["2025-01", "2025-02", "2025-03", "2025-04", "2025-05", "2025-06", "2025-07", "2025-08", "2025-09", "2025-10", "2025-11", "2025-12"];
  const harbour = [210, 215, 222, 230, 228, 236, 241, 247, 252, 250, 258, 263];
  const quay: (number | null)[] = [140, 144, 150, 149, 155, 158, 162, 166, 171, 170, null, null];
  const next = (h: number): string => { const m = 12 + h; return `${2025 + Math.floor((m - 1) / 12)}-${String(((m - 1) % 12) + 1).padStart(2, "0")}`; };
  const d: PaneData = { source: "test", names: ["Harbour", "Old Quay"], columns: [harbour, quay], headerRows: 0, rowLabels: months, nextLabel: next };
  test("its fan's steps are counted from its own last value: step 1 is 2025-11 (inside the selection), step 3 is 2026-01 (common practice)", () => {
    const v = fanView(d, { series: 1, method: "drift", lambda: "0", horizon: 3, period: 1, levels: "80" });
    if (!v.ok) throw new Error(v.message);
    expect([1, 2, 3].map((h) => v.stepLabel?.(h))).toEqual(["2025-11", "2025-12", "2026-01"]);
    expect(v.svg).toContain("2026-01"); // the chart labels its last step
    expect(v.svg).not.toContain("2026-03");
    const full = fanView(d, { series: 0, method: "drift", lambda: "0", horizon: 2, period: 1, levels: "80" });
    if (!full.ok) throw new Error(full.message);
    expect([1, 2].map((h) => full.stepLabel?.(h))).toEqual(["2026-01", "2026-02"]);
  });
});
