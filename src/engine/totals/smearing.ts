// Duan's smearing estimate of a retransformed mean (Duan 1983, "Smearing estimate: a nonparametric
// retransformation method", JASA 78:605–610): E y ≈ (1/n)Σ f(μ + e_i) over the transformed-scale
// residuals e_i, f the inverse Box-Cox transform. It needs no normality of the residuals.
import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda } from "../_lib/check";
import { boxCoxInverseDetailed } from "../transform/box-cox";

/** A smearing mean and what it met. */
export interface SmearingMean {
  mean: number;
  /** Residuals used. */
  n: number;
  /** Terms f(μ + e_i) that fell on the floor 0 (λ > 0). */
  floored: number;
}

/**
 * Duan's (1983) smearing mean on the original scale: the average of f(μ + e_i) over the residuals
 * e_i (transformed scale, from a log or Box-Cox model), f the inverse Box-Cox transform with λ
 * (0 = log; for λ > 0 a term below −1/λ counts as the floor 0, and is counted). Needs at least two
 * finite residuals. Throws an `unavailable` EngineError when, for λ < 0, some μ + e_i reaches the
 * pole at −1/λ (no finite value exists there).
 * @example smearingMean(0, [-1, 1], 0).mean // (e⁻¹ + e)/2 ≈ 1.5431
 */
export function smearingMean(mu: number, residuals: readonly number[], lambda: number): SmearingMean {
  requireFinite(mu, "mu (the transformed-scale point forecast)");
  requireLambda(lambda);
  const n = residuals.length;
  if (n < 2) throw new EngineError("input", `The smearing mean needs at least 2 residuals; got ${n}. Give the model's transformed-scale residuals (actual minus fitted, on the λ scale).`);
  let sum = 0;
  let floored = 0;
  let pole = 0;
  for (let i = 0; i < n; i++) {
    const e = requireFinite(residuals[i], `residual ${i + 1}`);
    const r = boxCoxInverseDetailed(mu + e, lambda);
    if (r.status === "ok") sum += r.value;
    else if (r.status === "floor") floored++;
    else pole++;
  }
  if (pole) {
    throw new EngineError("unavailable", `The smearing mean does not exist here: with λ = ${fmt(lambda)}, mu ${fmt(mu)} plus ${pole} of the ${n} residuals reaches ${lambda < 0 ? `the pole at ${fmt(-1 / lambda)}` : "a value too large to represent"}. Use a larger λ (e.g. 0) or check the residuals' scale.`);
  }
  const mean = sum / n;
  if (!Number.isFinite(mean)) throw new EngineError("domain", `The smearing mean for mu = ${fmt(mu)} is too large to represent.`);
  return { mean, n, floored };
}
