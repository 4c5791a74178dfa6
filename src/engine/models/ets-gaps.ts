// Exponential smoothing with missing observations (METHODS §8): a Kalman filter on the
// innovations form y_t = w′x_{t−1} + ε_t, x_t = F x_{t−1} + g ε_t, whose measurement and state
// noise are the same ε (Harvey 1989, Forecasting, Structural Time Series Models and the Kalman
// Filter, §3.2 and §3.4.7 on missing observations; Hyndman, Koehler, Ord & Snyder 2008, ch. 3 and
// 5 on the innovations form). With P̃ = P/σ²:
//   observed t: v_t = y_t − w′x̂_{t−1}, s_t = 1 + w′P̃_{t−1}w, k_t = (F P̃_{t−1} w + g)/s_t,
//               x̂_t = F x̂_{t−1} + k_t v_t,  P̃_t = F P̃_{t−1} F′ + g g′ − k_t k_t′ s_t;
//   missing t:  x̂_t = F x̂_{t−1},             P̃_t = F P̃_{t−1} F′ + g g′.
// P̃_0 = 0 (the initial states are parameters), so until the first gap s_t = 1 and k_t = g: the
// ordinary recursion. σ² concentrates out: σ̂² = (1/n_obs)Σ v_t²/s_t and
// ℓ = −½Σ ln(2π σ̂² s_t) − n_obs/2. For given smoothing parameters every v_t is linear in the
// initial states, so the initial states that maximise ℓ minimise Σ v_t²/s_t: weighted least
// squares on the observed points (the s_t do not depend on the states) — the same concentrated
// likelihood as the complete-data fit, which it equals when nothing is missing.
// F has a fixed sparse shape (level, damped trend, a seasonal rotation), so F·v, F P̃ F′ cost O(d)
// and O(d²) without forming F.
import { solveSymmetric } from "../_lib/cholesky";
import type { InitialStates, Smoothing } from "./ets";

/** The model's shape: which components it has, and the season length (1 without a season). */
export interface ModelShape { trend: boolean; damped: boolean; seasonal: boolean; m: number }

/** The state layout x = (ℓ, [b], s_t, s_{t−1}, …, s_{t−m+1}) and the system vectors w and g. */
export interface GapSystem {
  d: number;
  /** Index of s_t in the state vector (1 without a trend, 2 with one). */
  s0: number;
  m: number;
  trend: boolean;
  seasonal: boolean;
  phi: number;
  w: Float64Array;
  g: Float64Array;
}

/** The system of a shape with given smoothing parameters. */
export function gapSystem(shape: ModelShape, p: Smoothing): GapSystem {
  const m = shape.seasonal ? shape.m : 1;
  const s0 = shape.trend ? 2 : 1;
  const d = s0 + (shape.seasonal ? m : 0);
  const phi = shape.damped ? p.phi : 1;
  const w = new Float64Array(d);
  const g = new Float64Array(d);
  w[0] = 1;
  g[0] = p.alpha;
  if (shape.trend) {
    w[1] = phi;
    g[1] = p.beta;
  }
  if (shape.seasonal) {
    w[s0 + m - 1] = 1;
    g[s0] = p.gamma;
  }
  return { d, s0, m, trend: shape.trend, seasonal: shape.seasonal, phi, w, g };
}

/** The initial states as a state vector x_0 (s_{0−i} at s0 + i is the effect observation m−1−i uses). */
export function stateVector(sys: GapSystem, x0: InitialStates): Float64Array {
  const x = new Float64Array(sys.d);
  x[0] = x0.level;
  if (sys.trend) x[1] = x0.trend;
  if (sys.seasonal) for (let i = 0; i < sys.m; i++) x[sys.s0 + i] = x0.season[sys.m - 1 - i];
  return x;
}

/** v ← F v for the vector stored at x[off], x[off + stride], … */
function applyF(x: Float64Array, off: number, stride: number, sys: GapSystem): void {
  if (sys.trend) {
    const b = sys.phi * x[off + stride];
    x[off] += b;
    x[off + stride] = b;
  }
  if (sys.seasonal) {
    const base = off + sys.s0 * stride;
    const last = x[base + (sys.m - 1) * stride];
    for (let i = sys.m - 1; i > 0; i--) x[base + i * stride] = x[base + (i - 1) * stride];
    x[base] = last;
  }
}

/** w′v for the vector stored at x[off], x[off + stride], … */
function wDot(x: Float64Array, off: number, stride: number, sys: GapSystem): number {
  let s = x[off];
  if (sys.trend) s += sys.phi * x[off + stride];
  if (sys.seasonal) s += x[off + (sys.s0 + sys.m - 1) * stride];
  return s;
}

