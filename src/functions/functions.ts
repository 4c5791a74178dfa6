import "./runtime-guard";
// The @customfunction wrappers only: coerce → engine → map error (DESIGN.md). Metadata
// (functions.json) is generated from these JSDoc blocks by custom-functions-metadata-plugin.
import {
  backtransformMean, backtransformQuantile, boxCoxInverse, boxCoxShifted, boxCoxShiftedInverse, boxCox,
  fitLambda, impliedLambda, meanFromInterval, screenSeries, yeoJohnson, yeoJohnsonInverse, cleanSeries, EngineError, checkLevelPercent, checkLambda,
} from "../engine";
import { fanTable, quantileTable, totalForecast, describeForecaster, parseLevels, Maybe, METHODS, parseMethod, isArimaMethod, checkHorizon, auditLog, pinball, backtestAsync, RawCell, calibrationTable } from "../engine";
import { publishedTotal, parseDependence, alignSeries, totalAcross, smearingMean, checkWindowStart, Forecaster } from "../engine";
import { fitLambdaForModel, MEAN_METHODS, TRANSFORMS, parseShift } from "../engine";
import { optionalInteger, optionalKeyword, optionalNumber, readMatrix, readSeries, requiredNumber, optionalBoolean, readLevels, readLambda, readProbs, readShift } from "./coerce";
import { cachedForecast } from "./forecast-cache";
import { toExcelError } from "./excel-errors";
import { elementwise, finiteTable } from "./shape";
import { cancelSignal, CancelSignal, NEVER_CANCELLED, withCancel } from "./cancel";
import { auditInput, column, rowKey } from "./audit-args";

function guard<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    throw toExcelError(e);
  }
}

/**
 * Box-Cox transform of each value: (y^λ − 1)/λ, or ln y when λ is 0. Values must be > 0 (after the shift).
 * @customfunction BOXCOX
 * @helpurl https://localhost:3000/README.html#fwboxcox
 * @param {any[][]} values Positive numbers (a cell or a range).
 * @param {number} lambda The Box-Cox λ, between -5 and 5 (0 = log, 0.5 = square root, 1 = none).
 * @param {number} [shift] Added to every value first (shifted Box-Cox). Default 0.
 * @returns {any[][]} Transformed values, same shape as values.
 */
export function BOXCOX(values: any[][], lambda: number, shift?: number): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const c = optionalNumber(shift, "shift", 0);
    return elementwise([{ name: "values", cells: readMatrix(values, "values") }], (y) => (c === 0 ? boxCox(y, l) : boxCoxShifted(y, l, c)));
  });
}

/**
 * Back-transforms Box-Cox values to the original scale. Applied to a forecast, it gives the median, not the mean.
 * @customfunction BOXCOXINV
 * @helpurl https://localhost:3000/README.html#fwboxcoxinv
 * @param {any[][]} values Values on the Box-Cox scale (a cell or a range).
 * @param {number} lambda The Box-Cox λ used, between -5 and 5.
 * @param {number} [shift] The shift used in the transform, subtracted at the end. Default 0.
 * @returns {any[][]} Values on the original scale, same shape as values.
 */
export function BOXCOXINV(values: any[][], lambda: number, shift?: number): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const c = optionalNumber(shift, "shift", 0);
    return elementwise([{ name: "values", cells: readMatrix(values, "values") }], (w) => (c === 0 ? boxCoxInverse(w, l) : boxCoxShiftedInverse(w, l, c)));
  });
}

/**
 * Yeo-Johnson transform, which also accepts zeros and negative values.
 * @customfunction YEOJOHNSON
 * @helpurl https://localhost:3000/README.html#fwyeojohnson
 * @param {any[][]} values Any numbers (a cell or a range).
 * @param {number} lambda The Yeo-Johnson λ, between -5 and 5 (1 = no change).
 * @returns {any[][]} Transformed values, same shape as values.
 */
export function YEOJOHNSON(values: any[][], lambda: number): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    return elementwise([{ name: "values", cells: readMatrix(values, "values") }], (y) => yeoJohnson(y, l));
  });
}

/**
 * Back-transforms Yeo-Johnson values to the original scale.
 * @customfunction YEOJOHNSONINV
 * @helpurl https://localhost:3000/README.html#fwyeojohnsoninv
 * @param {any[][]} values Values on the Yeo-Johnson scale (a cell or a range).
 * @param {number} lambda The Yeo-Johnson λ used, between -5 and 5.
 * @returns {any[][]} Values on the original scale, same shape as values.
 */
export function YEOJOHNSONINV(values: any[][], lambda: number): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    return elementwise([{ name: "values", cells: readMatrix(values, "values") }], (w) => yeoJohnsonInverse(w, l));
  });
}

/**
 * Chooses the Box-Cox λ for each series: λ, the 95% likelihood interval that belongs to it (low, high), and a readable λ. By default the λ that FW.FAN with lambda "auto" uses.
 * @customfunction FITLAMBDA
 * @helpurl https://localhost:3000/README.html#fwfitlambda
 * @param {any[][]} values The series: one per column (a header row of names is allowed). Positive numbers.
 * @param {string} [method] "auto" (default: the λ forecasts with lambda "auto" use, with the chosen model's likelihood interval), "model" (the forecasting model's own maximum-likelihood λ), "guerrero" (no likelihood interval) or "mle" (i.i.d. maximum likelihood).
 * @param {number} [period] Season length: 12 for monthly, 4 for quarterly, 1 for none (default 1). Guerrero's window is the period, or 2 when it is 1.
 * @param {number} [lower] Lowest λ to consider. Default -1.
 * @param {number} [upper] Highest λ to consider. Default 2.
 * @returns {any[][]} One row per series: λ, interval low, interval high, readable λ.
 */
