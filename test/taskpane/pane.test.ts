// The built pane in Debian's Chromium, stand-alone on the invented demo workbook: badges, the fan's
// geometry (bands nest, mean above median for λ < 1), controls, paste box, width, and no request
// leaving the machine. A screenshot is written to test-output/ for a person to look at.
import * as fs from "fs";
import * as path from "path";
import type { Page } from "playwright-core";
import { fromRoot, paneBrowser, serveDist } from "../helpers/browser";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;

let server: { url: string; close: () => Promise<void>; requests: string[] };

// Runs as a script of the page's own origin (so the page's policy applies to it, unlike code
// the test harness evaluates): tries what the policy forbids and records what happened.
const CSP_PROBE = `(async () => {
  const out = {};
  try { out.eval = String(eval("1 + 1")); } catch (e) { out.eval = e.name; }
  try { out.newFunction = String(new Function("return 2")()); } catch (e) { out.newFunction = e.name; }
  try { out.stringTimer = String(setTimeout("window.timerRan = true", 0) >= 0); } catch (e) { out.stringTimer = e.name; }
  const s = document.createElement("script");
  s.textContent = "window.inlineRan = true;";
  document.head.appendChild(s);
  out.fetchSelf = await fetch("/collect-fetch", { method: "POST", body: "x" }).then(() => "sent", () => "refused");
  out.fetchElsewhere = await fetch("https://example.invalid/collect", { method: "POST", body: "x" }).then(() => "sent", () => "refused");
  try { navigator.sendBeacon("/collect-beacon", "x"); } catch (e) { /* refused */ }
  const img = new Image();
  img.src = "https://example.invalid/pixel.png";
  await new Promise((r) => setTimeout(r, 300));
  out.inline = String(window.inlineRan === true);
  out.timer = String(window.timerRan === true);
  window.cspProbe = out;
})();`;
let env: Awaited<ReturnType<typeof paneBrowser>>;
let page: Page;
const pageErrors: string[] = [];

beforeAll(async () => {
  server = await serveDist({ "/csp-probe.js": { body: CSP_PROBE, type: "text/javascript" } });
  env = await paneBrowser();
  // Record every Content-Security-Policy violation the page reports (the listener is installed
  // by the test harness before any page script runs).
  await env.context.addInitScript(() => {
    const w = window as unknown as { cspViolations: { directive: string; blocked: string; source: string }[] };
    w.cspViolations = [];
    document.addEventListener("securitypolicyviolation", (e) => w.cspViolations.push({ directive: e.violatedDirective, blocked: e.blockedURI, source: e.sourceFile }));
  });
  page = await env.context.newPage();
  page.on("pageerror", (e) => pageErrors.push(e.message));
  await page.goto(`${server.url}/taskpane.html`);
  await page.waitForFunction(() => (window as unknown as { fanwisePane?: { renders: number } }).fanwisePane?.renders ?? 0 > 0, undefined, { timeout: 20000 });
});

afterAll(async () => {
  await env?.browser.close();
  await server?.close();
});

async function renders(): Promise<number> {
  return page.evaluate(() => (window as unknown as { fanwisePane: { renders: number } }).fanwisePane.renders);
}
async function lastFan(): Promise<Json> {
  return page.evaluate(() => (window as unknown as { fanwisePane: { lastFan: unknown } }).fanwisePane.lastFan);
}
/** The points of an SVG path's d ("M x y L x y … [Z]"), in order. */
function points(attr: string | null): [number, number][] {
  return Array.from((attr ?? "").matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g), (m) => [Number(m[1]), Number(m[2])] as [number, number]);
}

test("the stand-alone page loads on the demo workbook, says so, and makes no request off the machine", async () => {
  await page.waitForSelector("#fw-check table");
  expect(await page.textContent("#fw-source")).toMatch(/demo workbook.*Invented demo data/);
  expect(env.offSite).toEqual([]);
  expect(pageErrors).toEqual([]);
});

