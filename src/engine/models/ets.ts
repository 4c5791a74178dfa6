// Exponential smoothing with additive errors as innovations state-space models (Hyndman,
// Koehler, Ord & Snyder 2008, ch. 2 and 6): A,N,N / A,A,N / A,Ad,N / A,N,A / A,A,A / A,Ad,A.
//   ŷ_t = ℓ_{t−1} + φb_{t−1} + s_{t−m}, e_t = y_t − ŷ_t
//   ℓ_t = ℓ_{t−1} + φb_{t−1} + αe_t,  b_t = φb_{t−1} + βe_t,  s_t = s_{t−m} + γe_t
// Estimation by Gaussian maximum likelihood (minimise n·ln SSE). The initial states enter the
// errors linearly, so for given smoothing parameters they are solved exactly by least squares
// (a concentrated likelihood), and only α, β, γ, φ are searched inside the usual admissible box
// from the best eight distinct points of a grid: by a projected quasi-Newton method on the
// analytic gradient (ets-gradient.ts), or, for series with gaps, by short Nelder–Mead runs and a
// full run from the best of those.
import { EngineError } from "../errors";
import { solveSymmetric } from "../_lib/cholesky";
import { minimizeBounded } from "../_lib/brent";
import { minimizeBox } from "../_lib/nelder-mead";
import { minimizeBoxWithGradient } from "../_lib/projected-bfgs";
import { sseGradient } from "./ets-gradient";
import { createRandom } from "../_lib/random";
import { SMOOTHING, SmoothingMethod } from "./methods";
import { stateSpaceMoments, StateSpaceForm } from "./state-space";
import type { FittedModel, StepMoments } from "./types";
import { concentrateWithGaps, filterWithGaps, gapStates, gapWorkspace } from "./ets-gaps";
import { semidefiniteFactor } from "../_lib/cholesky";
import { countMissing } from "../series/clean";

/** Bounds of the smoothing parameters (as statsmodels 0.13 uses): α, β/α, γ/(1 − α) in [1e-4, 1 − 1e-4]. */
export const SMOOTH_LO = 1e-4;
export const SMOOTH_HI = 1 - 1e-4;
/** Bounds of the damping parameter (the usual admissible box). */
export const PHI_LO = 0.8;
export const PHI_HI = 0.98;

/** Smoothing parameters of an additive-error model (β = 0 without trend, γ = 0 without season, φ = 1 undamped). */
export interface Smoothing { alpha: number; beta: number; gamma: number; phi: number }

/** Initial states: level, trend, and the seasonal effect of each of the first m observations. */
export interface InitialStates { level: number; trend: number; season: number[] }

interface Spec { trend: boolean; damped: boolean; seasonal: boolean; m: number }

function specOf(method: SmoothingMethod, period: number): Spec {
  const s = SMOOTHING[method];
  return { trend: s.trend, damped: s.damped, seasonal: s.seasonal, m: s.seasonal ? period : 1 };
}

/**
 * Number of parameters in the AICc: smoothing + damping + free initial states (one seasonal state
 * is fixed at 0, so m − 1 are free) + σ².
 * @example parameterCount("holt-winters", 12) // 17
 */
export function parameterCount(method: SmoothingMethod, period: number): number {
  const s = specOf(method, period);
  return 1 + (s.trend ? 2 : 0) + (s.damped ? 1 : 0) + (s.seasonal ? 1 + (s.m - 1) : 0) + 1 + 1;
}

/**
 * Smallest series a method can be fitted to: two full seasons for seasonal ones, and n ≥ k + 2.
 * @example minimumLength("holt-winters", 12) // 24
 */
export function minimumLength(method: SmoothingMethod, period: number): number {
  const s = specOf(method, period);
  return Math.max(s.seasonal ? 2 * s.m : 4, parameterCount(method, period) + 2);
}

/** Runs the filter from given states; returns the SSE and the final states (and residuals if asked). */
function filter(y: ArrayLike<number>, spec: Spec, p: Smoothing, x0: InitialStates, resid?: Float64Array): { sse: number; level: number; trend: number; ring: Float64Array } {
  const n = y.length;
  const m = spec.m;
  const ring = new Float64Array(m);
  for (let j = 0; j < m; j++) ring[j] = spec.seasonal ? x0.season[j] : 0;
  let l = x0.level;
  let b = spec.trend ? x0.trend : 0;
  const phi = spec.damped ? p.phi : 1;
  const beta = spec.trend ? p.beta : 0;
  const gamma = spec.seasonal ? p.gamma : 0;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const k = t % m;
    const pb = phi * b;
    const e = y[t] - (l + pb + ring[k]);
    if (resid) resid[t] = e;
    sse += e * e;
    l = l + pb + p.alpha * e;
    b = pb + beta * e;
    ring[k] += gamma * e;
  }
  return { sse, level: l, trend: b, ring };
}

/** Reusable work arrays for {@link concentrate}, sized for one series and model. */
interface Workspace {
  E: Float64Array; lag: Float64Array; ring: Float64Array; A: Float64Array; rhs: Float64Array;
  chol: { L: Float64Array; y: Float64Array; x: Float64Array }; q: number;
}

