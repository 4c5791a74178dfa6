// The exact ARMA log-likelihood as the optimiser sees it: a function of the unconstrained
// parameters u (each mapped to a partial autocorrelation by u/√(1 + u²), then to stationary or
// invertible coefficients by the Durbin–Levinson recursion: Jones 1980; Monahan 1984), evaluated on
// a fixed differenced series with every buffer allocated once per fit. The likelihood is the one of
// kalman.ts (Gardner, Harvey & Phillips 1980; Harvey 1989, §3.3) computed by the Chandrasekhar
// recursions (Morf, Sidhu & Kailath 1974), with σ² concentrated out and, with a constant, the mean
// by GLS through the same recursion. Only the first column of the stationary P₀ is needed.
//
// Steady state: the recursions change P_t by the rank-one term W_t M_t W_t′ (M_t < 0). Once
// |M_t|·max_i W_t[i]² falls below 1e-17·F_t, F_t and the gain K_t no longer move in double
// precision (F_t ≥ 1 in units of σ², and the increment of every later step is smaller still while
// the filter converges), so they are frozen and only the state update runs. The frozen and the full
// recursions are compared in the tests (to 1e-10).
import { armaFilter, armaSystem } from "./kalman";
import type { ArimaOrder } from "./order";
import { toUnit } from "./polynomial";

const LOG_2PI = Math.log(2 * Math.PI);
const log = Math.log;
const abs = Math.abs;

/** Below this |M|·max W² (relative to F), the covariance recursion is frozen (see above). */
export const STEADY_TOLERANCE = 1e-17;

/**
 * The negative exact log-likelihood of an ARIMA's differences as a function of the optimiser's
 * unconstrained parameters (order p, q, P, Q), with buffers reused across evaluations. A series with
 * missing differences goes through the full filter of kalman.ts instead.
 */
export class ArmaLikelihood {
  /** Likelihood evaluations so far (negLoglik and negLoglikAt; for profiling). */
  evaluations = 0;
  private readonly x: readonly number[];
  private readonly o: ArimaOrder;
  /** Whether the mean is concentrated out (a constant in the order, not fixed by the caller). */
  private withMean: boolean;
  /** The mean subtracted when it is not concentrated out. */
  private mu0 = 0;
  private readonly complete: boolean;
  private readonly r: number;
  private readonly pStar: number;
  private readonly qStar: number;
  // parameter buffers
  private readonly pac: Float64Array;
  private readonly tmp: Float64Array;
  private readonly phi: Float64Array;
  private readonly Phi: Float64Array;
  private readonly theta: Float64Array;
  private readonly Theta: Float64Array;
  /** Expanded AR coefficients, zero-padded to r (+1). */
  readonly ar: Float64Array;
  /** R = (1, b₁, …, b_{r−1}), zero-padded. */
  readonly R: Float64Array;
  // filter buffers
  private readonly col: Float64Array;
  private readonly a: Float64Array;
  private readonly c: Float64Array;
  private readonly K: Float64Array;
  private readonly W: Float64Array;
  private readonly vx: Float64Array;
  private readonly v1: Float64Array;
  private readonly Fs: Float64Array;
  private readonly e: Float64Array;
  /** Lags (0-based) where the expanded AR and MA polynomials can be non-zero. */
  private readonly arLags: Int32Array;
  private readonly maLags: Int32Array;
  /** Lags j with R_j possibly non-zero (0 first). */
  private readonly maIdx: Int32Array;
  // buffers of the autocovariances (firstRow)
  private readonly levels: Float64Array;
  private readonly gu: Float64Array;
  private readonly gx: Float64Array;
  private readonly psi: Float64Array;
  /** Whether the last evaluation froze the covariance recursion, and from which step. */
  steadyFrom = -1;
  /** Set false to run every step of the covariance recursion (for the tests). */
  allowSteady = true;

