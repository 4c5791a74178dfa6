// The Box-Cox profile log-likelihood of one positive series and its first two derivatives in λ,
// from one pass of exponentials over the logs (computed once). Box & Cox (1964), JRSS-B 26:211–252.
//
// With z_i = ln y_i − mean(ln y) (the logs centred, i.e. the series divided by its geometric mean),
//   ℓ(λ) = (λ − 1)·Σ ln y − (n/2)·ln var(w) = −Σ ln y − (n/2)·ln V(λ),
//   V(λ) = var(u), u_i = (e^{λ z_i} − 1)/λ,
// because var(w) = e^{2λ·mean(ln y)}·V(λ): the Jacobian term cancels against the scale. Writing
// u = z·φ(λz) with φ(t) = (e^t − 1)/t gives u′ = z²·φ′(λz), u″ = z³·φ″(λz), so
//   V′ = 2·cov(u, u′),  V″ = 2·var(u′) + 2·cov(u, u″).
// Away from t = 0 these are u = (e^t − 1)/λ, u′ = (z·e^t − u)/λ, u″ = (z²·e^t − 2u′)/λ. Near t = 0
// those cancel digits, so there φ, φ′, φ″ are summed as series (φ(t) = Σ t^k/(k+1)!); at λ = 0
// exactly they are 1, ½, ⅓ and no exponential is needed.
//
// Concavity (a short argument, no published source): u_i − u_j = ∫_{z_j}^{z_i} e^{λs} ds, so
// V(λ) = (1/2n²)·Σ_{i,j} ∫∫ e^{λ(s+r)} ds dr over the square between z_j and z_i: a Laplace transform
// of a positive measure, hence log-convex in λ (Hölder's inequality). So ℓ is strictly concave for
// any series that is not constant: one maximum, and the likelihood-ratio interval has exactly one
// end on each side of it. The search in lambda-mle.ts relies on this.

/** Above this |λ·z| the values u² would come near overflow; the profile is then evaluated scaled by the largest term. */
const FAR = 300;
/** Below this |λ·z| the series forms of φ, φ′, φ″ are used (11 terms: error < 1e-17 relative). */
const NEAR = 0.1;

// Taylor coefficients: φ = Σ t^k/(k+1)!, φ′ = Σ (k+1)t^k/(k+2)!, φ″ = Σ (k+1)(k+2)t^k/(k+3)!, k = 0..10.
const TERMS = 11;
const C1 = new Float64Array(TERMS);
const C2 = new Float64Array(TERMS);
const C3 = new Float64Array(TERMS);
{
  let f = 1; // (k+1)!
  for (let k = 0; k < TERMS; k++) {
    f *= k + 1;
    C1[k] = 1 / f;
    C2[k] = (k + 1) / (f * (k + 2));
    C3[k] = ((k + 1) * (k + 2)) / (f * (k + 2) * (k + 3));
  }
}

/**
 * Work arrays shared by every profile of at most SHARED_MAX points: allocating typed arrays of more
 * than a few dozen elements costs V8 more than a whole evaluation (it showed up as 70% of the time
 * in the λ benchmark), and an evaluation uses them only within one synchronous call. Longer series
 * get their own arrays, so a huge one leaves nothing large behind.
 */
const SHARED_MAX = 4096;
let shared = new Float64Array(0);

function workArrays(n: number): Float64Array {
  if (n > SHARED_MAX) return new Float64Array(3 * n);
  if (shared.length < 3 * n) shared = new Float64Array(3 * Math.max(n, 256));
  return shared;
}

/** The profile log-likelihood and its derivatives at one λ. */
export interface ProfilePoint {
  lambda: number;
  /** ℓ(λ), the same constant-free value as scipy.stats.boxcox_llf. */
  loglik: number;
  /** dℓ/dλ. */
  slope: number;
  /** d²ℓ/dλ² (negative: ℓ is concave). */
  curvature: number;
}

/** A concave log-likelihood in one parameter with its first two derivatives (what the λ search needs). */
export interface ProfileFunction {
  at(lambda: number): ProfilePoint;
}

/**
 * A prepared Box-Cox profile log-likelihood ℓ(λ) with its first two derivatives (Box & Cox 1964),
 * for a positive, non-constant series already checked by the caller.
 * @example new BoxCoxProfile([1, 2, 3, 4, 5]).at(1).loglik // -1.7328679513998633 (= −(5/2)·ln 2)
 */
export class BoxCoxProfile implements ProfileFunction {
  readonly n: number;
  /** Σ ln y. */
  readonly sumLog: number;
  private readonly z: number[];
  private readonly zMin: number;
  private readonly zMax: number;
  /** Own work arrays for a long series; null: the shared ones. */
  private readonly own: Float64Array | null;
  /** Number of evaluations so far (for the benchmark and tests of the search). */
  evaluations = 0;

