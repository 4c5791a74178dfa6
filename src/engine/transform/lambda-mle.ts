import { EngineError } from "../errors";
import { requireFinite } from "../_lib/check";
import { chiSquareQuantile } from "../distribution/chisquare";
import { isConstant, requirePositiveSeries } from "../series/positive";
import { BoxCoxProfile, ProfileFunction, ProfilePoint } from "./box-cox-profile";
import { boundHit, checkLambdaBounds } from "./bounds";

/** Smallest series the likelihood method accepts. */
export const MLE_MIN_LENGTH = 4;

/**
 * Box-Cox profile log-likelihood ℓ(λ) of a positive series (Box & Cox 1964), without constants,
 * matching scipy.stats.boxcox_llf.
 * @example boxCoxLogLik([1, 2, 3, 4, 5], 1) // -1.7328679513998633 (= −(5/2)·ln 2)
 */
export function boxCoxLogLik(values: readonly number[], lambda: number): number {
  requirePositiveSeries(values, 2, "the series", "a Box-Cox likelihood");
  requireFinite(lambda, "lambda");
  if (isConstant(values)) throw new EngineError("input", "The series is constant, so its Box-Cox likelihood is unbounded. λ cannot be estimated from it.");
  return new BoxCoxProfile(values).at(lambda).loglik;
}

/** Options for {@link lambdaMle}. */
export interface LambdaMleOptions {
  /** Search bounds for λ; default [−1, 2]. */
  lower?: number;
  upper?: number;
  /** Confidence level of the likelihood-ratio interval, as a fraction; default 0.95. */
  level?: number;
  /** A name for the series in messages. */
  label?: string;
  /** Compute the likelihood-ratio interval (default true); false leaves it [null, null]. */
  withInterval?: boolean;
}

/** Result of {@link lambdaMle}. */
export interface LambdaMleResult {
  lambda: number;
  loglik: number;
  /** Likelihood-ratio interval; an end is null when ℓ does not drop far enough within 10 of λ̂. */
  interval: [number | null, number | null];
  level: number;
  bounds: [number, number];
  onBound: "lower" | "upper" | null;
  n: number;
}

/**
 * λ by maximum likelihood (Box & Cox 1964), maximising the profile log-likelihood over
 * [lower, upper] (default [−1, 2]) by Newton's method on its analytic derivatives, safeguarded by
 * bisection inside a bracket whose ends are evaluated only when a step reaches them; the
 * likelihood-ratio interval {λ : ℓ(λ) ≥ ℓ(λ̂) − ½χ²₁(level)} by Halley's method from the roots of
 * the quadratic approximation at λ̂ (not truncated to the bounds). ℓ is strictly concave in λ
 * (see box-cox-profile.ts), so the maximum and each end are unique. Needs ≥ 4 positive values that
 * are not all equal.
 * @example lambdaMle(airPassengers).lambda // 0.148023 (scipy.stats.boxcox_normmax: 0.14802263)
 */
export function lambdaMle(values: readonly number[], options: LambdaMleOptions = {}): LambdaMleResult {
  const label = options.label ?? "the series";
  requirePositiveSeries(values, MLE_MIN_LENGTH, label, "estimating λ by maximum likelihood");
  if (isConstant(values)) throw new EngineError("input", `${label} is constant, so there is no λ to estimate. Use λ = 1 (no transform).`);
  const bounds = checkLambdaBounds(options.lower, options.upper);
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new EngineError("input", `The interval level must be between 0 and 1; got ${level}.`);
  const profile = new BoxCoxProfile(values);
  const top = maximiseProfile(profile, bounds[0], bounds[1]);
  const drop = 0.5 * chiSquareQuantile(level, 1);
  return {
    lambda: top.lambda,
    loglik: top.loglik,
    interval: options.withInterval === false ? [null, null] : [intervalEnd(profile, top, drop, -1), intervalEnd(profile, top, drop, +1)],
    level,
    bounds,
    onBound: boundHit(top.lambda, bounds),
    n: values.length,
  };
}

/** Newton steps smaller than this end the search (the error after such a step is of its square). */
const STEP_TOL = 1e-6;

/**
 * The maximum of a concave ℓ on [lo, hi]: Newton's method on ℓ′ from λ = 0 (or the nearer bound),
 * where no exponential is needed. The bracket [a, b] (ℓ′(a) > 0 > ℓ′(b)) starts as the bounds; a
 * bound is evaluated only when a step reaches it, and if ℓ′ there still points outward the maximum
 * is that bound. A step that leaves the bracket or does not shrink fast enough (less than half the
 * step before last, as in the safeguarded Newton of Press et al.'s rtsafe) is replaced by bisection.
 * @example maximiseProfile(new BoxCoxProfile(airPassengers), -1, 2).lambda // 0.148023 (scipy.stats.boxcox_normmax: 0.14802263)
 */
