// Exact Gaussian likelihood of a stationary ARMA process by the Kalman filter on Harvey's
// state-space form (Harvey 1989, Forecasting, Structural Time Series Models and the Kalman
// Filter, §3.3; Gardner, Harvey & Phillips 1980, Applied Statistics 29:311–322):
//   x_t − μ = Z α_t,  α_{t+1} = T α_t + R ε_{t+1},  Z = e₁′, T = [a | I; 0], R = (1, b₁, …, b_{r−1})′,
// r = max(p*, q* + 1) for the expanded AR coefficients a (p*) and MA coefficients b (q*). The
// filter starts from the stationary covariance P₀ = Σ_k T^k RR′ T′^k (computed by doubling), skips
// missing observations (NaN) by prediction only, and concentrates out σ² and (by generalised least
// squares through the same filter) the mean μ.
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
 * Builds Harvey's state-space form and its stationary state covariance (units of σ²).
 * Throws when the AR part is not stationary (the doubling sum does not converge).
 * @example armaSystem([0.5], []).P0[0] // 1/(1 − 0.25) = 1.3333…
 */
export function armaSystem(ar: readonly number[], ma: readonly number[]): ArmaSystem {
  const r = max(ar.length, ma.length + 1, 1);
  const R = new Float64Array(r);
  R[0] = 1;
  for (let i = 0; i < ma.length; i++) R[i + 1] = ma[i];
  // Doubling: P ← P + A P A′, A ← A², from P = RR′, A = T.
  let P = new Float64Array(r * r);
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i * r + j] = R[i] * R[j];
  let A = new Float64Array(r * r);
  for (let i = 0; i < r; i++) {
    if (i < ar.length) A[i * r] = ar[i];
    if (i + 1 < r) A[i * r + i + 1] = 1;
  }
  const tmp = new Float64Array(r * r);
  let converged = false;
  for (let iter = 0; iter < 80; iter++) {
    // tmp = A P
    matMul(A, P, tmp, r);
    // inc = tmp A′
    let incMax = 0;
    let pMax = 0;
    const next = new Float64Array(r * r);
    for (let i = 0; i < r; i++) {
      for (let j = 0; j < r; j++) {
        let s = 0;
        for (let k = 0; k < r; k++) s += tmp[i * r + k] * A[j * r + k];
        next[i * r + j] = P[i * r + j] + s;
        const as = abs(s);
        if (as > incMax) incMax = as;
      }
    }
    for (let i = 0; i < r * r; i++) if (abs(next[i]) > pMax) pMax = abs(next[i]);
    P = next;
    if (!Number.isFinite(pMax) || pMax > 1e12) break;
    if (incMax <= 1e-16 * pMax) { converged = true; break; }
    const A2 = new Float64Array(r * r);
    matMul(A, A, A2, r);
    A = A2;
  }
  if (!converged) throw new EngineError("domain", "The AR part of this ARIMA model is not stationary (a unit or explosive root); difference the series once more (raise d or D).");
  return { r, ar: ar.slice(), ma: ma.slice(), R, P0: P };
}

function matMul(A: Float64Array, B: Float64Array, out: Float64Array, r: number): void {
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < r; j++) {
      let s = 0;
      for (let k = 0; k < r; k++) s += A[i * r + k] * B[k * r + j];
      out[i * r + j] = s;
    }
  }
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
export function armaFilter(sys: ArmaSystem, x: readonly number[], mu: number | "estimate" | "none"): ArmaFilterResult {
  const { r, ar, R, P0 } = sys;
  const p = ar.length;
  const n = x.length;
  const withOnes = mu === "estimate";
  const mu0 = typeof mu === "number" ? mu : 0;
  const a = new Float64Array(r); // state for the data
  const c = new Float64Array(r); // state for the column of ones (GLS for μ)
  const P = P0.slice();
  const TP = new Float64Array(r * r);
  const vx = new Float64Array(n);
  const v1 = new Float64Array(n);
  const F = new Float64Array(n);
  let sumLogF = 0;
  let nobs = 0;
  let steady = false;
  const RR = new Float64Array(r * r);
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) RR[i * r + j] = R[i] * R[j];
  const Pcol = new Float64Array(r);
  const Pprev = new Float64Array(r * r);
  for (let t = 0; t < n; t++) {
    const xt = x[t];
    const observed = xt === xt; // not NaN
    if (observed) {
      if (!steady) Pprev.set(P);
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
        for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i * r + j] -= (Pcol[i] * Pcol[j]) / f;
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
      // P ← T P T′ + RR′, using T's structure: (TM)[i][j] = a_i M[0][j] + M[i+1][j].
      for (let i = 0; i < r; i++) {
        const ai = i < p ? ar[i] : 0;
        for (let j = 0; j < r; j++) TP[i * r + j] = ai * P[j] + (i + 1 < r ? P[(i + 1) * r + j] : 0);
      }
      let change = 0;
      for (let i = 0; i < r; i++) {
        for (let j = 0; j < r; j++) {
          const aj = j < p ? ar[j] : 0;
          const v = TP[i * r] * aj + (j + 1 < r ? TP[i * r + j + 1] : 0) + RR[i * r + j];
          if (observed) {
            const dlt = abs(v - Pprev[i * r + j]);
            if (dlt > change) change = dlt;
          }
          P[i * r + j] = v;
        }
      }
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
  const loglik = sigma2 > 0 ? -0.5 * (nobs * (LOG_2PI + log(sigma2) + 1) + sumLogF) : Infinity;
  return { loglik, sigma2, mu: muHat, nobs, innovations: vx, F, aNext: a, PNext: P };
}

function predictState(a: Float64Array, ar: readonly number[], r: number, p: number): void {
  const a0 = a[0];
  for (let i = 0; i < r; i++) a[i] = (i < p ? ar[i] * a0 : 0) + (i + 1 < r ? a[i + 1] : 0);
}