export function FITLAMBDA(values: any[][], method?: string, period?: number, lower?: number, upper?: number): any[][] {
  return guard(() => {
    const m = optionalKeyword(method, "method", ["auto", "model", "guerrero", "mle"] as const, "auto");
    const p = optionalInteger(period, "period", 1, 1);
    const lo = optionalNumber(lower, "lower", -1);
    const hi = optionalNumber(upper, "upper", 2);
    const s = readSeries(values);
    return finiteTable(s.series.map((cells, j) => {
      try {
        const clean = cleanSeries(cells, s.names[j], 1 + s.headerRows);
        const r = m === "auto" || m === "model"
          ? fitLambdaForModel(clean.values, { period: p, label: s.names[j], lambdaMethod: m })
          : fitLambda(clean.values, { method: m, period: p, lower: lo, upper: hi, label: s.names[j] });
        const none = m === "guerrero" ? "Guerrero's method has no likelihood, so no likelihood interval belongs to its λ; use method \"mle\" or \"model\" for one." : null;
        return [r.lambda, r.interval[0] ?? naCell(none ?? "The likelihood interval is open at the low end (the likelihood does not fall far enough)."), r.interval[1] ?? naCell(none ?? "The likelihood interval is open at the high end (the likelihood does not fall far enough)."), r.readable];
      } catch (e) {
        const err = toExcelError(e);
        return [err, err, err, err];
      }
    }));
  });
}

/** A single-number result, or a #NUM! error saying it overflowed (values near ±1e308). */
function finiteResult(x: number, what: string): number {
  if (Number.isFinite(x)) return x;
  throw new CustomFunctions.Error(CustomFunctions.ErrorCode.invalidNumber, `${what} is too large to represent; the values are near the limit of numbers (about 1e308). Rescale them, e.g. to thousands.`);
}

function naCell(message: string): CustomFunctions.Error {
  return toExcelError(new EngineError("unavailable", message));
}

/**
 * Checks each series before Box-Cox: size, blanks, text, minimum, values at or below zero, whether Box-Cox can be used, a suggested λ and the fix.
 * @customfunction SCREEN
 * @helpurl https://localhost:3000/README.html#fwscreen
 * @param {any[][]} values The series: one per column (a header row of names is allowed).
 * @param {number} [period] Season length: 12 for monthly, 4 for quarterly, 1 for none (default 1).
 * @returns {any[][]} One row per series: n, blanks, text cells, minimum, count ≤ 0, Box-Cox usable, suggested λ, suggested fix.
 */
export function SCREEN(values: any[][], period?: number): any[][] {
  return guard(() => {
    const p = optionalInteger(period, "period", 1, 1);
    const s = readSeries(values);
    return finiteTable(s.series.map((cells, j) => {
      const r = screenSeries(cells, { period: p, label: s.names[j], zerosOption: "leave those cells blank (a blank inside a series is a missing observation)" });
      return [r.n, r.blanks, r.textCells, r.min ?? "", r.nonPositive, r.boxCoxUsable, r.suggestedLambda ?? "", r.message];
    }));
  });
}

/**
 * Mean on the original scale of a forecast made on the Box-Cox scale (bias-adjusted), from its transformed mean and standard deviation.
 * @customfunction BTMEAN
 * @helpurl https://localhost:3000/README.html#fwbtmean
 * @param {any[][]} mu Mean on the transformed scale (a cell or a range).
 * @param {any[][]} sd Standard deviation on the transformed scale, > 0 (a cell or a range the size of mu).
 * @param {number} lambda The Box-Cox λ of the forecast's scale (0 = log).
 * @param {string} [method] "auto" (default: exact where it exists, λ ≥ 0; Taylor for λ < 0), "exact" (integral; not defined for λ < 0) or "taylor" (second-order approximation).
 * @returns {any[][]} The mean on the original scale, same shape as mu.
 */
export function BTMEAN(mu: any[][], sd: any[][], lambda: number, method?: string): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const m = optionalKeyword(method, "method", MEAN_METHODS, "auto");
    return elementwise([{ name: "mu", cells: readMatrix(mu, "mu") }, { name: "sd", cells: readMatrix(sd, "sd") }], (a, b) => backtransformMean(a, b, l, m));
  });
}

/**
 * Quantiles on the original scale of a forecast made on the Box-Cox scale.
 * @customfunction BTQUANTILE
 * @helpurl https://localhost:3000/README.html#fwbtquantile
 * @param {any[][]} mu Mean on the transformed scale (a cell or a column).
 * @param {any[][]} sd Standard deviation on the transformed scale, > 0 (a cell or a column the size of mu).
 * @param {number} lambda The Box-Cox λ of the forecast's scale (0 = log).
 * @param {any[][]} p Probabilities strictly between 0 and 1 (a cell or a row, e.g. 0.1 and 0.9).
 * @returns {any[][]} One row per mu, one column per probability.
 */
export function BTQUANTILE(mu: any[][], sd: any[][], lambda: number, p: any[][]): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const mus = readMatrix(mu, "mu").flat();
    const sds = readMatrix(sd, "sd").flat();
    const ps = readMatrix(p, "p").flat();
    if (sds.length !== 1 && sds.length !== mus.length) throw new EngineError("input", `sd must be a single cell or the same size as mu (${mus.length} cells); it has ${sds.length}.`);
    return mus.map((m, i) => elementwise([
      { name: "mu", cells: [[m]] },
      { name: "sd", cells: [[sds.length === 1 ? sds[0] : sds[i]]] },
      { name: "p", cells: [ps] },
    ], (a, b, q) => backtransformQuantile(a, b, l, q))[0]);
  });
}