export function maximiseProfile(profile: ProfileFunction, lo: number, hi: number): ProfilePoint {
  let a = lo;
  let b = hi;
  let aKnown = false;
  let bKnown = false;
  let x = Math.min(Math.max(0, lo), hi);
  let P = profile.at(x);
  let stepOld = hi - lo;
  let step = stepOld;
  for (let iter = 0; iter < 200; iter++) {
    if (P.slope > 0) {
      if (x === hi) return P;
      a = x;
      aKnown = true;
    } else if (P.slope < 0) {
      if (x === lo) return P;
      b = x;
      bKnown = true;
    } else {
      return P;
    }
    const newton = x - P.slope / P.curvature;
    if (P.curvature < 0 && Math.abs(newton - x) <= STEP_TOL && newton >= a && newton <= b) {
      // Converged: one more Newton step costs nothing; ℓ moves by ½·ℓ′·step to second order.
      return { lambda: newton, loglik: P.loglik + 0.5 * P.slope * (newton - x), slope: 0, curvature: P.curvature };
    }
    let next: number;
    if (newton >= b && !bKnown) {
      next = b;
    } else if (newton <= a && !aKnown) {
      next = a;
    } else if (newton > a && newton < b && P.curvature < 0 && Math.abs(2 * (newton - x)) <= Math.abs(stepOld)) {
      next = newton;
    } else {
      next = 0.5 * (a + b);
    }
    stepOld = step;
    step = next - x;
    if (aKnown && bKnown && b - a <= 4e-16 * Math.max(1, Math.abs(a))) return P;
    x = next;
    P = profile.at(x);
  }
  return P;
}

/**
 * Halley steps for an interval end smaller than this times the distance from λ̂ end the search (the
 * error after one is of the order of its cube, measured on the profile's own scale).
 */
const END_TOL = 1e-4;

/**
 * One end of the likelihood-ratio interval: where ℓ(λ) = ℓ(λ̂) − drop on the `dir` side of λ̂.
 * Halley's method (cubic convergence; ℓ″ comes free with ℓ′) in the distance d from λ̂, from the
 * root of the quadratic approximation at λ̂;
 * outward doubling while ℓ is still above the cut and not falling; bisection once the end is
 * bracketed and a step leaves the bracket. Null when ℓ has not dropped that far 10 from λ̂.
 * @example intervalEnd(profile, maximiseProfile(profile, -1, 2), 1.92073, +1) // 0.53371 for AirPassengers (scipy.stats.boxcox, alpha=0.05)
 */
export function intervalEnd(profile: ProfileFunction, top: ProfilePoint, drop: number, dir: -1 | 1): number | null {
  const MAX = 10;
  const cut = top.loglik - drop;
  const s = top.slope * dir;
  const h = top.curvature;
  let d = h < 0 ? (s + Math.sqrt(s * s - 2 * h * drop)) / -h : 1;
  if (!(d > 0 && Number.isFinite(d))) d = 1;
  d = Math.min(d, MAX);
  let inner = 0;
  let outer = Infinity;
  let stepOld = MAX;
  let step = MAX;
  for (let iter = 0; iter < 200; iter++) {
    const P = profile.at(top.lambda + dir * d);
    const q = P.loglik - cut;
    const qd = P.slope * dir;
    if (q > 0) {
      if (d >= MAX) return null;
      inner = d;
    } else if (q < 0) {
      outer = d;
    } else {
      return top.lambda + dir * d;
    }
    // Halley's step (ℓ″ comes with ℓ′ in the same pass), else Newton's.
    const denom = 2 * qd * qd - q * P.curvature;
    const halley = d - (2 * q * qd) / denom;
    const newton = qd < 0 && denom > 0 ? halley : d - q / qd;
    if (qd < 0 && Math.abs(newton - d) <= END_TOL * d && newton >= inner && newton <= outer) return top.lambda + dir * newton;
    let next: number;
    if (outer === Infinity) {
      next = newton > d ? Math.min(newton, MAX) : Math.min(2 * d, MAX);
    } else if (newton > inner && newton < outer && Math.abs(2 * (newton - d)) <= Math.abs(stepOld)) {
      next = newton;
    } else {
      next = 0.5 * (inner + outer);
    }
    stepOld = step;
    step = next - d;
    if (outer - inner <= 1e-12) return top.lambda + dir * next;
    d = next;
  }
  return outer === Infinity ? null : top.lambda + dir * 0.5 * (inner + outer);
}
