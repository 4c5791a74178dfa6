// The built pane in Debian's Chromium as if inside Excel: a stand-in office.js (no Excel exists on
// this machine) gives it a host, a selection and selection-change events through the same
// Excel.run calls excel-io.ts makes. Hostile selections: one text cell, 1,000 × 50 cells, whole
// columns, and more cells than the pane reads. The pane must stay responsive and say what it needs.
// Expectations are the project's own (README, "The task pane"), common practice.
import * as fs from "fs";
import * as path from "path";
import type { Page } from "playwright-core";
import { fromRoot, paneBrowser, serveDist } from "../helpers/browser";

/** Writes a screenshot to test-output/ for a person to look at. */
async function snapshot(page: Page, name: string): Promise<void> {
  const out = fromRoot("test-output");
  fs.mkdirSync(out, { recursive: true });
  await page.screenshot({ path: path.join(out, name), fullPage: false });
}

// A stand-in for office.js: Office.onReady reports Excel; Excel.run hands the callback a context
// whose selected range is built from window.fakeSelection (set by each test before load, or changed
// later and announced with window.fireSelectionChanged()). Values are invented.
const FAKE_OFFICE = `(() => {
  const grid = (rows, cols) => {
    const values = [Array.from({ length: cols }, (_, j) => "Line " + (j + 1))];
    const types = [values[0].map(() => "String")];
    for (let i = 0; i < rows; i++) {
      values.push(Array.from({ length: cols }, (_, j) => Math.round(1000 + 40 * j + 8 * i + 90 * Math.sin((i + j) / 2))));
      types.push(values[0].map(() => "Double"));
    }
    return { values, types };
  };
  const rangeOf = (spec) => {
    const g = spec.grid ? grid(spec.grid[0], spec.grid[1]) : { values: spec.values, types: spec.types };
    const r = {
      address: spec.address,
      rowCount: spec.rowCount ?? g.values.length,
      columnCount: spec.columnCount ?? g.values[0].length,
      isNullObject: false,
      load() { window.loads.push([spec.address, ...arguments]); return r; },
      worksheet: { getUsedRange: () => ({ used: true }) },
      getIntersectionOrNullObject: () => (spec.used ? rangeOf(spec.used) : { isNullObject: true, load() {} }),
    };
    Object.defineProperty(r, "values", { get() { window.valuesRead.push(spec.address); return g.values; } });
    Object.defineProperty(r, "valueTypes", { get() { return g.types; } });
    Object.defineProperty(r, "numberFormat", { get() { return spec.formats; } });
    return r;
  };
  window.loads = [];
  window.valuesRead = [];
  const handlers = [];
  window.fireSelectionChanged = () => handlers.forEach((h) => h({}));
  const ctx = {
    workbook: {
      getSelectedRange: () => rangeOf(window.fakeSelection),
      onSelectionChanged: { add: (h) => handlers.push(h) },
    },
    sync: async () => {},
  };
  window.Excel = { run: async (cb) => cb(ctx) };
  window.Office = {
    HostType: { Excel: "Excel" },
    context: { requirements: { isSetSupported: (name, v) => name === "ExcelApi" && Number(v) <= 1.7 } },
    onReady(cb) {
      const info = { host: "Excel", platform: "PC" };
      return new Promise((resolve) => setTimeout(() => { if (cb) cb(info); resolve(info); }, 0));
    },
  };
})();`;

let server: Awaited<ReturnType<typeof serveDist>>;
let env: Awaited<ReturnType<typeof paneBrowser>>;

beforeAll(async () => {
  server = await serveDist();
  env = await paneBrowser({ officeJs: FAKE_OFFICE });
});
afterAll(async () => {
  await env?.browser.close();
  await server?.close();
});

type Pane = { renders: number; checking: boolean; checkSlices: number };
const pane = (page: Page): Promise<Pane> => page.evaluate(() => {
  const p = (window as unknown as { fanwisePane: Pane }).fanwisePane;
  return { renders: p.renders, checking: p.checking, checkSlices: p.checkSlices };
});

