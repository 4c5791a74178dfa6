// The mean a user sees, for a normal forecast on any transform the forecaster uses: exact where it
// exists, the Taylor value with a stated accuracy where it does not (METHODS §4 and §9).
import { EngineError, isEngineError } from "../errors";
import { fmt } from "../_lib/check";
import { integrate } from "../_lib/quadrature";
import { backtransformMeanExact, MeanMethod } from "./backtransform";
import { normalPdf } from "./normal";
import { exactMeanExists, inverseSecondDerivative, poleProbability, TransformSpec, transformInverse } from "../transform/spec";

/** A Taylor mean is flagged when its correction ½σ²f″(μ) exceeds this share of the median (issue 12; a stated choice, common practice). */
export const TAYLOR_NOTE_CORRECTION = 0.05;
/** A Taylor mean is flagged when the normal puts more than this probability past the pole; an exact mean when more than this falls on the floor. */
export const TAYLOR_NOTE_POLE = 0.001;

/** The mean of one step with how it was made and how far to trust it. */
export interface MeanResult {
  /** The mean on the original scale, or null where it does not exist (with `note`). */
  value: number | null;
  /** The formula that gave `value`. */
  used: "exact" | "taylor" | null;
  /** The exact mean (null where it does not exist or could not be computed). */
  exact: number | null;
  /** The second-order Taylor value (null where f(μ) does not exist). */
  taylor: number | null;
  /** The Taylor correction ½σ²f″(μ) as a share of the median's distance from the floor (|f(μ) + shift|). */
  correction: number | null;
  /** Probability the normal puts past the inverse's pole (0 when it has none). */
  poleProbability: number;
  /** Probability on the floor (Box-Cox λ > 0), 0 otherwise. */
  floorProbability: number;
  /** Why `value` is null. */
  note: string | null;
  /** A caution that goes with a value shown (a large Taylor correction, mass past the pole or on the floor). */
  accuracy: string | null;
}

/**
 * Reads a mean-method keyword (default `auto`); the message lists the three.
 * @example parseMeanMethod("Exact") // "exact"
 */
export function parseMeanMethod(method: unknown): MeanMethod {
  if (method === undefined || method === null || method === "") return "auto";
  const k = String(method).trim().toLowerCase();
  if (k === "auto" || k === "exact" || k === "taylor") return k;
  throw new EngineError("input", `Unknown mean "${String(method)}". Use "auto" (default: exact where it exists), "exact" or "taylor".`);
}

function taylorOf(t: TransformSpec, mu: number, sigma: number): { value: number; correction: number } | null {
  const med = transformInverse(t, mu);
  if (med.status !== "ok") return null;
  const adj = 0.5 * sigma * sigma * inverseSecondDerivative(t, mu);
  const value = med.value + adj;
  if (!Number.isFinite(value)) return null;
  const scale = Math.abs(med.value + t.shift);
  return { value, correction: scale > 0 ? Math.abs(adj) / scale : Infinity };
}

function exactOf(t: TransformSpec, mu: number, sigma: number): { value: number; floor: number } {
  if (t.kind === "none") return { value: mu, floor: 0 };
  if (t.kind === "box-cox") {
    const e = backtransformMeanExact(mu, sigma, t.lambda as number);
    return { value: e.mean - t.shift, floor: e.floorProbability };
  }
  // Yeo-Johnson, 0 ≤ λ ≤ 2: ∫ g⁻¹(μ + σz)φ(z)dz by adaptive Gauss–Kronrod, split where the
  // integrand bends (w = 0) and near the peaks of its two tails (z = ±σ).
  const f = (z: number): number => {
    const r = transformInverse(t, mu + sigma * z);
    return r.status === "ok" ? r.value * normalPdf(z) : 0;
  };
  const lo = -sigma - 40;
  const hi = sigma + 40;
  const cuts = [lo, -sigma, 0, sigma, hi, -mu / sigma].filter((c) => c >= lo && c <= hi).sort((a, b) => a - b);
  let value = 0;
  for (let i = 0; i + 1 < cuts.length; i++) if (cuts[i + 1] > cuts[i]) value += integrate(f, cuts[i], cuts[i + 1], 1e-13, 1e-300).value;
  if (!Number.isFinite(value)) throw new EngineError("domain", `The mean for mu = ${fmt(mu)}, sd = ${fmt(sigma)} is too large to represent.`);
  return { value, floor: 0 };
}