/**
 * Mean of a forecast known only by its median and a central interval, such as a log-scale forecast from another team.
 * @customfunction MEANFROMINTERVAL
 * @helpurl https://localhost:3000/README.html#fwmeanfrominterval
 * @param {any[][]} median The published median (point forecast), > 0 (a cell or a column).
 * @param {any[][]} lower The interval's lower end, same shape as median.
 * @param {any[][]} upper The interval's upper end, same shape as median.
 * @param {number} level The interval's coverage in percent, e.g. 80 or 95.
 * @param {number} [lambda] The Box-Cox λ the forecast was made on. Default 0 (log).
 * @param {string} [method] "auto" (default: exact where it exists, λ ≥ 0; Taylor for λ < 0), "exact" or "taylor".
 * @returns {any[][]} The mean on the original scale, same shape as median.
 */
export function MEANFROMINTERVAL(median: any[][], lower: any[][], upper: any[][], level: number, lambda?: number, method?: string): any[][] {
  return guard(() => {
    const lv = requiredNumber(level, "level");
    checkLevelPercent(lv);
    const l = checkLambda(optionalNumber(lambda, "lambda", 0));
    const m = optionalKeyword(method, "method", MEAN_METHODS, "auto");
    return elementwise([
      { name: "median", cells: readMatrix(median, "median") },
      { name: "lower", cells: readMatrix(lower, "lower") },
      { name: "upper", cells: readMatrix(upper, "upper") },
    ], (a, b, c) => meanFromInterval(a, b, c, lv, l, m).mean);
  });
}

/**
 * The Box-Cox λ on which a published interval is symmetric around its median (0 means a log-scale forecast).
 * @customfunction IMPLIEDLAMBDA
 * @helpurl https://localhost:3000/README.html#fwimpliedlambda
 * @param {any[][]} median The published median, > 0 (a cell or a column).
 * @param {any[][]} lower The interval's lower end, same shape as median.
 * @param {any[][]} upper The interval's upper end, same shape as median.
 * @returns {any[][]} λ for each interval, same shape as median.
 */
export function IMPLIEDLAMBDA(median: any[][], lower: any[][], upper: any[][]): any[][] {
  return guard(() => elementwise([
    { name: "median", cells: readMatrix(median, "median") },
    { name: "lower", cells: readMatrix(lower, "lower") },
    { name: "upper", cells: readMatrix(upper, "upper") },
  ], (a, b, c) => impliedLambda(a, b, c)));
}

async function guardAsync<T>(f: () => Promise<T>): Promise<T> {
  try {
    return await f();
  } catch (e) {
    throw toExcelError(e);
  }
}

let lastYield = 0;
let turns: Promise<void> = Promise.resolve();
/**
 * Lets Excel's shared runtime breathe during long work (before each series' fit, between backtest
 * origins), so the pane and Excel stay responsive. Calls take turns in one queue: a recalculation
 * starts many cells at once, and each turn is decided when the work before it has run, so the host
 * gets a turn (a new event-loop task, {@link nextTask}) whenever 30 ms of work have passed since the last one — not only once
 * for the whole batch (bench/cells.js: 50 "auto" cells froze the page for 1.4–1.9 s before).
 */
function yieldToHost(): Promise<void> {
  const mine = turns.then(() => {
    if (Date.now() - lastYield < 30) return undefined;
    return nextTask().then(() => { lastYield = Date.now(); });
  });
  turns = mine;
  return mine;
}

let channel: MessageChannel | null = null;
const waiting: (() => void)[] = [];
/**
 * Resolves in a new task of the event loop, so the host can paint and take input first. A message
 * on a MessageChannel, not a timer: browsers throttle timers in hidden pages (to one a second in
 * Chromium), and a runtime without a visible page must not be slowed that way. setTimeout where
 * there is no page (Node, in the tests, drains a port's messages before its timers).
 */
function nextTask(): Promise<void> {
  // Node (the tests) drains a port's messages without giving its timers a turn: timers there.
  if (typeof MessageChannel === "undefined" || typeof document === "undefined") return new Promise((resolve) => setTimeout(resolve, 0));
  if (channel === null) {
    channel = new MessageChannel();
    channel.port1.onmessage = () => waiting.shift()?.();
  }
  return new Promise((resolve) => {
    waiting.push(resolve);
    (channel as MessageChannel).port2.postMessage(null);
  });
}

function cell(m: Maybe): number | CustomFunctions.Error {
  if (m.value !== null && Number.isFinite(m.value) && m.note === null) return m.value;
  return naCell(m.note ?? "This value does not exist.");
}

interface SeriesArgs { method: string; lambda: string | number; period: number; transform: string; shift: number | "auto" }

function forecastArgs(method: unknown, lambda: unknown, period: unknown, transform?: unknown, shift?: unknown): SeriesArgs {
  // ARIMA orders are free text in the project's syntax ("arima:0,1,1/0,1,1"); the rest are keywords.
  const m = typeof method === "string" && isArimaMethod(method) ? parseMethod(method) : optionalKeyword(method, "method", METHODS, "auto");
  const t = optionalKeyword(transform, "transform", TRANSFORMS, "box-cox");
  return { method: m, lambda: readLambda(lambda), period: optionalInteger(period, "period", 1, 1), transform: t, shift: parseShift(readShift(shift)) };
}

async function eachSeries<T>(values: unknown, args: SeriesArgs, f: (fc: ReturnType<typeof cachedForecast>, name: string) => T, onError: (err: CustomFunctions.Error, name: string) => T, cancel: CancelSignal = NEVER_CANCELLED): Promise<{ names: string[]; results: T[] }> {
  const s = readSeries(values);
  const results: T[] = [];
  const pause = withCancel(yieldToHost, cancel);
  for (let j = 0; j < s.series.length; j++) {
    // Before every series, the first too: a recalculation starts many one-series cells at once, and
    // without a turn for the host between them the pane froze for the whole batch (bench/cells.js:
    // 1.4–1.9 s for 50 "auto" cells; now about one fit). Returns at once within 30 ms of the last turn.
    await pause();
    try {
      const fc = cachedForecast(s.series[j], { method: args.method, lambda: args.lambda, transform: args.transform, shift: args.shift, period: args.period, label: s.names[j], firstRow: 1 + s.headerRows });
      results.push(f(fc, s.names[j]));
    } catch (e) {
      if (e instanceof EngineError && /^horizon|^levels|^each level|^probs|^each probability|^from /.test(e.message)) throw e;
      results.push(onError(toExcelError(e), s.names[j]));
    }
  }
  return { names: s.names, results };
}