  constructor(x: readonly number[], order: ArimaOrder) {
    this.x = x;
    this.o = order;
    this.withMean = order.constant;
    let complete = true;
    for (let t = 0; t < x.length; t++) if (!(x[t] === x[t])) { complete = false; break; }
    this.complete = complete;
    this.pStar = order.p + order.m * order.P;
    this.qStar = order.q + order.m * order.Q;
    const r = Math.max(this.pStar, this.qStar + 1, 1);
    this.r = r;
    const most = Math.max(order.p, order.q, order.P, order.Q, 1);
    this.pac = new Float64Array(most);
    this.tmp = new Float64Array(most);
    this.phi = new Float64Array(order.p);
    this.Phi = new Float64Array(order.P);
    this.theta = new Float64Array(order.q);
    this.Theta = new Float64Array(order.Q);
    this.ar = new Float64Array(r + 1);
    this.R = new Float64Array(r + 1);
    this.col = new Float64Array(r);
    this.a = new Float64Array(r + 1);
    this.c = new Float64Array(r + 1);
    this.K = new Float64Array(r);
    this.W = new Float64Array(r + 1);
    const n = x.length;
    this.vx = new Float64Array(order.constant ? n : 0);
    this.v1 = new Float64Array(order.constant ? n : 0);
    this.Fs = new Float64Array(order.constant ? n : 0);
    this.e = new Float64Array(n);
    this.arLags = Int32Array.from(lagsOf(order.p, order.P, order.m));
    this.maLags = Int32Array.from(lagsOf(order.q, order.Q, order.m));
    this.maIdx = Int32Array.from([0, ...Array.from(this.maLags, (k) => k + 1)]);
    const p = this.pStar;
    this.levels = new Float64Array((p + 1) * (p + 1));
    this.gu = new Float64Array(2 * r + 2);
    this.gx = new Float64Array(r + 2);
    this.psi = new Float64Array(r + 1);
  }

  /** Number of unconstrained parameters (p + q + P + Q; the mean is concentrated out). */
  get dimension(): number {
    return this.o.p + this.o.q + this.o.P + this.o.Q;
  }

  /** −ℓ at the unconstrained parameters u (Infinity where the likelihood is not finite). */
  negLoglik(u: readonly number[]): number {
    this.evaluations++;
    this.setParameters(u);
    this.withMean = this.o.constant;
    this.mu0 = 0;
    return this.evaluate();
  }

  /**
   * −ℓ at given coefficients (AR-form φ, Φ; MA θ, Θ, as in ArimaParams) with the mean fixed at `mu`
   * (σ² still concentrated out), for the Hessian of the standard errors; NaN where the likelihood is
   * not finite. The AR side must be stationary (else NaN).
   */
  negLoglikAt(phi: readonly number[], Phi: readonly number[], theta: readonly number[], Theta: readonly number[], mu: number): number {
    this.evaluations++;
    this.phi.set(phi);
    this.Phi.set(Phi);
    this.theta.set(theta);
    this.Theta.set(Theta);
    this.expand();
    this.withMean = false;
    this.mu0 = mu;
    const v = this.evaluate();
    return Number.isFinite(v) ? v : NaN;
  }

  private evaluate(): number {
    if (!this.complete) return this.viaFullFilter();
    const ll = this.chandrasekhar();
    return Number.isFinite(ll) ? -ll : Infinity;
  }

  /**
   * Conditional sum of squares per observed difference at u (pre-sample errors zero, the mean
   * fixed at `mu`), for the optimiser's start; the same sum as fit.ts computed before, with the
   * lags where the expanded polynomials are structurally zero skipped.
   */
  css(u: readonly number[], mu: number): number {
    this.setParameters(u);
    const { x, ar, R, e, arLags, maLags } = this;
    const n = x.length;
    const p = this.pStar;
    e.fill(0);
    let s = 0;
    let count = 0;
    for (let t = p; t < n; t++) {
      const xt = x[t];
      if (!(xt === xt)) continue;
      let v = xt - mu;
      let ok = true;
      for (let i = 0; i < arLags.length; i++) {
        const k = arLags[i];
        const xv = x[t - k - 1];
        if (!(xv === xv)) { ok = false; break; }
        v -= ar[k] * (xv - mu);
      }
      if (!ok) continue;
      for (let i = 0; i < maLags.length; i++) {
        const j = maLags[i];
        if (t - j - 1 < 0) break;
        v -= R[j + 1] * e[t - j - 1];
      }
      e[t] = v;
      s += v * v;
      count++;
    }
    return count > 0 ? s / count : Infinity;
  }

