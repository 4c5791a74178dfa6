// Exact Gaussian likelihood of a stationary ARMA process by the Kalman filter on Harvey's
// state-space form (Harvey 1989, Forecasting, Structural Time Series Models and the Kalman
// Filter, §3.3; Gardner, Harvey & Phillips 1980, Applied Statistics 29:311–322):
//   x_t − μ = Z α_t,  α_{t+1} = T α_t + R ε_{t+1},  Z = e₁′, T = [a | I; 0], R = (1, b₁, …, b_{r−1})′,
// r = max(p*, q* + 1) for the expanded AR coefficients a (p*) and MA coefficients b (q*). The
// filter starts from the stationary covariance P₀ = Σ_k T^k RR′ T′^k (computed by doubling), skips
// missing observations (NaN) by prediction only, and concentrates out σ² and (by generalised least
// squares through the same filter) the mean μ. P₀ = Σ_k T^k RR′ T′^k is computed exactly.
import { EngineError } from "../../errors";

const log = Math.log;
const abs = Math.abs;
const max = Math.max;
const LOG_2PI = Math.log(2 * Math.PI);

/** The state-space matrices of an ARMA model, r × r row-major T and length-r R. */
export interface ArmaSystem {
  r: number;
  /** Expanded AR coefficients a₁..a_p* (x_t = Σ a_k x_{t−k} + …). */
  ar: readonly number[];
  /** Expanded MA coefficients b₁..b_q*. */
  ma: readonly number[];
  R: Float64Array;
  /** Stationary covariance of the state, in units of σ². */
  P0: Float64Array;
}

/**
 * Builds Harvey's state-space form and its stationary state covariance (units of σ²), exact
 * (closed form for a pure MA; from the autocovariances otherwise).
 * Throws when the AR part is not stationary.
 * @example armaSystem([0.5], []).P0[0] // 1/(1 − 0.25) = 1.3333…
 */
export function armaSystem(ar: readonly number[], ma: readonly number[]): ArmaSystem {
  const r = max(ar.length, ma.length + 1, 1);
  const R = new Float64Array(r);
  R[0] = 1;
  for (let i = 0; i < ma.length; i++) R[i + 1] = ma[i];
  if (ar.length === 0) {
    // Pure MA: α_t[i] = Σ_k R[i+k] ε_{t−k}, so P₀[i][j] = Σ_k R[i+k] R[j+k] exactly.
    const P0 = new Float64Array(r * r);
    for (let i = 0; i < r; i++) {
      for (let j = i; j < r; j++) {
        let s = 0;
        for (let k = 0; j + k < r; k++) s += R[i + k] * R[j + k];
        P0[i * r + j] = s;
        P0[j * r + i] = s;
      }
    }
    return { r, ar: ar.slice(), ma: ma.slice(), R, P0 };
  }
  const P0 = stationaryCovariance(ar, R, r);
  if (P0 === null) throw new EngineError("domain", "The AR part of this ARIMA model is not stationary (a unit or explosive root); difference the series once more (raise d or D).");
  return { r, ar: ar.slice(), ma: ma.slice(), R, P0 };
}

/**
 * P₀ from the ARMA autocovariances (no iteration): γ(0..p) solve the linear system
 * γ(k) − Σ_i a_i γ(|k − i|) = Σ_{j≥k} b_j ψ_{j−k} (Brockwell & Davis 1991, §3.3, "third method"),
 * the first row of P₀ is Cov(x_t, α_t[j]) = Σ_{k≥j} (a_{k+1} γ(1 + k − j) + R_k ψ_{k−j}), and the rest
 * follows from P₀ = T P₀ T′ + RR′ read element by element. Null when the AR part is not stationary.
 */
function stationaryCovariance(ar: readonly number[], R: Float64Array, r: number): Float64Array | null {
  const P = new Float64Array(r * r);
  const row = new Float64Array(r);
  if (!stationaryFirstRow(ar, ar.length, R, r, row)) return null;
  const p = ar.length;
  for (let j = 0; j < r; j++) {
    P[j] = row[j];
    P[j * r] = row[j];
  }
  const P00 = P[0];
  for (let i = 1; i < r; i++) {
    for (let j = i; j < r; j++) {
      const ai = i - 1 < p ? ar[i - 1] : 0;
      const aj = j - 1 < p ? ar[j - 1] : 0;
      const v = P[(i - 1) * r + j - 1] - ai * aj * P00 - ai * P[j] - aj * P[i * r] - R[i - 1] * R[j - 1];
      P[i * r + j] = v;
      P[j * r + i] = v;
    }
  }
  for (let i = 0; i < r * r; i++) if (!Number.isFinite(P[i])) return null;
  for (let i = 0; i < r; i++) if (!(P[i * r + i] >= -1e-9 * P00)) return null;
  return P;
}

