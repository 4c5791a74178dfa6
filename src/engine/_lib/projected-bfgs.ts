// Minimisation over the unit box [0, 1]^d with an analytic gradient: a projected quasi-Newton
// method (Bertsekas 1982, SIAM J. Control Optim. 20:221–246): variables on a bound whose gradient
// pushes outward are held there, the others take a BFGS step (Broyden, Fletcher, Goldfarb and
// Shanno 1970; Hessian approximation scaled after the first step, Shanno & Phua 1978) found by
// backtracking along the projected path under the Armijo condition (Nocedal & Wright 2006, ch. 3).
// Optima on a bound or a corner are reached exactly, where a simplex method stops short of them.

/** Result of a projected BFGS run. */
export interface BoxGradientResult {
  x: number[];
  fx: number;
  /** Calls of the objective (each with its gradient). */
  evaluations: number;
  /** True when the projected gradient fell below the tolerance (not merely out of iterations). */
  converged: boolean;
}

/** Options of {@link minimizeBoxWithGradient}. */
export interface BoxGradientOptions {
  /** Largest number of quasi-Newton steps (default 100). */
  maxIterations?: number;
  /** Stop when every free component of the gradient is below this (default 1e-9). */
  gTol?: number;
  /**
   * Stop when the quasi-Newton step promises to lower f by less than fTol·(1 + |f|), or when a
   * step lowered it by less than that and moved by less than xTol (default 1e-13).
   */
  fTol?: number;
  /** See fTol (default 1e-10). */
  xTol?: number;
  /** Longest first step (largest coordinate change) before any curvature is known (default 0.05). */
  firstStep?: number;
  /**
   * The first step is also kept short enough that the gradient predicts a fall of f by at most
   * this much (default 0.03): where f is steep its basin is narrow, and a long first step jumps it.
   */
  firstFall?: number;
}

function clamp01(v: number): number {
  return v < 0 ? 0 : v > 1 ? 1 : v;
}

/**
 * Minimises f over [0, 1]^d from x0; `fg(x, g)` returns f(x) and writes its gradient into g (it
 * must not keep either array). A non-finite value counts as worse than any finite one.
 * @example minimizeBoxWithGradient((x, g) => { g[0] = 2 * (x[0] - 1.5); return (x[0] - 1.5) ** 2; }, [0.2]).x // [1] (on the bound)
 */