test("the zero-month and the credit-month series carry the badge with the right reason", async () => {
  const row = (name: string) => page.locator(`#fw-check tr[data-series="${name}"]`);
  expect(await row("Old Quay").locator(".fw-badge").textContent()).toBe("not Box-Cox ready");
  expect(await row("Old Quay").locator(".fw-reason").textContent()).toMatch(/1 zero \(minimum 0, first at 2023-02\).*tick "Treat zeros as missing" in the fan controls\. Otherwise use shift "auto", which adds [\d.]+ \(command line: --shift auto\), or transform "yeo-johnson"/);
  expect(await row("Parts costs (net)").locator(".fw-badge").textContent()).toBe("not Box-Cox ready");
  expect(await row("Parts costs (net)").locator(".fw-reason").textContent()).toMatch(/1 negative value.*Use transform "yeo-johnson" \(command line: --transform yeo-johnson\)/);
  expect(await row("Harbour Street").locator(".fw-badge").count()).toBe(0);
});

test("the fan's bands nest (95 ⊇ 80 ⊇ 50) at every step, in the numbers and on screen", async () => {
  const fan = await lastFan();
  expect(fan.levels).toEqual([50, 80, 95]);
  for (const r of fan.rows) {
    const iv = (l: number, k: 0 | 1): number => r.intervals[String(l)][k].value;
    expect(iv(95, 0)).toBeLessThanOrEqual(iv(80, 0));
    expect(iv(80, 0)).toBeLessThanOrEqual(iv(50, 0));
    expect(iv(50, 0)).toBeLessThanOrEqual(r.median.value);
    expect(r.median.value).toBeLessThanOrEqual(iv(50, 1));
    expect(iv(50, 1)).toBeLessThanOrEqual(iv(80, 1));
    expect(iv(80, 1)).toBeLessThanOrEqual(iv(95, 1));
  }
  // On screen (y grows downwards): each band's outline contains the next one's at every x.
  const polys: Record<string, [number, number][]> = {};
  for (const l of [50, 80, 95]) polys[l] = points(await page.getAttribute(`#fw-chart path.band-${l}`, "d"));
  const half = (p: [number, number][]) => p.length / 2;
  for (let k = 1; k < half(polys[95]); k++) {
    const upper = (l: number) => polys[l][k][1];
    const lower = (l: number) => polys[l][polys[l].length - 1 - k][1];
    expect(upper(95)).toBeLessThanOrEqual(upper(80) + 1e-9);
    expect(upper(80)).toBeLessThanOrEqual(upper(50) + 1e-9);
    expect(lower(50)).toBeLessThanOrEqual(lower(80) + 1e-9);
    expect(lower(80)).toBeLessThanOrEqual(lower(95) + 1e-9);
  }
});

test("the mean line lies above the median line where λ < 1", async () => {
  const fan = await lastFan();
  expect(fan.lambda).toBeLessThan(1);
  for (const r of fan.rows) expect(r.mean.value).toBeGreaterThan(r.median.value);
  const mean = points(await page.getAttribute("#fw-chart path.mean", "d"));
  const median = points(await page.getAttribute("#fw-chart path.median", "d"));
  for (let k = 1; k < mean.length; k++) expect(mean[k][1]).toBeLessThanOrEqual(median[k][1]); // screen y: smaller is higher
  expect(await page.textContent("#fw-gap")).toMatch(/mean is [\d.]+% .* above the median/);
});

test("changing the horizon changes the number of forecast points", async () => {
  expect(await page.locator("#fw-chart .median-marker").count()).toBe(12);
  const before = await renders();
  await page.fill("#fw-horizon", "6");
  await page.waitForFunction((n) => (window as unknown as { fanwisePane: { renders: number } }).fanwisePane.renders > n, before);
  expect(await page.locator("#fw-chart .median-marker").count()).toBe(6);
  expect((await lastFan()).rows).toHaveLength(6);
});

test("controls are labelled and reachable by keyboard", async () => {
  for (const id of ["fw-series", "fw-method", "fw-lambda-mode", "fw-horizon", "fw-period", "fw-levels"]) {
    expect(await page.locator(`label[for="${id}"]`).count()).toBe(1);
  }
  await page.focus("#fw-method");
  await page.keyboard.press("Tab");
  expect(await page.evaluate(() => document.activeElement?.id)).toBe("fw-lambda-mode");
  expect(await page.locator("#fw-chart svg[role=img] title").textContent()).toMatch(/Fan chart/);
});