/**
 * The first row (= first column) of the stationary state covariance P₀ (units of σ²) of an ARMA
 * with AR coefficients ar[0..p) and R = (1, b₁, …, b_{r−1}), into `out` (length ≥ r), from the
 * autocovariances as in stationaryCovariance (Brockwell & Davis 1991, §3.3). This is all the
 * Chandrasekhar recursions need. False when the AR part is not stationary.
 */
export function stationaryFirstRow(ar: ArrayLike<number>, p: number, R: ArrayLike<number>, r: number, out: Float64Array): boolean {
  const q = r - 1; // R = (1, b_1, …, b_{r−1}), zeros past the MA order
  // ψ weights up to lag r
  const psi = new Float64Array(r + 1);
  for (let j = 0; j <= r; j++) {
    let v = j === 0 ? 1 : j <= q ? R[j] : 0;
    for (let i = 1; i <= Math.min(j, p); i++) v += ar[i - 1] * psi[j - i];
    psi[j] = v;
  }
  // γ(0..p): (p+1) × (p+1) system
  const d = p + 1;
  const A = new Float64Array(d * d);
  const rhs = new Float64Array(d);
  for (let k = 0; k <= p; k++) {
    A[k * d + k] += 1;
    for (let i = 1; i <= p; i++) A[k * d + Math.abs(k - i)] -= ar[i - 1];
    let v = 0;
    for (let j = k; j <= q; j++) v += (j === 0 ? 1 : R[j]) * psi[j - k];
    rhs[k] = v;
  }
  const g0 = solveGeneral(A, rhs, d);
  if (g0 === null || !(g0[0] > 0)) return false;
  const gamma = new Float64Array(r + 2);
  for (let k = 0; k <= Math.min(p, r + 1); k++) gamma[k] = g0[k];
  for (let k = p + 1; k <= r + 1; k++) {
    let v = 0;
    for (let i = 1; i <= p; i++) v += ar[i - 1] * gamma[k - i];
    for (let j = k; j <= q; j++) v += (j === 0 ? 1 : R[j]) * psi[j - k];
    gamma[k] = v;
  }
  for (let j = 0; j < r; j++) {
    let v = 0;
    for (let k = j; k < r; k++) v += (k < p ? ar[k] : 0) * gamma[1 + k - j] + R[k] * psi[k - j];
    if (!Number.isFinite(v)) return false;
    out[j] = v;
  }
  return true;
}

/** Gaussian elimination with partial pivoting; null when singular. */
function solveGeneral(A: Float64Array, b: Float64Array, d: number): Float64Array | null {
  const M = A.slice();
  const x = b.slice();
  for (let c = 0; c < d; c++) {
    let piv = c;
    for (let i = c + 1; i < d; i++) if (abs(M[i * d + c]) > abs(M[piv * d + c])) piv = i;
    if (!(abs(M[piv * d + c]) > 1e-300)) return null;
    if (piv !== c) {
      for (let k = 0; k < d; k++) { const t = M[c * d + k]; M[c * d + k] = M[piv * d + k]; M[piv * d + k] = t; }
      const t = x[c]; x[c] = x[piv]; x[piv] = t;
    }
    for (let i = c + 1; i < d; i++) {
      const f = M[i * d + c] / M[c * d + c];
      if (f === 0) continue;
      for (let k = c; k < d; k++) M[i * d + k] -= f * M[c * d + k];
      x[i] -= f * x[c];
    }
  }
  for (let i = d - 1; i >= 0; i--) {
    let v = x[i];
    for (let k = i + 1; k < d; k++) v -= M[i * d + k] * x[k];
    x[i] = v / M[i * d + i];
  }
  return x;
}


/** What the filter returns for a given μ (or with μ concentrated out). */
export interface ArmaFilterResult {
  loglik: number;
  sigma2: number;
  mu: number;
  nobs: number;
  /** One-step prediction errors v_t (NaN where x_t is missing). */
  innovations: Float64Array;
  /** Their variances in units of σ² (F_t). */
  F: Float64Array;
  /** Predicted state a_{n+1|n} and its covariance P_{n+1|n} (units of σ²), for forecasting. */
  aNext: Float64Array;
  PNext: Float64Array;
}

/**
 * Runs the Kalman filter over x (NaN = missing) for the ARMA system. With `mu` a number the mean
 * is fixed; with `mu` = "estimate" it is concentrated out by GLS; with `mu` = "none" it is 0.
 * σ² is concentrated out: σ̂² = Σ v_t²/F_t / n_obs and
 * ℓ = −½[n_obs(ln 2π + ln σ̂² + 1) + Σ ln F_t].
 * @example armaFilter(armaSystem([], []), [1, -1, 2], "none").sigma2 // (1 + 1 + 4)/3 = 2
 */
