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
 * `maxEvaluations`. The simplex lives in one typed array and every trial point in a reused buffer
 * (nothing is allocated per step); `f` must not keep the array it is given.
 * @example minimizeBox((x) => (x[0] - 0.3) ** 2, [0.9]).x[0] // ≈ 0.3
 */
export function minimizeBox(f: (x: Float64Array) => number, x0: ArrayLike<number>, step = 0.1, fTol = 1e-10, xTol = 1e-8, maxEvaluations = 1000): SimplexResult {
  const d = x0.length;
  let evaluations = 0;
  const pts = new Float64Array((d + 1) * d); // row i: point i
  const vals = new Float64Array(d + 1);
  const centroid = new Float64Array(d);
  const xr = new Float64Array(d);
  const xt = new Float64Array(d); // expansion or contraction
  const tmp = new Float64Array(d);
  const evalAt = (x: Float64Array): number => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  for (let j = 0; j < d; j++) pts[j] = clamp01(x0[j]);
  for (let i = 0; i < d; i++) {
    const row = (i + 1) * d;
    for (let j = 0; j < d; j++) pts[row + j] = pts[j];
    const v = pts[row + i];
    pts[row + i] = clamp01(v + step <= 1 ? v + step : v - step);
  }
  for (let i = 0; i <= d; i++) {
    for (let j = 0; j < d; j++) tmp[j] = pts[i * d + j];
    vals[i] = evalAt(tmp);
  }
  const setRow = (i: number, x: Float64Array, v: number): void => {
    for (let j = 0; j < d; j++) pts[i * d + j] = x[j];
    vals[i] = v;
  };
  const along = (t: number, out: Float64Array): Float64Array => {
    for (let j = 0; j < d; j++) out[j] = clamp01(centroid[j] + t * (pts[d * d + j] - centroid[j]));
    return out;
  };
  let converged = false;
  while (evaluations < maxEvaluations) {
    // order the vertices by value (stable insertion sort, rows moved with their values)
    for (let i = 1; i <= d; i++) {
      const v = vals[i];
      if (!(v < vals[i - 1])) continue;
      for (let j = 0; j < d; j++) tmp[j] = pts[i * d + j];
      let k = i - 1;
      while (k >= 0 && vals[k] > v) {
        vals[k + 1] = vals[k];
        for (let j = 0; j < d; j++) pts[(k + 1) * d + j] = pts[k * d + j];
        k--;
      }
      setRow(k + 1, tmp, v);
    }
    let spread = 0;
    for (let i = 1; i <= d; i++) for (let j = 0; j < d; j++) spread = Math.max(spread, Math.abs(pts[i * d + j] - pts[j]));
    if (Math.abs(vals[d] - vals[0]) <= fTol && spread <= xTol) { converged = true; break; }
    if (spread <= 1e-14) { converged = true; break; }
    centroid.fill(0);
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) centroid[j] += pts[i * d + j] / d;
    const fr = evalAt(along(-1, xr));
    if (fr < vals[0]) {
      const fe = evalAt(along(-2, xt));
      if (fe < fr) setRow(d, xt, fe);
      else setRow(d, xr, fr);
    } else if (fr < vals[d - 1]) {
      setRow(d, xr, fr);
    } else {
      const outside = fr < vals[d];
      const fc = evalAt(along(outside ? -0.5 : 0.5, xt));
      if (fc < (outside ? fr : vals[d])) {
        setRow(d, xt, fc);
      } else {
        for (let i = 1; i <= d; i++) {
          for (let j = 0; j < d; j++) {
            const v = pts[i * d + j];
            tmp[j] = clamp01(pts[j] + 0.5 * (v - pts[j]));
          }
          setRow(i, tmp, evalAt(tmp));
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i <= d; i++) if (vals[i] < vals[best]) best = i;
  return { x: Array.from(pts.subarray(best * d, best * d + d)), fx: vals[best], evaluations, converged };
}
