import { EngineError } from "../errors";
import { isArimaMethod, parseArimaMethod } from "./arima/order";

/** Forecasting methods, by their trade names. */
export const METHODS = [
  "mean", "naive", "seasonal-naive", "drift",
  "ses", "holt", "damped", "seasonal-ses", "holt-winters", "damped-holt-winters",
  "arima", "auto",
] as const;

/** A method name: one of METHODS, or an ARIMA order in the project's syntax (`arima:p,d,q/P,D,Q`). */
export type MethodName = (typeof METHODS)[number] | `arima:${string}`;
export type SmoothingMethod = "ses" | "holt" | "damped" | "seasonal-ses" | "holt-winters" | "damped-holt-winters";
export type BenchmarkMethod = "mean" | "naive" | "seasonal-naive" | "drift";

/** The exponential-smoothing methods as additive-error state-space forms (Hyndman et al. 2008). */
export const SMOOTHING: Readonly<Record<SmoothingMethod, { trend: boolean; damped: boolean; seasonal: boolean; code: string; title: string }>> = {
  ses: { trend: false, damped: false, seasonal: false, code: "A,N,N", title: "simple exponential smoothing" },
  holt: { trend: true, damped: false, seasonal: false, code: "A,A,N", title: "Holt's linear trend" },
  damped: { trend: true, damped: true, seasonal: false, code: "A,Ad,N", title: "damped trend" },
  "seasonal-ses": { trend: false, damped: false, seasonal: true, code: "A,N,A", title: "simple smoothing with additive season" },
  "holt-winters": { trend: true, damped: false, seasonal: true, code: "A,A,A", title: "Holt-Winters additive" },
  "damped-holt-winters": { trend: true, damped: true, seasonal: true, code: "A,Ad,A", title: "damped Holt-Winters additive" },
};

/**
 * True for the four benchmark methods.
 * @example isBenchmark("drift") // true
 */
export function isBenchmark(m: MethodName): m is BenchmarkMethod {
  return m === "mean" || m === "naive" || m === "seasonal-naive" || m === "drift";
}

/**
 * Reads a method name (case-insensitive); the message lists the valid ones.
 * @example parseMethod("Holt-Winters") // "holt-winters"
 */
export function parseMethod(name: unknown): MethodName {
  const k = typeof name === "string" ? name.trim().toLowerCase().replace(/\s+/g, "") : "";
  if (k !== "arima" && isArimaMethod(k)) {
    // Syntax and limits checked here (the period is checked when the model is fitted).
    parseArimaMethod(k, 2);
    return k as MethodName;
  }
  const hit = (METHODS as readonly string[]).find((m) => m === k);
  if (!hit) throw new EngineError("input", `Unknown method "${String(name)}". Use one of: ${METHODS.join(", ")}, or an ARIMA order such as "arima:0,1,1" or "arima:0,1,1/0,1,1".`);
  return hit as MethodName;
}
