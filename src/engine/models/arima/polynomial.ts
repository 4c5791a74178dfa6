// Polynomial algebra for seasonal ARIMA: multiplying the non-seasonal and seasonal lag
// polynomials, the differencing operator, and the map from partial autocorrelations to
// stationary (or invertible) coefficients (Barndorff-Nielsen & Schou 1973; Jones 1980,
// Technometrics 22:389–395; Monahan 1984, Biometrika 71:403–404).

/**
 * Expands the AR side φ(B)Φ(B^m) = 1 − Σ a_k B^k and returns a (length p + mP).
 * `phi` and `Phi` follow the convention 1 − φ₁B − φ₂B² …
 * @example expandAr([0.5], [0.3], 4) // [0.5, 0, 0, 0.3, -0.15]
 */
export function expandAr(phi: readonly number[], Phi: readonly number[], m: number): number[] {
  const a = [1, ...phi.map((v) => -v)];
  const b = new Array(Phi.length * m + 1).fill(0);
  b[0] = 1;
  Phi.forEach((v, j) => { b[(j + 1) * m] = -v; });
  return multiply(a, b).slice(1).map((v) => -v);
}

/**
 * Expands the MA side θ(B)Θ(B^m) = 1 + Σ b_k B^k and returns b (length q + mQ).
 * @example expandMa([0.4], [0.6], 12)[11] // 0.24 (the B^13 coefficient θ₁Θ₁)
 */
export function expandMa(theta: readonly number[], Theta: readonly number[], m: number): number[] {
  const a = [1, ...theta];
  const b = new Array(Theta.length * m + 1).fill(0);
  b[0] = 1;
  Theta.forEach((v, j) => { b[(j + 1) * m] = v; });
  return multiply(a, b).slice(1);
}

function multiply(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
}

/**
 * Coefficients c of the differencing operator (1 − B)^d (1 − B^m)^D = Σ c_k B^k, c₀ = 1.
 * @example differencingPolynomial(1, 1, 4) // [1, -1, 0, 0, -1, 1]
 */
export function differencingPolynomial(d: number, D: number, m: number): number[] {
  let poly = [1];
  for (let i = 0; i < d; i++) poly = multiply(poly, [1, -1]);
  if (D <= 0) return poly; // no seasonal factor: nothing of length m is built (m may be any size)
  const seasonal = new Array(m + 1).fill(0);
  seasonal[0] = 1;
  seasonal[m] = -1;
  for (let i = 0; i < D; i++) poly = multiply(poly, seasonal);
  return poly;
}

/**
 * Applies a differencing polynomial: x_t = Σ c_k w_{t+K−k} for t = 0..n−K−1 (K = degree). A
 * missing value (NaN) makes every difference that uses it missing.
 * @example applyDifference([1, 3, 6, 10], [1, -1]) // [2, 3, 4]
 */
export function applyDifference(w: readonly number[], c: readonly number[]): number[] {
  const K = c.length - 1;
  const out: number[] = [];
  for (let t = K; t < w.length; t++) {
    let s = 0;
    for (let k = 0; k <= K; k++) if (c[k] !== 0) s += c[k] * w[t - k];
    out.push(s);
  }
  return out;
}

/**
 * Partial autocorrelations r (each in (−1, 1)) → the coefficients of a stationary AR polynomial
 * 1 − Σ φ_j B^j, by the Durbin–Levinson recursion φ_{k,j} = φ_{k−1,j} − r_k φ_{k−1,k−j}
 * (Barndorff-Nielsen & Schou 1973; the reparameterisation of Jones 1980 / Monahan 1984).
 * @example pacfToAr([0.5, 0.2]) // [0.4, 0.2]
 */
export function pacfToAr(r: readonly number[]): number[] {
  let phi: number[] = [];
  for (let k = 0; k < r.length; k++) {
    const next = phi.map((v, j) => v - r[k] * phi[k - 1 - j]);
    next.push(r[k]);
    phi = next;
  }
  return phi;
}

/**
 * The inverse of pacfToAr (the step-down recursion); null when the polynomial is not
 * stationary (a partial autocorrelation of modulus ≥ 1).
 * @example arToPacf([0.4, 0.2]) // [0.5, 0.2] (to rounding)
 */
export function arToPacf(phi: readonly number[]): number[] | null {
  let cur = phi.slice();
  const r = new Array(phi.length).fill(0);
  for (let k = phi.length - 1; k >= 0; k--) {
    const rk = cur[k];
    if (!(Math.abs(rk) < 1)) return null;
    r[k] = rk;
    const denom = 1 - rk * rk;
    const prev: number[] = [];
    for (let j = 0; j < k; j++) prev.push((cur[j] + rk * cur[k - 1 - j]) / denom);
    cur = prev;
  }
  return r;
}

/** Unconstrained u → (−1, 1): u/√(1 + u²), smooth and one-to-one (the map statsmodels also uses). */
export function toUnit(u: number): number {
  return u / Math.sqrt(1 + u * u);
}

/** The inverse of toUnit. */
export function fromUnit(r: number): number {
  return r / Math.sqrt(1 - r * r);
}
