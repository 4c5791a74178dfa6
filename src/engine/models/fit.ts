// From a raw series to a fitted, transformed forecasting model: trim, check, choose λ, transform,
// fit the method (or choose one by AICc). The one entry the faces use.
import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import { cap } from "../_lib/cells";
import { cleanSeries, listRows, observedValues, ZerosRule } from "../series/clean";
import type { RawCell } from "../series/screen";
import { isConstant } from "../series/positive";
import { fitLambda, LambdaChoice } from "../transform/fit-lambda";
import { MLE_MIN_LENGTH } from "../transform/lambda-mle";
import { autoShift, parseShift } from "../transform/shift";
import { describeTransform, makeTransform, TransformKind, TransformSpec, TRANSFORMS, transformForward } from "../transform/spec";
import { fitBenchmark } from "./benchmarks";
import { fitSmoothing } from "./ets";
import { isBenchmark, MethodName, parseMethod, SmoothingMethod } from "./methods";
import { isArimaMethod, parseArimaMethod } from "./arima/order";
import { fitArima } from "./arima/fit";
import { autoArima } from "./arima/auto";
import { chooseLambdaAuto, originalScaleFit, OriginalScaleFit, profileModelLambda } from "./lambda-choice";
import { AutoChoice, fitAuto } from "./select";
import type { FittedModel, StepMoments } from "./types";

/**
 * How λ is given: a number, or chosen — `auto` (readable λ and form together by original-scale
 * AICc), `model` (the chosen model's own maximum-likelihood λ), `guerrero`, `mle` (i.i.d. profile
 * likelihood) — or `none` (no transform, the same as transform `none`).
 */
export type LambdaSpec = number | "auto" | "model" | "guerrero" | "mle" | "none";

/** Options for {@link fitForecast}. */
export interface ForecastOptions {
  /** Default `auto` (lowest AICc among the smoothing models). */
  method?: MethodName | string;
  /** Default `auto`: the readable λ and the form chosen together by AICc on the original scale. */
  lambda?: LambdaSpec | string;
  /** Default `box-cox`; `yeo-johnson` accepts zeros and negatives; `none` forecasts the values as they are. */
  transform?: TransformKind | string;
  /** Added to every value before Box-Cox: a number, or `auto` (see autoShift). Default 0. */
  shift?: number | "auto" | string;
  /** Seasonal period; default 1 (none). */
  period?: number;
  label?: string;
  /** Row number of the first cell, for messages (default 1). */
  firstRow?: number;
  /** `missing`: zeros are missing observations (closed periods); default `keep` (zeros are values). */
  zeros?: ZerosRule;
}

/** A fitted model with its transform. Immutable. */
export interface Forecaster {
  readonly label: string;
  /** The method used (for `auto`, the winner). */
  readonly method: Exclude<MethodName, "auto">;
  readonly requestedMethod: MethodName;
  /** The transform the model is fitted on (kind, λ, shift). */
  readonly transform: TransformSpec;
  /** λ of the transform, or null for no transform (the same as transform.lambda). */
  readonly lambda: number | null;
  readonly lambdaSource: "given" | "auto" | "model" | "guerrero" | "mle" | "none";
  readonly lambdaChoice: LambdaChoice | null;
  readonly period: number;
  /** Values used (after trimming). */
  readonly n: number;
  readonly leadingBlanks: number;
  readonly trailingBlanks: number;
  /** Missing observations inside the series (blanks, or zeros read as missing), handled by the model. */
  readonly missing: number;
  /** Zeros read as missing observations (`zeros: "missing"`). */
  readonly zerosAsMissing: number;
  /** The last observed value on the original scale. */
  readonly lastValue: number;
  /** The model on the transformed scale; null for a constant series. */
  readonly model: FittedModel | null;
  /** The model's log-likelihood and AICc on the original scale (comparable across λ); null for a constant series. */
  readonly fit: OriginalScaleFit | null;
  readonly auto: AutoChoice | null;
  /** Sentences a user should read (trimming, constant series, choices made). */
  readonly notes: readonly string[];
  /** Per-step normal forecasts on the transformed scale. */
  forecast(h: number): StepMoments[];
  /** Sample paths on the transformed scale, row-major paths × h. */
  simulate(h: number, paths: number, seed: number): Float64Array;
  /** Sample paths driven by given standard-normal innovations (see FittedModel.simulateShocks); null when the model cannot. */
  readonly simulateShocks: ((h: number, paths: number, seed: number, shocks: Float64Array) => Float64Array) | null;
}

