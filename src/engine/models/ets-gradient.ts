// The gradient of the concentrated sum of squares of an additive-error smoothing model with
// respect to its smoothing and damping parameters. The initial states x0 minimise the SSE for the
// given parameters, so by the envelope theorem the derivative of SSE*(θ) = min over x0 of SSE(θ, x0)
// is the partial derivative at fixed x0 = x0*(θ): 2·Σ e_t·∂e_t/∂θ. The ∂e_t/∂θ come from the
// filter's forward sensitivity recursions (differentiating ŷ_t = ℓ + φb + s, ℓ' = ℓ + φb + αe,
// b' = φb + βe, s' = s + γe term by term), one extra channel per parameter, run in the same loop.
// Model equations: Hyndman, Koehler, Ord & Snyder (2008), ch. 2; the envelope theorem for
// concentrated (profile) likelihoods: e.g. Magnus & Neudecker (1999), ch. 7, and Golub & Pereyra
// (1973), SIAM J. Numer. Anal. 10:413–432 (variable projection).

/** Shape of the model: which components it has, and the season length (1 without a season). */
export interface GradientSpec { trend: boolean; damped: boolean; seasonal: boolean; m: number }

/**
 * SSE of the filter run from the initial states `x` (level, [trend], seasonal effects of ring
 * positions 1..m−1; position 0 is 0), and in `out` its derivatives with respect to α, β, γ, φ
 * (in that order; the entries for parameters the model does not have are left meaningless).
 * `ring` is scratch of at least 5·m values. At the least-squares initial states these derivatives
 * are those of the concentrated SSE (envelope theorem).
 * @example
 * // ses on [1, 2, 3] from level 1 with α = 0.5: e = (0, 1, 1.5), ∂SSE/∂α = 2Σ e·∂e/∂α = −3
 * sseGradient([1, 2, 3], { trend: false, damped: false, seasonal: false, m: 1 }, 0.5, 0, 0, 1, new Float64Array([1]), new Float64Array(5), new Float64Array(4)) // 3.25
 */
export function sseGradient(y: ArrayLike<number>, spec: GradientSpec, alpha: number, beta: number, gamma: number, phi: number, x: ArrayLike<number>, ring: Float64Array, out: Float64Array): number {
  const n = y.length;
  const m = spec.m;
  let l = x[0];
  let b = spec.trend ? x[1] : 0;
  if (!spec.trend) beta = 0;
  if (!spec.damped) phi = 1;
  if (!spec.seasonal) gamma = 0;
  // sensitivities of ℓ and b to α, β, γ, φ
  let la = 0, lb = 0, lg = 0, lp = 0;
  let ba = 0, bb = 0, bg = 0, bp = 0;
  let ga = 0, gb = 0, gg = 0, gp = 0;
  let sse = 0;
  if (spec.seasonal) {
    // ring: states at 0..m−1, then their sensitivities to α, β, γ, φ at m, 2m, 3m, 4m
    ring.fill(0, 0, 5 * m);
    const off = spec.trend ? 2 : 1;
    for (let j = 1; j < m; j++) ring[j] = x[off + j - 1];
    const m2 = 2 * m, m3 = 3 * m, m4 = 4 * m;
    let k = 0;
    for (let t = 0; t < n; t++) {
      const pb = phi * b;
      const e = y[t] - (l + pb + ring[k]);
      const pa = phi * ba, pB = phi * bb, pg = phi * bg, pp = phi * bp + b;
      const ea = -(la + pa + ring[m + k]);
      const eb = -(lb + pB + ring[m2 + k]);
      const eg = -(lg + pg + ring[m3 + k]);
      const ep = -(lp + pp + ring[m4 + k]);
      sse += e * e;
      ga += e * ea; gb += e * eb; gg += e * eg; gp += e * ep;
      la += pa + alpha * ea + e; lb += pB + alpha * eb; lg += pg + alpha * eg; lp += pp + alpha * ep;
      ba = pa + beta * ea; bb = pB + beta * eb + e; bg = pg + beta * eg; bp = pp + beta * ep;
      ring[m + k] += gamma * ea; ring[m2 + k] += gamma * eb; ring[m3 + k] += gamma * eg + e; ring[m4 + k] += gamma * ep;
      l += pb + alpha * e;
      b = pb + beta * e;
      ring[k] += gamma * e;
      if (++k === m) k = 0;
    }
  } else {
    for (let t = 0; t < n; t++) {
      const pb = phi * b;
      const e = y[t] - (l + pb);
      const pa = phi * ba, pB = phi * bb, pp = phi * bp + b;
      const ea = -(la + pa);
      const eb = -(lb + pB);
      const ep = -(lp + pp);
      sse += e * e;
      ga += e * ea; gb += e * eb; gp += e * ep;
      la += pa + alpha * ea + e; lb += pB + alpha * eb; lp += pp + alpha * ep;
      ba = pa + beta * ea; bb = pB + beta * eb + e; bp = pp + beta * ep;
      l += pb + alpha * e;
      b = pb + beta * e;
    }
  }
  out[0] = 2 * ga;
  out[1] = 2 * gb;
  out[2] = 2 * gg;
  out[3] = 2 * gp;
  return sse;
}
