// Solves the symmetric positive (semi-)definite system A x = b by Cholesky factorisation, adding
// a tiny multiple of the diagonal's mean when A is singular to working precision (a ridge that
// leaves well-posed systems untouched).

/**
 * Solves A x = b for symmetric A (row-major, d×d); A and b are not modified. `work` (optional)
 * supplies the scratch arrays so repeated solves allocate nothing; the result then lives in work.x.
 * @example solveSymmetric(new Float64Array([4, 2, 2, 3]), new Float64Array([2, 1]), 2) // ≈ [0.5, 0]
 */
export function solveSymmetric(A: Float64Array, b: Float64Array, d: number, work?: { L: Float64Array; y: Float64Array; x: Float64Array }): Float64Array {
  const L = work ? work.L : new Float64Array(d * d);
  let scale = 0;
  for (let i = 0; i < d; i++) scale += Math.abs(A[i * d + i]);
  scale = scale / d || 1;
  for (let ridge = 0, attempt = 0; attempt < 6; attempt++, ridge = ridge === 0 ? 1e-13 * scale : ridge * 100) {
    let ok = true;
    for (let i = 0; i < d && ok; i++) {
      for (let j = 0; j <= i; j++) {
        let s = A[i * d + j] + (i === j ? ridge : 0);
        for (let k = 0; k < j; k++) s -= L[i * d + k] * L[j * d + k];
        if (i === j) {
          if (!(s > 0)) { ok = false; break; }
          L[i * d + i] = Math.sqrt(s);
        } else L[i * d + j] = s / L[j * d + j];
      }
    }
    if (!ok) continue;
    const y = work ? work.y : new Float64Array(d);
    for (let i = 0; i < d; i++) {
      let s = b[i];
      for (let k = 0; k < i; k++) s -= L[i * d + k] * y[k];
      y[i] = s / L[i * d + i];
    }
    const x = work ? work.x : new Float64Array(d);
    for (let i = d - 1; i >= 0; i--) {
      let s = y[i];
      for (let k = i + 1; k < d; k++) s -= L[k * d + i] * x[k];
      x[i] = s / L[i * d + i];
    }
    return x;
  }
  const zero = work ? work.x.fill(0) : new Float64Array(d);
  return zero; // hopeless: fall back to zero initial states (the objective then says so)
}

/**
 * A lower-triangular factor C with C C′ = P of a symmetric positive semi-definite P (row-major,
 * d×d), by the outer-product Cholesky algorithm that leaves a column at zero when its pivot is at
 * rounding level (≤ 1e-12 × the largest diagonal): P may be singular, e.g. a covariance that is
 * zero in some directions. Used to draw from N(0, P).
 * @example semidefiniteFactor(new Float64Array([4, 2, 2, 1]), 2) // [2, 0, 1, 0]
 */
export function semidefiniteFactor(P: Float64Array, d: number): Float64Array {
  const A = Float64Array.from(P);
  const C = new Float64Array(d * d);
  let maxDiag = 0;
  for (let i = 0; i < d; i++) maxDiag = Math.max(maxDiag, A[i * d + i]);
  const tol = 1e-12 * maxDiag;
  for (let j = 0; j < d; j++) {
    const pivot = A[j * d + j];
    if (!(pivot > tol)) continue;
    const r = Math.sqrt(pivot);
    for (let i = j; i < d; i++) C[i * d + j] = A[i * d + j] / r;
    for (let i = j + 1; i < d; i++) {
      for (let k = j + 1; k <= i; k++) A[i * d + k] -= C[i * d + j] * C[k * d + j];
    }
  }
  return C;
}