function workspace(n: number, spec: Spec): Workspace {
  const m = spec.m;
  const q = 1 + (spec.trend ? 1 : 0) + (spec.seasonal ? m - 1 : 0);
  return {
    E: new Float64Array(4 * n), lag: new Float64Array(Math.max(m - 1, 1) * n), ring: new Float64Array(4 * m),
    A: new Float64Array(q * q), rhs: new Float64Array(q),
    chol: { L: new Float64Array(q * q), y: new Float64Array(q), x: new Float64Array(q) }, q,
  };
}

/**
 * For given smoothing parameters, the SSE at the least-squares initial states (which are left
 * in ws.chol.x: level, [trend], seasonal 2..m). The errors are linear in the initial states:
 * e = e0 + E·x0. The filter is run for the data (zero initial states) and for a unit initial
 * level, trend and position-0 seasonal; a unit seasonal at position j only starts to act at time
 * j, so (the filter being time-invariant and the seasonal ring indexed by t mod m) its error
 * response is the position-0 response delayed by j. The Gram matrix of those delayed copies comes
 * from cumulative lagged products, so the cost is O(n·m) rather than O(n·m²).
 */
function concentrate(y: ArrayLike<number>, spec: Spec, p: Smoothing, ws: Workspace): number {
  const n = y.length;
  const m = spec.m;
  const T = spec.trend;
  const S = spec.seasonal;
  const q = ws.q;
  const phi = spec.damped ? p.phi : 1;
  const beta = T ? p.beta : 0;
  const gamma = S ? p.gamma : 0;
  const alpha = p.alpha;
  const { E, lag, A, rhs, ring } = ws;
  // The four channels (0: data; 1: unit level; 2: unit trend; 3: unit seasonal at ring position 0)
  // run in one loop: each is a serial recursion, so interleaving them lets the processor overlap
  // them. The Gram entries among the first three channels are summed on the way.
  const n2 = 2 * n;
  const n3 = 3 * n;
  let l0 = 0, l1 = 1, l2 = 0, l3 = 0;
  let b0 = 0, b1 = 0, b2 = T ? 1 : 0, b3 = 0;
  let g00 = 0, g01 = 0, g11 = 0, g02 = 0, g12 = 0, g22 = 0;
  if (S) {
    // ring: the seasonal states of the four channels at offsets 0, m, 2m, 3m
    ring.fill(0);
    ring[3 * m] = 1;
    let k = 0;
    for (let t = 0; t < n; t++) {
      const p0 = phi * b0, p1 = phi * b1, p2 = phi * b2, p3 = phi * b3;
      const e0 = y[t] - (l0 + p0 + ring[k]);
      const e1 = -(l1 + p1 + ring[m + k]);
      const e2 = -(l2 + p2 + ring[2 * m + k]);
      const e3 = -(l3 + p3 + ring[3 * m + k]);
      E[t] = e0;
      E[n + t] = e1;
      E[n2 + t] = e2;
      E[n3 + t] = e3;
      l0 += p0 + alpha * e0; l1 += p1 + alpha * e1; l2 += p2 + alpha * e2; l3 += p3 + alpha * e3;
      b0 = p0 + beta * e0; b1 = p1 + beta * e1; b2 = p2 + beta * e2; b3 = p3 + beta * e3;
      ring[k] += gamma * e0; ring[m + k] += gamma * e1; ring[2 * m + k] += gamma * e2; ring[3 * m + k] += gamma * e3;
      g00 += e0 * e0; g01 += e0 * e1; g11 += e1 * e1; g02 += e0 * e2; g12 += e1 * e2; g22 += e2 * e2;
      if (++k === m) k = 0;
    }
  } else {
    for (let t = 0; t < n; t++) {
      const p0 = phi * b0, p1 = phi * b1, p2 = phi * b2;
      const e0 = y[t] - (l0 + p0);
      const e1 = -(l1 + p1);
      const e2 = -(l2 + p2);
      E[t] = e0;
      E[n + t] = e1;
      E[n2 + t] = e2;
      l0 += p0 + alpha * e0; l1 += p1 + alpha * e1; l2 += p2 + alpha * e2;
      b0 = p0 + beta * e0; b1 = p1 + beta * e1; b2 = p2 + beta * e2;
      g00 += e0 * e0; g01 += e0 * e1; g11 += e1 * e1; g02 += e0 * e2; g12 += e1 * e2; g22 += e2 * e2;
    }
  }
  // Free states in order: level, [trend], seasonal 1..m−1. rhs = −E′e0, A = E′E.
  rhs[0] = -g01;
  A[0] = g11;
  let off = 1;
  if (T) {
    rhs[1] = -g02;
    A[1] = A[q] = g12;
    A[q + 1] = g22;
    off = 2;
  }
  if (S) {
    const s3 = 3 * n;
    // Cross terms with the delayed seasonal responses: Σ_{t≥j} E_c[t]·E_S[t−j], c = data, level,
    // trend, two lags at a time so that six independent sums run side by side (one running sum is
    // bound by the latency of the additions, not by their number).
    for (let j = 1; j < m; j += 2) {
      const pair = j + 1 < m;
      const sj = s3 - j;
      let a0 = E[j] * E[s3];
      let a1 = E[n + j] * E[s3];
      let a2 = E[n2 + j] * E[s3];
      let c0 = 0, c1 = 0, c2 = 0;
      if (pair) {
        for (let t = j + 1; t < n; t++) {
          const x = E[sj + t];
          const z = E[sj - 1 + t];
          const e0 = E[t], e1 = E[n + t], e2 = E[n2 + t];
          a0 += e0 * x; a1 += e1 * x; a2 += e2 * x;
          c0 += e0 * z; c1 += e1 * z; c2 += e2 * z;
        }
      } else {
        for (let t = j + 1; t < n; t++) {
          const x = E[sj + t];
          a0 += E[t] * x; a1 += E[n + t] * x; a2 += E[n2 + t] * x;
        }
      }
      for (let h = 0; h < (pair ? 2 : 1); h++) {
        const col = off + j + h - 1;
        rhs[col] = -(h ? c0 : a0);
        A[col] = A[col * q] = h ? c1 : a1;
        if (T) A[q + col] = A[col * q + 1] = h ? c2 : a2;
      }
    }
    // seasonal × seasonal: for j ≤ k, Σ_{u=0}^{n−1−k} E_S[u]·E_S[u+k−j], from cumulative sums per
    // lag; only the last m partial sums are read below, so only those are stored. Four lags at a
    // time up to u = n − m (independent sums again), then each lag's tail on its own.
    const stop = n - m;
    for (let d0 = 0; d0 < m - 1; d0 += 4) {
      const nd = Math.min(4, m - 1 - d0);
      const e = s3 + d0;
      let sA = 0, sB = 0, sC = 0, sD = 0;
      if (nd === 4) {
        for (let u = 0; u < stop; u++) {
          const x = E[s3 + u];
          sA += x * E[e + u]; sB += x * E[e + 1 + u]; sC += x * E[e + 2 + u]; sD += x * E[e + 3 + u];
        }
      } else {
        for (let u = 0; u < stop; u++) {
          const x = E[s3 + u];
          sA += x * E[e + u];
          if (nd > 1) sB += x * E[e + 1 + u];
          if (nd > 2) sC += x * E[e + 2 + u];
        }
      }
      for (let h = 0; h < nd; h++) {
        const d = d0 + h;
        let sum = h === 0 ? sA : h === 1 ? sB : h === 2 ? sC : sD;
        const o = d * n;
        for (let u = stop; u + d < n; u++) {
          sum += E[s3 + u] * E[s3 + d + u];
          lag[o + u] = sum;
        }
      }
    }
    for (let j = 1; j < m; j++) {
      for (let k = j; k < m; k++) {
        const v = lag[(k - j) * n + (n - 1 - k)];
        A[(off + j - 1) * q + off + k - 1] = v;
        A[(off + k - 1) * q + off + j - 1] = v;
      }
    }
  }
  const x = solveSymmetric(A, rhs, q, ws.chol);
  let sse = g00;
  for (let i = 0; i < q; i++) sse -= x[i] * rhs[i];
  return Math.max(sse, 1e-300 * (1 + g00));
}