export function armaFilter(sys: ArmaSystem, x: readonly number[], mu: number | "estimate" | "none", needCovariance = true): ArmaFilterResult {
  if (!needCovariance) {
    let complete = true;
    for (let t = 0; t < x.length; t++) if (!(x[t] === x[t])) { complete = false; break; }
    if (complete) return armaFilterFast(sys, x, mu);
  }
  const { r, ar, R, P0 } = sys;
  const p = ar.length;
  const n = x.length;
  const withOnes = mu === "estimate";
  const mu0 = typeof mu === "number" ? mu : 0;
  const a = new Float64Array(r); // state for the data
  const c = new Float64Array(r); // state for the column of ones (GLS for μ)
  // P: predicted covariance P_{t|t−1}; Q: filtered P_{t|t}; TP = T Q; Pn: the next predicted one.
  let P = P0.slice();
  let Pn = new Float64Array(r * r);
  const Q = new Float64Array(r * r);
  const TP = new Float64Array(r * r);
  const vx = new Float64Array(n);
  const v1 = new Float64Array(n);
  const F = new Float64Array(n);
  const arPad = new Float64Array(r);
  for (let i = 0; i < p; i++) arPad[i] = ar[i];
  let sumLogF = 0;
  let nobs = 0;
  let steady = false;
  const RR = new Float64Array(r * r);
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) RR[i * r + j] = R[i] * R[j];
  const Pcol = new Float64Array(r);
  for (let t = 0; t < n; t++) {
    const xt = x[t];
    const observed = xt === xt; // not NaN
    let source = P; // the covariance the prediction starts from (filtered when observed)
    if (observed) {
      const f = P[0];
      F[t] = f;
      const e = xt - mu0 - a[0];
      const e1 = 1 - c[0];
      vx[t] = e;
      v1[t] = e1;
      sumLogF += log(f);
      nobs++;
      for (let i = 0; i < r; i++) Pcol[i] = P[i * r];
      // filtered state, then predicted: a ← T(a + P e₁ e / f)
      for (let i = 0; i < r; i++) {
        a[i] += (Pcol[i] * e) / f;
        if (withOnes) c[i] += (Pcol[i] * e1) / f;
      }
      if (!steady) {
        // Q = P − P e₁ e₁′ P / f (symmetric)
        const inv = 1 / f;
        for (let i = 0; i < r; i++) {
          const pi = Pcol[i] * inv;
          for (let j = i; j < r; j++) {
            const v = P[i * r + j] - pi * Pcol[j];
            Q[i * r + j] = v;
            Q[j * r + i] = v;
          }
        }
        source = Q;
      }
    } else {
      vx[t] = NaN;
      v1[t] = NaN;
      F[t] = NaN;
      steady = false;
    }
    predictState(a, ar, r, p);
    if (withOnes) predictState(c, ar, r, p);
    if (!steady || !observed) {
      // P ← T S T′ + RR′ (S = Q or P), using T's structure: (TM)[i][j] = a_i M[0][j] + M[i+1][j].
      const S = source;
      for (let i = 0; i + 1 < r; i++) {
        const ai = arPad[i];
        const row = i * r, below = (i + 1) * r;
        for (let j = 0; j < r; j++) TP[row + j] = ai * S[j] + S[below + j];
      }
      {
        const ai = arPad[r - 1];
        const row = (r - 1) * r;
        for (let j = 0; j < r; j++) TP[row + j] = ai * S[j];
      }
      // (TP T′)[i][j] = TP[i][0] a_j + TP[i][j+1]; symmetric, so the upper triangle is mirrored.
      let change = 0;
      for (let i = 0; i < r; i++) {
        const row = i * r;
        const t0 = TP[row];
        for (let j = i; j < r; j++) {
          const v = t0 * arPad[j] + (j + 1 < r ? TP[row + j + 1] : 0) + RR[row + j];
          Pn[row + j] = v;
          Pn[j * r + i] = v;
          const dlt = abs(v - P[row + j]);
          if (dlt > change) change = dlt;
        }
      }
      const old = P;
      P = Pn;
      Pn = old;
      // Steady state: the covariance no longer changes (it then stays fixed while data are observed).
      if (observed && change < 1e-14 * (1 + abs(P[0])) && t + 1 < n && x[t + 1] === x[t + 1]) steady = true;
    }
  }
  if (nobs === 0) throw new EngineError("input", "The differenced series has no observed values.");
  let muHat = mu0;
  if (withOnes) {
    let sxy = 0, syy = 0;
    for (let t = 0; t < n; t++) if (x[t] === x[t]) { sxy += (vx[t] * v1[t]) / F[t]; syy += (v1[t] * v1[t]) / F[t]; }
    muHat = syy > 0 ? sxy / syy : 0;
    for (let t = 0; t < n; t++) if (x[t] === x[t]) vx[t] -= muHat * v1[t];
    for (let i = 0; i < r; i++) a[i] -= muHat * c[i];
  }
  let ssq = 0;
  for (let t = 0; t < n; t++) if (x[t] === x[t]) ssq += (vx[t] * vx[t]) / F[t];
  const sigma2 = ssq / nobs;
  const loglik = sigma2 > 0 ? -0.5 * (nobs * (LOG_2PI + log(sigma2) + 1) + sumLogF) : -Infinity;
  return { loglik, sigma2, mu: muHat, nobs, innovations: vx, F, aNext: a, PNext: P };
}

