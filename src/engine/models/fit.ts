// From a raw series to a fitted, transformed forecasting model: trim, check, choose λ, transform,
// fit the method (or choose one by AICc). The one entry the faces use.
import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import { cleanSeries, listRows, observedValues, ZerosRule } from "../series/clean";
import type { RawCell } from "../series/screen";
import { requirePositiveSeries, isConstant } from "../series/positive";
import { boxCoxUnchecked } from "../transform/box-cox";
import { fitLambda, LambdaChoice } from "../transform/fit-lambda";
import { guerreroWindowsUsable } from "../transform/guerrero";
import { MLE_MIN_LENGTH } from "../transform/lambda-mle";
import { fitBenchmark } from "./benchmarks";
import { fitSmoothing } from "./ets";
import { isBenchmark, MethodName, parseMethod, SmoothingMethod } from "./methods";
import { isArimaMethod, parseArimaMethod } from "./arima/order";
import { fitArima } from "./arima/fit";
import { autoArima } from "./arima/auto";
import { AutoChoice, fitAuto } from "./select";
import type { FittedModel, StepMoments } from "./types";

/** How λ is given: a number, or chosen (`auto`, `guerrero`, `mle`), or `none` (no transform). */
export type LambdaSpec = number | "auto" | "guerrero" | "mle" | "none";

/** Options for {@link fitForecast}. */
export interface ForecastOptions {
  /** Default `auto` (lowest AICc among the smoothing models). */
  method?: MethodName | string;
  /** Default `auto`: Guerrero's λ (window = period, 2 when period is 1), by maximum likelihood when the series is too short for two windows. */
  lambda?: LambdaSpec | string;
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
  /** λ of the Box-Cox transform, or null for no transform. */
  readonly lambda: number | null;
  readonly lambdaSource: "given" | "guerrero" | "mle" | "none";
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

function parseLambda(spec: LambdaSpec | string | undefined): LambdaSpec {
  if (spec === undefined || spec === null) return "auto";
  if (typeof spec === "number") {
    if (!Number.isFinite(spec) || spec < -5 || spec > 5) throw new EngineError("input", `lambda must be between -5 and 5, or "auto", "guerrero", "mle" or "none"; got ${spec}.`);
    return spec;
  }
  const k = String(spec).trim().toLowerCase();
  if (k === "auto" || k === "guerrero" || k === "mle" || k === "none") return k;
  const asNumber = Number(k);
  if (k !== "" && Number.isFinite(asNumber)) return parseLambda(asNumber);
  throw new EngineError("input", `Unknown lambda "${String(spec)}". Use a number between -5 and 5, or "auto", "guerrero", "mle" or "none".`);
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

  // λ and the transform
  let lambda: number | null;
  let lambdaSource: Forecaster["lambdaSource"];
  let lambdaChoice: LambdaChoice | null = null;
  if (lambdaSpec === "none") {
    lambda = null;
    lambdaSource = "none";
  } else {
    // a missing observation stands in as 1 here, so the message's positions are the series' own
    requirePositiveSeries(clean.missing ? y.map((v) => (Number.isNaN(v) ? 1 : v)) : y, 1, label, "a Box-Cox forecast");
    if (typeof lambdaSpec === "number") {
      lambda = lambdaSpec;
      lambdaSource = "given";
    } else if (isConstant(observed)) {
      lambda = 1;
      lambdaSource = "given";
      notes.push("The series is constant, so λ = 1 (no transform) is used.");
    } else {
      const window = period > 1 ? period : 2;
      let method: "mle" | "guerrero" = lambdaSpec === "mle" || (lambdaSpec === "auto" && y.length < 2 * window) ? "mle" : "guerrero";
      if (observed.length < MLE_MIN_LENGTH) {
        throw new EngineError("input", `${label} is too short to choose λ (${observed.length} observed values; at least ${MLE_MIN_LENGTH}). Give λ as a number (0 for the log) or "none".`);
      }
      let fallback = "";
      if (method === "guerrero" && lambdaSpec === "auto" && clean.missing > 0) {
        const usable = guerreroWindowsUsable(y, window);
        if (usable.used < 2) {
          method = "mle";
          fallback = `λ by maximum likelihood: only ${usable.used} of Guerrero's ${usable.groups} windows of ${window} have few enough missing points.`;
        }
      }
      lambdaChoice = fitLambda(y, { method, period, label });
      lambda = lambdaChoice.lambda;
      lambdaSource = method;
      if (fallback) notes.push(fallback);
      else if (lambdaSpec === "auto" && method === "mle") notes.push(`λ by maximum likelihood: the series is too short for Guerrero's windows of ${window}.`);
      if (lambdaChoice.onBound) notes.push(lambdaChoice.note);
      if (lambdaChoice.skippedWindows) notes.push(`Guerrero's method skipped ${lambdaChoice.skippedWindows} window${lambdaChoice.skippedWindows > 1 ? "s" : ""} of ${window} with too many missing points.`);
    }
  }
  // missing observations stay NaN on the transformed scale
  const w = lambda === null ? y.slice() : y.map((v) => (Number.isNaN(v) ? NaN : boxCoxUnchecked(v, lambda as number)));
  for (const v of w) {
    if (!Number.isFinite(v) && !Number.isNaN(v)) throw new EngineError("domain", `Box-Cox with λ = ${fmt(lambda as number)} overflows on ${label}'s values; use a smaller λ (e.g. 0).`);
  }

  const base = {
    label, requestedMethod, lambda, lambdaSource, lambdaChoice, period, n: y.length,
    leadingBlanks: clean.leadingBlanks, trailingBlanks: clean.trailingBlanks, missing: clean.missing, zerosAsMissing: clean.zerosAsMissing,
    lastValue: y[y.length - 1],
  };

  if (isConstant(observedValues(w))) {
    notes.push(`${label} is constant (${fmt(y[0])}): the forecast is that value with no uncertainty (σ = 0).`);
    const v = w[0];
    const method = requestedMethod === "auto" ? "naive" : requestedMethod;
    return Object.freeze({
      ...base, method, model: null, auto: null, notes: Object.freeze(notes),
      forecast: (h: number): StepMoments[] => Array.from({ length: h }, (_, i) => ({ h: i + 1, mean: v, sd: 0 })),
      simulate: (h: number, paths: number): Float64Array => new Float64Array(paths * h).fill(v),
      simulateShocks: (h: number, paths: number): Float64Array => new Float64Array(paths * h).fill(v),
    });
  }

  let model: FittedModel;
  let auto: AutoChoice | null = null;
  if (requestedMethod === "auto") {
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
  const m = model;
  return Object.freeze({
    ...base,
    method: m.method,
    model: m,
    auto,
    notes: Object.freeze(notes),
    forecast: (h: number): StepMoments[] => m.forecast(h),
    simulate: (h: number, paths: number, seed: number): Float64Array => m.simulate(h, paths, seed),
    simulateShocks: m.simulateShocks ? (h: number, paths: number, seed: number, shocks: Float64Array): Float64Array => (m.simulateShocks as NonNullable<FittedModel["simulateShocks"]>)(h, paths, seed, shocks) : null,
  });
}