/**
 * Forecast fan for each series, back on the original scale: step, mean (for budgets), median, and the low and high ends of each interval.
 * @customfunction FAN
 * @helpurl https://localhost:3000/README.html#fwfan
 * @cancelable
 * @param {any[][]} values The history: one series per column (a header row of names is allowed), oldest first, positive numbers.
 * @param {number} horizon How many periods ahead to forecast (a whole number, e.g. 12).
 * @param {string} [method] "auto" (default: lowest AICc among the smoothing models), "naive", "drift", "seasonal-naive", "mean", "ses", "holt", "damped", "seasonal-ses", "holt-winters", "damped-holt-winters", "arima" (automatic seasonal ARIMA) or an ARIMA order such as "arima:0,1,1" or "arima:0,1,1/0,1,1".
 * @param {any} [lambda] λ: a number (0 = log), "auto" (default: readable λ and model chosen together by AICc), "model", "guerrero", "mle" or "none".
 * @param {any[][]} [levels] Interval levels in percent: a range of numbers or text like "80,95" (default 80 and 95).
 * @param {number} [period] Season length: 12 for monthly, 4 for quarterly, 1 for none (default 1).
 * @param {boolean} [header] TRUE adds a header row naming the columns (default FALSE: numbers only).
 * @param {string} [transform] "box-cox" (default), "yeo-johnson" (accepts zeros and negatives) or "none".
 * @param {any} [shift] Added to every value before Box-Cox: a number, or "auto" (for zeros). Default 0.
 * @param {string} [mean] "auto" (default: exact where it exists, Taylor for λ < 0), "exact" or "taylor".
 * @returns One row per step: step, then per series mean, median, low and high for each level.
 */
export async function FAN(values: any[][], horizon: number, method?: string, lambda?: any, levels?: any[][], period?: number, header?: boolean, transform?: string, shift?: any, mean?: string): Promise<any[][]> {
  // eslint-disable-next-line prefer-rest-params -- Excel passes the CancelableInvocation after the declared arguments (cancel.ts)
  const cancel = cancelSignal(FAN, arguments);
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period, transform, shift);
    const meanMethod = optionalKeyword(mean, "mean", MEAN_METHODS, "auto");
    const lv = parseLevels(readLevels(levels));
    const h = checkHorizon(requiredNumber(horizon, "horizon"), Number.MAX_SAFE_INTEGER);
    const withHeader = optionalBoolean(header, "header", false);
    const width = 2 + 2 * lv.length;
    const { names, results } = await eachSeries(values, args, (fc) => {
      const t = fanTable(fc, h, { levels: lv, mean: meanMethod });
      return t.rows.map((r) => [cell(r.mean), cell(r.median), ...lv.flatMap((l) => [cell(r.intervals[String(l)][0]), cell(r.intervals[String(l)][1])])]);
    }, (err) => Array.from({ length: Math.max(1, Math.min(checkHorizonSafe(h), 1000)) }, () => new Array(width).fill(err)), cancel);
    const H = results[0].length;
    const out: any[][] = [];
    if (withHeader) {
      out.push(["step", ...names.flatMap((n) => [`${n} mean`, `${n} median`, ...lv.flatMap((l) => [`${n} low ${l}%`, `${n} high ${l}%`])])]);
    }
    for (let i = 0; i < H; i++) out.push([i + 1, ...results.flatMap((r) => r[i] ?? new Array(width).fill(naCell("No value.")))]);
    return finiteTable(out);
  });
}

function checkHorizonSafe(h: number): number {
  return Number.isInteger(h) && h > 0 ? h : 1;
}

/**
 * Forecast quantiles on the original scale: one row per step, one column per probability (per series).
 * @customfunction QUANTILES
 * @helpurl https://localhost:3000/README.html#fwquantiles
 * @cancelable
 * @param {any[][]} values The history: one series per column (a header row of names is allowed), positive numbers.
 * @param {number} horizon How many periods ahead (a whole number).
 * @param {any[][]} probs Probabilities strictly between 0 and 1, e.g. 0.1, 0.5, 0.9 (a cell or a row).
 * @param {string} [method] Forecasting method (default "auto"); see FW.FAN.
 * @param {any} [lambda] λ: a number, "auto" (default), "model", "guerrero", "mle" or "none".
 * @param {number} [period] Season length (default 1).
 * @param {string} [transform] "box-cox" (default), "yeo-johnson" (accepts zeros and negatives) or "none".
 * @param {any} [shift] Added to every value before Box-Cox: a number, or "auto" (for zeros). Default 0.
 * @returns horizon rows × (probabilities × series) columns.
 */
export async function QUANTILES(values: any[][], horizon: number, probs: any[][], method?: string, lambda?: any, period?: number, transform?: string, shift?: any): Promise<any[][]> {
  // eslint-disable-next-line prefer-rest-params -- Excel passes the CancelableInvocation after the declared arguments (cancel.ts)
  const cancel = cancelSignal(QUANTILES, arguments);
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period, transform, shift);
    const ps = readProbs(probs);
    const h = checkHorizon(requiredNumber(horizon, "horizon"), Number.MAX_SAFE_INTEGER);
    const { results } = await eachSeries(values, args, (fc) => quantileTable(fc, h, ps).map((row) => row.map(cell)),
      (err) => Array.from({ length: Math.min(checkHorizonSafe(h), 1000) }, () => new Array(ps.length).fill(err)), cancel);
    const H = results[0].length;
    return finiteTable(Array.from({ length: H }, (_, i) => results.flatMap((r) => r[i])));
  });
}

