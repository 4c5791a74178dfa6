// Unconstrained quasi-Newton minimisation: BFGS updates of the inverse Hessian (Broyden 1970,
// Fletcher 1970, Goldfarb 1970, Shanno 1970) with finite-difference gradients (forward while the
// gradient is large, central near the minimum) and a backtracking line search under the Armijo
// condition (Nocedal & Wright's standard scheme).

/** Result of a BFGS run. */
export interface BfgsResult {
  x: number[];
  fx: number;
  evaluations: number;
  converged: boolean;
}

/**
 * Central-difference gradient of f at x (step 1e-5·max(1, |x_i|)).
 * @example numericGradient((x) => x[0] ** 2, [3]) // ≈ [6]
 */
export function numericGradient(f: (x: number[]) => number, x: readonly number[], fx?: number): number[] {
  const g: number[] = new Array(x.length);
  const xx = x.slice();
  for (let i = 0; i < x.length; i++) {
    const h = 1e-5 * Math.max(1, Math.abs(x[i]));
    xx[i] = x[i] + h;
    const fp = f(xx);
    xx[i] = x[i] - h;
    const fm = f(xx);
    xx[i] = x[i];
    g[i] = Number.isFinite(fp) && Number.isFinite(fm) ? (fp - fm) / (2 * h) : fx !== undefined && Number.isFinite(fp) ? (fp - fx) / h : 0;
  }
  return g;
}

/**
 * Forward-difference gradient of f at x (step 1e-7·max(1, |x_i|)), d evaluations instead of 2d:
 * used while the gradient is large, where its O(h) error does not matter for the direction.
 * @example forwardGradient((x) => x[0] ** 2, [3], 9) // ≈ [6]
 */
export function forwardGradient(f: (x: number[]) => number, x: readonly number[], fx: number): number[] {
  const g: number[] = new Array(x.length);
  const xx = x.slice();
  for (let i = 0; i < x.length; i++) {
    const h = 1e-7 * Math.max(1, Math.abs(x[i]));
    xx[i] = x[i] + h;
    const fp = f(xx);
    xx[i] = x[i];
    if (Number.isFinite(fp)) g[i] = (fp - fx) / h;
    else {
      xx[i] = x[i] - h;
      const fm = f(xx);
      xx[i] = x[i];
      g[i] = Number.isFinite(fm) ? (fx - fm) / h : 0;
    }
  }
  return g;
}

/** Above this largest gradient entry, minimizeBfgs uses forward differences (see forwardGradient). */
const FORWARD_ABOVE = 1;

/**
 * Minimises f from x0. Stops when the gradient's largest entry is below `gTol`, when a step
 * changes f by less than `fTol`·(1 + |f|) while the gradient is below √gTol, when `stop(x, f)`
 * says so after a step (converged stays false), or after `maxIterations`. The first step from an identity inverse Hessian is at most 1 long in every
 * coordinate, and the identity is scaled by s′y/y′y before the first update (Shanno & Phua 1978;
 * Nocedal & Wright 2006, eq. 6.20); gradients are forward differences while their largest entry
 * exceeds 1 and central differences after.
 * @example minimizeBfgs((x) => (x[0] - 1) ** 2 + 10 * (x[1] + 2) ** 2, [0, 0]).x // ≈ [1, −2]
 */
export function minimizeBfgs(f: (x: number[]) => number, x0: readonly number[], gTol = 1e-7, fTol = 1e-13, maxIterations = 200, stop?: (x: readonly number[], fx: number) => boolean): BfgsResult {
  const d = x0.length;
  let evaluations = 0;
  const F = (x: number[]): number => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const gradient = (x: number[], fx: number, previous: number[] | null): number[] => {
    if (previous && Math.max(...previous.map(Math.abs)) > FORWARD_ABOVE) {
      const g = forwardGradient(F, x, fx);
      if (Math.max(...g.map(Math.abs)) > FORWARD_ABOVE) return g;
    }
    return numericGradient(F, x, fx);
  };
  let x = x0.slice();
  let fx = F(x);
  if (d === 0) return { x, fx, evaluations, converged: true };
  let g = gradient(x, fx, [Infinity]);
  let H = identity(d);
  let fresh = true; // H is the (unscaled) identity
  let converged = false;
  for (let iter = 0; iter < maxIterations; iter++) {
    if (Math.max(...g.map(Math.abs)) < gTol) {
      converged = true;
      break;
    }
    let p = H.map((row) => -row.reduce((s, v, j) => s + v * g[j], 0));
    let slope = p.reduce((s, v, i) => s + v * g[i], 0);
    if (!(slope < 0)) {
      H = identity(d);
      fresh = true;
      p = g.map((v) => -v);
      slope = -g.reduce((s, v) => s + v * v, 0);
    }
    let step = 1;
    if (fresh) {
      const longest = Math.max(...p.map(Math.abs));
      if (longest > 1) step = 1 / longest;
    }
    let xn = x;
    let fn = Infinity;
    for (let k = 0; k < 40; k++) {
      xn = x.map((v, i) => v + step * p[i]);
      fn = F(xn);
      if (fn <= fx + 1e-4 * step * slope) break;
      step *= 0.5;
    }
    if (!(fn < fx)) {
      if (!fresh) {
        H = identity(d);
        fresh = true;
        continue;
      }
      converged = true;
      break;
    }
    const gn = gradient(xn, fn, g);
    const s = xn.map((v, i) => v - x[i]);
    const y = gn.map((v, i) => v - g[i]);
    const sy = s.reduce((acc, v, i) => acc + v * y[i], 0);
    const small = Math.abs(fx - fn) < fTol * (1 + Math.abs(fn));
    x = xn;
    g = gn;
    fx = fn;
    if (stop && stop(x, fx)) break;
    if (small && Math.max(...g.map(Math.abs)) < Math.sqrt(gTol)) {
      converged = true;
      break;
    }
    if (sy > 1e-12) {
      if (fresh) {
        const yy = y.reduce((acc, v) => acc + v * v, 0);
        const scale = sy / yy;
        for (let i = 0; i < d; i++) H[i][i] = scale;
        fresh = false;
      }
      const Hy = H.map((row) => row.reduce((acc, v, j) => acc + v * y[j], 0));
      const yHy = y.reduce((acc, v, i) => acc + v * Hy[i], 0);
      const rho = 1 / sy;
      for (let i = 0; i < d; i++) {
        for (let j = 0; j < d; j++) {
          H[i][j] += rho * ((1 + rho * yHy) * s[i] * s[j] - (Hy[i] * s[j] + s[i] * Hy[j]));
        }
      }
    }
  }
  return { x, fx, evaluations, converged };
}

function identity(d: number): number[][] {
  return Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => (i === j ? 1 : 0)));
}
