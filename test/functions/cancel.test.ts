// Long functions are cancelable: Excel calls the CancelableInvocation's onCanceled when an argument
// changes or the sheet recalculates ("CustomFunctions.CancelableInvocation",
// https://learn.microsoft.com/javascript/api/custom-functions-runtime/customfunctions.cancelableinvocation),
// and the call stops at its next yield instead of finishing stale work on the shared runtime's one
// thread. Here the invocation is a plain object passed after the declared arguments, as Excel does.
import * as fs from "fs";
import * as path from "path";
import "../helpers/custom-functions-shim";
import { ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { cacheStats, clearForecastCache } from "../../src/functions/forecast-cache";
import { cancelSignal, pauseCount } from "../../src/functions/cancel";
import { buildDemoWorkbook } from "../../src/demo/quillmere";

const N = null;
type Invocation = { onCanceled?: () => void };

/** Six invented demo series (Quillmere, invented), one column each with a header row. */
function demoColumns(): unknown[][] {
  const wb = buildDemoWorkbook();
  const cols = wb.columns.filter((c) => c.values.every((v) => typeof v === "number" && v > 0)).slice(0, 6);
  const rows = cols[0].values.length;
  return [cols.map((c) => c.name), ...Array.from({ length: rows }, (_, i) => cols.map((c) => c.values[i]))];
}

async function settle<T>(p: Promise<T>): Promise<{ ok: true; value: T } | { ok: false; error: unknown }> {
  try {
    return { ok: true, value: await p };
  } catch (error) {
    return { ok: false, error };
  }
}

// As Excel calls it: every declared argument (null where omitted), then the invocation.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const call = (f: (...a: any[]) => Promise<unknown>, args: unknown[], inv: Invocation): Promise<unknown> => f(...args, ...new Array(Math.max(0, f.length - args.length)).fill(null), inv);

beforeEach(() => {
  clearForecastCache();
  pauseCount(true);
});

test("the metadata marks the long functions cancelable (the JSDoc @cancelable tag)", () => {
  const file = path.join(__dirname, "..", "..", "dist", "functions.json");
  if (!fs.existsSync(file)) throw new Error("dist/functions.json is missing: run `npm run build` first (npm test does)");
  const meta = JSON.parse(fs.readFileSync(file, "utf8")) as { functions: { id: string; options?: { cancelable?: boolean } }[] };
  const cancelable = meta.functions.filter((f) => f.options?.cancelable).map((f) => f.id).sort();
  expect(cancelable).toEqual(expect.arrayContaining(["BACKTEST", "FAN", "MODELINFO", "QUANTILES", "TOTAL"]));
});

test("without a cancel FW.TOTAL fits every series; cancelled at once it stops at its first turn, before fitting anything", async () => {
  const values = demoColumns();
  const series = values[0].length;
  expect(series).toBeGreaterThanOrEqual(3);
  const full = await call(FW.TOTAL, [values, 12, "ses", 0, 95, 12, 1], {});
  expect((full as unknown[][]).length).toBe(series);
  expect(cacheStats().misses).toBe(series);

  clearForecastCache();
  pauseCount(true);
  const inv: Invocation = {};
  const running = settle(call(FW.TOTAL, [values, 12, "holt", 0, 95, 12, 1], inv));
  inv.onCanceled?.(); // Excel cancels while the cell waits for its first turn (every series' fit waits for one)
  const r = await running;
  expect(r.ok).toBe(false);
  if (!r.ok) expect(r.error).toBeInstanceOf(ShimError);
  expect(cacheStats().misses).toBe(0); // no series was fitted
  expect(pauseCount()).toBe(1); // it stopped at the first turn
});

test("FW.BACKTEST stops at the next origin when cancelled, instead of refitting hundreds of times", async () => {
  // An invented series of 240 months (trend and season), one column: about 230 origins.
  const y = Array.from({ length: 240 }, (_, t) => 200 + t + 30 * Math.sin((2 * Math.PI * t) / 12) + 7 * Math.cos(t * 1.7));
  const values = [["Invented sales"], ...y.map((v) => [v])];
  const full = await call(FW.BACKTEST, [values, 1, "naive", 0, 80, 12, 5], {});
  const origins = (full as number[][])[0][1];
  expect(origins).toBeGreaterThan(200);
  expect(pauseCount(true)).toBeGreaterThanOrEqual(origins);

  const inv: Invocation = {};
  const running = settle(call(FW.BACKTEST, [values, 1, "naive", 0, 80, 12, 5], inv));
  inv.onCanceled?.();
  const r = await running;
  expect(r.ok).toBe(false);
  if (!r.ok) expect((r.error as ShimError).message).toMatch(/cancelled/);
  expect(pauseCount()).toBe(1);
});

test("FW.FAN, FW.QUANTILES and FW.MODELINFO stop at their turn too", async () => {
  const values = demoColumns();
  for (const [f, args] of [[FW.FAN, [values, 3, "ses", 0, N, 12, N]], [FW.QUANTILES, [values, 3, [[0.5]], "ses", 0, 12]], [FW.MODELINFO, [values, "ses", 0, 12]]] as const) {
    clearForecastCache();
    const inv: Invocation = {};
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const running = settle(call(f as any, args as unknown as unknown[], inv));
    inv.onCanceled?.();
    expect((await running).ok).toBe(false);
    expect(cacheStats().misses).toBe(0);
  }
});

test("called without an invocation (from code, or by Excel for a function not marked cancelable) nothing is cancelled", async () => {
  const values = demoColumns();
  const r = await FW.TOTAL(values, 12, "ses", 0, 95, 12, 1);
  expect(r.length).toBe(values[0].length);
  expect(cancelSignal(function f(_a: unknown) { return _a; }, [1]).cancelled).toBe(false);
  expect(cancelSignal(function f(_a: unknown) { return _a; }, [1, [[1]]]).cancelled).toBe(false); // an array is an argument, not an invocation
});

test("cells started together take turns with the host: a timer gets to run during the batch (common practice for a shared runtime: a long calculation must not freeze the task pane)", async () => {
  // INVENTED: 8 monthly series of 10 years; FW.FAN with λ and the model chosen by "auto" costs
  // tens of milliseconds each, so the batch takes well over the 30 ms between turns.
  clearForecastCache();
  const cols = Array.from({ length: 8 }, (_, s) => Array.from({ length: 120 }, (_, t) => [Math.round(100 * (800 + 37 * s) * Math.exp(0.003 * t + 0.02 * Math.sin(5 * t + s) + 0.15 * Math.cos((2 * Math.PI * t) / 12))) / 100]));
  let ticks = 0;
  const id = setInterval(() => { ticks++; }, 1);
  const t0 = Date.now();
  await Promise.all(cols.map((c) => FW.FAN(c, 12, "auto", "auto", N as never, 12)));
  const ms = Date.now() - t0;
  clearInterval(id);
  if (ms > 120) expect(ticks).toBeGreaterThanOrEqual(2); // before the turn queue: 0 (one turn for the whole batch)
  expect(ms).toBeGreaterThan(0);
});