/** P ← F P F′ + g g′ (P symmetric, d×d row-major). */
function predictCovariance(P: Float64Array, sys: GapSystem): void {
  const d = sys.d;
  for (let j = 0; j < d; j++) applyF(P, j, d, sys); // F P: F on each column
  for (let i = 0; i < d; i++) applyF(P, i * d, 1, sys); // (F P) F′: F on each row
  const g = sys.g;
  for (let i = 0; i < d; i++) {
    if (g[i] === 0) continue;
    for (let j = 0; j < d; j++) P[i * d + j] += g[i] * g[j];
  }
}

/** Per-time s_t (0 where missing) and gains k_t, and the final P̃_T, for one parameter set. */
interface Gains { S: Float64Array; K: Float64Array; P: Float64Array; sumLogS: number; nObs: number }

/** Runs the P̃ recursion; fills S, K and P (which ends as P̃_T). */
function runGains(obs: Uint8Array, sys: GapSystem, out: Gains, a: Float64Array): void {
  const d = sys.d;
  const n = obs.length;
  const { S, K, P } = out;
  P.fill(0);
  let zero = true; // P̃ is exactly 0 until the first gap
  let sumLogS = 0;
  let nObs = 0;
  for (let t = 0; t < n; t++) {
    const kt = t * d;
    if (!obs[t]) {
      S[t] = 0;
      predictCovariance(P, sys);
      zero = false;
      continue;
    }
    nObs++;
    if (zero) {
      S[t] = 1;
      for (let i = 0; i < d; i++) K[kt + i] = sys.g[i];
      continue;
    }
    for (let i = 0; i < d; i++) a[i] = wDot(P, i * d, 1, sys); // a = P̃ w
    const s = 1 + wDot(a, 0, 1, sys);
    S[t] = s;
    sumLogS += Math.log(s);
    applyF(a, 0, 1, sys); // a = F P̃ w
    for (let i = 0; i < d; i++) K[kt + i] = (a[i] + sys.g[i]) / s;
    predictCovariance(P, sys);
    for (let i = 0; i < d; i++) {
      const ki = K[kt + i] * s;
      for (let j = 0; j < d; j++) P[i * d + j] -= ki * K[kt + j];
    }
  }
  out.sumLogS = sumLogS;
  out.nObs = nObs;
}

/** Reusable arrays for {@link concentrateWithGaps}, sized for one series and model shape. */
export interface GapWorkspace {
  obs: Uint8Array;
  gains: Gains;
  a: Float64Array;
  X: Float64Array;
  E: Float64Array;
  A: Float64Array;
  rhs: Float64Array;
  chol: { L: Float64Array; y: Float64Array; x: Float64Array };
  /** State index of each free initial state: level, [trend], seasonal effects of observations 1..m−1. */
  free: Int32Array;
  q: number;
}

/** A workspace for a series (NaN = missing) and a model shape. */
export function gapWorkspace(y: ArrayLike<number>, shape: ModelShape): GapWorkspace {
  const n = y.length;
  const m = shape.seasonal ? shape.m : 1;
  const s0 = shape.trend ? 2 : 1;
  const d = s0 + (shape.seasonal ? m : 0);
  const q = 1 + (shape.trend ? 1 : 0) + (shape.seasonal ? m - 1 : 0);
  const obs = new Uint8Array(n);
  for (let t = 0; t < n; t++) obs[t] = Number.isNaN(y[t]) ? 0 : 1;
  const free = new Int32Array(q);
  free[0] = 0;
  let f = 1;
  if (shape.trend) free[f++] = 1;
  // season[j] (j = 1..m−1; season[0] is fixed at 0) sits at s0 + m − 1 − j
  if (shape.seasonal) for (let j = 1; j < m; j++) free[f++] = s0 + m - 1 - j;
  return {
    obs,
    gains: { S: new Float64Array(n), K: new Float64Array(n * d), P: new Float64Array(d * d), sumLogS: 0, nObs: 0 },
    a: new Float64Array(d),
    X: new Float64Array((q + 1) * d),
    E: new Float64Array((q + 1) * n),
    A: new Float64Array(q * q),
    rhs: new Float64Array(q),
    chol: { L: new Float64Array(q * q), y: new Float64Array(q), x: new Float64Array(q) },
    free,
    q,
  };
}

/**
 * For given smoothing parameters on a series with gaps: the weighted SSE Σ v_t²/s_t at the
 * weighted-least-squares initial states (left in ws.chol.x in the order of ws.free), Σ ln s_t and
 * the number of observed points. The innovations are linear in the initial states,
 * v = v⁰ + E·x₀: the filter is run for the data (zero initial states) and for each unit initial
 * state, with the same gains.
 */