/**
 * Forecast of the total over the next periods (e.g. a year's budget from monthly history): mean, median, and the interval's low and high ends.
 * @customfunction TOTAL
 * @helpurl https://localhost:3000/README.html#fwtotal
 * @cancelable
 * @param {any[][]} values The history: one series per column (a header row of names is allowed), positive numbers.
 * @param {number} horizon Number of periods to add up (e.g. 12 for a year of months).
 * @param {string} [method] Forecasting method (default "auto"); see FW.FAN.
 * @param {any} [lambda] λ: a number, "auto" (default), "model", "guerrero", "mle" or "none".
 * @param {number} [level] Interval level in percent (default 95).
 * @param {number} [period] Season length (default 1).
 * @param {number} [seed] Seed of the simulation, a whole number (default 1): the same seed gives the same answer on every recalculation.
 * @param {number} [from] First step of the window to add up (default 1): steps from..horizon are summed, e.g. from 8 and horizon 19 for next January–December after a history ending in May.
 * @param {string} [transform] "box-cox" (default), "yeo-johnson" (accepts zeros and negatives) or "none".
 * @param {any} [shift] Added to every value before Box-Cox: a number, or "auto" (for zeros). Default 0.
 * @param {string} [mean] "auto" (default: exact where it exists, Taylor for λ < 0), "exact" or "taylor".
 * @returns One row per series: mean, median, low, high.
 */
export async function TOTAL(values: any[][], horizon: number, method?: string, lambda?: any, level?: number, period?: number, seed?: number, from?: number, transform?: string, shift?: any, mean?: string): Promise<any[][]> {
  // eslint-disable-next-line prefer-rest-params -- Excel passes the CancelableInvocation after the declared arguments (cancel.ts)
  const cancel = cancelSignal(TOTAL, arguments);
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period, transform, shift);
    const meanMethod = optionalKeyword(mean, "mean", MEAN_METHODS, "auto");
    const lv = optionalNumber(level, "level", 95);
    checkLevelPercent(lv);
    const sd = optionalInteger(seed, "seed", 1, 0);
    const h = checkHorizon(requiredNumber(horizon, "horizon"), Number.MAX_SAFE_INTEGER);
    const start = checkWindowStart(optionalInteger(from, "from", 1, 1), h);
    const { results } = await eachSeries(values, args, (fc) => {
      const t = totalForecast(fc, h, { level: lv, seed: sd, mean: meanMethod, from: start });
      return [cell(t.mean), t.median, t.interval[0], t.interval[1] ?? naCell("The total's upper end is unbounded at this λ.")];
    }, (err) => [err, err, err, err], cancel);
    return finiteTable(results);
  });
}

/**
 * Describes the fitted model: method, transform, λ (with its interval), parameters, σ, log-likelihood and AICc on the original scale, n, and which mean is shown and how accurate it is (a label column, then one column per series).
 * @customfunction MODELINFO
 * @helpurl https://localhost:3000/README.html#fwmodelinfo
 * @cancelable
 * @param {any[][]} values The history: one series per column (a header row of names is allowed), positive numbers.
 * @param {string} [method] Forecasting method (default "auto"); see FW.FAN.
 * @param {any} [lambda] λ: a number, "auto" (default), "model", "guerrero", "mle" or "none".
 * @param {number} [period] Season length (default 1).
 * @param {string} [transform] "box-cox" (default), "yeo-johnson" (accepts zeros and negatives) or "none".
 * @param {any} [shift] Added to every value before Box-Cox: a number, or "auto" (for zeros). Default 0.
 * @returns Two columns (label, value) for one series; one more value column per extra series.
 */
export async function MODELINFO(values: any[][], method?: string, lambda?: any, period?: number, transform?: string, shift?: any): Promise<any[][]> {
  // eslint-disable-next-line prefer-rest-params -- Excel passes the CancelableInvocation after the declared arguments (cancel.ts)
  const cancel = cancelSignal(MODELINFO, arguments);
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period, transform, shift);
    const { results } = await eachSeries(values, args, (fc) => describeForecaster(fc), (err) => [["error", err] as [string, any]], cancel);
    // Union of labels in first-seen order; a series without a label gets a blank.
    const labels: string[] = [];
    for (const r of results) for (const [k] of r) if (!labels.includes(k)) labels.push(k);
    return finiteTable(labels.map((k) => [k, ...results.map((r) => { const hit = r.find(([kk]) => kk === k); return hit ? hit[1] : ""; })]));
  });
}

/**
 * Checks how often past intervals contained what happened: n, misses, observed coverage, the Kupiec, independence, conditional-coverage and binomial-tail p-values, the mean interval score, the zone and one verdict. With groups: one row per series plus a pooled row; with horizons: per step ahead; with several levels: per level.
 * @customfunction COVERAGE
 * @helpurl https://localhost:3000/README.html#fwcoverage
 * @param {any[][]} actuals What happened, one per row (blanks are skipped).
 * @param {any[][]} lower The lower ends of the published intervals, same rows (one column per level).
 * @param {any[][]} upper The upper ends, same rows (one column per level).
 * @param {any} level The promised coverage in percent, e.g. 80; several as "80,95" or a range, one per column of lower and upper.
 * @param {any[][]} [groups] The series name of each row: one result row per series plus a pooled row "all groups".
 * @param {any[][]} [horizons] Steps ahead of each row (1, 2, 3, …): results per step; for h > 1 the tests use every h-th origin.
 * @returns {any[][]} Per row: [group], [step], [level] (each only when used), n, misses, observed coverage, Kupiec p, independence p, conditional-coverage p, binomial tail p, mean interval score, zone, verdict.
 */