  constructor(values: ArrayLike<number>) {
    const n = values.length;
    const z: number[] = [];
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const l = Math.log(values[i]);
      z.push(l);
      sum += l;
    }
    const mean = sum / n;
    let zMin = Infinity;
    let zMax = -Infinity;
    for (let i = 0; i < n; i++) {
      const d = z[i] - mean;
      z[i] = d;
      if (d < zMin) zMin = d;
      if (d > zMax) zMax = d;
    }
    this.n = n;
    this.sumLog = sum;
    this.z = z;
    this.zMin = zMin;
    this.zMax = zMax;
    this.own = n > SHARED_MAX ? workArrays(n) : null;
  }

  /** ℓ(λ), dℓ/dλ and d²ℓ/dλ². */
  at(lambda: number): ProfilePoint {
    this.evaluations++;
    const { n, z } = this;
    // a, b, c: the values, first and second λ-derivatives of each term, at offsets 0, n, 2n.
    const w = this.own ?? workArrays(n);
    const reach = Math.abs(lambda) * Math.max(-this.zMin, this.zMax);
    // d ln V/dλ = shift1 + V′/V, d² ln V/dλ² = shift2 + V″/V − (V′/V)², ln V = shift0 + ln var(a)
    let shift0 = 0;
    let shift1 = 0;
    let shift2 = 0;
    let sa = 0;
    let sb = 0;
    let sc = 0;
    if (reach <= FAR) {
      const inv = 1 / lambda;
      for (let i = 0; i < n; i++) {
        const zi = z[i];
        const t = lambda * zi;
        let p1: number;
        let p2: number;
        let p3: number;
        if (t === 0) {
          p1 = 1;
          p2 = 0.5;
          p3 = 1 / 3;
        } else if (t > -NEAR && t < NEAR) {
          p1 = C1[TERMS - 1];
          p2 = C2[TERMS - 1];
          p3 = C3[TERMS - 1];
          for (let k = TERMS - 2; k >= 0; k--) {
            p1 = p1 * t + C1[k];
            p2 = p2 * t + C2[k];
            p3 = p3 * t + C3[k];
          }
        } else {
          // u = (e^t − 1)/λ, u′ = (z·e^t − u)/λ, u″ = (z²·e^t − 2u′)/λ: no division per term.
          const m = Math.expm1(t);
          const ze = zi * (1 + m);
          const u = m * inv;
          const v1 = (ze - u) * inv;
          const v2 = (zi * ze - 2 * v1) * inv;
          w[i] = u;
          w[n + i] = v1;
          w[2 * n + i] = v2;
          sa += u;
          sb += v1;
          sc += v2;
          continue;
        }
        const u = zi * p1;
        const z2 = zi * zi;
        const v1 = z2 * p2;
        const v2 = z2 * zi * p3;
        w[i] = u;
        w[n + i] = v1;
        w[2 * n + i] = v2;
        sa += u;
        sb += v1;
        sc += v2;
      }
    } else {
      // Far from λ = 0 (|λ·z| > 300): V = e^{2M}·var(e^{λ(z − z_k)})/λ², with M = λ·z_k the largest
      // λ·z, so every term is in (0, 1]. Its derivatives carry 2z_k − 2/λ and 2/λ² outside.
      const zk = lambda > 0 ? this.zMax : this.zMin;
      for (let i = 0; i < n; i++) {
        const d = z[i] - zk;
        const e = Math.exp(lambda * d);
        const v1 = d * e;
        const v2 = d * v1;
        w[i] = e;
        w[n + i] = v1;
        w[2 * n + i] = v2;
        sa += e;
        sb += v1;
        sc += v2;
      }
      shift0 = 2 * lambda * zk - 2 * Math.log(Math.abs(lambda));
      shift1 = 2 * zk - 2 / lambda;
      shift2 = 2 / (lambda * lambda);
    }
    // Centred sums (second pass, with the usual correction for the rounding error of the means).
    const ma = sa / n;
    const mb = sb / n;
    const mc = sc / n;
    let saa = 0;
    let sab = 0;
    let sbb = 0;
    let sac = 0;
    let ca = 0;
    let cb = 0;
    let cc = 0;
    for (let i = 0; i < n; i++) {
      const da = w[i] - ma;
      const db = w[n + i] - mb;
      const dc = w[2 * n + i] - mc;
      saa += da * da;
      sab += da * db;
      sbb += db * db;
      sac += da * dc;
      ca += da;
      cb += db;
      cc += dc;
    }
    saa -= (ca * ca) / n;
    sab -= (ca * cb) / n;
    sbb -= (cb * cb) / n;
    sac -= (ca * cc) / n;
    const r1 = (2 * sab) / saa;
    const r2 = (2 * (sbb + sac)) / saa;
    const logV = shift0 + Math.log(saa / n);
    const half = 0.5 * n;
    return {
      lambda,
      loglik: -this.sumLog - half * logV,
      slope: -half * (shift1 + r1),
      curvature: -half * (shift2 + r2 - r1 * r1),
    };
  }
}