/** The initial states left in the workspace by the last {@link concentrate} call. */
function statesOf(ws: Workspace, spec: Spec): InitialStates {
  const x = ws.chol.x;
  const season = new Array<number>(spec.m).fill(0);
  const off = spec.trend ? 2 : 1;
  if (spec.seasonal) for (let j = 1; j < spec.m; j++) season[j] = x[off + j - 1];
  return { level: x[0], trend: spec.trend ? x[1] : 0, season };
}

function smoothingFromUnit(u: ArrayLike<number>, spec: Spec): Smoothing {
  const span = SMOOTH_HI - SMOOTH_LO;
  const alpha = SMOOTH_LO + span * u[0];
  let i = 1;
  const beta = spec.trend ? alpha * (SMOOTH_LO + span * u[i++]) : 0;
  const gamma = spec.seasonal ? (1 - alpha) * (SMOOTH_LO + span * u[i++]) : 0;
  const phi = spec.damped ? PHI_LO + (PHI_HI - PHI_LO) * u[i++] : 1;
  return { alpha, beta, gamma, phi };
}

function objectiveWithGradient(y: ArrayLike<number>, spec: Spec, ws: Workspace): (u: ArrayLike<number>, g: Float64Array) => number {
  const ring = new Float64Array(5 * spec.m);
  const dSSE = new Float64Array(4);
  return (u: ArrayLike<number>, g: Float64Array): number => {
    const p = smoothingFromUnit(u, spec);
    const sse = concentrate(y, spec, p, ws);
    sseGradient(y, spec, p.alpha, p.beta, p.gamma, p.phi, ws.chol.x, ring, dSSE);
    unitGradient(spec, p, dSSE, sse, g);
    return Math.log(sse);
  };
}

