// Seasonal ARIMA on the transformed scale: the series is differenced by (1 − B)^d (1 − B^m)^D,
// the differences follow a stationary, invertible ARMA with an optional mean (Box & Jenkins'
// seasonal model), estimated by exact Gaussian maximum likelihood through the Kalman filter
// (Gardner, Harvey & Phillips 1980; Harvey 1989) with conditional sum of squares only as a start.
// Stationarity and invertibility hold by construction: the optimiser works on partial
// autocorrelations (Jones 1980; Monahan 1984). Forecasts integrate the ARMA forecasts of the
// differences back to levels; their variances use the filter's final state covariance (exact for
// the finite sample, not the infinite-past approximation), and simulation runs the same recursion.
import { countMissing } from "../../series/clean";
import { EngineError } from "../../errors";
import { createRandom } from "../../_lib/random";
import { minimizeBfgs } from "../../_lib/bfgs";
import { solveSymmetric } from "../../_lib/cholesky";
import { choleskyLower } from "../../_lib/cholesky-factor";
import type { FittedModel, StepMoments } from "../types";
import { armaFilter, armaSystem, ArmaFilterResult, ArmaSystem } from "./kalman";
import { ArmaLikelihood } from "./likelihood";
import { ArimaOrder, arimaTitle, formatArimaOrder } from "./order";
import { applyDifference, differencingPolynomial, expandAr, expandMa, pacfToAr, toUnit } from "./polynomial";

const sqrt = Math.sqrt;

/** The natural parameters of a seasonal ARIMA: AR φ, seasonal AR Φ, MA θ, seasonal MA Θ, mean μ of the differences. */
export interface ArimaParams {
  phi: number[];
  Phi: number[];
  theta: number[];
  Theta: number[];
  /** Mean of the differenced series (0 without a constant). */
  mu: number;
}

/** A fitted seasonal ARIMA: the common FittedModel plus its order, coefficients and their standard errors. */
export interface ArimaModel extends FittedModel {
  readonly order: ArimaOrder;
  readonly spec: string;
  readonly coefficients: ArimaParams;
  /** Standard errors by parameter name (from the observed information), or null where the Hessian is not usable. */
  readonly standardErrors: Readonly<Record<string, number>> | null;
  /** Observed differenced points used by the likelihood. */
  readonly nobs: number;
  /** Sentences a user should read (e.g. a root near the unit circle). */
  readonly notes: readonly string[];
}

/**
 * Smallest series an order accepts: the values used up by differencing, then enough for the
 * parameters (twice their number plus two, at least 8; common practice).
 * @example arimaMinimumLength({ p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false }) // 21
 */
export function arimaMinimumLength(o: ArimaOrder): number {
  const k = o.p + o.q + o.P + o.Q + (o.constant ? 1 : 0) + 1;
  return o.d + o.D * o.m + Math.max(2 * k + 2, 8);
}

function countParams(o: ArimaOrder): number {
  return o.p + o.q + o.P + o.Q + (o.constant ? 1 : 0);
}

function unpack(u: readonly number[], o: ArimaOrder): Omit<ArimaParams, "mu"> {
  let i = 0;
  const take = (k: number): number[] => { const s = u.slice(i, i + k).map(toUnit); i += k; return s; };
  const phi = pacfToAr(take(o.p));
  const Phi = pacfToAr(take(o.P));
  const theta = pacfToAr(take(o.q)).map((v) => -v);
  const Theta = pacfToAr(take(o.Q)).map((v) => -v);
  return { phi, Phi, theta, Theta };
}

function system(p: Omit<ArimaParams, "mu">, m: number): ArmaSystem {
  return armaSystem(expandAr(p.phi, p.Phi, m), expandMa(p.theta, p.Theta, m));
}

function observedMean(x: readonly number[]): number {
  let s = 0, n = 0;
  for (const v of x) if (v === v) { s += v; n++; }
  return n ? s / n : 0;
}

/**
 * Fits a seasonal ARIMA of the given order to a transformed series w (NaN = missing) by exact
 * maximum likelihood (Kalman filter; Gardner, Harvey & Phillips 1980), from a conditional-sum-of-
 * squares start; σ² and the mean are concentrated out. AICc counts the ARMA coefficients, the
 * constant and σ² (k), with the number of observed differences as n.
 * @example fitArima(logAirPassengers, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false }).coefficients.theta[0] // ≈ −0.40
 */