function predictState(a: Float64Array, ar: readonly number[], r: number, p: number): void {
  const a0 = a[0];
  for (let i = 0; i < r; i++) a[i] = (i < p ? ar[i] * a0 : 0) + (i + 1 < r ? a[i + 1] : 0);
}

/**
 * The same likelihood without the r × r covariance: for a time-invariant system started at its
 * stationary covariance and observed at every t, P_{t+1} − P_t stays of rank one, W_t M_t W_t′,
 * so F_t and the gain follow from O(r) updates (the Chandrasekhar recursions of Morf, Sidhu &
 * Kailath 1974, IEEE Trans. Automatic Control 19:315–323): F_{t+1} = F_t + M_t z², K_{t+1} =
 * K_t + M_t z T W_t, W_{t+1} = T W_t − K_t z/F_t, M_{t+1} = M_t F_t/F_{t+1} (z = W_t[0]), from
 * W_1 = K_1 = T P₀ e₁, M_1 = −1/F_1. Used inside the optimiser; PNext is not computed (empty).
 */
function armaFilterFast(sys: ArmaSystem, x: readonly number[], mu: number | "estimate" | "none"): ArmaFilterResult {
  const { r, ar, P0 } = sys;
  const p = ar.length;
  const n = x.length;
  const withOnes = mu === "estimate";
  const mu0 = typeof mu === "number" ? mu : 0;
  const a = new Float64Array(r);
  const c = new Float64Array(r);
  const K = new Float64Array(r);
  const W = new Float64Array(r);
  const TW = new Float64Array(r);
  const vx = new Float64Array(n);
  const v1 = new Float64Array(n);
  const Fs = new Float64Array(n);
  // K_1 = T P₀ e₁: (T v)[i] = a_i v[0] + v[i+1], with v = P₀ e₁ (first column).
  for (let i = 0; i < r; i++) K[i] = (i < p ? ar[i] * P0[0] : 0) + (i + 1 < r ? P0[(i + 1) * r] : 0);
  let F = P0[0];
  W.set(K);
  let M = -1 / F;
  let sumLogF = 0;
  for (let t = 0; t < n; t++) {
    Fs[t] = F;
    const e = x[t] - mu0 - a[0];
    const e1 = 1 - c[0];
    vx[t] = e;
    v1[t] = e1;
    sumLogF += log(F);
    // a_{t+1} = T a_t + K_t e / F_t
    const a0 = a[0], c0 = c[0];
    for (let i = 0; i < r; i++) {
      a[i] = (i < p ? ar[i] * a0 : 0) + (i + 1 < r ? a[i + 1] : 0) + (K[i] * e) / F;
      if (withOnes) c[i] = (i < p ? ar[i] * c0 : 0) + (i + 1 < r ? c[i + 1] : 0) + (K[i] * e1) / F;
    }
    // Chandrasekhar step
    const z = W[0];
    for (let i = 0; i < r; i++) TW[i] = (i < p ? ar[i] * z : 0) + (i + 1 < r ? W[i + 1] : 0);
    const Fnext = F + M * z * z;
    for (let i = 0; i < r; i++) {
      const k = K[i];
      K[i] = k + M * z * TW[i];
      W[i] = TW[i] - (k * z) / F;
    }
    M = (M * F) / Fnext;
    F = Fnext;
  }
  let muHat = mu0;
  if (withOnes) {
    let sxy = 0, syy = 0;
    for (let t = 0; t < n; t++) { sxy += (vx[t] * v1[t]) / Fs[t]; syy += (v1[t] * v1[t]) / Fs[t]; }
    muHat = syy > 0 ? sxy / syy : 0;
    for (let t = 0; t < n; t++) vx[t] -= muHat * v1[t];
    for (let i = 0; i < r; i++) a[i] -= muHat * c[i];
  }
  let ssq = 0;
  for (let t = 0; t < n; t++) ssq += (vx[t] * vx[t]) / Fs[t];
  const sigma2 = ssq / n;
  const loglik = sigma2 > 0 && Number.isFinite(sumLogF) ? -0.5 * (n * (LOG_2PI + log(sigma2) + 1) + sumLogF) : -Infinity;
  return { loglik, sigma2, mu: muHat, nobs: n, innovations: vx, F: Fs, aNext: a, PNext: new Float64Array(0) };
}