  /** u → coefficients, written into phi, Phi, theta, Theta, then expanded into ar and R. */
  private setParameters(u: readonly number[]): void {
    const { o } = this;
    let i = 0;
    i = this.pacfInto(u, i, o.p, this.phi, 1);
    i = this.pacfInto(u, i, o.P, this.Phi, 1);
    i = this.pacfInto(u, i, o.q, this.theta, -1);
    this.pacfInto(u, i, o.Q, this.Theta, -1);
    this.expand();
  }

  /** phi, Phi, theta, Theta → the expanded ar and R. */
  private expand(): void {
    const { o, ar, R, phi, Phi, theta, Theta } = this;
    const m = o.m;
    ar.fill(0);
    R.fill(0);
    // φ(B)Φ(B^m) = 1 − Σ a_k B^k: a_i = φ_i, a_{jm} = Φ_j, a_{i+jm} = −φ_iΦ_j (as expandAr)
    for (let k = 0; k < o.p; k++) ar[k] += phi[k];
    for (let j = 0; j < o.P; j++) {
      ar[(j + 1) * m - 1] += Phi[j];
      for (let k = 0; k < o.p; k++) ar[k + 1 + (j + 1) * m - 1] -= phi[k] * Phi[j];
    }
    // θ(B)Θ(B^m) = 1 + Σ b_k B^k: b_i = θ_i, b_{jm} = Θ_j, b_{i+jm} = θ_iΘ_j (as expandMa)
    R[0] = 1;
    for (let k = 0; k < o.q; k++) R[k + 1] += theta[k];
    for (let j = 0; j < o.Q; j++) {
      R[(j + 1) * m] += Theta[j];
      for (let k = 0; k < o.q; k++) R[k + 1 + (j + 1) * m] += theta[k] * Theta[j];
    }
  }

  /** Partial autocorrelations toUnit(u[i..i+k)) → AR-form coefficients (Durbin–Levinson) × sign. */
  private pacfInto(u: readonly number[], i: number, k: number, out: Float64Array, sign: number): number {
    const { pac, tmp } = this;
    for (let j = 0; j < k; j++) pac[j] = toUnit(u[i + j]);
    // as pacfToAr: φ_{k,j} = φ_{k−1,j} − r_k φ_{k−1,k−j}
    for (let s = 0; s < k; s++) {
      for (let j = 0; j < s; j++) tmp[j] = out[j] - pac[s] * out[s - 1 - j];
      for (let j = 0; j < s; j++) out[j] = tmp[j];
      out[s] = pac[s];
    }
    if (sign < 0) for (let j = 0; j < k; j++) out[j] = -out[j];
    return i + k;
  }

  private viaFullFilter(): number {
    const { o } = this;
    const arr = Array.from(this.ar.subarray(0, this.pStar));
    const ma = Array.from(this.R.subarray(1, this.qStar + 1));
    try {
      const f = armaFilter(armaSystem(arr, ma), this.x, this.withMean ? "estimate" : o.constant ? this.mu0 : "none", true);
      return Number.isFinite(f.loglik) ? -f.loglik : Infinity;
    } catch {
      return Infinity;
    }
  }