export function fitArima(w: readonly number[], order: ArimaOrder, fixed?: ArimaParams & { sigma2?: number }, withStandardErrors = true): ArimaModel {
  const o = order;
  // Checked before any lag polynomial is built: a seasonal period longer than the series (e.g. a
  // mistyped period) must be refused, not allocated.
  const seasonalLag = o.m * Math.max(o.P, o.Q, o.D);
  if (w.length < arimaMinimumLength(o) || seasonalLag >= w.length) {
    throw new EngineError("input", `${arimaTitle(o)} needs at least ${Math.max(arimaMinimumLength(o), seasonalLag + 1)} values (period ${o.m}); the series has ${w.length}. Use a smaller order, the right period, or a longer history.`);
  }
  const c = differencingPolynomial(o.d, o.D, o.m);
  const K = c.length - 1;
  const n = w.length;
  for (let t = n - K; t < n; t++) {
    if (t >= 0 && !(w[t] === w[t])) throw new EngineError("input", `${arimaTitle(o)} needs the last ${K} values observed (they carry the differencing into the forecast); value ${t + 1} of ${n} is missing.`);
  }
  const x = applyDifference(w, c);
  let nObsX = 0;
  for (const v of x) if (v === v) nObsX++;
  const kCount = countParams(o);
  const need = arimaMinimumLength(o);
  if (n < need || nObsX < kCount + 4) {
    throw new EngineError("input", `${arimaTitle(o)} needs at least ${need} values (${K} are used up by differencing, then enough for ${kCount + 1} parameters); the series has ${n}${nObsX < n - K ? `, ${nObsX} usable differences` : ""}. Use a smaller order or a longer history.`);
  }
  let xs = 0;
  for (const v of x) if (v === v) xs += v * v;
  if (!(xs > 0) && !o.constant) throw new EngineError("input", `After differencing (${formatArimaOrder(o)}) the series is all zeros: nothing is left to model.`);
  const muMode: "estimate" | "none" = o.constant ? "estimate" : "none";
  const notes: string[] = [];

  let params: Omit<ArimaParams, "mu">;
  let filt: ArmaFilterResult;
  let sys: ArmaSystem;
  if (fixed) {
    params = { phi: fixed.phi.slice(), Phi: fixed.Phi.slice(), theta: fixed.theta.slice(), Theta: fixed.Theta.slice() };
    sys = system(params, o.m);
    filt = armaFilter(sys, x, o.constant ? fixed.mu : "none");
  } else {
    const d = o.p + o.q + o.P + o.Q;
    const mu0 = o.constant ? observedMean(x) : 0;
    const likelihood = new ArmaLikelihood(x, o);
    const cssObjective = (u: number[]): number => Math.log(likelihood.css(u, mu0));
    const mlObjective = (u: number[]): number => likelihood.negLoglik(u);
    const zero = new Array(d).fill(0);
    const starts: number[][] = [zero];
    if (d > 0) {
      // Only a start: looser than the likelihood's tolerances (its gradient is of log CSS, O(1)).
      const cssFit = minimizeBfgs(cssObjective, zero, 1e-4, 1e-8, 100);
      if (Number.isFinite(cssFit.fx)) starts.unshift(cssFit.x.map((v) => Math.max(-8, Math.min(8, v))));
    }
    let best = { x: zero, fx: mlObjective(zero) };
    let first: { x: number[]; fx: number } | null = null;
    // A later start whose path comes within 0.01 (in every unconstrained coordinate) of the first
    // start's optimum, no more than 0.01 above it in −ℓ, is on its way to the same optimum: stopped.
    const joins = (u: readonly number[], fu: number): boolean =>
      first !== null && Number.isFinite(first.fx) && fu - first.fx < 0.01 && u.every((v, i) => Math.abs(v - (first as { x: number[] }).x[i]) < 0.01);
    for (const s of starts) {
      const r = d > 0 ? minimizeBfgs(mlObjective, s, 1e-6, 1e-11, 300, joins) : { x: s, fx: mlObjective(s) };
      if (r.fx < best.fx) best = { x: r.x, fx: r.fx };
      if (first === null) first = { x: r.x, fx: r.fx };
    }
    if (!Number.isFinite(best.fx)) throw new EngineError("domain", `${arimaTitle(o)} could not be fitted to this series (the likelihood is not finite anywhere tried). Try a smaller order.`);
    params = unpack(best.x, o);
    const edge = best.x.some((v) => Math.abs(toUnit(v)) > 0.999);
    if (edge) notes.push(`${arimaTitle(o)}: a fitted root is almost on the unit circle (a partial autocorrelation beyond ±0.999), so the model is close to needing another difference or a smaller MA order; treat its intervals with care.`);
    sys = system(params, o.m);
    filt = armaFilter(sys, x, muMode);
  }
  const coefficients: ArimaParams = { ...params, mu: o.constant ? filt.mu : 0 };
  const k = kCount + 1;
  const nobs = filt.nobs;
  let loglik = filt.loglik;
  let sigma2 = filt.sigma2;
  if (fixed && fixed.sigma2 !== undefined) {
    // ℓ at a given σ²: −½[n ln(2πσ²) + Σ ln F_t + Σ v_t²/F_t /σ²], with Σ v²/F = n σ̂².
    const s2 = fixed.sigma2;
    loglik = filt.loglik + 0.5 * nobs * (Math.log(filt.sigma2) + 1) - 0.5 * nobs * (Math.log(s2) + filt.sigma2 / s2);
    sigma2 = s2;
  }
  const aicc = nobs - k - 1 > 0 ? -2 * loglik + 2 * k + (2 * k * (k + 1)) / (nobs - k - 1) : Infinity;
  const sigma = sqrt(sigma2);
  const residuals: number[] = Array.from(filt.innovations);
  const named = paramRecord(coefficients, o);
  const standardErrors = fixed || !withStandardErrors ? null : hessianErrors(x, coefficients, o);

  const lastW = w.slice(n - K);
  const moments = (H: number): { mean: number[]; cov: Float64Array } => forecastMoments(sys, filt, coefficients.mu, c, lastW, sigma2, H);
  const title = arimaTitle(o);
  return Object.freeze({
    method: formatArimaOrder(o) as `arima:${string}`,
    title,
    n,
    missing: countMissing(w),
    period: o.m,
    params: Object.freeze(named),
    sigma,
    loglik,
    aicc,
    k,
    residuals: Object.freeze(residuals),
    order: Object.freeze({ ...o }),
    spec: formatArimaOrder(o),
    coefficients: Object.freeze(coefficients),
    standardErrors: standardErrors ? Object.freeze(standardErrors) : null,
    nobs,
    notes: Object.freeze(notes),
    forecast(h: number): StepMoments[] {
      const { mean, cov } = moments(h);
      return mean.map((m, i) => ({ h: i + 1, mean: m, sd: sqrt(Math.max(0, cov[i * h + i])) }));
    },
    simulate(h: number, paths: number, seed: number): Float64Array {
      return simulateArima(sys, filt, coefficients.mu, c, lastW, sigma, h, paths, seed);
    },
    simulateShocks(h: number, paths: number, seed: number, shocks: Float64Array): Float64Array {
      return simulateArima(sys, filt, coefficients.mu, c, lastW, sigma, h, paths, seed, shocks);
    },
  });
}

