import { minimizeBounded, MinimumResult } from "./brent";

/**
 * Global-then-local minimisation on [a, b]: scan a grid of `points` values, then run Brent's
 * method in the two grid cells around the best grid point. Guards against Brent settling in
 * a poorer local minimum when the objective has more than one.
 */
export function minimizeScanned(f: (x: number) => number, a: number, b: number, points = 25, absTol = 1e-10): MinimumResult {
  let best = 0;
  let fbest = Infinity;
  const step = (b - a) / (points - 1);
  for (let i = 0; i < points; i++) {
    const v = f(a + i * step);
    if (v < fbest) { fbest = v; best = i; }
  }
  const lo = a + Math.max(0, best - 1) * step;
  const hi = a + Math.min(points - 1, best + 1) * step;
  const r = minimizeBounded(f, lo, hi, absTol);
  return { x: r.x, fx: r.fx, evaluations: r.evaluations + points };
}