async function openWith(selection: unknown): Promise<{ page: Page; errors: string[] }> {
  const page = await env.context.newPage();
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(e.message));
  await page.addInitScript((sel) => {
    (window as unknown as { fakeSelection: unknown }).fakeSelection = sel;
    // Count animation frames painted while the series check is still running: frames can only be
    // painted when the check has handed the main thread back.
    const w = window as unknown as { framesWhileChecking: number; fanwisePane?: Pane };
    w.framesWhileChecking = 0;
    const tick = (): void => {
      if (w.fanwisePane?.checking) w.framesWhileChecking++;
      requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
  }, selection);
  await page.goto(`${server.url}/taskpane.html`);
  return { page, errors };
}

test("a single text cell: the pane says what to select instead, and computes nothing", async () => {
  const { page, errors } = await openWith({ address: "Sheet1!C3", values: [["Revenue"]], types: [["String"]] });
  await page.waitForFunction(() => /Revenue/.test(document.getElementById("fw-source")?.textContent ?? ""));
  const source = await page.textContent("#fw-source");
  expect(source).toMatch(/^Selection Sheet1!C3: The selection is one cell holding text \("Revenue"\)\. Select the data: one column per series, oldest first, its name in the top cell/);
  expect(await page.isVisible("#fw-error")).toBe(true);
  expect(await page.textContent("#fw-error")).toMatch(/one cell holding text/);
  expect(await page.locator("#fw-chart svg").count()).toBe(0);
  expect(await page.locator("#fw-check table").count()).toBe(0);
  expect(await page.textContent("#fw-check")).toBe("Nothing to check: see Data above.");
  expect(await page.inputValue("#fw-audit-level")).toBe("80"); // "column 1" is not a level of 1%
  expect(await page.isVisible("#fw-write")).toBe(true); // in Excel: the write section is offered
  await snapshot(page, "pane-excel-text-cell.png");
  expect(errors).toEqual([]);
  expect(env.offSite).toEqual([]);
  await page.close();
});