test("it fits the pane's 320 px width without horizontal scrolling, and the screenshot is written", async () => {
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(320);
  const out = fromRoot("test-output");
  fs.mkdirSync(out, { recursive: true });
  await page.screenshot({ path: path.join(out, "pane-standalone.png"), fullPage: true });
  expect(fs.statSync(path.join(out, "pane-standalone.png")).size).toBeGreaterThan(10000);
});

test("pasting a small table works", async () => {
  await page.click("#fw-paste-box summary");
  const tsv = ["month\tKiosk sales\tRepairs", ...Array.from({ length: 30 }, (_, i) => `2024-${i}\t${100 + 3 * i + (i % 4) * 5}\t${i === 7 ? 0 : 40 + i}`)].join("\n");
  await page.fill("#fw-paste", tsv);
  const before = await renders();
  await page.click("#fw-paste-go");
  await page.waitForFunction((n) => (window as unknown as { fanwisePane: { renders: number } }).fanwisePane.renders > n, before);
  expect(await page.textContent("#fw-paste-msg")).toMatch(/2 series/);
  expect(await page.locator("#fw-check tbody tr").count()).toBe(2);
  expect(await page.locator('#fw-check tr[data-series="Repairs"] .fw-badge').textContent()).toBe("not Box-Cox ready");
  expect((await lastFan()).rows.length).toBeGreaterThan(0);
  await page.fill("#fw-paste", "just one line");
  await page.click("#fw-paste-go");
  expect(await page.textContent("#fw-paste-msg")).toMatch(/header row but no data rows|No column of numbers/);
  expect(env.offSite).toEqual([]);
});

test("text meets WCAG AA contrast (4.5:1) against its background (WCAG 2.1 §1.4.3 formula)", async () => {
  const ratios = await page.evaluate(() => {
    const parse = (c: string): number[] => (c.match(/[\d.]+/g) ?? []).map(Number);
    const lum = (rgb: number[]): number => {
      const [r, g, b] = rgb.slice(0, 3).map((v) => {
        const s = v / 255;
        return s <= 0.03928 ? s / 12.92 : Math.pow((s + 0.055) / 1.055, 2.4);
      });
      return 0.2126 * r + 0.7152 * g + 0.0722 * b;
    };
    const background = (e: Element | null): number[] => {
      for (let n = e; n; n = n.parentElement) {
        const c = parse(getComputedStyle(n).backgroundColor);
        if (c.length === 3 || (c.length === 4 && c[3] > 0)) return c;
      }
      return [255, 255, 255];
    };
    const out: [string, number][] = [];
    for (const sel of ["h1", "h2", ".fw-sub", ".fw-note", ".fw-reason", ".fw-badge", ".fw-ok", "button", ".fw-series-button", ".fw-gap", ".fw-caution", ".fw-caution-inline", ".fw-readout dd", "#fw-check td"]) {
      const e = document.querySelector(sel);
      if (!e) continue;
      const L1 = lum(parse(getComputedStyle(e).color));
      const L2 = lum(background(e));
      out.push([sel, (Math.max(L1, L2) + 0.05) / (Math.min(L1, L2) + 0.05)]);
    }
    return out;
  });
  expect(ratios.length).toBeGreaterThan(10);
  for (const [sel, r] of ratios) expect([sel, r >= 4.5]).toEqual([sel, true]);
});

test("the preview exports as SVG and as PNG", async () => {
  const [svg] = await Promise.all([page.waitForEvent("download"), page.click("#fw-export-svg")]);
  expect(svg.suggestedFilename()).toBe("fanwise-fan.svg");
  const svgText = fs.readFileSync(await svg.path(), "utf8");
  expect(svgText).toMatch(/^<svg[\s\S]*class="band band-95"[\s\S]*<\/svg>$/);
  const [png] = await Promise.all([page.waitForEvent("download"), page.click("#fw-export-png")]);
  expect(png.suggestedFilename()).toBe("fanwise-fan.png");
  const bytes = fs.readFileSync(await png.path());
  expect(bytes.subarray(0, 8).toString("hex")).toBe("89504e470d0a1a0a");
});