export function concentrateWithGaps(y: ArrayLike<number>, shape: ModelShape, p: Smoothing, ws: GapWorkspace): { sse: number; sumLogS: number; nObs: number } {
  const sys = gapSystem(shape, p);
  const d = sys.d;
  const n = y.length;
  const { obs, gains, X, E, A, rhs, free, q } = ws;
  runGains(obs, sys, gains, ws.a);
  const { S, K } = gains;
  const C = q + 1;
  X.fill(0);
  for (let c = 1; c < C; c++) X[c * d + free[c - 1]] = 1;
  for (let t = 0; t < n; t++) {
    if (!obs[t]) {
      for (let c = 0; c < C; c++) {
        E[c * n + t] = 0;
        applyF(X, c * d, 1, sys);
      }
      continue;
    }
    const r = 1 / Math.sqrt(S[t]);
    const kt = t * d;
    for (let c = 0; c < C; c++) {
      const o = c * d;
      const e = (c === 0 ? y[t] : 0) - wDot(X, o, 1, sys);
      E[c * n + t] = e * r;
      applyF(X, o, 1, sys);
      for (let i = 0; i < d; i++) X[o + i] += K[kt + i] * e;
    }
  }
  let g00 = 0;
  for (let t = 0; t < n; t++) g00 += E[t] * E[t];
  for (let i = 0; i < q; i++) {
    const oi = (i + 1) * n;
    let s0 = 0;
    for (let t = 0; t < n; t++) s0 += E[t] * E[oi + t];
    rhs[i] = -s0;
    for (let j = 0; j <= i; j++) {
      const oj = (j + 1) * n;
      let s = 0;
      for (let t = 0; t < n; t++) s += E[oi + t] * E[oj + t];
      A[i * q + j] = A[j * q + i] = s;
    }
  }
  const x = solveSymmetric(A, rhs, q, ws.chol);
  let sse = g00;
  for (let i = 0; i < q; i++) sse -= x[i] * rhs[i];
  return { sse: Math.max(sse, 1e-300 * (1 + g00)), sumLogS: gains.sumLogS, nObs: gains.nObs };
}

/** The initial states left in the workspace by the last {@link concentrateWithGaps} call. */
export function gapStates(ws: GapWorkspace, shape: ModelShape): InitialStates {
  const x = ws.chol.x;
  const m = shape.seasonal ? shape.m : 1;
  const season = new Array<number>(m).fill(0);
  const off = shape.trend ? 2 : 1;
  if (shape.seasonal) for (let j = 1; j < m; j++) season[j] = x[off + j - 1];
  return { level: x[0], trend: shape.trend ? x[1] : 0, season };
}

/** The filter's output on a series with gaps, for given parameters and initial states. */
export interface GapFilterResult {
  /** Standardised innovations v_t/√s_t (each with variance σ²); NaN where missing. */
  residuals: Float64Array;
  /** Σ v_t²/s_t, Σ ln s_t and the number of observed points. */
  sse: number;
  sumLogS: number;
  nObs: number;
  /** x̂_T, in the layout of {@link GapSystem}. */
  x: Float64Array;
  /** P̃_T = P_T/σ², d×d row-major. */
  P: Float64Array;
  sys: GapSystem;
}

/**
 * Runs the Kalman filter through a series with gaps (NaN = missing) from given initial states.
 * With nothing missing it is the ordinary recursion (s_t = 1, k_t = g, P̃_T = 0).
 */
export function filterWithGaps(y: ArrayLike<number>, shape: ModelShape, p: Smoothing, x0: InitialStates): GapFilterResult {
  const sys = gapSystem(shape, p);
  const d = sys.d;
  const n = y.length;
  const obs = new Uint8Array(n);
  for (let t = 0; t < n; t++) obs[t] = Number.isNaN(y[t]) ? 0 : 1;
  const gains: Gains = { S: new Float64Array(n), K: new Float64Array(n * d), P: new Float64Array(d * d), sumLogS: 0, nObs: 0 };
  runGains(obs, sys, gains, new Float64Array(d));
  const x = stateVector(sys, x0);
  const residuals = new Float64Array(n);
  let sse = 0;
  for (let t = 0; t < n; t++) {
    if (!obs[t]) {
      residuals[t] = NaN;
      applyF(x, 0, 1, sys);
      continue;
    }
    const e = y[t] - wDot(x, 0, 1, sys);
    const s = gains.S[t];
    residuals[t] = e / Math.sqrt(s);
    sse += (e * e) / s;
    applyF(x, 0, 1, sys);
    for (let i = 0; i < d; i++) x[i] += gains.K[t * d + i] * e;
  }
  return { residuals, sse, sumLogS: gains.sumLogS, nObs: gains.nObs, x, P: gains.P, sys };
}