export function COVERAGE(actuals: any[][], lower: any[][], upper: any[][], level: any, groups?: any[][], horizons?: any[][]): any[][] {
  return guard(() => {
    const a = auditLog(auditInput(actuals, lower, upper, level, groups, horizons));
    return finiteTable(a.rows.map((r) => [
      ...rowKey(a, r), r.n, r.misses, r.coverage, r.kupiec.p, r.independence.p, r.conditional.p, r.binomialTail, r.intervalScore, r.verdict.colour, r.verdict.headline,
    ]));
  });
}

/**
 * Mean interval (Winkler) score of past intervals: width plus a penalty for each miss. Lower is better. With groups, horizons or several levels: one row each (and a pooled row).
 * @customfunction INTERVALSCORE
 * @helpurl https://localhost:3000/README.html#fwintervalscore
 * @param {any[][]} actuals What happened, one per row (blanks are skipped).
 * @param {any[][]} lower The lower ends of the intervals, same rows (one column per level).
 * @param {any[][]} upper The upper ends, same rows (one column per level).
 * @param {any} level The intervals' coverage in percent, e.g. 80; several as "80,95" or a range.
 * @param {any[][]} [groups] The series name of each row: one score per series plus the pooled score.
 * @param {any[][]} [horizons] Steps ahead of each row: one score per step.
 * @returns {any[][]} The mean interval score in the units of the data; with groups, horizons or several levels, [group], [step], [level] and the score per row.
 */
export function INTERVALSCORE(actuals: any[][], lower: any[][], upper: any[][], level: any, groups?: any[][], horizons?: any[][]): any[][] {
  return guard(() => {
    const a = auditLog(auditInput(actuals, lower, upper, level, groups, horizons));
    return finiteTable(a.rows.map((r) => [...rowKey(a, r), finiteResult(r.intervalScore, "The mean interval score")]));
  });
}

/**
 * Mean pinball (quantile) loss of past quantile forecasts. Lower is better.
 * @customfunction PINBALL
 * @helpurl https://localhost:3000/README.html#fwpinball
 * @param {any[][]} actuals What happened, one per row (blanks are skipped).
 * @param {any[][]} quantiles The forecast quantiles, same rows.
 * @param {number} p The probability the quantiles were for, strictly between 0 and 1 (e.g. 0.9).
 * @returns {number} The mean pinball loss, in the units of the data.
 */
export function PINBALL(actuals: any[][], quantiles: any[][], p: number): number {
  return guard(() => {
    const prob = requiredNumber(p, "p");
    const a = column(actuals, "actuals");
    const q = column(quantiles, "quantiles");
    if (a.length !== q.length) throw new EngineError("input", `actuals and quantiles must have the same number of rows; they have ${a.length} and ${q.length}.`);
    let sum = 0;
    let n = 0;
    a.forEach((y, i) => {
      const qi = q[i];
      if (y === null || y === "" || qi === null || qi === "") return;
      if (typeof y !== "number" || typeof qi !== "number") throw new EngineError("input", `Row ${i + 1}: the actual and the quantile must be numbers.`);
      sum += pinball(qi, y, prob);
      n++;
    });
    if (n === 0) throw new EngineError("input", "No row has both an actual and a quantile.");
    return finiteResult(sum / n, "The mean pinball loss");
  });
}

/**
 * Calibration of past quantile forecasts: per probability, the share of actuals at or below the quantile (a calibrated forecast makes it p), its exact 95% interval, Kupiec's p-value for that share against p, and the mean pinball loss.
 * @customfunction CALIBRATION
 * @helpurl https://localhost:3000/README.html#fwcalibration
 * @param {any[][]} actuals What happened, one per row (a row with any blank is skipped).
 * @param {any[][]} quantiles The forecast quantiles, same rows, one column per probability, from the lowest probability to the highest.
 * @param {any[][]} probs The probabilities of those columns, e.g. 0.1, 0.5, 0.9 (a row of cells or text like "0.1,0.5,0.9").
 * @returns {any[][]} One row per probability: p, rows used, share at or below, its 95% interval (low, high), Kupiec p-value, mean pinball loss.
 */
export function CALIBRATION(actuals: any[][], quantiles: any[][], probs: any[][]): any[][] {
  return guard(() => {
    const raw = singleText(probs);
    const ps = raw === null ? readProbs(probs) : raw.split(/[,;\s]+/).filter((t) => t !== "").map((t) => {
      const x = Number(t);
      if (!Number.isFinite(x)) throw new EngineError("input", `probs must be numbers strictly between 0 and 1, e.g. "0.1,0.5,0.9"; got "${t.slice(0, 20)}".`);
      return x;
    });
    const a = column(actuals, "actuals");
    const q = readMatrix(quantiles, "quantiles");
    const width = q[0].length;
    if (width !== ps.length) throw new EngineError("input", `quantiles has ${width} column${width === 1 ? "" : "s"} but ${ps.length} probabilit${ps.length === 1 ? "y was" : "ies were"} given: give one probability per quantile column, in the same order.`);
    if (q.length !== a.length) throw new EngineError("input", `actuals and quantiles must have the same number of rows; they have ${a.length} and ${q.length}.`);
    const t = calibrationTable(a, ps.map((p, j) => ({ p, cells: q.map((r) => r[j]) })));
    return finiteTable(t.rows.map((r) => [r.p, r.n, r.hitRate, r.interval[0], r.interval[1], r.test.p, finiteResult(r.pinball, "The mean pinball loss")]));
  });
}