function paramRecord(p: ArimaParams, o: ArimaOrder): Record<string, number> {
  const out: Record<string, number> = {};
  p.phi.forEach((v, i) => { out[`ar${i + 1}`] = v; });
  p.theta.forEach((v, i) => { out[`ma${i + 1}`] = v; });
  p.Phi.forEach((v, i) => { out[`sar${i + 1}`] = v; });
  p.Theta.forEach((v, i) => { out[`sma${i + 1}`] = v; });
  if (o.constant) out[o.d + o.D === 0 ? "mean" : "drift"] = p.mu;
  return out;
}

/** Standard errors from a central-difference Hessian of −ℓ (σ² profiled out) in the natural parameters. */
function hessianErrors(x: readonly number[], p: ArimaParams, o: ArimaOrder): Record<string, number> | null {
  const names = Object.keys(paramRecord(p, o));
  const vec = [...p.phi, ...p.theta, ...p.Phi, ...p.Theta, ...(o.constant ? [p.mu] : [])];
  const d = vec.length;
  if (d === 0) return {};
  const likelihood = new ArmaLikelihood(x, o);
  const f = (v: number[]): number => {
    let i = 0;
    const take = (k: number): number[] => { const s = v.slice(i, i + k); i += k; return s; };
    const phi = take(o.p), theta = take(o.q), Phi = take(o.P), Theta = take(o.Q);
    const mu = o.constant ? v[i] : 0;
    return likelihood.negLoglikAt(phi, Phi, theta, Theta, mu);
  };
  const H = new Float64Array(d * d);
  const steps = vec.map((v) => 1e-4 * Math.max(1, Math.abs(v)));
  const f0 = f(vec);
  for (let i = 0; i < d; i++) {
    for (let j = i; j < d; j++) {
      const e = (di: number, dj: number): number => {
        const v = vec.slice();
        v[i] += di * steps[i];
        v[j] += dj * steps[j];
        return f(v);
      };
      let h: number;
      if (i === j) h = (e(1, 0) - 2 * f0 + e(-1, 0)) / (steps[i] * steps[i]);
      else h = (e(1, 1) - e(1, -1) - e(-1, 1) + e(-1, -1)) / (4 * steps[i] * steps[j]);
      if (!Number.isFinite(h)) return null;
      H[i * d + j] = h;
      H[j * d + i] = h;
    }
  }
  for (let i = 0; i < d; i++) if (!(H[i * d + i] > 0)) return null;
  const out: Record<string, number> = {};
  for (let i = 0; i < d; i++) {
    const e = new Float64Array(d);
    e[i] = 1;
    const col = solveSymmetric(H, e, d);
    const v = col[i];
    if (!(v > 0) || !Number.isFinite(v)) return null;
    out[names[i]] = sqrt(v);
  }
  return out;
}

