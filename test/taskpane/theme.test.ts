// The pane's looks follow Office and the system, in Debian's Chromium: the light palette by default,
// a dark one for Office's dark themes (html[data-theme="dark"], set from Office.context.officeTheme)
// and for a dark system (emulated prefers-color-scheme: dark), the system's colours in forced-colors
// mode (emulated forced-colors: active). In every one, text keeps WCAG AA contrast (4.5:1, WCAG 2.1
// §1.4.3 formula). Numbers follow the user's locale (a German locale groups thousands with ".").
import type { BrowserContext, Page } from "playwright-core";
import { paneBrowser, serveDist } from "../helpers/browser";
import { themeFromOffice, luminance } from "../../src/taskpane/theme";

let server: Awaited<ReturnType<typeof serveDist>>;
let env: Awaited<ReturnType<typeof paneBrowser>>;

beforeAll(async () => {
  server = await serveDist();
  env = await paneBrowser();
});
afterAll(async () => {
  await env?.browser.close();
  await server?.close();
});

const SELECTORS = ["body", "h1", "h2", ".fw-sub", ".fw-note", ".fw-reason", ".fw-badge", ".fw-ok", "button", ".fw-series-button", ".fw-gap", ".fw-caution", ".fw-caution-inline", ".fw-readout dd", "#fw-check td", "select", "input#fw-horizon", "label"];

/** [selector, contrast ratio] for the first element of each selector (WCAG 2.1 relative luminance). */
async function contrasts(page: Page): Promise<[string, number][]> {
  return page.evaluate((sels) => {
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
      return parse(getComputedStyle(document.documentElement).backgroundColor).length >= 3 ? parse(getComputedStyle(document.documentElement).backgroundColor) : [255, 255, 255];
    };
    const out: [string, number][] = [];
    for (const sel of sels) {
      const e = document.querySelector(sel);
      if (!e) continue;
      const L1 = lum(parse(getComputedStyle(e).color));
      const L2 = lum(background(e));
      out.push([sel, (Math.max(L1, L2) + 0.05) / (Math.min(L1, L2) + 0.05)]);
    }
    return out;
  }, SELECTORS);
}

async function open(setup: (page: Page) => Promise<void>, context: BrowserContext = env.context): Promise<Page> {
  const page = await context.newPage();
  await setup(page);
  await page.goto(`${server.url}/taskpane.html`);
  await page.waitForSelector("#fw-check table", { timeout: 30000 });
  return page;
}

const bodyLuminance = (page: Page): Promise<number> => page.evaluate(() => {
  const c = (getComputedStyle(document.body).backgroundColor.match(/[\d.]+/g) ?? []).map(Number);
  const f = (v: number): number => (v / 255 <= 0.03928 ? v / 255 / 12.92 : Math.pow((v / 255 + 0.055) / 1.055, 2.4));
  return 0.2126 * f(c[0]) + 0.7152 * f(c[1]) + 0.0722 * f(c[2]);
});

function expectAA(ratios: [string, number][]): void {
  expect(ratios.length).toBeGreaterThanOrEqual(15);
  for (const [sel, r] of ratios) expect([sel, Math.round(r * 100) / 100 >= 4.5]).toEqual([sel, true]);
}

test("light (the default): the pane's own palette, AA contrast throughout", async () => {
  const page = await open(async (p) => p.emulateMedia({ colorScheme: "light" }));
  expect(await bodyLuminance(page)).toBeGreaterThan(0.9);
  expectAA(await contrasts(page));
  await page.close();
});

test("a dark system (prefers-color-scheme: dark, no Office theme): dark palette, AA contrast throughout", async () => {
  const page = await open(async (p) => p.emulateMedia({ colorScheme: "dark" }));
  expect(await bodyLuminance(page)).toBeLessThan(0.05);
  expectAA(await contrasts(page));
  await page.close();
});

test("Office's dark theme (data-theme=dark) wins over a light system, and Office's light theme over a dark system", async () => {
  const dark = await open(async (p) => p.emulateMedia({ colorScheme: "light" }));
  await dark.evaluate(() => { document.documentElement.dataset.theme = "dark"; });
  expect(await bodyLuminance(dark)).toBeLessThan(0.05);
  expectAA(await contrasts(dark));
  await dark.close();
  const light = await open(async (p) => p.emulateMedia({ colorScheme: "dark" }));
  await light.evaluate(() => { document.documentElement.dataset.theme = "light"; });
  expect(await bodyLuminance(light)).toBeGreaterThan(0.9);
  expectAA(await contrasts(light));
  await light.close();
});

test("forced colours (high contrast): the system's colours are used, AA contrast throughout", async () => {
  for (const colorScheme of ["light", "dark"] as const) {
    const page = await open(async (p) => p.emulateMedia({ forcedColors: "active", colorScheme }));
    expect(await page.evaluate(() => matchMedia("(forced-colors: active)").matches)).toBe(true);
    expectAA(await contrasts(page));
    // the badge keeps a visible border when its background is replaced
    expect(await page.evaluate(() => getComputedStyle(document.querySelector(".fw-badge") as Element).borderTopStyle)).toBe("solid");
    await page.close();
  }
});

test("Office's theme to the pane's: isDarkTheme where given, else the body background's luminance", () => {
  expect(themeFromOffice({ isDarkTheme: true, bodyBackgroundColor: "#ffffff" })).toBe("dark");
  expect(themeFromOffice({ isDarkTheme: false })).toBe("light");
  expect(themeFromOffice({ bodyBackgroundColor: "#262626" })).toBe("dark"); // Office's "Black" theme body (from memory)
  expect(themeFromOffice({ bodyBackgroundColor: "#FFFFFF" })).toBe("light");
  expect(themeFromOffice({ bodyBackgroundColor: "not a colour" })).toBeNull();
  expect(themeFromOffice(undefined)).toBeNull();
  expect(luminance("#000000")).toBe(0);
  expect(luminance("#ffffff")).toBeCloseTo(1, 12);
});

test("numbers follow the user's locale: a German locale groups thousands with a point, an English one with a comma", async () => {
  const grouped = async (locale: string): Promise<string[]> => {
    const context = await env.browser.newContext({ locale, viewport: { width: 320, height: 1400 } });
    await context.route("**/*", (route) => (route.request().url().startsWith("http://127.0.0.1:") ? route.continue() : route.abort()));
    const page = await open(async () => undefined, context);
    const cells = await page.locator("#fw-check td.num").allTextContents();
    await context.close();
    return cells.filter((t) => /^\d{1,3}([.,\u00a0\u202f]\d{3})+$/.test(t));
  };
  const de = await grouped("de-DE");
  const en = await grouped("en-US");
  expect(de.length).toBeGreaterThan(0);
  for (const t of de) expect(t).toMatch(/^\d{1,3}(\.\d{3})+$/);
  for (const t of en) expect(t).toMatch(/^\d{1,3}(,\d{3})+$/);
  expect(en.length).toBe(de.length);
});