/**
 * What the smoothing fit minimises for a series without gaps, with its gradient: ln SSE* (the sum
 * of squares at the least-squares initial states, so −2ℓ/n up to a constant) as a function of the
 * box's unit coordinates u = (α*, [β*], [γ*], [φ*]) of {@link fitSmoothing} (α = 1e-4 + (1 − 2e-4)·α*,
 * β = α·(1e-4 + (1 − 2e-4)·β*), γ = (1 − α)·(…γ*), φ = 0.8 + 0.18·φ*). The gradient is written into
 * g. Hyndman et al. (2008), ch. 5; the gradient by the envelope theorem ({@link sseGradient}).
 * @example concentratedObjective(logAir, "holt-winters", 12)([0.3, 0.1, 0.2], new Float64Array(3)) // ln SSE*
 */
export function concentratedObjective(y: readonly number[], method: SmoothingMethod, period: number): (u: ArrayLike<number>, g: Float64Array) => number {
  const spec = specOf(method, period);
  const need = minimumLength(method, period);
  if (y.length < need || countMissing(y) > 0) throw new EngineError("input", `${SMOOTHING[method].title} (${method}): the concentrated objective needs at least ${need} values and no gaps.`);
  return objectiveWithGradient(y, spec, workspace(y.length, spec));
}

/**
 * The gradient of ln SSE*(u) in the unit coordinates of {@link smoothingFromUnit}, from the
 * derivatives of SSE with respect to α, β, γ, φ (chain rule: β = α·β*, γ = (1 − α)·γ*).
 */
function unitGradient(spec: Spec, p: Smoothing, dSSE: Float64Array, sse: number, g: Float64Array): void {
  const span = SMOOTH_HI - SMOOTH_LO;
  const inv = 1 / sse;
  let dAlpha = dSSE[0];
  let i = 1;
  if (spec.trend) {
    dAlpha += dSSE[1] * (p.beta / p.alpha);
    g[i++] = dSSE[1] * p.alpha * span * inv;
  }
  if (spec.seasonal) {
    dAlpha -= dSSE[2] * (p.gamma / (1 - p.alpha));
    g[i++] = dSSE[2] * (1 - p.alpha) * span * inv;
  }
  if (spec.damped) g[i++] = dSSE[3] * (PHI_HI - PHI_LO) * inv;
  g[0] = dAlpha * span * inv;
}

function startGrid(spec: Spec, fine = false): number[][] {
  // the gradient runs are local, so their grid also has α* = 0.005 and β* = 0.1 (optima with a
  // tiny α, and β just off its bound, are common in monthly business series: bench/README.md)
  const axes: number[][] = [fine ? [0.005, 0.02, 0.1, 0.3, 0.6, 0.95] : [0.02, 0.1, 0.3, 0.6, 0.95]];
  if (spec.trend) axes.push(fine ? [0.01, 0.1, 0.3, 0.9] : [0.01, 0.2, 0.9]);
  if (spec.seasonal) axes.push([0.01, 0.3, 0.8]);
  if (spec.damped) axes.push([0.2, 0.9]);
  let pts: number[][] = [[]];
  for (const a of axes) pts = pts.flatMap((p) => a.map((v) => [...p, v]));
  return pts;
}

/**
 * A last local refinement that respects the box: coordinate by coordinate, Brent's method (Brent
 * 1973) on a window of ±0.05 around the point, with the box edge itself tried whenever the window
 * reaches it (Nelder–Mead and Brent both stop a little short of an optimum on a bound); repeated
 * while any coordinate improves (at most 2 rounds). Issue 12 §3: no fit may be beaten by a point
 * inside its own box.
 */
function refineInBox(obj: (u: ArrayLike<number>) => number, x0: number[], f0: number): { x: number[]; fx: number } {
  let x = x0.slice();
  let fx = f0;
  for (let round = 0; round < 2; round++) {
    let improved = false;
    for (let i = 0; i < x.length; i++) {
      const at = (v: number): number => {
        const y = x.slice();
        y[i] = v;
        return obj(y);
      };
      const lo = Math.max(0, x[i] - 0.05);
      const hi = Math.min(1, x[i] + 0.05);
      const tries: { v: number; f: number }[] = [];
      const r = minimizeBounded(at, lo, hi, 1e-8);
      tries.push({ v: r.x, f: r.fx });
      if (lo === 0) tries.push({ v: 0, f: at(0) });
      if (hi === 1) tries.push({ v: 1, f: at(1) });
      for (const t of tries) {
        if (t.f < fx - 1e-13 * Math.abs(fx)) {
          x = x.slice();
          x[i] = t.v;
          fx = t.f;
          improved = true;
        }
      }
    }
    if (!improved) break;
  }
  return { x, fx };
}

/**
 * An optimum on a bound (β* or γ* at its floor, say) is often a local one, with a better optimum
 * just inside the box (the likelihood first falls, then rises, as the parameter leaves the bound,
 * and the better point needs the other parameters to move too). For each coordinate on a bound,
 * f is probed at a few distances from it, and a new gradient run starts from the best probe.
 * Returns the best optimum found.
 */
