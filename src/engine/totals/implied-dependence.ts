// How the months of a published forecast move together, inferred from how its intervals widen:
// a local-level (simple exponential smoothing) error structure e_h = ε_{T+h} + αΣ_{j<h} ε_{T+j}
// has Var e_h = σ²(1 + (h − 1)α²) and, for h ≤ k, Cov(e_h, e_k) = σ²(α + (h − 1)α²) (METHODS §10;
// the variance is Hyndman, Koehler, Ord & Snyder 2008, Table 6.1, model A,N,N).
import { EngineError } from "../errors";
import { fmt } from "../_lib/check";

/** The local-level structure fitted to published widths, and how well it fits. */
export interface LocalLevelFit {
  /** One-step variance σ² on the transformed scale. */
  sigma2: number;
  /** α² and α (α ≥ 0). */
  alpha2: number;
  alpha: number;
  /** Root mean square of σ̂_h/σ_h − 1 over the months (the fitted sd against the published one). */
  rmsRelative: number;
  /** Largest |σ̂_h/σ_h − 1|. */
  maxRelative: number;
  /** True when rmsRelative ≤ {@link IMPLIED_FIT_TOLERANCE}. */
  ok: boolean;
  note: string;
}

/** The largest root-mean-square relative error of the fitted widths accepted by the implied dependence (10%; our choice). */
export const IMPLIED_FIT_TOLERANCE = 0.1;

/**
 * Fits σ² and α² of a local-level structure to transformed-scale sds σ_h (h = 1..H) by relative
 * least squares: minimise Σ_h [(σ² + σ²α²(h − 1))/σ_h² − 1]², linear in a = σ² and b = σ²α²
 * (b ≥ 0: widths that do not grow give α = 0, independent months). Reports the fit's relative
 * error in the sds; `ok` is false beyond {@link IMPLIED_FIT_TOLERANCE}. Structure: METHODS §10.
 * @example fitLocalLevelWidening([0.1, 0.1 * Math.sqrt(1.25), 0.1 * Math.sqrt(1.5)]).alpha // 0.5
 */
export function fitLocalLevelWidening(sd: readonly number[]): LocalLevelFit {
  const H = sd.length;
  if (H === 0) throw new EngineError("input", "Need at least one month to fit how the intervals widen.");
  for (const s of sd) if (!(Number.isFinite(s) && s > 0)) throw new EngineError("input", `Each month's transformed-scale sd must be > 0; got ${fmt(s)}.`);
  const y = sd.map((s) => s * s);
  if (H === 1) return { sigma2: y[0], alpha2: 0, alpha: 0, rmsRelative: 0, maxRelative: 0, ok: true, note: "One month: there is no widening to fit." };
  // rows x_h = [1/y_h, (h−1)/y_h], target 1
  let s11 = 0, s12 = 0, s22 = 0, t1 = 0, t2 = 0;
  for (let h = 0; h < H; h++) {
    const u = 1 / y[h];
    const v = h / y[h];
    s11 += u * u; s12 += u * v; s22 += v * v; t1 += u; t2 += v;
  }
  const det = s11 * s22 - s12 * s12;
  let a = (t1 * s22 - t2 * s12) / det;
  let b = (s11 * t2 - s12 * t1) / det;
  let shrinking = false;
  if (!(b >= 0) || !(a > 0) || !Number.isFinite(a) || !Number.isFinite(b)) {
    shrinking = !(b >= 0);
    b = 0;
    a = t1 / s11;
  }
  let ss = 0;
  let mx = 0;
  for (let h = 0; h < H; h++) {
    const rel = Math.sqrt(a + b * h) / sd[h] - 1;
    ss += rel * rel;
    mx = Math.max(mx, Math.abs(rel));
  }
  const rmsRelative = Math.sqrt(ss / H);
  const alpha2 = b / a;
  const ok = rmsRelative <= IMPLIED_FIT_TOLERANCE;
  const pct = (x: number): string => `${Number((100 * x).toPrecision(2))}%`;
  let note = `A local-level structure with α = ${fmt(Math.sqrt(alpha2))} reproduces the published widths to ${pct(rmsRelative)} (root mean square; worst month ${pct(mx)}).`;
  if (shrinking) note += " The widths do not grow with the horizon, so the fit takes α = 0 (independent months).";
  if (!ok) note += ` That is worse than the ${pct(IMPLIED_FIT_TOLERANCE)} accepted, so the implied dependence is not used.`;
  return { sigma2: a, alpha2, alpha: Math.sqrt(alpha2), rmsRelative, maxRelative: mx, ok, note };
}

/**
 * The correlation matrix (row-major H×H) of a local-level structure's h-step errors:
 * ρ_hk = (α + (h − 1)α²)/√[(1 + (h − 1)α²)(1 + (k − 1)α²)] for h < k (METHODS §10).
 * @example localLevelCorrelation(1, 2)[1] // √(1/2) ≈ 0.7071 (a random walk)
 */
export function localLevelCorrelation(alpha: number, H: number): Float64Array {
  if (!(Number.isFinite(alpha) && alpha >= 0)) throw new EngineError("input", `alpha must be ≥ 0; got ${fmt(alpha)}.`);
  const a2 = alpha * alpha;
  const R = new Float64Array(H * H);
  for (let h = 0; h < H; h++) {
    for (let k = 0; k < H; k++) {
      if (h === k) R[h * H + k] = 1;
      else {
        const i = Math.min(h, k);
        const j = Math.max(h, k);
        R[h * H + k] = (alpha + i * a2) / Math.sqrt((1 + i * a2) * (1 + j * a2));
      }
    }
  }
  return R;
}
