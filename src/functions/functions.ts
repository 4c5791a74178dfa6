import "./runtime-guard";
// The @customfunction wrappers only: coerce → engine → map error (DESIGN.md). Metadata
// (functions.json) is generated from these JSDoc blocks by custom-functions-metadata-plugin.
import {
  backtransformMean, backtransformQuantile, boxCoxInverse, boxCoxShifted, boxCoxShiftedInverse, boxCox,
  fitLambda, impliedLambda, meanFromInterval, screenSeries, yeoJohnson, yeoJohnsonInverse, cleanSeries, EngineError, checkLevelPercent, checkLambda,
} from "../engine";
import { optionalInteger, optionalKeyword, optionalNumber, readMatrix, readSeries, requiredNumber } from "./coerce";
import { toExcelError } from "./excel-errors";
import { elementwise, finiteTable } from "./shape";

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
 * Chooses the Box-Cox λ for each series: λ, its 95% likelihood interval (low, high), and a readable λ.
 * @customfunction FITLAMBDA
 * @helpurl https://localhost:3000/README.html#fwfitlambda
 * @param {any[][]} values The series: one per column (a header row of names is allowed). Positive numbers.
 * @param {string} [method] "guerrero" (default) or "mle" (maximum likelihood).
 * @param {number} [period] Season length: 12 for monthly, 4 for quarterly, 1 for none (default 1). Guerrero's window is the period, or 2 when it is 1.
 * @param {number} [lower] Lowest λ to consider. Default -1.
 * @param {number} [upper] Highest λ to consider. Default 2.
 * @returns {any[][]} One row per series: λ, interval low, interval high, readable λ.
 */
export function FITLAMBDA(values: any[][], method?: string, period?: number, lower?: number, upper?: number): any[][] {
  return guard(() => {
    const m = optionalKeyword(method, "method", ["guerrero", "mle"] as const, "guerrero");
    const p = optionalInteger(period, "period", 1, 1);
    const lo = optionalNumber(lower, "lower", -1);
    const hi = optionalNumber(upper, "upper", 2);
    const s = readSeries(values);
    return finiteTable(s.series.map((cells, j) => {
      try {
        const clean = cleanSeries(cells, s.names[j], 1 + s.headerRows);
        const r = fitLambda(clean.values, { method: m, period: p, lower: lo, upper: hi, label: s.names[j] });
        return [r.lambda, r.interval[0] ?? naCell("The likelihood interval has no lower end within 10 of λ."), r.interval[1] ?? naCell("The likelihood interval has no upper end within 10 of λ."), r.readable];
      } catch (e) {
        const err = toExcelError(e);
        return [err, err, err, err];
      }
    }));
  });
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
      const r = screenSeries(cells, { period: p, label: s.names[j] });
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
 * @param {string} [method] "taylor" (default, second-order approximation) or "exact" (integral; not defined for λ < 0).
 * @returns {any[][]} The mean on the original scale, same shape as mu.
 */
export function BTMEAN(mu: any[][], sd: any[][], lambda: number, method?: string): any[][] {
  return guard(() => {
    const l = checkLambda(requiredNumber(lambda, "lambda"));
    const m = optionalKeyword(method, "method", ["taylor", "exact"] as const, "taylor");
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
 * @param {string} [method] "taylor" (default) or "exact".
 * @returns {any[][]} The mean on the original scale, same shape as median.
 */
export function MEANFROMINTERVAL(median: any[][], lower: any[][], upper: any[][], level: number, lambda?: number, method?: string): any[][] {
  return guard(() => {
    const lv = requiredNumber(level, "level");
    checkLevelPercent(lv);
    const l = checkLambda(optionalNumber(lambda, "lambda", 0));
    const m = optionalKeyword(method, "method", ["taylor", "exact"] as const, "taylor");
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
