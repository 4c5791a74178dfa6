import { EngineError } from "../errors";
import { lambdaGuerrero } from "./guerrero";
import { lambdaMle } from "./lambda-mle";
import { readableLambda } from "./readable";

/** How λ is chosen. */
export type LambdaMethod = "guerrero" | "mle";

/** Options for {@link fitLambda}. */
export interface FitLambdaOptions {
  method?: LambdaMethod;
  /** Seasonal period (1 = none). Guerrero's window is the period, or 2 when the period is 1. */
  period?: number;
  lower?: number;
  upper?: number;
  /** Level of the likelihood-ratio interval, as a fraction (default 0.95). */
  level?: number;
  label?: string;
}

/** A chosen λ with the evidence behind it. */
export interface LambdaChoice {
  lambda: number;
  method: LambdaMethod;
  /** 95% likelihood-ratio interval from the Box-Cox profile likelihood (for either method). */
  interval: [number | null, number | null];
  level: number;
  /** Nearest of 1, ½, ⅓, 0, −½, −1 inside the interval, else λ. */
  readable: number;
  /** Profile log-likelihood at λ (for `mle`), null for `guerrero`. */
  loglik: number | null;
  bounds: [number, number];
  onBound: "lower" | "upper" | null;
  /** Guerrero's window R, when that method was used. */
  window: number | null;
  /** Guerrero's windows skipped for missing points (0 otherwise). */
  skippedWindows: number;
  /** Observed values used (missing ones, NaN, are not counted). */
  n: number;
  /** Missing observations (NaN) in the series given. */
  missing: number;
  /** A sentence a user can read, e.g. why λ sits on a bound. */
  note: string;
}

/**
 * Chooses λ for a positive series by Guerrero's method (default; Guerrero 1993) or by maximum
 * likelihood (Box & Cox 1964), and reports the likelihood-ratio interval (Box & Cox 1964) and a
 * readable λ. For Guerrero the interval is the range of λ the profile likelihood supports, so
 * the readable value is one the data do not reject. Missing observations (NaN) are left out of the
 * likelihood (it is of i.i.d. values, so only the observed points count); Guerrero's windows keep
 * their places and skip those with too many missing points.
 * @example fitLambda(airPassengers, { method: "mle" }).readable // 0
 */
export function fitLambda(values: readonly number[], options: FitLambdaOptions = {}): LambdaChoice {
  const method = options.method ?? "guerrero";
  if (method !== "guerrero" && method !== "mle") {
    throw new EngineError("input", `Unknown λ method "${String(method)}". Use "guerrero" or "mle".`);
  }
  const period = options.period ?? 1;
  if (!Number.isInteger(period) || period < 1) {
    throw new EngineError("input", `period must be a whole number of at least 1 (12 for monthly data, 4 for quarterly, 1 for none); got ${period}.`);
  }
  const observed = values.filter((v) => !Number.isNaN(v));
  const mle = lambdaMle(observed, { lower: options.lower, upper: options.upper, level: options.level, label: options.label });
  let lambda = mle.lambda;
  let onBound = mle.onBound;
  let window: number | null = null;
  let skippedWindows = 0;
  if (method === "guerrero") {
    const g = lambdaGuerrero(values, { window: period > 1 ? period : 2, lower: options.lower, upper: options.upper, label: options.label });
    lambda = g.lambda;
    onBound = g.onBound;
    window = g.window;
    skippedWindows = g.skipped;
  }
  const notes: string[] = [];
  if (onBound) {
    notes.push(`λ sits on the ${onBound} bound (${mle.bounds[onBound === "lower" ? 0 : 1]}); the best value may lie beyond it: widen the bounds to see.`);
  }
  const readable = readableLambda(lambda, mle.interval);
  if (readable !== lambda) notes.push(`λ = ${round(readable)} is inside the ${Math.round(mle.level * 100)}% likelihood interval and easier to explain.`);
  return {
    lambda,
    method,
    interval: mle.interval,
    level: mle.level,
    readable,
    loglik: method === "mle" ? mle.loglik : null,
    bounds: mle.bounds,
    onBound,
    window,
    skippedWindows,
    n: observed.length,
    missing: values.length - observed.length,
    note: notes.join(" "),
  };
}

function round(x: number): string {
  return String(Number(x.toFixed(3)));
}
