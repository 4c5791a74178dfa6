import { EngineError } from "../errors";
import { lambdaGuerrero } from "./guerrero";
import { lambdaMle } from "./lambda-mle";
import { readableLambda } from "./readable";

/**
 * How λ is chosen: `guerrero` (Guerrero 1993), `mle` (i.i.d. profile likelihood, Box & Cox 1964),
 * and, under a forecasting model (models/lambda-choice), `model` and `auto`.
 */
export type LambdaMethod = "guerrero" | "mle" | "model" | "auto";

/** Options for {@link fitLambda}. */
export interface FitLambdaOptions {
  method?: "guerrero" | "mle";
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
  /**
   * The likelihood-ratio interval that belongs to this estimate (`mle`: the i.i.d. profile; `model`:
   * the forecasting model's profile); [null, null] for `guerrero` and `auto` (no likelihood of their own).
   */
  interval: [number | null, number | null];
  level: number;
  /** `mle`: the nearest of 1, ½, ⅓, 0, −½, −1 inside the interval, else λ; otherwise λ itself. */
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
 * likelihood (Box & Cox 1964). `mle` reports its likelihood-ratio interval (measured from the true
 * maximum: when λ̂ sits on a search bound the search widens to [−5, 5]) and a readable λ inside it.
 * `guerrero` has no likelihood, so it reports no interval; its note says when the i.i.d. likelihood
 * interval leaves Guerrero's λ out. Missing observations (NaN) are left out of the likelihood (it is
 * of i.i.d. values, so only the observed points count); Guerrero's windows keep their places and
 * skip those with too many missing points.
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
  const missing = values.length - observed.length;
  let mle = lambdaMle(observed, { lower: options.lower, upper: options.upper, level: options.level, label: options.label });
  const requested = mle.bounds;
  const notes: string[] = [];
  if (method === "mle" && mle.onBound && (mle.bounds[0] > -5 || mle.bounds[1] < 5)) {
    // Never use a λ on a search bound silently: look for the true maximum, and measure the interval from it.
    mle = lambdaMle(observed, { lower: -5, upper: 5, level: options.level, label: options.label });
    notes.push(`The likelihood rises past the ${requested[0]} to ${requested[1]} search range, so the search was widened to −5 to 5.`);
  }
  if (method === "mle") {
    if (mle.onBound) notes.push(`λ sits on the ${mle.onBound} end of the search (${mle.bounds[mle.onBound === "lower" ? 0 : 1]}); the likelihood may keep rising beyond it.`);
    const readable = readableLambda(mle.lambda, mle.interval);
    if (readable !== mle.lambda) notes.push(`λ = ${round(readable)} is inside the ${Math.round(mle.level * 100)}% likelihood interval and easier to explain.`);
    return { lambda: mle.lambda, method, interval: mle.interval, level: mle.level, readable, loglik: mle.loglik, bounds: mle.bounds, onBound: mle.onBound, window: null, skippedWindows: 0, n: observed.length, missing, note: notes.join(" ") };
  }
  const g = lambdaGuerrero(values, { window: period > 1 ? period : 2, lower: options.lower, upper: options.upper, label: options.label });
  if (g.onBound) notes.push(`Guerrero's λ sits on the ${g.onBound} bound (${g.bounds[g.onBound === "lower" ? 0 : 1]}); the best value may lie beyond it: widen the bounds to see.`);
  const [lo, hi] = mle.interval;
  if ((lo !== null && g.lambda < lo) || (hi !== null && g.lambda > hi)) {
    notes.push(`The i.i.d. likelihood (Box & Cox 1964) disagrees: its ${Math.round(mle.level * 100)}% interval, ${lo === null ? "open" : round(lo)} to ${hi === null ? "open" : round(hi)}, leaves Guerrero's λ out.`);
  }
  return { lambda: g.lambda, method, interval: [null, null], level: mle.level, readable: g.lambda, loglik: null, bounds: g.bounds, onBound: g.onBound, window: g.window, skippedWindows: g.skipped, n: observed.length, missing, note: notes.join(" ") };
}

function round(x: number): string {
  return String(Number(x.toFixed(3)));
}