const LAMBDA_WORDS = '"auto", "model", "guerrero", "mle" or "none"';

function parseLambda(spec: LambdaSpec | string | undefined): LambdaSpec {
  if (spec === undefined || spec === null) return "auto";
  if (typeof spec === "number") {
    if (!Number.isFinite(spec) || spec < -5 || spec > 5) throw new EngineError("input", `lambda must be between -5 and 5, or ${LAMBDA_WORDS}; got ${spec}.`);
    return spec;
  }
  const k = String(spec).trim().toLowerCase();
  if (k === "auto" || k === "model" || k === "guerrero" || k === "mle" || k === "none") return k;
  const asNumber = Number(k);
  if (k !== "" && Number.isFinite(asNumber)) return parseLambda(asNumber);
  throw new EngineError("input", `Unknown lambda "${String(spec)}". Use a number between -5 and 5, or ${LAMBDA_WORDS}.`);
}

/**
 * Reads a transform keyword (default `box-cox`).
 * @example parseTransform("Yeo-Johnson") // "yeo-johnson"
 */
export function parseTransform(kind: unknown): TransformKind {
  if (kind === undefined || kind === null || kind === "") return "box-cox";
  const k = String(kind).trim().toLowerCase();
  const hit = TRANSFORMS.find((t) => t === k);
  if (!hit) throw new EngineError("input", `Unknown transform "${String(kind)}". Use "box-cox" (default), "yeo-johnson" (zeros and negatives) or "none".`);
  return hit;
}

/**
 * Checks a forecast horizon: a whole number from 1 to 10 × the series length.
 * @example checkHorizon(12, 72) // 12
 */
export function checkHorizon(h: unknown, n: number): number {
  if (typeof h !== "number" || !Number.isFinite(h)) throw new EngineError("input", `horizon must be a whole number of steps ahead, e.g. 12; got ${typeof h === "string" ? `the text "${h}"` : String(h)}.`);
  if (!Number.isInteger(h) || h < 1) throw new EngineError("input", `horizon must be a whole number of at least 1; got ${fmt(h)}.`);
  if (h > 10 * n) throw new EngineError("input", `horizon ${h} is more than 10 times the series length (${n}); forecasts that far out say nothing. Use at most ${10 * n}.`);
  return h;
}

/**
 * Fits a forecasting model to a positive series on a Box-Cox scale (or untransformed with
 * `lambda: "none"`): trims leading/trailing blanks (reported), reads interior blanks (and, with
 * `zeros: "missing"`, zeros) as missing observations (counted in `missing`; at most
 * MAX_MISSING_SHARE of the periods; METHODS §8), chooses λ on the observed points (Guerrero 1993 / Box & Cox 1964), fits the method (METHODS §3: benchmarks, or
 * exponential smoothing by maximum likelihood, Hyndman et al. 2008), and returns an immutable
 * forecaster. A constant series gives a degenerate forecaster (σ = 0) with a note.
 * @example fitForecast(airPassengers, { method: "holt-winters", lambda: 0, period: 12 }).forecast(1)[0].mean // ≈ 6.10
 */