export function minimizeBoxWithGradient(fg: (x: Float64Array, g: Float64Array) => number, x0: ArrayLike<number>, options: BoxGradientOptions = {}): BoxGradientResult {
  const maxIterations = options.maxIterations ?? 100;
  const gTol = options.gTol ?? 1e-9;
  const fTol = options.fTol ?? 1e-13;
  const xTol = options.xTol ?? 1e-10;
  const firstStep = options.firstStep ?? 0.05;
  const firstFall = options.firstFall ?? 0.03;
  const d = x0.length;
  const x = new Float64Array(d);
  for (let i = 0; i < d; i++) x[i] = clamp01(x0[i]);
  const g = new Float64Array(d);
  const xt = new Float64Array(d);
  const gt = new Float64Array(d);
  const p = new Float64Array(d);
  const s = new Float64Array(d);
  const yv = new Float64Array(d);
  const Bs = new Float64Array(d);
  const B = new Float64Array(d * d); // Hessian approximation, row-major
  const L = new Float64Array(d * d);
  const free = new Uint8Array(d);
  let evaluations = 1;
  let f = fg(x, g);
  const done = (converged: boolean): BoxGradientResult => ({ x: Array.from(x), fx: f, evaluations, converged });
  if (!Number.isFinite(f)) return done(false);
  const resetB = (scale: number): void => {
    B.fill(0);
    for (let i = 0; i < d; i++) B[i * d + i] = scale;
  };
  let scaled = false;
  resetB(1);
  for (let iter = 0; iter < maxIterations; iter++) {
    // free variables: not on a bound with the gradient pointing out of the box
    let gMax = 0;
    for (let i = 0; i < d; i++) {
      free[i] = (x[i] <= 0 && g[i] > 0) || (x[i] >= 1 && g[i] < 0) ? 0 : 1;
      if (free[i]) gMax = Math.max(gMax, Math.abs(g[i]));
    }
    if (!(gMax > gTol)) return done(true);
    // solve B_FF p_F = −g_F by Cholesky; steepest descent if B_FF is not positive definite
    let ok = true;
    for (let i = 0; i < d && ok; i++) {
      if (!free[i]) continue;
      for (let j = 0; j <= i; j++) {
        if (!free[j]) continue;
        let v = B[i * d + j];
        for (let k = 0; k < j; k++) if (free[k]) v -= L[i * d + k] * L[j * d + k];
        if (i === j) {
          if (!(v > 0)) { ok = false; break; }
          L[i * d + i] = Math.sqrt(v);
        } else L[i * d + j] = v / L[j * d + j];
      }
    }
    if (ok) {
      for (let i = 0; i < d; i++) {
        if (!free[i]) { p[i] = 0; continue; }
        let v = -g[i];
        for (let k = 0; k < i; k++) if (free[k]) v -= L[i * d + k] * p[k];
        p[i] = v / L[i * d + i];
      }
      for (let i = d - 1; i >= 0; i--) {
        if (!free[i]) continue;
        let v = p[i];
        for (let k = i + 1; k < d; k++) if (free[k]) v -= L[k * d + i] * p[k];
        p[i] = v / L[i * d + i];
      }
    }
    let slope = 0;
    for (let i = 0; i < d; i++) slope += g[i] * p[i];
    if (!ok || !(slope < 0)) {
      resetB(1);
      scaled = false;
      slope = 0;
      for (let i = 0; i < d; i++) {
        p[i] = free[i] ? -g[i] : 0;
        slope -= p[i] * p[i];
      }
    }
    // Converged when the step promises less than f's own rounding noise (a concentrated sum of
    // squares carries relative errors near 1e-13): further steps would only chase that noise.
    if (-slope < fTol * (1 + Math.abs(f))) return done(true);
    // No step longer than the box is wide, and none longer than firstStep (nor promising a fall
    // of more than firstFall) while the Hessian approximation knows nothing of f's curvature, so
    // that a start explores its own basin, as a small simplex would, rather than jumping to a
    // bound on the first gradient.
    let pMax = 0;
    for (let i = 0; i < d; i++) pMax = Math.max(pMax, Math.abs(p[i]));
    const cap = scaled ? 1 : Math.min(firstStep, firstFall / gMax);
    if (pMax > cap) for (let i = 0; i < d; i++) p[i] *= cap / pMax;
    // backtracking along the projected path
    let t = 1;
    let ft = Infinity;
    let accepted = false;
    for (let back = 0; back < 40; back++) {
      let dec = 0;
      let moved = 0;
      for (let i = 0; i < d; i++) {
        xt[i] = clamp01(x[i] + t * p[i]);
        dec += g[i] * (xt[i] - x[i]);
        moved = Math.max(moved, Math.abs(xt[i] - x[i]));
      }
      if (moved === 0) break;
      evaluations++;
      ft = fg(xt, gt);
      if (Number.isFinite(ft) && ft <= f + 1e-4 * dec) { accepted = true; break; }
      t *= 0.5;
    }
    if (!accepted) return done(gMax <= 1e3 * gTol);
    // Where the slope at the accepted point is still nearly as steep (the curvature condition of
    // Wolfe fails: a direction with little curvature, e.g. toward a bound), go further while f
    // keeps falling; a quasi-Newton step alone would creep along it.
    for (let grow = 0; grow < 30; grow++) {
      let slope0 = 0, slope1 = 0;
      for (let i = 0; i < d; i++) {
        slope0 += g[i] * (xt[i] - x[i]);
        slope1 += gt[i] * (xt[i] - x[i]);
      }
      if (!(slope1 < 0.9 * slope0)) break;
      const t2 = 2 * t;
      let moved = false;
      for (let i = 0; i < d; i++) {
        s[i] = clamp01(x[i] + t2 * p[i]);
        if (s[i] !== xt[i]) moved = true;
      }
      if (!moved) break;
      evaluations++;
      const f2 = fg(s, yv);
      if (!(f2 < ft)) break;
      t = t2;
      ft = f2;
      xt.set(s);
      gt.set(yv);
    }
    let sy = 0, ss = 0, yy = 0, sMax = 0;
    for (let i = 0; i < d; i++) {
      s[i] = xt[i] - x[i];
      yv[i] = gt[i] - g[i];
      sy += s[i] * yv[i];
      ss += s[i] * s[i];
      yy += yv[i] * yv[i];
      sMax = Math.max(sMax, Math.abs(s[i]));
    }
    const fPrev = f;
    x.set(xt);
    g.set(gt);
    f = ft;
    if (fPrev - f < fTol * (1 + Math.abs(f)) && sMax < xTol) return done(true);
    if (sy > 1e-12 * Math.sqrt(ss * yy)) {
      if (!scaled) {
        resetB(yy / sy);
        scaled = true;
      }
      let sBs = 0;
      for (let i = 0; i < d; i++) {
        let v = 0;
        for (let j = 0; j < d; j++) v += B[i * d + j] * s[j];
        Bs[i] = v;
        sBs += s[i] * v;
      }
      for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) B[i * d + j] += (yv[i] * yv[j]) / sy - (Bs[i] * Bs[j]) / sBs;
    }
  }
  return done(false);
}
