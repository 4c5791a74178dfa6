import { EngineError } from "../errors";

/** Forecasting methods, by their trade names. */
export const METHODS = [
  "mean", "naive", "seasonal-naive", "drift",
  "ses", "holt", "damped", "seasonal-ses", "holt-winters", "damped-holt-winters",
  "auto",
] as const;

export type MethodName = (typeof METHODS)[number];
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
  const k = typeof name === "string" ? name.trim().toLowerCase() : "";
  const hit = (METHODS as readonly string[]).find((m) => m === k);
  if (!hit) throw new EngineError("input", `Unknown method "${String(name)}". Use one of: ${METHODS.join(", ")}.`);
  return hit as MethodName;
}
