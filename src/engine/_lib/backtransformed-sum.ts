// Seeded simulation of Σ_h f(w_h) for a joint normal w on the Box-Cox scale: w_h = μ_h + σ_h·(L z)_h,
// z standard normal, L the lower Cholesky factor of the correlation matrix (null: independent),
// f the inverse Box-Cox transform with its floor (λ > 0) and pole (λ < 0) rules.
import { LAMBDA_ZERO } from "../transform/box-cox";
import { createRandom } from "./random";

/** Simulated totals (sorted ascending) with what the simulation met. */
export interface SimulatedSum {
  totals: Float64Array;
  /** Paths whose total is unbounded (a step past the pole of λ < 0). */
  unbounded: number;
  /** Step values that fell on the floor 0 (λ > 0). */
  floored: number;
  /** Mean of the simulated totals and its Monte Carlo standard error (null when a path is unbounded). */
  mean: number | null;
  monteCarloError: number | null;
}

/** Simulates `paths` totals Σ_h f(μ_h + σ_h (L z)_h) with a seeded generator. */
export function simulateBacktransformedSum(mu: readonly number[], sd: readonly number[], L: Float64Array | null, lambda: number, paths: number, seed: number): SimulatedSum {
  const H = mu.length;
  const rng = createRandom(seed);
  const z = new Float64Array(H);
  const totals = new Float64Array(paths);
  const logScale = Math.abs(lambda) < LAMBDA_ZERO;
  const { exp, log1p } = Math;
  let unbounded = 0;
  let floored = 0;
  for (let r = 0; r < paths; r++) {
    for (let h = 0; h < H; h++) z[h] = rng.normal();
    let t = 0;
    for (let h = 0; h < H; h++) {
      let e = z[h];
      if (L !== null) {
        e = 0;
        const o = h * H;
        for (let k = 0; k <= h; k++) e += L[o + k] * z[k];
      }
      const w = mu[h] + sd[h] * e;
      if (logScale) t += exp(w);
      else {
        const base = lambda * w;
        if (base > -1) t += exp(log1p(base) / lambda);
        else if (lambda > 0) floored++;
        else t = Infinity;
      }
    }
    if (!Number.isFinite(t)) unbounded++;
    totals[r] = t;
  }
  let mean: number | null = null;
  let monteCarloError: number | null = null;
  if (unbounded === 0) {
    let s = 0;
    for (let r = 0; r < paths; r++) s += totals[r];
    mean = s / paths;
    let ss = 0;
    for (let r = 0; r < paths; r++) ss += (totals[r] - mean) ** 2;
    monteCarloError = Math.sqrt(ss / (paths - 1) / paths);
  }
  totals.sort();
  return { totals, unbounded, floored, mean, monteCarloError };
}