/**
 * Forecast means and the joint covariance of the level errors for steps 1..H: the differences'
 * errors have covariance σ²[g_j′P g_k + Σ_{i=2}^{min(j,k)} ψ_{j−i}ψ_{k−i}] (g_j = T′^{j−1}e₁,
 * ψ_k = e₁′T^k R, P = P_{n+1|n}), and level errors follow from ε^w_h = ε^x_h − Σ_k c_k ε^w_{h−k}.
 */
function forecastMoments(sys: ArmaSystem, filt: ArmaFilterResult, mu: number, c: readonly number[], lastW: readonly number[], sigma2: number, H: number): { mean: number[]; cov: Float64Array } {
  const { r, ar, R } = sys;
  const p = ar.length;
  const P = filt.PNext;
  // g_j vectors and ψ weights
  const G: Float64Array[] = [];
  let g = new Float64Array(r);
  g[0] = 1;
  for (let j = 0; j < H; j++) {
    G.push(g);
    // g ← T′ g : (T′g)[i] = T[0][i] g[0] + … ; T[k][i] nonzero for i = 0 (a_k) and i = k + 1 (1)
    const next = new Float64Array(r);
    for (let i = 0; i < r; i++) {
      let s = 0;
      if (i === 0) for (let k = 0; k < Math.min(p, r); k++) s += ar[k] * g[k];
      else s += g[i - 1];
      next[i] = s;
    }
    g = next;
  }
  const psi = G.map((gj) => { let s = 0; for (let i = 0; i < r; i++) s += gj[i] * R[i]; return s; });
  const Pg = G.map((gj) => { const v = new Float64Array(r); for (let i = 0; i < r; i++) { let s = 0; for (let k = 0; k < r; k++) s += P[i * r + k] * gj[k]; v[i] = s; } return v; });
  const Cx = new Float64Array(H * H);
  for (let j = 0; j < H; j++) {
    for (let k = j; k < H; k++) {
      let s = 0;
      for (let i = 0; i < r; i++) s += G[j][i] * Pg[k][i];
      // future shocks ε_{n+2}..: step j (0-based) has ψ_{j−i} for i = 1..j
      for (let i = 1; i <= j; i++) s += psi[j - i] * psi[k - i];
      Cx[j * H + k] = s * sigma2;
      Cx[k * H + j] = s * sigma2;
    }
  }
  // Means of the differences: μ + e₁′T^{j−1} a_{n+1|n}
  const a = filt.aNext.slice();
  const xMean: number[] = [];
  for (let j = 0; j < H; j++) {
    xMean.push(mu + a[0]);
    const a0 = a[0];
    for (let i = 0; i < r; i++) a[i] = (i < p ? ar[i] * a0 : 0) + (i + 1 < r ? a[i + 1] : 0);
  }
  // Integrate: w_h = x_h − Σ_{k≥1} c_k w_{h−k}
  const K = c.length - 1;
  const hist = lastW.slice();
  const mean: number[] = [];
  for (let h = 0; h < H; h++) {
    let v = xMean[h];
    for (let k = 1; k <= K; k++) v -= c[k] * (h - k >= 0 ? mean[h - k] : hist[hist.length + h - k]);
    mean.push(v);
  }
  // L: ε^w = L ε^x (lower triangular)
  const L = new Float64Array(H * H);
  for (let h = 0; h < H; h++) {
    L[h * H + h] = 1;
    for (let k = 1; k <= Math.min(K, h); k++) {
      if (c[k] === 0) continue;
      for (let col = 0; col < H; col++) L[h * H + col] -= c[k] * L[(h - k) * H + col];
    }
  }
  const LC = new Float64Array(H * H);
  for (let i = 0; i < H; i++) for (let j = 0; j < H; j++) { let s = 0; for (let k = 0; k <= i; k++) s += L[i * H + k] * Cx[k * H + j]; LC[i * H + j] = s; }
  const cov = new Float64Array(H * H);
  for (let i = 0; i < H; i++) for (let j = 0; j < H; j++) { let s = 0; for (let k = 0; k <= j; k++) s += LC[i * H + k] * L[j * H + k]; cov[i * H + j] = s; }
  return { mean, cov };
}