  /**
   * The first row of the stationary P₀ (units of σ²) into col, in O(p² + r·(p + s²)) for p AR and s
   * non-zero MA coefficients, instead of solving the (p+1)-square autocovariance system: the AR part
   * alone, u_t = Σ a_i u_{t−i} + ε_t, has partial autocorrelations κ_k from the step-down recursion
   * (Barndorff-Nielsen & Schou 1973) and γ_u(0) = 1/Π(1 − κ_k²); the order-k predictors a^{(k)} met on
   * the way give γ_u(k) = Σ_j a^{(k)}_j γ_u(k − j) (Durbin 1960's recursion read forwards), and the AR
   * recursion continues γ_u past lag p. The ARMA x_t = Σ_i R_i u_{t−i} then has
   * γ_x(k) = Σ_{i,j} R_i R_j γ_u(k − i + j), and the first row follows as in kalman.ts's
   * stationaryFirstRow. False when the AR part is not stationary (some |κ_k| ≥ 1).
   */
  private firstRow(): boolean {
    const { r, ar, R, col, levels, gu, gx, psi, maIdx } = this;
    const p = this.pStar;
    const w = p + 1;
    // step-down: levels[k*w + j] = a^{(k)}_j (j = 1..k)
    for (let j = 1; j <= p; j++) levels[p * w + j] = ar[j - 1];
    let prod = 1;
    for (let k = p; k >= 1; k--) {
      const kap = levels[k * w + k];
      if (!(abs(kap) < 1)) return false;
      const den = 1 - kap * kap;
      prod *= den;
      for (let j = 1; j < k; j++) levels[(k - 1) * w + j] = (levels[k * w + j] + kap * levels[k * w + k - j]) / den;
    }
    const L = gu.length - 1;
    gu[0] = 1 / prod;
    if (!Number.isFinite(gu[0])) return false;
    for (let k = 1; k <= p; k++) {
      let v = 0;
      for (let j = 1; j <= k; j++) v += levels[k * w + j] * gu[k - j];
      gu[k] = v;
    }
    for (let l = p + 1; l <= L; l++) {
      let v = 0;
      for (let i = 1; i <= p; i++) v += ar[i - 1] * gu[l - i];
      gu[l] = v;
    }
    const s = maIdx.length;
    for (let k = 0; k <= r + 1; k++) {
      let v = 0;
      for (let a = 0; a < s; a++) {
        const i = maIdx[a];
        const Ri = R[i];
        for (let b = 0; b < s; b++) {
          const j = maIdx[b];
          const lag = k - i + j;
          v += Ri * R[j] * gu[lag < 0 ? -lag : lag];
        }
      }
      gx[k] = v;
    }
    // ψ weights up to lag r
    for (let j = 0; j <= r; j++) {
      let v = j === 0 ? 1 : j < r ? R[j] : 0;
      const top = j < p ? j : p;
      for (let i = 1; i <= top; i++) v += ar[i - 1] * psi[j - i];
      psi[j] = v;
    }
    for (let j = 0; j < r; j++) {
      let v = 0;
      for (let k = j; k < r; k++) v += ar[k] * gx[1 + k - j] + R[k] * psi[k - j];
      if (!Number.isFinite(v)) return false;
      col[j] = v;
    }
    return true;
  }

