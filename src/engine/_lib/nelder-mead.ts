// Nelder–Mead simplex minimisation on the unit box [0, 1]^d (points are clamped into the box, so
// optima on a bound are reached exactly). Nelder & Mead (1965), The Computer Journal 7:308–313,
// with the standard coefficients (reflection 1, expansion 2, contraction ½, shrink ½) and the
// convergence test of Lagarias, Reeds, Wright & Wright (1998), SIAM J. Optim. 9:112–147.

/** Result of a Nelder–Mead run. */
export interface SimplexResult {
  x: number[];
  fx: number;
  evaluations: number;
  converged: boolean;
}

function clamp01(v: number): number {
  return v < 0 ? 0 : v > 1 ? 1 : v;
}

/**
 * Minimises f over the unit box from the start x0, with an initial simplex of edge `step`.
 * Stops when the simplex's values agree to `fTol` (absolute) and its points to `xTol`, or after
 * `maxEvaluations`.
 * @example minimizeBox((x) => (x[0] - 0.3) ** 2, [0.9]).x[0] // ≈ 0.3
 */
export function minimizeBox(f: (x: number[]) => number, x0: number[], step = 0.1, fTol = 1e-10, xTol = 1e-8, maxEvaluations = 1000): SimplexResult {
  const d = x0.length;
  let evaluations = 0;
  const evalAt = (x: number[]): number => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const pts: number[][] = [x0.map(clamp01)];
  for (let i = 0; i < d; i++) {
    const p = pts[0].slice();
    p[i] = p[i] + step <= 1 ? p[i] + step : p[i] - step;
    pts.push(p.map(clamp01));
  }
  const vals = pts.map(evalAt);
  let converged = false;
  while (evaluations < maxEvaluations) {
    // order
    const idx = vals.map((_, i) => i).sort((a, b) => vals[a] - vals[b]);
    const P = idx.map((i) => pts[i]);
    const V = idx.map((i) => vals[i]);
    for (let i = 0; i <= d; i++) { pts[i] = P[i]; vals[i] = V[i]; }
    let spread = 0;
    for (let i = 1; i <= d; i++) for (let j = 0; j < d; j++) spread = Math.max(spread, Math.abs(pts[i][j] - pts[0][j]));
    if (Math.abs(vals[d] - vals[0]) <= fTol && spread <= xTol) { converged = true; break; }
    if (spread <= 1e-14) { converged = true; break; }
    const centroid = new Array<number>(d).fill(0);
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) centroid[j] += pts[i][j] / d;
    const along = (t: number): number[] => centroid.map((c, j) => clamp01(c + t * (pts[d][j] - c)));
    const xr = along(-1);
    const fr = evalAt(xr);
    if (fr < vals[0]) {
      const xe = along(-2);
      const fe = evalAt(xe);
      if (fe < fr) { pts[d] = xe; vals[d] = fe; } else { pts[d] = xr; vals[d] = fr; }
    } else if (fr < vals[d - 1]) {
      pts[d] = xr; vals[d] = fr;
    } else {
      const outside = fr < vals[d];
      const xc = along(outside ? -0.5 : 0.5);
      const fc = evalAt(xc);
      if (fc < (outside ? fr : vals[d])) {
        pts[d] = xc; vals[d] = fc;
      } else {
        for (let i = 1; i <= d; i++) {
          pts[i] = pts[i].map((v, j) => clamp01(pts[0][j] + 0.5 * (v - pts[0][j])));
          vals[i] = evalAt(pts[i]);
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i <= d; i++) if (vals[i] < vals[best]) best = i;
  return { x: pts[best], fx: vals[best], evaluations, converged };
}