function offTheBounds(obj: (u: ArrayLike<number>) => number, run: (start: ArrayLike<number>) => { x: number[]; fx: number }, top: { x: number[]; fx: number }): { x: number[]; fx: number } {
  let best = top;
  for (let i = 0; i < top.x.length; i++) {
    const v = top.x[i];
    if (v > 0 && v < 1) continue;
    let probe: number[] = top.x;
    let fProbe = Infinity;
    for (const dist of BOUND_PROBES) {
      const u = top.x.slice();
      u[i] = v === 0 ? dist : 1 - dist;
      const f = obj(u);
      if (f < fProbe) {
        fProbe = f;
        probe = u;
      }
    }
    const r = run(probe);
    if (r.fx < best.fx) best = r;
  }
  return best;
}

/** Distances from a bound at which {@link offTheBounds} looks. */
const BOUND_PROBES = [0.01, 0.025, 0.05, 0.08];

/** Evaluations allowed to each short run from a grid start. */
const SCOUT_EVALUATIONS = 50;

/**
 * Projected quasi-Newton runs with the analytic gradient from every chosen start, each to its local
 * optimum; the best of them, after a look just off the bounds it sits on, is the fit
 * (bench/README.md: as good as statsmodels' fit on the benchmark's series or better, in about a
 * third of the evaluations of the simplex runs). Returns the point in unit coordinates.
 */
function searchWithGradient(obj: (u: ArrayLike<number>) => number, withGradient: (u: ArrayLike<number>, g: Float64Array) => number, grid: { u: number[]; f: number }[], chosen: number[][], quick: boolean): number[] {
  const run = (start: ArrayLike<number>): { x: number[]; fx: number } =>
    minimizeBoxWithGradient(withGradient, start, { maxIterations: quick ? 30 : 100, gTol: quick ? 1e-5 : 1e-9 });
  let top = { x: grid[0].u, fx: grid[0].f };
  for (const start of chosen) {
    const r = run(start);
    if (r.fx < top.fx) top = r;
  }
  return (quick ? top : offTheBounds(obj, run, top)).x;
}

/**
 * Short Nelder–Mead runs from every chosen start, then a full run from the best of them: the local
 * optima of these likelihoods sit on edges and corners of the box, and which start reaches the
 * best one varies from series to series (bench/README.md: 2 full runs missed statsmodels' optimum
 * on 1.0–1.2% of the benchmark's series, 8 short ones on ≤ 0.2%); unless `quick`, a polish and the
 * in-box refinement. Used for series with gaps. Returns the point in unit coordinates.
 */
function searchBySimplex(obj: (u: ArrayLike<number>) => number, grid: { u: number[]; f: number }[], chosen: number[][], quick: boolean): number[] {
  let scout = { x: grid[0].u, fx: grid[0].f };
  for (const start of chosen) {
    const r = minimizeBox(obj, start, 0.15, 1e-4, 1e-2, SCOUT_EVALUATIONS);
    if (r.fx < scout.fx) scout = r;
  }
  const full = minimizeBox(obj, scout.x, 0.05, 1e-5, 1e-3, 120);
  const best = full.fx < scout.fx ? full : scout;
  if (quick) return best.x;
  const polish = minimizeBox(obj, best.x, 0.01, 1e-10, 1e-7, 150);
  const top = polish.fx < best.fx ? polish : best;
  return refineInBox(obj, top.x, top.fx).x;
}

/** Options for {@link fitSmoothing}. */
export interface SmoothingFitOptions {
  /** Local runs from the best distinct grid starts (default 8; 2 when `quick`). */
  starts?: number;
  /**
   * A screening fit for comparing many (λ, form) pairs: two starts, looser tolerances, no second
   * look off the bounds (for series with gaps: two short starts and the full run, without the final
   * polish and in-box refinement). The λ rules compare candidates with it and refit the one they
   * keep in full.
   */
  quick?: boolean;
}

/**
 * Fits an exponential-smoothing model (additive errors) by maximum likelihood: smoothing and
 * damping parameters from eight distinct starts of a grid by a projected quasi-Newton method on
 * the analytic gradient (Bertsekas 1982; {@link sseGradient}), then once more from just inside any
 * bound the best optimum sits on (series with gaps: short Nelder–Mead runs, Nelder & Mead 1965,
 * and a full run from the best), on the admissible
 * box 1e-4 ≤ α ≤ 1 − 1e-4, β = α·β* and γ = (1 − α)·γ* with β*, γ* in the same range (so
 * 0 < β < α and 0 < γ < 1 − α), 0.8 ≤ φ ≤ 0.98; initial states by exact least squares for each
 * trial (concentrated likelihood). Source: Hyndman et al. (2008), ch. 5 (estimation) and 6.
 * @example fitSmoothing(logAirPassengers, "holt-winters", 12).loglik // ≥ 275.3 (statsmodels 0.13.5: 275.327)
 */