  /** ℓ by the Chandrasekhar recursions (σ² and the mean concentrated out). */
  private chandrasekhar(): number {
    const { r, ar, R, col, a, c, K, W, x } = this;
    const p = this.pStar;
    const n = x.length;
    if (p === 0) {
      // Pure MA: P₀[i][0] = Σ_k R[i+k] R[k] exactly.
      for (let i = 0; i < r; i++) {
        let s = 0;
        for (let k = 0; i + k < r; k++) s += R[i + k] * R[k];
        col[i] = s;
      }
    } else if (!this.firstRow()) {
      return -Infinity;
    }
    // K_1 = T P₀ e₁ (T v)[i] = a_i v[0] + v[i+1]; W_1 = K_1, M_1 = −1/F_1.
    const F0 = col[0];
    for (let i = 0; i < r; i++) {
      K[i] = ar[i] * F0 + (i + 1 < r ? col[i + 1] : 0);
      W[i] = K[i];
    }
    W[r] = 0;
    a.fill(0);
    c.fill(0);
    let F = F0;
    let M = -1 / F;
    let sumLogF = 0;
    let ssq = 0;
    const withMean = this.withMean;
    const { vx, v1, Fs } = this;
    const mu0 = this.mu0;
    let t = 0;
    this.steadyFrom = -1;
    const allowSteady = this.allowSteady;
    for (; t < n; t++) {
      if (!(F > 0)) return -Infinity;
      const e = x[t] - mu0 - a[0];
      const g = e / F;
      sumLogF += log(F);
      const z = W[0];
      const Mz = M * z;
      const kz = z / F;
      const a0 = a[0];
      let wmax = 0;
      if (withMean) {
        const e1 = 1 - c[0];
        vx[t] = e;
        v1[t] = e1;
        Fs[t] = F;
        const g1 = e1 / F;
        const c0 = c[0];
        for (let i = 0; i < r; i++) {
          const ai = ar[i];
          const k = K[i];
          a[i] = ai * a0 + a[i + 1] + k * g;
          c[i] = ai * c0 + c[i + 1] + k * g1;
          const tw = ai * z + W[i + 1];
          K[i] = k + Mz * tw;
          const w = tw - k * kz;
          W[i] = w;
          const aw = abs(w);
          if (aw > wmax) wmax = aw;
        }
      } else {
        ssq += e * g;
        for (let i = 0; i < r; i++) {
          const ai = ar[i];
          const k = K[i];
          a[i] = ai * a0 + a[i + 1] + k * g;
          const tw = ai * z + W[i + 1];
          K[i] = k + Mz * tw;
          const w = tw - k * kz;
          W[i] = w;
          const aw = abs(w);
          if (aw > wmax) wmax = aw;
        }
      }
      const Fnext = F + Mz * z;
      M = (M * F) / Fnext;
      F = Fnext;
      if (allowSteady && -M * wmax * wmax < STEADY_TOLERANCE * F) {
        t++;
        this.steadyFrom = t;
        break;
      }
    }
    if (t < n) {
      // Steady state: F and K fixed, only the state moves.
      if (!(F > 0)) return -Infinity;
      const logF = log(F);
      for (; t < n; t++) {
        const e = x[t] - mu0 - a[0];
        const g = e / F;
        sumLogF += logF;
        const a0 = a[0];
        if (withMean) {
          const e1 = 1 - c[0];
          vx[t] = e;
          v1[t] = e1;
          Fs[t] = F;
          const g1 = e1 / F;
          const c0 = c[0];
          for (let i = 0; i < r; i++) {
            const ai = ar[i];
            const k = K[i];
            a[i] = ai * a0 + a[i + 1] + k * g;
            c[i] = ai * c0 + c[i + 1] + k * g1;
          }
        } else {
          ssq += e * g;
          for (let i = 0; i < r; i++) a[i] = ar[i] * a0 + a[i + 1] + K[i] * g;
        }
      }
    }
    if (withMean) {
      let sxy = 0, syy = 0;
      for (let s = 0; s < n; s++) { sxy += (vx[s] * v1[s]) / Fs[s]; syy += (v1[s] * v1[s]) / Fs[s]; }
      const mu = syy > 0 ? sxy / syy : 0;
      ssq = 0;
      for (let s = 0; s < n; s++) { const v = vx[s] - mu * v1[s]; ssq += (v * v) / Fs[s]; }
    }
    const sigma2 = ssq / n;
    return sigma2 > 0 && Number.isFinite(sumLogF) ? -0.5 * (n * (LOG_2PI + log(sigma2) + 1) + sumLogF) : -Infinity;
  }
}

/** 0-based lags k of the expanded polynomial (coefficient of B^{k+1}) that can be non-zero, ascending. */
function lagsOf(p: number, P: number, m: number): number[] {
  const set = new Set<number>();
  for (let j = 0; j <= P; j++) for (let k = 0; k <= p; k++) if (j + k > 0) set.add(k + j * m - 1);
  return [...set].sort((a, b) => a - b);
}