/**
 * Sample paths of the levels: draw the state error from N(0, σ²P_{n+1|n}), run the ARMA state
 * recursion with N(0, σ²) shocks, add μ and integrate the differences. Row-major, paths × h.
 * With `shocks` (standard normals, paths × h) the innovation of step j is σ·shocks[j]: the state
 * error at n + 1 splits into R·ε_{n+1} (the first step's innovation, given) and T P_{n|n} T′ =
 * P_{n+1|n} − R R′ (what the data leave unknown about the state, drawn from `seed`), so the paths
 * have the same distribution as without shocks when the shocks are independent (the state equation
 * a_{t+1} = T a_t + R ε_{t+1} of Gardner, Harvey & Phillips 1980).
 */
function simulateArima(sys: ArmaSystem, filt: ArmaFilterResult, mu: number, c: readonly number[], lastW: readonly number[], sigma: number, h: number, paths: number, seed: number, shocks?: Float64Array): Float64Array {
  const { r, ar, R } = sys;
  const p = ar.length;
  let cov: ArrayLike<number> = filt.PNext;
  if (shocks) {
    if (shocks.length !== paths * h) throw new EngineError("domain", `Need ${paths * h} shocks (paths × h); got ${shocks.length}.`);
    const rest = Float64Array.from(filt.PNext);
    for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) rest[i * r + j] -= R[i] * R[j];
    cov = rest;
  }
  // P_{n+1|n} (and P_{n+1|n} − R R′ = T P_{n|n} T′) is positive semi-definite by construction (a pivot zero to rounding gives a zero column)
  const chol = choleskyLower(cov, r);
  if (!chol) throw new EngineError("domain", "The ARIMA model's final state covariance is not positive semi-definite (a numerical breakdown); simulate with a smaller order or another method.");
  const rng = createRandom(seed);
  const out = new Float64Array(paths * h);
  const K = c.length - 1;
  const alpha = new Float64Array(r);
  const z = new Float64Array(r);
  const level = new Float64Array(K + h);
  for (let path = 0; path < paths; path++) {
    for (let i = 0; i < r; i++) z[i] = rng.normal();
    const first = shocks ? sigma * shocks[path * h] : 0;
    for (let i = 0; i < r; i++) { let s = 0; for (let k = 0; k <= i; k++) s += chol[i * r + k] * z[k]; alpha[i] = filt.aNext[i] + sigma * s + R[i] * first; }
    for (let i = 0; i < K; i++) level[i] = lastW[i];
    for (let j = 0; j < h; j++) {
      if (j > 0) {
        const e = sigma * (shocks ? shocks[path * h + j] : rng.normal());
        const a0 = alpha[0];
        for (let i = 0; i < r; i++) alpha[i] = (i < p ? ar[i] * a0 : 0) + (i + 1 < r ? alpha[i + 1] : 0) + R[i] * e;
      }
      let v = mu + alpha[0];
      for (let k = 1; k <= K; k++) v -= c[k] * level[K + j - k];
      level[K + j] = v;
      out[path * h + j] = v;
    }
  }
  return out;
}
