import { EngineError } from "../errors";
import { fmt, requireLambda } from "../_lib/check";

/** Default search bounds for λ: [−1, 2] (common practice; the range statsmodels uses for Guerrero). */
export const DEFAULT_LAMBDA_BOUNDS: readonly [number, number] = [-1, 2];

/**
 * Validates λ search bounds: both in [−5, 5] and lower < upper.
 * @example checkLambdaBounds(-1, 2) // [-1, 2]
 */
export function checkLambdaBounds(lower: number | undefined, upper: number | undefined): [number, number] {
  const lo = lower === undefined ? DEFAULT_LAMBDA_BOUNDS[0] : requireLambda(lower, "lower bound for λ");
  const hi = upper === undefined ? DEFAULT_LAMBDA_BOUNDS[1] : requireLambda(upper, "upper bound for λ");
  if (!(lo < hi)) throw new EngineError("input", `The lower bound for λ (${fmt(lo)}) must be below the upper bound (${fmt(hi)}).`);
  return [lo, hi];
}

/** Which bound (if any) an estimate sits on, within a small tolerance of the bracket width. */
export function boundHit(lambda: number, bounds: readonly [number, number]): "lower" | "upper" | null {
  const tol = 1e-6 * (bounds[1] - bounds[0]);
  if (lambda - bounds[0] <= tol) return "lower";
  if (bounds[1] - lambda <= tol) return "upper";
  return null;
}