/** The text of a one-cell argument, or null when it is a number or a range of several cells. */
function singleText(v: unknown): string | null {
  const x = Array.isArray(v) && v.length === 1 && Array.isArray(v[0]) && v[0].length === 1 ? v[0][0] : v;
  return typeof x === "string" ? x : null;
}

/**
 * Backtests the method on your own history (rolling origin): per step ahead, the number of origins, the coverage of the interval, the mean interval score, the mean error of the mean and of the median, Kupiec's p-value and a verdict.
 * @customfunction BACKTEST
 * @helpurl https://localhost:3000/README.html#fwbacktest
 * @cancelable
 * @param {any[][]} values The history, oldest first, one column (a header cell is allowed).
 * @param {number} horizon Steps ahead to check (a whole number).
 * @param {string} [method] Forecasting method (default "auto"); see FW.FAN.
 * @param {any} [lambda] λ: a number, "auto" (default), "model", "guerrero", "mle" or "none".
 * @param {number} [level] Interval level in percent (default 95).
 * @param {number} [period] Season length (default 1).
 * @param {number} [first] Length of the first fitting window (default: the smallest the method needs, or the latest 500 origins of a long series).
 * @param {string} [transform] "box-cox" (default), "yeo-johnson" (accepts zeros and negatives) or "none".
 * @param {any} [shift] Added to every value before Box-Cox: a number, or "auto" (for zeros). Default 0.
 * @param {string} [mean] The mean scored: "auto" (default: exact where it exists, Taylor for λ < 0), "exact" or "taylor".
 * @returns One row per step ahead: step, origins, coverage, mean interval score, mean error of the mean, mean error of the median, Kupiec p, verdict.
 */
export async function BACKTEST(values: any[][], horizon: number, method?: string, lambda?: any, level?: number, period?: number, first?: number, transform?: string, shift?: any, mean?: string): Promise<any[][]> {
  // eslint-disable-next-line prefer-rest-params -- Excel passes the CancelableInvocation after the declared arguments (cancel.ts)
  const cancel = cancelSignal(BACKTEST, arguments);
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period, transform, shift);
    const meanMethod = optionalKeyword(mean, "mean", MEAN_METHODS, "auto");
    const lv = optionalNumber(level, "level", 95);
    checkLevelPercent(lv);
    const h = checkHorizon(requiredNumber(horizon, "horizon"), Number.MAX_SAFE_INTEGER);
    const f = first === null || first === undefined ? undefined : optionalInteger(first, "first", 2, 2);
    const s = readSeries(values);
    if (s.series.length !== 1) throw new EngineError("input", `FW.BACKTEST checks one series at a time; the range has ${s.series.length} columns.`);
    const b = await backtestAsync(s.series[0], h, { method: args.method, lambda: args.lambda, transform: args.transform, shift: args.shift, mean: meanMethod, period: args.period, level: lv, first: f, label: s.names[0], firstRow: 1 + s.headerRows }, withCancel(yieldToHost, cancel));
    return finiteTable(b.rows.map((r) => [r.h, r.origins, r.coverage ?? "", r.intervalScore ?? "", r.meanErrorOfMean ?? "", r.meanErrorOfMedian ?? "", r.kupiecP ?? "", r.verdict?.headline ?? ""]));
  });
}

/** Reads one column (or row) of published figures; trailing rows blank in every column are dropped. */
function publishedColumns(medians: unknown, lowers: unknown, uppers: unknown): { m: number[]; l: number[]; u: number[] } {
  const cols = [column(medians, "medians"), column(lowers, "lowers"), column(uppers, "uppers")];
  const names = ["medians", "lowers", "uppers"];
  const blank = (c: RawCell): boolean => c === null || c === undefined || (typeof c === "string" && c.trim() === "");
  // a header cell of text on top of all three is allowed
  if (cols.every((c) => typeof c[0] === "string" && !blank(c[0]))) cols.forEach((c, k) => (cols[k] = c.slice(1)));
  const n = Math.max(...cols.map((c) => c.length));
  let last = -1;
  for (let i = 0; i < n; i++) if (cols.some((c) => i < c.length && !blank(c[i]))) last = i;
  if (last < 0) throw new EngineError("input", "medians, lowers and uppers hold no numbers; select the published forecast's three columns.");
  const out = cols.map((c, k) => {
    if (c.length < last + 1) throw new EngineError("input", `medians, lowers and uppers must have one value per month; ${names[k]} has ${c.length} and another has ${last + 1}.`);
    return c.slice(0, last + 1).map((v, i) => {
      if (typeof v === "number") return v;
      if (blank(v)) throw new EngineError("input", `${names[k]} is blank in month ${i + 1}; every month needs a median, a lower and an upper end.`);
      throw new EngineError("input", `${names[k]} in month ${i + 1} is not a number (${JSON.stringify(String(v)).slice(0, 24)}).`);
    });
  });
  return { m: out[0], l: out[1], u: out[2] };
}

/**
 * Total of a forecast published elsewhere as monthly medians and intervals (e.g. next year's budget): mean, median and interval of the total, with the range from independent to perfectly dependent months beside it.
 * @customfunction TOTALFROMINTERVALS
 * @helpurl https://localhost:3000/README.html#fwtotalfromintervals
 * @param {any[][]} medians The published monthly medians (point forecasts), > 0, one per row (a header cell is allowed).
 * @param {any[][]} lowers The lower ends of the published central intervals, same rows.
 * @param {any[][]} uppers The upper ends, same rows.
 * @param {number} level The intervals' coverage in percent (e.g. 80 or 95); the total's interval has the same level.
 * @param {any} [lambda] The Box-Cox λ the forecast was made on: a number (default 0, the log) or "implied" (from the intervals' asymmetry, as FW.IMPLIEDLAMBDA).
 * @param {any} [dependence] How the months move together: "implied" (default: from how the intervals widen), "independent", "comonotone" (perfectly together), or a correlation from 0 to 1.
 * @returns {any[][]} One row: mean, median, low, high of the total; then the low and high under independent months and under comonotone months.
 */
