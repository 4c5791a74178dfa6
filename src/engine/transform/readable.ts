/** The values practitioners prefer to quote: none, square root, cube root, log, inverse root, inverse. */
export const READABLE_LAMBDAS: readonly number[] = [1, 0.5, 1 / 3, 0, -0.5, -1];

/**
 * A "readable λ": the value from 1, 0.5, 1/3, 0, −0.5, −1 nearest to λ that lies inside the
 * interval [lo, hi]; λ itself when none does or when there is no interval. Rounding λ to such a
 * value is common practice (no published source); it is offered, never forced.
 * @example readableLambda(0.148, [-0.238, 0.534]) // 0
 */
export function readableLambda(lambda: number, interval: readonly [number | null, number | null] | null): number {
  if (!interval) return lambda;
  const lo = interval[0] ?? -Infinity;
  const hi = interval[1] ?? Infinity;
  let best: number | null = null;
  for (const r of READABLE_LAMBDAS) {
    if (r < lo || r > hi) continue;
    if (best === null || Math.abs(r - lambda) < Math.abs(best - lambda)) best = r;
  }
  return best ?? lambda;
}