test("1,000 × 50 cells: checked in slices with frames painted in between, then all 50 series listed and the first previewed", async () => {
  const { page, errors } = await openWith({ address: "Sheet1!A1:AX1001", grid: [1000, 50] });
  await page.waitForFunction(() => {
    const p = (window as unknown as { fanwisePane?: Pane }).fanwisePane;
    return !!p && p.renders > 0 && !p.checking && document.querySelectorAll("#fw-check tbody tr").length > 0;
  }, undefined, { timeout: 60000 });
  const p = await pane(page);
  const frames = await page.evaluate(() => (window as unknown as { framesWhileChecking: number }).framesWhileChecking);
  console.log(`1,000 × 50 selection: series check in ${p.checkSlices} slices, ${frames} frames painted while it ran`);
  expect(p.checkSlices).toBeGreaterThan(1);
  expect(frames).toBeGreaterThan(0);
  expect(await page.locator("#fw-check tbody tr").count()).toBe(50);
  expect(await page.locator("#fw-series option").count()).toBe(50);
  expect(await page.textContent("#fw-source")).toBe("Selection Sheet1!A1:AX1001");
  expect(await page.locator("#fw-chart svg").count()).toBe(1);
  expect(await page.textContent("#fw-formula")).toMatch(/^=FW\.FAN\(Sheet1!A1:A1001,/);
  await snapshot(page, "pane-excel-1000x50.png");
  // a control still answers: previewing another series
  const before = (await pane(page)).renders;
  await page.selectOption("#fw-series", "49");
  await page.waitForFunction((n) => (window as unknown as { fanwisePane: Pane }).fanwisePane.renders > n, before);
  expect(await page.textContent("#fw-formula")).toMatch(/^=FW\.FAN\(Sheet1!AX1:AX1001,/);
  expect(errors).toEqual([]);
  expect(env.offSite).toEqual([]);
  await page.close();
});

test("whole columns are cut to the data; an oversized selection is refused with what to do", async () => {
  // Whole columns A:D: 1,048,576 rows, of which 120 (plus the header) hold data.
  const { page, errors } = await openWith({ address: "Sheet1!A:D", rowCount: 1048576, columnCount: 4, grid: [1, 1], used: { address: "Sheet1!A1:D121", grid: [120, 4] } });
  await page.waitForFunction(() => document.getElementById("fw-source")?.textContent === "Selection Sheet1!A1:D121", undefined, { timeout: 30000 });
  await page.waitForFunction(() => !(window as unknown as { fanwisePane: Pane }).fanwisePane.checking && document.querySelectorAll("#fw-check tbody tr").length > 0);
  expect(await page.locator("#fw-check tbody tr").count()).toBe(4);
  const read = await page.evaluate(() => (window as unknown as { valuesRead: string[] }).valuesRead);
  expect(read).toEqual(["Sheet1!A1:D121"]); // the million-row range's values were never asked for
  // Then 5,000 rows × 50 columns of data: more than the pane reads.
  await page.evaluate(() => {
    const w = window as unknown as { fakeSelection: unknown; fireSelectionChanged: () => void };
    w.fakeSelection = { address: "Sheet1!A:AX", rowCount: 1048576, columnCount: 50, grid: [1, 1], used: { address: "Sheet1!A1:AX5001", rowCount: 5001, columnCount: 50, grid: [1, 1] } };
    w.fireSelectionChanged();
  });
  await page.waitForFunction(() => /previews up to/.test(document.getElementById("fw-source")?.textContent ?? ""), undefined, { timeout: 30000 });
  expect(await page.textContent("#fw-source")).toBe("The selection Sheet1!A1:AX5001 has 5,001 rows × 50 columns (250,050 cells); the pane previews up to 200,000 cells. Select fewer rows or columns; the FW functions in cells take any size.");
  expect(await page.evaluate(() => (window as unknown as { valuesRead: string[] }).valuesRead)).toEqual(["Sheet1!A1:D121"]);
  expect(errors).toEqual([]);
  expect(env.offSite).toEqual([]);
  await page.close();
});

test("a date column (cells with a date format) labels the rows: period 12, the axis ends on a date, the formula reads the series' column", async () => {
  // AirPassengers 1958–1960 (R datasets) under a column of first-of-month dates shown as mmm-yy.
  const air = [340, 318, 362, 348, 363, 435, 491, 505, 404, 359, 310, 337, 360, 342, 406, 396, 420, 472, 548, 559, 463, 407, 362, 405, 417, 391, 419, 461, 472, 535, 622, 606, 508, 461, 390, 432];
  const serial = (i: number): number => Math.round((Date.UTC(1958, i, 1) - Date.UTC(1899, 11, 30)) / 86400000);
  const values = [["Month", "Passengers"], ...air.map((v, i) => [serial(i), v])];
  const types = values.map((r, i) => r.map(() => (i === 0 ? "String" : "Double")));
  const formats = values.map((_, i) => (i === 0 ? ["General", "General"] : ["mmm-yy", "#,##0"]));
  const { page, errors } = await openWith({ address: "Sheet1!A1:B37", values, types, formats });
  await page.waitForFunction(() => document.querySelectorAll("#fw-chart svg").length > 0, undefined, { timeout: 30000 });
  expect(await page.textContent("#fw-source")).toMatch(/^Selection Sheet1!A1:B37 Dates in "Month": monthly, 1958-01 to 1960-12; period 12\./);
  expect(await page.locator("#fw-series option").count()).toBe(1);
  expect(await page.inputValue("#fw-period")).toBe("12");
  expect(await page.innerHTML("#fw-chart")).toContain("1961-");
  expect(await page.textContent("#fw-formula")).toMatch(/^=FW\.FAN\(Sheet1!B1:B37,/);
  expect(errors).toEqual([]);
  expect(env.offSite).toEqual([]);
  await page.close();
});