export function TOTALFROMINTERVALS(medians: any[][], lowers: any[][], uppers: any[][], level: number, lambda?: any, dependence?: any): any[][] {
  return guard(() => {
    const lv = requiredNumber(level, "level");
    checkLevelPercent(lv);
    const rawLambda = singleCell(lambda, "lambda");
    const lam = rawLambda === null || rawLambda === undefined || rawLambda === "" ? 0 : readLambda(rawLambda);
    const dep = parseDependence(singleCell(dependence, "dependence"));
    const { m, l, u } = publishedColumns(medians, lowers, uppers);
    const t = publishedTotal(m, l, u, lv, { lambda: lam, dependence: dep });
    const unbounded = naCell("The total's upper end is unbounded at this λ (past its pole).");
    return finiteTable([[
      t.mean ?? naCell(t.notes.find((n) => /mean/.test(n)) ?? "The total's mean does not exist."), t.median, t.interval[0], t.interval[1] ?? unbounded,
      t.independent.interval[0], t.independent.interval[1] ?? unbounded, t.comonotone.interval[0], t.comonotone.interval[1] ?? unbounded,
    ]]);
  });
}

function singleCell(v: unknown, name: string): unknown {
  if (!Array.isArray(v)) return v;
  if (v.length === 1 && Array.isArray(v[0]) && v[0].length === 1) return v[0][0];
  throw new EngineError("input", `${name} must be a single cell.`);
}

/**
 * Company total over several series (one per column) and the next periods: mean, median and interval of the sum, simulated jointly with the series' errors correlated as in their history, and the interval if they were independent.
 * @customfunction TOTALACROSS
 * @helpurl https://localhost:3000/README.html#fwtotalacross
 * @param {any[][]} values The histories: one series per column (at least two; a header row of names is allowed), positive numbers, same rows = same periods.
 * @param {number} horizon Last step to add up (e.g. 12 for the next year of months).
 * @param {string} [method] Forecasting method for every series (default "auto"); see FW.FAN.
 * @param {any} [lambda] Box-Cox λ: a number, "auto" (default, chosen per series), "guerrero", "mle" or "none".
 * @param {number} [level] Interval level in percent (default 95).
 * @param {number} [period] Season length (default 1).
 * @param {number} [seed] Seed of the simulation, a whole number (default 1).
 * @param {number} [from] First step of the window (default 1): steps from..horizon of every series are summed.
 * @returns One row: mean, median, low, high of the total; then the low and high if the series moved independently.
 */
export async function TOTALACROSS(values: any[][], horizon: number, method?: string, lambda?: any, level?: number, period?: number, seed?: number, from?: number): Promise<any[][]> {
  return guardAsync(async () => {
    const args = forecastArgs(method, lambda, period);
    const lv = optionalNumber(level, "level", 95);
    checkLevelPercent(lv);
    const sd = optionalInteger(seed, "seed", 1, 0);
    const h = checkHorizon(requiredNumber(horizon, "horizon"), Math.max(1, Array.isArray(values) ? values.length : 1));
    const start = checkWindowStart(optionalInteger(from, "from", 1, 1), h);
    const s = readSeries(values);
    if (s.series.length < 2) throw new EngineError("input", `FW.TOTALACROSS adds up several series, one per column; the range has ${s.series.length}. For one series use FW.TOTAL.`);
    const aligned = alignSeries(s.series, s.names, 1 + s.headerRows);
    const fs: Forecaster[] = [];
    for (let j = 0; j < aligned.columns.length; j++) {
      if (j > 0) await yieldToHost();
      try {
        fs.push(cachedForecast(aligned.columns[j], { method: args.method, lambda: args.lambda, period: args.period, label: s.names[j], firstRow: 1 + s.headerRows }));
      } catch (e) {
        if (e instanceof EngineError) throw new EngineError(e.code, `${s.names[j]}: ${e.message}`);
        throw e;
      }
    }
    await yieldToHost();
    const t = totalAcross(fs, h, { level: lv, seed: sd, from: start });
    const unbounded = naCell("The total's upper end is unbounded at this λ (past its pole).");
    return finiteTable([[
      t.mean ?? naCell(t.meanNote ?? "The total's mean does not exist."), t.median, t.interval[0], t.interval[1] ?? unbounded,
      t.independent.interval[0], t.independent.interval[1] ?? unbounded,
    ]]);
  });
}

/**
 * Mean on the original scale by Duan's smearing estimate: the average of the back-transformed point forecast plus each residual, for a log or Box-Cox model whose residuals need not be normal.
 * @customfunction SMEARMEAN
 * @helpurl https://localhost:3000/README.html#fwsmearmean
 * @param {any[][]} mu Point forecast on the transformed scale (a cell or a range).
 * @param {any[][]} residuals The model's residuals on the transformed scale (actual minus fitted), at least two; blank cells are skipped.
 * @param {number} lambda The Box-Cox λ of the model's scale (0 = log).
 * @returns {any[][]} The mean on the original scale, same shape as mu.
 */
export function SMEARMEAN(mu: any[][], residuals: any[][], lambda: number): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const e: number[] = [];
    readMatrix(residuals, "residuals").forEach((row, i) => row.forEach((c, j) => {
      if (c === null || c === undefined || (typeof c === "string" && c.trim() === "")) return;
      if (typeof c !== "number") throw new EngineError("input", `residuals row ${i + 1}, column ${j + 1} is not a number (${JSON.stringify(String(c)).slice(0, 24)}); residuals must be numbers.`);
      e.push(c);
    }));
    return elementwise([{ name: "mu", cells: readMatrix(mu, "mu") }], (a) => smearingMean(a, e, l).mean);
  });
}
