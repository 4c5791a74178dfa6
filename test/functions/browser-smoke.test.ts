// Smoke test in real Chromium: office.js and the custom-functions runtime from node_modules, then
// the built functions bundle. Every FW function must register, and a few must compute the right
// values and errors (references: scipy 1.10.1 fixtures and closed forms). No request may leave
// the machine.
import * as fs from "fs";
import { fromRoot, isolatedBrowser, serve } from "../helpers/browser";
import { check } from "../helpers/reference";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";

const EXPECTED = ["BOXCOX", "BOXCOXINV", "YEOJOHNSON", "YEOJOHNSONINV", "FITLAMBDA", "SCREEN", "BTMEAN", "BTQUANTILE", "MEANFROMINTERVAL", "IMPLIEDLAMBDA", "FAN", "QUANTILES", "TOTAL", "MODELINFO", "COVERAGE", "INTERVALSCORE", "PINBALL", "CALIBRATION", "BACKTEST", "TOTALFROMINTERVALS", "TOTALACROSS", "SMEARMEAN"];

test("the built functions bundle registers every FW function in Chromium and computes", async () => {
  const bundle = fromRoot("dist", "functions.js");
  if (!fs.existsSync(bundle)) throw new Error("dist/functions.js is missing: run `npm run build` first (npm test does)");
  const office = fromRoot("node_modules", "@microsoft", "office-js", "dist");
  const server = await serve({
    "/smoke.html": { type: "text/html", body: '<!doctype html><html><head><script src="/office.js"></script><script src="/custom-functions-runtime.js"></script></head><body><script src="/functions.js"></script></body></html>' },
    "/office.js": `${office}/office.js`,
    "/custom-functions-runtime.js": `${office}/custom-functions-runtime.js`,
    "/functions.js": bundle,
  });
  const { browser, context, offSite } = await isolatedBrowser();
  try {
    const page = await context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${server.url}/smoke.html`);
    await page.waitForFunction(() => {
      const cf = (window as unknown as { CustomFunctions?: { _association?: { mappings?: object } } }).CustomFunctions;
      return !!cf && !!cf._association && Object.keys(cf._association.mappings ?? {}).length > 0;
    }, undefined, { timeout: 15000 });
    const result = await page.evaluate(async () => {
      type Fn = (...a: unknown[]) => unknown;
      const cf = (window as unknown as { CustomFunctions: { _association: { mappings: Record<string, Fn> }; Error: new (...a: unknown[]) => { code: string; message: string } } }).CustomFunctions;
      const m = cf._association.mappings;
      const asError = (v: unknown): string | null => (v instanceof cf.Error ? `${(v as { code: string }).code}|${(v as { message: string }).message}` : null);
      const boxcox = m.BOXCOX([[100], [0]], 0, null) as unknown[][];
      const btmean = m.BTMEAN([[5]], [[0.5]], 0, "exact", null) as number[][];
      let rejected: string | null = null;
      try {
        await m.FAN([[1], [2], [3]], "twelve", null, null, null, null, null);
      } catch (e) {
        rejected = asError(e);
      }
      const fan = (await m.FAN([[100], [110], [121], [133.1], [146.41]], 2, "drift", 0, null, null, null)) as number[][];
      // The audit tests use @stdlib's incomplete beta and gamma, which the bundle builds without
      // their eval-based generator variants (webpack.config.js): same numbers as under Node.
      const log = Array.from({ length: 40 }, (_, i) => [100 + ((i * 37) % 23) - 11]);
      const coverage = m.COVERAGE(log, log.map(() => [95]), log.map(() => [105]), 80) as (number | string)[][];
      // Cells recalculated together take turns with the page (a message task every 30 ms of work):
      // a 10 ms timer must get to run during a batch of "auto" fits (common practice: a long
      // calculation must not freeze the task pane).
      let ticks = 0;
      const tick = setInterval(() => { ticks++; }, 10);
      const t0 = performance.now();
      await Promise.all(Array.from({ length: 16 }, (_, s) => m.FAN(Array.from({ length: 120 }, (_, t) => [Math.round(100 * (800 + 37 * s) * Math.exp(0.003 * t + 0.02 * Math.sin(5 * t + s) + 0.15 * Math.cos((2 * Math.PI * t) / 12))) / 100]), 12, "auto", "auto", null, 12, null)));
      const batchMs = performance.now() - t0;
      clearInterval(tick);
      return {
        batchMs,
        ticks,
        coverage: coverage[0],
        keys: Object.keys(m),
        boxcox0: boxcox[0][0],
        boxcoxZero: asError(boxcox[1][0]),
        btmean: btmean[0][0],
        rejected,
        fanMedian1: fan[0][2],
      };
    });
    expect(result.keys.sort()).toEqual(EXPECTED.slice().sort());
    expect(result.boxcox0).toBeCloseTo(Math.log(100), 14);
    expect(result.boxcoxZero).toMatch(/^#VALUE!\|Box-Cox needs values > 0/);
    // λ = 0, μ = 5, σ = 0.5: the lognormal mean exp(5.125) (scipy 1.10.1 backtransform.grid)
    const e = check("backtransform.grid").expected.find((x: { lmbda: number; mu: number; sigma: number }) => x.lmbda === 0 && x.mu === 5 && x.sigma === 0.5);
    expect(Math.abs(result.btmean - e.mean_lognormal_closed_form) / e.mean_lognormal_closed_form).toBeLessThan(1e-12);
    expect(result.rejected).toMatch(/^#VALUE!\|horizon must be a number/);
    // drift on logs of a 10%-a-year series: the next median is 146.41 × 1.1
    expect(result.fanMedian1).toBeCloseTo(161.051, 9);
    const log = Array.from({ length: 40 }, (_, i) => [100 + ((i * 37) % 23) - 11]);
    const node = FW.COVERAGE(log, log.map(() => [95]), log.map(() => [105]), 80)[0] as (number | string)[];
    // eight numbers, then the zone and the verdict (text)
    const nums = node.slice(0, 8) as number[];
    expect(nums.every((v) => typeof v === "number" && Number.isFinite(v))).toBe(true);
    nums.forEach((v, k) => expect(Math.abs((result.coverage[k] as number) - v)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(v))));
    expect(result.coverage.slice(8)).toEqual(node.slice(8));
    if (result.batchMs > 150) expect(result.ticks).toBeGreaterThanOrEqual(2); // 0 when the batch held the thread
    expect(errors).toEqual([]);
    expect(offSite).toEqual([]);
  } finally {
    await browser.close();
    await server.close();
  }
});