export function fitForecast(cells: readonly RawCell[], options: ForecastOptions = {}): Forecaster {
  const label = options.label ?? "the series";
  const requestedMethod = parseMethod(options.method ?? "auto");
  const lambdaSpec = parseLambda(options.lambda as LambdaSpec | string | undefined);
  const period = options.period ?? 1;
  if (typeof period !== "number" || !Number.isInteger(period) || period < 1) {
    throw new EngineError("input", `period must be a whole number of at least 1 (12 for monthly data, 4 for quarterly, 1 for none); got ${String(period)}.`);
  }
  if (isArimaMethod(requestedMethod)) parseArimaMethod(requestedMethod, period); // a seasonal order needs a period
  const seasonalMethod = requestedMethod === "seasonal-naive" || requestedMethod === "seasonal-ses" || requestedMethod === "holt-winters" || requestedMethod === "damped-holt-winters";
  if (seasonalMethod && period < 2) {
    throw new EngineError("input", `${requestedMethod} is seasonal: give the period (12 for monthly data, 4 for quarterly).`);
  }
  const clean = cleanSeries(cells, label, options.firstRow ?? 1, { zeros: options.zeros });
  const y = clean.values;
  const observed = observedValues(y);
  const notes: string[] = [];
  if (clean.leadingBlanks) notes.push(`${clean.leadingBlanks} leading blank${clean.leadingBlanks > 1 ? "s" : ""} skipped.`);
  if (clean.trailingBlanks) notes.push(`${clean.trailingBlanks} trailing blank${clean.trailingBlanks > 1 ? "s" : ""} skipped.`);
  if (clean.zerosAsMissing) notes.push(clean.zerosAsMissing > 1 ? `${clean.zerosAsMissing} zeros read as missing observations (closed periods).` : "1 zero read as a missing observation (a closed period).");
  if (clean.missing) notes.push(`${clean.missing} missing observation${clean.missing > 1 ? "s" : ""} inside the series (row${clean.missing > 1 ? "s" : ""} ${listRows(clean.missingRows)}) of ${y.length} periods: the model allows for ${clean.missing > 1 ? "them" : "it"} (not filled in); with exponential smoothing the uncertainty grows through each gap and later intervals include it.`);
  if (y.length < 2) throw new EngineError("input", `${label} is too short to forecast: it has ${y.length} value; at least 2 are needed (more for most methods).`);
  if (seasonalMethod && y.length < 2 * period) {
    throw new EngineError("input", `${requestedMethod} needs two full seasons (${2 * period} values with period ${period}); ${label} has ${y.length}.`);
  }

  // The transform, λ and the shift
  let kind = parseTransform(options.transform);
  if (lambdaSpec === "none") kind = "none";
  const shiftSpec = parseShift(options.shift);
  if (kind !== "box-cox" && shiftSpec !== 0) {
    throw new EngineError("input", `shift applies to Box-Cox only; with transform "${kind}" leave shift empty.`);
  }
  if (kind === "none" && typeof lambdaSpec === "number") {
    throw new EngineError("input", `transform "none" takes no λ; leave lambda empty (or "auto"), or use transform "box-cox" with λ = ${fmt(lambdaSpec)}.`);
  }
  const shift = kind === "box-cox" ? (shiftSpec === "auto" ? autoShift(y) : shiftSpec) : 0;
  if (kind === "box-cox") {
    let firstBad = -1;
    for (let i = 0; i < y.length; i++) if (!Number.isNaN(y[i]) && !(y[i] + shift > 0)) { firstBad = i; break; }
    if (firstBad >= 0) {
      const row = (options.firstRow ?? 1) + clean.leadingBlanks + firstBad;
      const c = autoShift(y);
      const zeros = observed.filter((v) => v === 0).length;
      const negatives = observed.filter((v) => v < 0).length;
      const what = [zeros ? `${zeros} zero${zeros > 1 ? "s" : ""}` : "", negatives ? `${negatives} negative value${negatives > 1 ? "s" : ""}` : ""].filter(Boolean).join(" and ");
      throw new EngineError("input", shift === 0
        ? `${cap(label)} has ${what} (first: ${fmt(y[firstBad])} in row ${row}); Box-Cox needs values > 0. Use shift "auto" (adds ${fmt(c)}; command line --shift auto) or transform "yeo-johnson" (command line --transform yeo-johnson).`
        : `${cap(label)} has ${fmt(y[firstBad])} in row ${row}, and ${fmt(y[firstBad])} + shift ${fmt(shift)} is not > 0. Use a shift above ${fmt(-Math.min(...observed))}, shift "auto" (adds ${fmt(c)}) or transform "yeo-johnson".`);
    }
  }
  if (shift !== 0) notes.push(`Box-Cox of the values + ${fmt(shift)} (shift${shiftSpec === "auto" ? " auto: −minimum + half the smallest step above it" : ""}); results are back on the original scale with the shift taken off.`);

  let transform: TransformSpec = makeTransform("none", null);
  let lambdaSource: Forecaster["lambdaSource"] = "none";
  let lambdaChoice: LambdaChoice | null = null;
  let chosen: { model: FittedModel; auto: AutoChoice | null } | null = null;
  let autoForm: Exclude<MethodName, "auto"> | null = null;
  const constantY = isConstant(observed);
  if (kind !== "none") {
    if (typeof lambdaSpec === "number") {
      transform = makeTransform(kind, lambdaSpec, shift);
      lambdaSource = "given";
    } else if (constantY) {
      transform = makeTransform(kind, 1, shift);
      lambdaSource = "given";
      notes.push("The series is constant, so λ = 1 (no transform) is used.");
    } else if (lambdaSpec === "guerrero" || lambdaSpec === "mle") {
      if (kind !== "box-cox") throw new EngineError("input", `λ by ${lambdaSpec} is defined for Box-Cox; with transform "${kind}" use lambda "auto", "model" or a number.`);
      const window = period > 1 ? period : 2;
      if (lambdaSpec === "guerrero" && y.length < 2 * window) {
        throw new EngineError("input", `${label} is too short for Guerrero's method (${y.length} values; two windows of ${window} are needed). Use lambda "auto", "model" or "mle".`);
      }
      if (observed.length < MLE_MIN_LENGTH) throw new EngineError("input", `${label} is too short to choose λ (${observed.length} observed values; at least ${MLE_MIN_LENGTH}). Give λ as a number (0 for the log) or "none".`);
      lambdaChoice = fitLambda(shift ? y.map((v) => v + shift) : y, { method: lambdaSpec, period, label });
      transform = makeTransform(kind, lambdaChoice.lambda, shift);
      lambdaSource = lambdaSpec;
      if (lambdaChoice.note) notes.push(lambdaChoice.note);
      if (lambdaChoice.skippedWindows) notes.push(`Guerrero's method skipped ${lambdaChoice.skippedWindows} window${lambdaChoice.skippedWindows > 1 ? "s" : ""} of ${window} with too many missing points.`);
    } else {
      if (observed.length < MLE_MIN_LENGTH) throw new EngineError("input", `${label} is too short to choose λ (${observed.length} observed values; at least ${MLE_MIN_LENGTH}). Give λ as a number (0 for the log) or "none".`);
      const a = chooseLambdaAuto(y, { kind, shift, method: requestedMethod, period, label });
      if (lambdaSpec === "auto") {
        transform = a.transform;
        // On a very long series λ was chosen on the latest values; the model is then fitted to all of them.
        chosen = a.model.n === y.length ? { model: a.model, auto: a.auto } : null;
        autoForm = a.model.method;
        lambdaSource = "auto";
        lambdaChoice = { lambda: a.lambda, method: "auto", interval: [null, null], level: 0.95, readable: a.lambda, loglik: a.fit.loglik, bounds: [-1, 1], onBound: null, window: null, skippedWindows: 0, n: observed.length, missing: clean.missing, note: a.note };
        notes.push(a.note);
      } else {
        const m = profileModelLambda(y, a.model.method, { kind, shift, period, label });
        transform = makeTransform(kind, m.lambda, shift);
        lambdaSource = "model";
        lambdaChoice = { lambda: m.lambda, method: "model", interval: m.interval, level: m.level, readable: m.lambda, loglik: m.loglik, bounds: m.bounds, onBound: m.onBound, window: null, skippedWindows: 0, n: observed.length, missing: clean.missing, note: m.note };
        notes.push(`λ = ${fmt(m.lambda)} maximises the likelihood of ${a.model.method} on the original scale${requestedMethod === "auto" ? ` (the form auto chose)` : ""}.`);
        if (m.note) notes.push(m.note);
      }
    }
  }
  const lambda = transform.lambda;
  const w = y.map((v) => transformForward(transform, v));
  if (w.some((v, i) => !Number.isFinite(v) && !Number.isNaN(y[i]))) throw new EngineError("domain", `The ${describeTransform(transform)} transform overflows on ${label}'s values; use a smaller λ (e.g. 0).`);

  const base = {
    label, requestedMethod, transform, lambda, lambdaSource, lambdaChoice, period, n: y.length,
    leadingBlanks: clean.leadingBlanks, trailingBlanks: clean.trailingBlanks, missing: clean.missing, zerosAsMissing: clean.zerosAsMissing,
    lastValue: y[y.length - 1],
  };

  if (isConstant(observedValues(w))) {
    notes.push(`${label} is constant (${fmt(y[0])}): the forecast is that value with no uncertainty (σ = 0).`);
    const v = w[0];
    const method = requestedMethod === "auto" ? "naive" : requestedMethod;
    return Object.freeze({
      ...base, method, model: null, fit: null, auto: null, notes: Object.freeze(notes),
      forecast: (h: number): StepMoments[] => Array.from({ length: h }, (_, i) => ({ h: i + 1, mean: v, sd: 0 })),
      simulate: (h: number, paths: number): Float64Array => new Float64Array(paths * h).fill(v),
      simulateShocks: (h: number, paths: number): Float64Array => new Float64Array(paths * h).fill(v),
    });
  }

  let model: FittedModel;
  let auto: AutoChoice | null = null;
  if (chosen) {
    model = chosen.model;
    auto = chosen.auto;
  } else if (requestedMethod === "auto" && autoForm !== null) {
    // λ and the form were chosen together (on the latest values): fit that form to the whole series.
    model = fitSmoothing(w, autoForm as SmoothingMethod, period);
  } else if (requestedMethod === "auto") {
    auto = fitAuto(w, period);
    model = auto.model;
    notes.push(`auto chose ${model.method} (lowest AICc${auto.candidates.length > 1 ? `, ${auto.margin.toFixed(1)} below the next best` : ""}).`);
  } else if (isArimaMethod(requestedMethod)) {
    const spec = parseArimaMethod(requestedMethod, period);
    if (spec.auto) {
      const search = autoArima(w, period);
      model = search.model;
      notes.push(...search.notes);
    } else {
      model = fitArima(w, spec.order);
    }
    notes.push(...((model as { notes?: readonly string[] }).notes ?? []));
  } else if (isBenchmark(requestedMethod)) {
    model = fitBenchmark(w, requestedMethod, period);
  } else {
    model = fitSmoothing(w, requestedMethod as SmoothingMethod, period);
  }
  const fit = originalScaleFit(model, y, transform, lambdaSource !== "given" && lambdaSource !== "none");
  const m = model;
  return Object.freeze({
    ...base,
    method: m.method,
    model: m,
    fit,
    auto,
    notes: Object.freeze(notes),
    forecast: (h: number): StepMoments[] => m.forecast(h),
    simulate: (h: number, paths: number, seed: number): Float64Array => m.simulate(h, paths, seed),
    simulateShocks: m.simulateShocks ? (h: number, paths: number, seed: number, shocks: Float64Array): Float64Array => (m.simulateShocks as NonNullable<FittedModel["simulateShocks"]>)(h, paths, seed, shocks) : null,
  });
}