export function fitSmoothing(y: readonly number[], method: SmoothingMethod, period: number, options: SmoothingFitOptions = {}): FittedModel {
  const spec = specOf(method, period);
  const need = minimumLength(method, period);
  if (y.length < need) {
    throw new EngineError("input", `${SMOOTHING[method].title} (${method}) needs at least ${need} values${spec.seasonal ? ` (two full seasons of ${spec.m} and enough for its parameters)` : ""}; the series has ${y.length}.`);
  }
  const missing = countMissing(y);
  let obj: (u: ArrayLike<number>) => number;
  let objWithGradient: ((u: ArrayLike<number>, g: Float64Array) => number) | null = null;
  let statesAt: (p: Smoothing) => InitialStates;
  if (missing === 0) {
    const ws = workspace(y.length, spec);
    obj = (u: ArrayLike<number>): number => Math.log(concentrate(y, spec, smoothingFromUnit(u, spec), ws));
    objWithGradient = objectiveWithGradient(y, spec, ws);
    statesAt = (p: Smoothing): InitialStates => {
      concentrate(y, spec, p, ws);
      return statesOf(ws, spec);
    };
  } else {
    checkGapsFit(y, method, period);
    const ws = gapWorkspace(y, spec);
    // −2ℓ/n_obs up to a constant: ln Σ v²/s + (1/n_obs)Σ ln s (METHODS §8)
    obj = (u: ArrayLike<number>): number => {
      const r = concentrateWithGaps(y, spec, smoothingFromUnit(u, spec), ws);
      return Math.log(r.sse) + r.sumLogS / r.nObs;
    };
    statesAt = (p: Smoothing): InitialStates => {
      concentrateWithGaps(y, spec, p, ws);
      return gapStates(ws, spec);
    };
  }
  let bestU: number[];
  if (!spec.trend && !spec.seasonal) {
    // one parameter: a grid, then Brent's method in the best cell
    const pts = 11;
    let bi = 0;
    let bf = Infinity;
    for (let i = 0; i < pts; i++) {
      const f = obj([i / (pts - 1)]);
      if (f < bf) { bf = f; bi = i; }
    }
    const r = minimizeBounded((u) => obj([u]), Math.max(0, bi - 1) / (pts - 1), Math.min(pts - 1, bi + 1) / (pts - 1), 1e-9);
    bestU = options.quick ? [r.x] : refineInBox(obj, [r.x], r.fx).x;
  } else {
    const fine = objWithGradient !== null;
    const grid = startGrid(spec, fine).map((u) => ({ u, f: obj(u) })).sort((a, b) => a.f - b.f);
    const chosen: number[][] = [];
    const apart = fine ? 0.15 : 0.2;
    for (const g of grid) {
      if (chosen.length >= (options.starts ?? (options.quick ? 2 : 8))) break;
      if (chosen.every((c) => c.some((v, i) => Math.abs(v - g.u[i]) > apart))) chosen.push(g.u);
    }
    bestU = objWithGradient ? searchWithGradient(obj, objWithGradient, grid, chosen, options.quick ?? false) : searchBySimplex(obj, grid, chosen, options.quick ?? false);
  }
  const p = smoothingFromUnit(bestU, spec);
  return buildModel(y, method, period, p, statesAt(p));
}

/**
 * Checks that a series with missing observations (NaN) can be fitted by a smoothing method:
 * enough observed points for its parameters (k + 2), and for a seasonal method at least one
 * observation at every position of the season (an unobserved season's effect cannot be
 * estimated). Throws an EngineError with the numbers.
 * @example checkGapsFit([1, NaN, 3, 4, 5, 6], "ses", 1) // passes
 */
export function checkGapsFit(y: readonly number[], method: SmoothingMethod, period: number): void {
  const spec = specOf(method, period);
  const missing = countMissing(y);
  const nObs = y.length - missing;
  const k = parameterCount(method, period);
  if (nObs < k + 2) {
    throw new EngineError("input", `${SMOOTHING[method].title} (${method}) needs at least ${k + 2} observed values; the series has ${nObs} (${missing} of its ${y.length} periods missing).`);
  }
  if (spec.seasonal) {
    const m = spec.m;
    const seen = new Array<number>(m).fill(0);
    for (let t = 0; t < y.length; t++) if (!Number.isNaN(y[t])) seen[t % m]++;
    const empty = seen.map((c, j) => (c === 0 ? j : -1)).filter((j) => j >= 0);
    if (empty.length) {
      const j = empty[0];
      const at: number[] = [];
      for (let t = j; t < y.length && at.length < 4; t += m) at.push(t + 1);
      throw new EngineError("input", `${SMOOTHING[method].title} (${method}) needs at least one observation in every season, but ${empty.length === 1 ? "one season has" : `${empty.length} seasons have`} none: every value at position ${j + 1} of the ${m}-period season (periods ${at.join(", ")}, … of the series) is missing. Fill one of them, or use a non-seasonal method.`);
    }
  }
}

