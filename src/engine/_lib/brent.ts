// Brent's one-dimensional methods (R. P. Brent, Algorithms for Minimization without
// Derivatives, Prentice-Hall 1973, ch. 4 "zero" and ch. 5 "localmin").

/** Result of a bounded scalar minimisation. */
export interface MinimumResult {
  x: number;
  fx: number;
  evaluations: number;
}

/**
 * Minimises f on [a, b] by Brent's method (golden section + parabolic interpolation).
 * Stops when the bracket is within 2·(rel·|x| + abs) of the best point.
 * Source: Brent (1973) ch. 5, procedure localmin.
 * @example minimizeBounded((x) => (x - 1) ** 2, -3, 3).x // ≈ 1
 */
export function minimizeBounded(
  f: (x: number) => number,
  a: number,
  b: number,
  absTol = 1e-10,
  relTol = 1e-12,
  maxIter = 500,
): MinimumResult {
  const c = 0.5 * (3 - Math.sqrt(5));
  let lo = a;
  let hi = b;
  let v = lo + c * (hi - lo);
  let w = v;
  let x = v;
  let e = 0;
  let d = 0;
  let fx = f(x);
  let fv = fx;
  let fw = fx;
  let evaluations = 1;
  for (let iter = 0; iter < maxIter; iter++) {
    const m = 0.5 * (lo + hi);
    const tol = relTol * Math.abs(x) + absTol;
    const t2 = 2 * tol;
    if (Math.abs(x - m) <= t2 - 0.5 * (hi - lo)) break;
    let useGolden = true;
    if (Math.abs(e) > tol) {
      // parabola through x, w, v
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (lo - x) && p < q * (hi - x)) {
        d = p / q;
        const u = x + d;
        if (u - lo < t2 || hi - u < t2) d = x < m ? tol : -tol;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = (x < m ? hi : lo) - x;
      d = c * e;
    }
    const u = Math.abs(d) >= tol ? x + d : x + (d > 0 ? tol : -tol);
    const fu = f(u);
    evaluations++;
    if (fu <= fx) {
      if (u < x) hi = x;
      else lo = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) lo = u;
      else hi = u;
      if (fu <= fw || w === x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u; fv = fu;
      }
    }
  }
  // The ends themselves are candidates: localmin never evaluates exactly at a or b.
  const fa = f(a);
  const fb = f(b);
  evaluations += 2;
  if (fa < fx) return { x: a, fx: fa, evaluations };
  if (fb < fx) return { x: b, fx: fb, evaluations };
  return { x, fx, evaluations };
}

/**
 * Finds a root of f in [a, b] where f(a) and f(b) have opposite signs (or one is zero).
 * Source: Brent (1973) ch. 4, procedure zero. Returns NaN if the bracket has no sign change;
 * callers check for that and explain it.
 * @example findRoot((x) => x * x - 2, 0, 2) // ≈ 1.41421356
 */
export function findRoot(f: (x: number) => number, a0: number, b0: number, tol = 1e-13, maxIter = 200): number {
  let a = a0;
  let b = b0;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if ((fa > 0) === (fb > 0)) return NaN;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < maxIter; iter++) {
    if ((fb > 0) === (fc > 0)) {
      c = a; fc = fa; d = b - a; e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    const t = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= t || fb === 0) return b;
    if (Math.abs(e) < t || Math.abs(fa) <= Math.abs(fb)) {
      d = m; e = m;
    } else {
      let s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      s = e;
      e = d;
      if (2 * p < 3 * m * q - Math.abs(t * q) && p < Math.abs(0.5 * s * q)) {
        d = p / q;
      } else {
        d = m; e = m;
      }
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > t ? d : m > 0 ? t : -t;
    fb = f(b);
  }
  return b;
}
