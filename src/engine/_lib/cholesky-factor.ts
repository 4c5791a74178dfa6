// The lower Cholesky factor of a symmetric positive semi-definite matrix (a covariance or a
// correlation), used to draw correlated normals: x = L z with z standard normal has covariance
// L L′ = A. A pivot that is zero to working precision (a singular matrix, e.g. perfectly correlated
// columns) gives a zero column instead of a failure.

/**
 * Lower-triangular L (row-major, d×d) with L L′ = A for symmetric positive semi-definite A
 * (row-major). Returns null when A is not positive semi-definite (a pivot clearly below zero).
 */
export function choleskyLower(A: ArrayLike<number>, d: number): Float64Array | null {
  const L = new Float64Array(d * d);
  let scale = 0;
  for (let i = 0; i < d; i++) scale = Math.max(scale, Math.abs(A[i * d + i]));
  const tiny = 1e-12 * (scale || 1);
  for (let j = 0; j < d; j++) {
    let s = A[j * d + j];
    for (let k = 0; k < j; k++) s -= L[j * d + k] * L[j * d + k];
    if (s < -1e3 * tiny) return null;
    const pivot = s > tiny ? Math.sqrt(s) : 0;
    L[j * d + j] = pivot;
    for (let i = j + 1; i < d; i++) {
      let t = A[i * d + j];
      for (let k = 0; k < j; k++) t -= L[i * d + k] * L[j * d + k];
      L[i * d + j] = pivot > 0 ? t / pivot : 0;
    }
  }
  return L;
}
