import { EngineError, isEngineError } from "../errors";
import { countMissing } from "../series/clean";
import { checkGapsFit, fitSmoothing, minimumLength, SmoothingFitOptions } from "./ets";
import { SmoothingMethod } from "./methods";
import type { FittedModel } from "./types";

/** One candidate in an automatic choice. */
export interface Candidate { method: SmoothingMethod; aicc: number; loglik: number; k: number }

/** The outcome of {@link fitAuto}. */
export interface AutoChoice {
  model: FittedModel;
  candidates: Candidate[];
  /** AICc of the runner-up minus the winner's (0 when only one model fitted). */
  margin: number;
  /** Methods left out, with the reason (e.g. too short for a seasonal model). */
  skipped: { method: SmoothingMethod; reason: string }[];
}

const ORDER: SmoothingMethod[] = ["ses", "holt", "damped", "seasonal-ses", "holt-winters", "damped-holt-winters"];

/**
 * The smoothing model with the lowest AICc among those that fit the period and the length:
 * seasonal forms only when the period is ≥ 2 and the series holds two full seasons (and, with
 * missing observations, one in every season). AICc as in
 * Hyndman et al. (2008), §7.1 (Hurvich & Tsai 1989 correction).
 * @example fitAuto(logAirPassengers, 12).model.method // "holt-winters"
 */
export function fitAuto(w: readonly number[], period: number, fitOptions: SmoothingFitOptions = {}): AutoChoice {
  const candidates: Candidate[] = [];
  const missing = countMissing(w);
  const skipped: AutoChoice["skipped"] = [];
  let best: FittedModel | null = null;
  for (const method of ORDER) {
    const seasonal = method === "seasonal-ses" || method === "holt-winters" || method === "damped-holt-winters";
    if (seasonal && period < 2) continue;
    const need = minimumLength(method, period);
    if (w.length < need) {
      skipped.push({ method, reason: `needs at least ${need} values` });
      continue;
    }
    if (missing > 0) {
      try {
        checkGapsFit(w, method, period);
      } catch (e) {
        if (!isEngineError(e)) throw e;
        skipped.push({ method, reason: e.message });
        continue;
      }
    }
    const model = fitSmoothing(w, method, period, fitOptions);
    candidates.push({ method, aicc: model.aicc, loglik: model.loglik, k: model.k });
    if (!best || model.aicc < best.aicc) best = model;
  }
  if (!best) {
    if (missing > 0 && skipped.length) throw new EngineError("input", `No smoothing model can be fitted: ${skipped[0].reason}`);
    throw new EngineError("input", `The series is too short for any smoothing model: it has ${w.length} values, at least ${minimumLength("ses", 1)} are needed.`);
  }
  const sorted = candidates.map((c) => c.aicc).sort((a, b) => a - b);
  return { model: best, candidates, margin: sorted.length > 1 ? sorted[1] - sorted[0] : 0, skipped };
}