test("coverage audit on the demo forecast log: observed vs nominal, the tests, the zone and a strip of hits and misses", async () => {
  if (!(await page.isVisible("#fw-demo-log-go"))) await page.click("#fw-paste-box summary");
  await page.click("#fw-demo-log-go");
  await page.waitForSelector("#fw-audit-strip svg");
  expect(await page.textContent("#fw-audit-readout")).toMatch(/observed coverage75\.0% of 36 \(nominal 80%; 95% interval 57\.8–87\.9%\)/);
  expect(await page.textContent("#fw-audit-readout")).toMatch(/zonegreen/);
  expect(await page.locator("#fw-audit-strip rect.miss").count()).toBe(9);
  expect(await page.locator("#fw-audit-strip rect.hit").count()).toBe(27);
  expect(await page.textContent("#fw-audit-strip")).toMatch(/hit \(inside\)[\s\S]*miss above[\s\S]*miss below/);
  expect(await page.textContent("#fw-audit-strip")).toMatch(/2023-01[\s\S]*2025-12/);
  expect(await page.textContent("#fw-audit-headline")).toBe("Consistent with the promised coverage (zone green)");
  expect(await page.textContent("#fw-audit-verdict")).toMatch(/27 of 36 inside \(75\.0%; 80\.0% promised\)/);
  expect(await page.locator("#fw-audit-calibration .error-bar").count()).toBe(2); // 80% and 95% (lower95/upper95 found by name)
  await page.selectOption("#fw-audit-lower", { label: "upper80" });
  await page.selectOption("#fw-audit-upper", { label: "lower80" });
  await page.click("#fw-audit-go");
  expect(await page.textContent("#fw-audit-error")).toMatch(/lower end .* is above the upper end/);
});

test("a backtest runs from the pane with a progress bar and shows per-step results", async () => {
  await page.click("#fw-demo-go");
  await page.selectOption("#fw-method", "seasonal-naive");
  await page.fill("#fw-horizon", "3");
  await page.click("#fw-backtest-go");
  await page.waitForSelector("#fw-backtest table", { timeout: 20000 });
  expect(await page.locator("#fw-backtest tbody tr").count()).toBe(3);
  expect(await page.locator("#fw-backtest .fw-backtest-verdicts li").count()).toBe(3);
  expect(await page.textContent("#fw-backtest .fw-backtest-verdicts")).toMatch(/^h = 1: (Too many misses|Misses cluster|Intervals too wide \(too few misses\)|Consistent with the promised coverage)/);
  expect(await page.textContent("#fw-backtest")).toMatch(/Origins after 24 to \d+ values \(\d+ refits\): the first fit uses 24 values \(two full seasons of 12\)/);
  expect(await page.isHidden("#fw-backtest-progress")).toBe(true);
  expect(env.offSite).toEqual([]);
});

test("the Content-Security-Policy holds: the pane's own code never trips it; eval, inline script and connections are refused", async () => {
  type V = { directive: string; blocked: string; source: string };
  const violations = await page.evaluate(() => (window as unknown as { cspViolations: V[] }).cspViolations);
  // Outside Office, the platform's office.js tries a telemetry frame (with an inline style); the
  // policy blocks both. Nothing that comes from this origin (bundles, styles, SVG) may be blocked.
  const fromPlatform = (v: V): boolean => /^https:\/\/appsforoffice\.microsoft\.com\//.test(v.source) || (v.directive === "frame-src" && /^https:\/\//.test(v.blocked));
  const ours = violations.filter((v) => !fromPlatform(v));
  expect(ours).toEqual([]);
  await page.evaluate(() => {
    const s = document.createElement("script");
    s.src = "/csp-probe.js";
    document.head.appendChild(s);
  });
  await page.waitForFunction(() => (window as unknown as { cspProbe?: unknown }).cspProbe !== undefined);
  const probes = await page.evaluate(() => (window as unknown as { cspProbe: unknown }).cspProbe);
  expect(probes).toEqual({ eval: "EvalError", newFunction: "EvalError", stringTimer: "true", fetchSelf: "refused", fetchElsewhere: "refused", inline: "false", timer: "false" });
  // nothing reached this origin's server either (the beacon and the fetch were stopped in the page)
  expect(server.requests.filter((r) => /collect/.test(r))).toEqual([]);
  expect(env.offSite).toEqual([]);
});
