// The built pane in Debian's Chromium, stand-alone: the Published forecast view on the demo
// forecast log (invented), the "total over" sentence in the fan preview, and the series check's
// total row. The numbers come from the engine (checked against numpy in test/engine/totals-*);
// here we check that the pane shows them and says its assumptions, with no page error and no
// request leaving the machine.
import type { Page } from "playwright-core";
import { paneBrowser, serveDist } from "../helpers/browser";

let server: { url: string; close: () => Promise<void>; requests: string[] };
let env: Awaited<ReturnType<typeof paneBrowser>>;
let page: Page;
const pageErrors: string[] = [];

beforeAll(async () => {
  server = await serveDist({});
  env = await paneBrowser();
  page = await env.context.newPage();
  page.on("pageerror", (e) => pageErrors.push(e.message));
  await page.goto(`${server.url}/taskpane.html`);
  await page.waitForFunction(() => (window as unknown as { fanwisePane?: { renders: number } }).fanwisePane?.renders ?? 0 > 0, undefined, { timeout: 20000 });
});

afterAll(async () => {
  await env?.browser.close();
  await server?.close();
});

test("the fan preview states the total over a window of steps and follows a change of window", async () => {
  await page.waitForSelector("#fw-check table");
  await page.waitForFunction(() => (document.getElementById("fw-total")?.textContent ?? "") !== "");
  expect(await page.textContent("#fw-total")).toMatch(/^Total of steps 1–12 \(2026-01 to 2026-12\): mean [\d,]+; median [\d,]+; 95% interval [\d,]+ to [\d,]+; the monthly medians add up to [\d,]+\.$/);
  await page.fill("#fw-total-from", "8");
  await page.fill("#fw-horizon", "19");
  // the demo's history ends in December 2025: steps 8–19 are August 2026 to July 2027 (invented data)
  await page.waitForFunction(() => /steps 8–19 \(2026-08 to 2027-07\)/.test(document.getElementById("fw-total")?.textContent ?? ""));
  expect(pageErrors).toEqual([]);
});

test("the series check has a total row across the selected series, computed on request", async () => {
  await page.fill("#fw-total-from", "1");
  await page.fill("#fw-horizon", "12");
  await page.selectOption("#fw-method", "naive");
  await page.click("#fw-across-go");
  await page.waitForFunction(() => (document.getElementById("fw-across")?.textContent ?? "") !== "", undefined, { timeout: 30000 });
  // the demo holds a shop with a zero month (Old Quay): the total across all shops refuses and names it
  expect(await page.textContent("#fw-across")).toMatch(/Old Quay.*(zero|> 0)/);
});

test("the Published forecast view: monthly means beside the medians, the total with its range and assumption", async () => {
  if (!(await page.isVisible("#fw-demo-log-go"))) await page.click("#fw-paste-box summary");
  await page.click("#fw-demo-log-go");
  await page.selectOption("#fw-pub-median", { label: "median" });
  await page.selectOption("#fw-pub-lower", { label: "lower80" });
  await page.selectOption("#fw-pub-upper", { label: "upper80" });
  expect(await page.inputValue("#fw-pub-level")).toBe("80");
  await page.click("#fw-pub-go");
  await page.waitForSelector("#fw-pub-table table");
  const readout = await page.textContent("#fw-pub-readout");
  expect(readout).toMatch(/mean of the total[\d,]+/);
  expect(readout).toMatch(/80% interval[\d,]+ to [\d,]+/);
  expect(readout).toMatch(/if independent[\d,]+ to [\d,]+/);
  expect(readout).toMatch(/if comonotone[\d,]+ to [\d,]+/);
  expect(await page.locator("#fw-pub-table tr").count()).toBeGreaterThan(12);
  // the wrong way round: the message names the first month
  await page.selectOption("#fw-pub-lower", { label: "upper80" });
  await page.selectOption("#fw-pub-upper", { label: "lower80" });
  await page.click("#fw-pub-go");
  expect(await page.textContent("#fw-pub-error")).toMatch(/Month 1: Need lower < median < upper/);
  expect(pageErrors).toEqual([]);
  expect(env.offSite).toEqual([]);
});