/**
 * The model with given smoothing parameters and the initial states that are best for them (exact
 * least squares, as inside {@link fitSmoothing}): the concentrated likelihood at one point of the
 * parameter box, e.g. to check that no point of the box beats a fit (Hyndman et al. 2008, ch. 5).
 * @example smoothingAtParams(logAir, "ses", 1, { alpha: 0.9, beta: 0, gamma: 0, phi: 1 }).loglik // ≤ fitSmoothing(logAir, "ses", 1).loglik
 */
export function smoothingAtParams(y: readonly number[], method: SmoothingMethod, period: number, p: Smoothing): FittedModel {
  const spec = specOf(method, period);
  const need = minimumLength(method, period);
  if (y.length < need) throw new EngineError("input", `${SMOOTHING[method].title} (${method}) needs at least ${need} values; the series has ${y.length}.`);
  const ws = workspace(y.length, spec);
  concentrate(y, spec, p, ws);
  return buildModel(y, method, period, p, statesOf(ws, spec));
}

/**
 * The model with given parameters and initial states (no estimation): for checking against a
 * reference fit, or for re-use. `x0.season[j]` is the seasonal effect used by observation j.
 * @example smoothingWithParams([1, 2, 3, 4, 5], "ses", 1, { alpha: 0.5, beta: 0, gamma: 0, phi: 1 }, { level: 1, trend: 0, season: [0] }).sigma
 */
export function smoothingWithParams(y: readonly number[], method: SmoothingMethod, period: number, p: Smoothing, x0: InitialStates): FittedModel {
  return buildModel(y, method, period, p, x0);
}

function buildModel(y: readonly number[], method: SmoothingMethod, period: number, p: Smoothing, x0: InitialStates): FittedModel {
  const missing = countMissing(y);
  if (missing > 0) return buildModelWithGaps(y, method, period, p, x0, missing);
  const spec = specOf(method, period);
  const n = y.length;
  const resid = new Float64Array(n);
  const end = filter(y, spec, p, x0, resid);
  const sigma2 = end.sse / n;
  const loglik = -0.5 * n * (Math.log((2 * Math.PI * end.sse) / n) + 1);
  const k = parameterCount(method, period);
  const aicc = -2 * loglik + 2 * k + (2 * k * (k + 1)) / Math.max(n - k - 1, 1e-9);
  const m = spec.m;
  const params = paramsOf(spec, p, x0);
  const form = stateForm(spec, p, end.level, end.trend, end.ring, n);
  const residuals = Object.freeze(Array.from(resid));
  const model: FittedModel = {
    method,
    title: `${SMOOTHING[method].title} (${SMOOTHING[method].code})`,
    n,
    missing: 0,
    period: m,
    params: Object.freeze(params),
    sigma: Math.sqrt(sigma2),
    loglik,
    aicc,
    k,
    residuals,
    forecast: (h: number): StepMoments[] => stateSpaceMoments(form, sigma2, h),
    simulate: (h: number, paths: number, seed: number): Float64Array => simulate(spec, p, end, n, Math.sqrt(sigma2), h, paths, seed),
    simulateShocks: (h: number, paths: number, seed: number, shocks: Float64Array): Float64Array => simulate(spec, p, end, n, Math.sqrt(sigma2), h, paths, seed, undefined, shocks),
  };
  return Object.freeze(model);
}

function paramsOf(spec: Spec, p: Smoothing, x0: InitialStates): Record<string, number> {
  const params: Record<string, number> = { alpha: p.alpha };
  if (spec.trend) params.beta = p.beta;
  if (spec.seasonal) params.gamma = p.gamma;
  if (spec.damped) params.phi = p.phi;
  params.level0 = x0.level;
  if (spec.trend) params.trend0 = x0.trend;
  if (spec.seasonal) for (let j = 0; j < spec.m; j++) params[`season${j + 1}`] = x0.season[j];
  return params;
}

/**
 * The model on a series with missing observations (NaN), by the Kalman filter of METHODS §8:
 * σ̂² = (1/n_obs)Σ v_t²/s_t, ℓ = −½Σ ln(2π σ̂² s_t) − n_obs/2, AICc on n_obs; forecasts start
 * from x̂_T with covariance σ²P̃_T, and simulated paths draw the state at T from it.
 */