function pct(p: number): string {
  return `${Number((100 * p).toPrecision(2))}%`;
}

/**
 * The mean on the original scale of w ~ N(μ, σ²) on the transform's scale, by `method`:
 * - `exact`: E g⁻¹(w) — exp(μ + σ²/2) at Box-Cox λ = 0, quadrature with the floor for λ > 0
 *   (Gauss–Kronrod, Piessens et al. 1983), quadrature for Yeo-Johnson 0 ≤ λ ≤ 2; null with a
 *   note where it does not exist (a pole the normal reaches);
 * - `taylor`: f(μ) + ½σ²f″(μ), the second-order expansion (METHODS §4);
 * - `auto` (default): exact where it exists, else Taylor with its accuracy stated (METHODS §9):
 *   `accuracy` warns when the correction exceeds 5% of the median or more than 0.1% of the
 *   normal lies past the pole (and, for an exact mean, more than 0.1% on the floor).
 * The shift of a shifted Box-Cox is taken off at the end.
 * @example forecastMean(makeTransform("box-cox", 0), 5, 0.5).value // 168.17414165184545 (= e^5.125)
 */
export function forecastMean(t: TransformSpec, mu: number, sigma: number, method: MeanMethod = "auto"): MeanResult {
  const pole = poleProbability(t, mu, sigma);
  const taylor = taylorOf(t, mu, sigma);
  const base: MeanResult = { value: null, used: null, exact: null, taylor: taylor ? taylor.value : null, correction: taylor ? taylor.correction : null, poleProbability: pole, floorProbability: 0, note: null, accuracy: null };
  if (t.kind === "none" || sigma === 0) {
    const m = transformInverse(t, mu);
    if (m.status !== "ok") return { ...base, note: "The mean is unbounded (past the pole of the transform or too large to represent)." };
    return { ...base, value: m.value, used: "exact", exact: m.value, taylor: m.value, correction: 0 };
  }
  const exists = exactMeanExists(t);
  let exact: { value: number; floor: number } | null = null;
  let exactError: string | null = null;
  if (exists && method !== "taylor") {
    try {
      exact = exactOf(t, mu, sigma);
    } catch (e) {
      if (!isEngineError(e)) throw e;
      exactError = e.message;
    }
  }
  const withExact = { ...base, exact: exact ? exact.value : null, floorProbability: exact ? exact.floor : 0 };
  const lam = fmt(t.lambda as number);
  if (method === "exact" || (method === "auto" && exists)) {
    if (exact) {
      const accuracy = exact.floor > TAYLOR_NOTE_POLE ? `${pct(exact.floor)} of the normal forecast on the λ = ${lam} scale falls below the floor (no positive value); the normal assumption is strained there.` : null;
      return { ...withExact, value: exact.value, used: "exact", accuracy };
    }
    if (exactError) return { ...withExact, note: exactError };
    return {
      ...withExact,
      note: `The exact mean does not exist for λ = ${lam}: the normal forecast on that scale reaches the pole of the inverse transform, where the original value is unbounded.` +
        (taylor ? ` Use mean "taylor" or "auto" for the Taylor approximation (${fmt(taylor.value)}).` : ""),
    };
  }
  // taylor (asked for, or auto where no exact mean exists)
  if (!taylor) return { ...withExact, note: "The Taylor mean does not exist here: the median itself is past the pole or on the floor of the transform." };
  const cautions: string[] = [];
  if (taylor.correction > TAYLOR_NOTE_CORRECTION) cautions.push(`its correction is ${pct(taylor.correction)} of the median (over ${pct(TAYLOR_NOTE_CORRECTION)})`);
  if (pole > TAYLOR_NOTE_POLE) cautions.push(`${pct(pole)} of the normal forecast lies past the pole (over ${pct(TAYLOR_NOTE_POLE)})`);
  const accuracy = cautions.length
    ? `The mean is a second-order Taylor approximation and may be far off: ${cautions.join(" and ")}${exists ? "" : `; no exact mean exists at λ = ${lam}`}.`
    : null;
  return { ...withExact, value: taylor.value, used: "taylor", accuracy };
}