function buildModelWithGaps(y: readonly number[], method: SmoothingMethod, period: number, p: Smoothing, x0: InitialStates, missing: number): FittedModel {
  const spec = specOf(method, period);
  const n = y.length;
  const r = filterWithGaps(y, spec, p, x0);
  const nObs = r.nObs;
  const sigma2 = r.sse / nObs;
  const loglik = -0.5 * r.sumLogS - 0.5 * nObs * (Math.log(2 * Math.PI * sigma2) + 1);
  const k = parameterCount(method, period);
  const aicc = -2 * loglik + 2 * k + (2 * k * (k + 1)) / Math.max(nObs - k - 1, 1e-9);
  const d = r.sys.d;
  const form = stateForm(spec, p, 0, 0, new Float64Array(spec.m), n);
  form.x = Array.from(r.x);
  const Pt = Array.from({ length: d }, (_, i) => Array.from(r.P.subarray(i * d, (i + 1) * d)));
  const factor = semidefiniteFactor(r.P, d);
  // the final states as the complete-data simulation holds them: level, trend, and the ring
  const s0 = spec.trend ? 2 : 1;
  const m = spec.m;
  const ring = new Float64Array(m);
  if (spec.seasonal) for (let i = 0; i < m; i++) ring[(((n - 1 - i) % m) + m) % m] = r.x[s0 + i];
  const end = { level: r.x[0], trend: spec.trend ? r.x[1] : 0, ring };
  const model: FittedModel = {
    method,
    title: `${SMOOTHING[method].title} (${SMOOTHING[method].code})`,
    n,
    missing,
    period: m,
    params: Object.freeze(paramsOf(spec, p, x0)),
    sigma: Math.sqrt(sigma2),
    loglik,
    aicc,
    k,
    residuals: Object.freeze(Array.from(r.residuals)),
    forecast: (h: number): StepMoments[] => stateSpaceMoments(form, sigma2, h, Pt),
    simulate: (h: number, paths: number, seed: number): Float64Array => simulate(spec, p, end, n, Math.sqrt(sigma2), h, paths, seed, { factor, d, s0 }),
    simulateShocks: (h: number, paths: number, seed: number, shocks: Float64Array): Float64Array => simulate(spec, p, end, n, Math.sqrt(sigma2), h, paths, seed, { factor, d, s0 }, shocks),
  };
  return Object.freeze(model);
}

/** The state-space form (F, w, g, x_T) with x = (ℓ, b, s_T, s_{T−1}, …, s_{T−m+1}). */
function stateForm(spec: Spec, p: Smoothing, level: number, trend: number, ring: Float64Array, n: number): StateSpaceForm {
  const m = spec.m;
  const d = 1 + (spec.trend ? 1 : 0) + (spec.seasonal ? m : 0);
  const F = Array.from({ length: d }, () => new Array<number>(d).fill(0));
  const w = new Array<number>(d).fill(0);
  const g = new Array<number>(d).fill(0);
  const x = new Array<number>(d).fill(0);
  const phi = spec.damped ? p.phi : 1;
  w[0] = 1;
  F[0][0] = 1;
  g[0] = p.alpha;
  x[0] = level;
  let s0 = 1;
  if (spec.trend) {
    w[1] = phi;
    F[0][1] = phi;
    F[1][1] = phi;
    g[1] = p.beta;
    x[1] = trend;
    s0 = 2;
  }
  if (spec.seasonal) {
    w[s0 + m - 1] = 1;
    F[s0][s0 + m - 1] = 1;
    for (let i = 1; i < m; i++) F[s0 + i][s0 + i - 1] = 1;
    g[s0] = p.gamma;
    for (let i = 0; i < m; i++) x[s0 + i] = ring[(((n - 1 - i) % m) + m) % m];
  }
  return { F, w, g, x };
}

/**
 * Sample paths from the final states. With `uncertain` (a series with gaps), each path first
 * draws its state at T from N(x̂_T, σ²P̃_T) through a factor C with C C′ = P̃_T, then runs the
 * recursion. With `shocks` (standard normals, paths × h), those drive the steps instead of the
 * generator (joint simulation across series).
 */
function simulate(spec: Spec, p: Smoothing, end: { level: number; trend: number; ring: Float64Array }, n: number, sigma: number, h: number, paths: number, seed: number, uncertain?: { factor: Float64Array; d: number; s0: number }, shocks?: Float64Array): Float64Array {
  const rng = createRandom(seed);
  const out = new Float64Array(paths * h);
  const m = spec.m;
  const phi = spec.damped ? p.phi : 1;
  const beta = spec.trend ? p.beta : 0;
  const gamma = spec.seasonal ? p.gamma : 0;
  const ring = new Float64Array(m);
  const z = uncertain ? new Float64Array(uncertain.d) : null;
  for (let r = 0; r < paths; r++) {
    let l = end.level;
    let b = spec.trend ? end.trend : 0;
    ring.set(end.ring);
    if (uncertain && z) {
      const { factor: C, d, s0 } = uncertain;
      for (let i = 0; i < d; i++) z[i] = rng.normal();
      for (let i = 0; i < d; i++) {
        let dx = 0;
        for (let j = 0; j <= i; j++) dx += C[i * d + j] * z[j];
        dx *= sigma;
        if (i === 0) l += dx;
        else if (spec.trend && i === 1) b += dx;
        else ring[(((n - 1 - (i - s0)) % m) + m) % m] += dx;
      }
    }
    for (let j = 0; j < h; j++) {
      const k = (n + j) % m;
      const pb = phi * b;
      const e = sigma * (shocks ? shocks[r * h + j] : rng.normal());
      out[r * h + j] = l + pb + ring[k] + e;
      l = l + pb + p.alpha * e;
      b = pb + beta * e;
      ring[k] += gamma * e;
    }
  }
  return out;
}
