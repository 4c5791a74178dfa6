// How many differences a series needs, by published stationarity tests:
// - KPSS (Kwiatkowski, Phillips, Schmidt & Shin 1992, J. Econometrics 54:159–178): level
//   stationarity is the null; η = Σ S_t² / (n² s²(l)), S_t the partial sums of the demeaned series,
//   s²(l) the Newey–West (Bartlett) long-run variance. The differencing decision uses the paper's
//   short lag l4 = ⌊4 (n/100)^{1/4}⌋ (the long one, l12, has little power in samples of business
//   size); reject at 5% when η > 0.463 (their Table 1).
// - Canova & Hansen (1995, J. Business & Economic Statistics 13:237–252): stable seasonality is
//   the null; regress w_t on a constant, w_{t−1} and the m − 1 trigonometric seasonal terms, form
//   the partial sums F_t of (seasonal terms × residual) and L = Σ F_t′ Ω̂⁻¹ F_t / n², Ω̂ their
//   Newey–West long-run covariance; reject at 5% against the VM(m − 1) critical value.
import { solveSymmetric } from "../../_lib/cholesky";

const cos = Math.cos;
const sin = Math.sin;

/** KPSS level-stationarity statistic and its lag count. */
export interface KpssResult { stat: number; lags: number; reject5: boolean }

/**
 * The KPSS statistic for level stationarity (Kwiatkowski et al. 1992, eq. 10–11) with the
 * Newey–West variance at `lags` lags (default the paper's l4 = ⌊4 (n/100)^{1/4}⌋; "long" is
 * ⌈12 (n/100)^{1/4}⌉, statsmodels' "legacy"), capped at n − 1; rejects at 5% above 0.463.
 * Missing values (NaN) are left out.
 * @example kpss(whiteNoise).reject5 // false for most draws
 */
export function kpss(series: readonly number[], lagRule: "short" | "long" | number = "short"): KpssResult {
  const x = series.filter((v) => v === v);
  const n = x.length;
  const mean = x.reduce((s, v) => s + v, 0) / n;
  const e = x.map((v) => v - mean);
  const raw = lagRule === "short" ? Math.floor(4 * Math.pow(n / 100, 0.25)) : lagRule === "long" ? Math.ceil(12 * Math.pow(n / 100, 0.25)) : lagRule;
  const lags = Math.max(0, Math.min(raw, n - 1));
  let cum = 0, eta = 0;
  for (const v of e) { cum += v; eta += cum * cum; }
  eta /= n * n;
  const s2 = longRunVariance(e, lags);
  const stat = s2 > 0 ? eta / s2 : 0;
  return { stat, lags, reject5: stat > 0.463 };
}

function longRunVariance(e: readonly number[], lags: number): number {
  const n = e.length;
  let s = 0;
  for (const v of e) s += v * v;
  for (let i = 1; i <= lags; i++) {
    let prod = 0;
    for (let t = i; t < n; t++) prod += e[t] * e[t - i];
    s += 2 * prod * (1 - i / (lags + 1));
  }
  return s / n;
}

/**
 * 5% critical values of VM(p), p = 1..12, from the published tables (Nyblom 1989; Hansen 1990;
 * reproduced in Canova & Hansen 1995) — quoted from memory, checked against a seeded simulation
 * (test/fixtures/arima/make_vm.py) to within 2%.
 */
export const VM_CRITICAL_5 = [0.470, 0.749, 1.01, 1.24, 1.47, 1.68, 1.9, 2.11, 2.32, 2.54, 2.75, 2.96] as const;

/** The Canova–Hansen statistic for seasonal stability and whether it rejects at 5%. */
export interface SeasonalTestResult { stat: number; critical: number; reject5: boolean; lags: number }

/**
 * Canova & Hansen's (1995) joint test at all seasonal frequencies for period m (2 ≤ m ≤ 13);
 * missing values are left out of the regression. Rejecting stable seasonality suggests a
 * seasonal difference (D = 1). Null when the series is too short (< 3m points).
 * @example canovaHansen(monthlySeries, 12)?.reject5 // true for a wandering seasonal pattern
 */
export function canovaHansen(series: readonly number[], m: number): SeasonalTestResult | null {
  if (m < 2 || m > 13) return null;
  const n0 = series.length;
  if (n0 < 3 * m) return null;
  // Seasonal regressors: cos/sin at frequencies 2πj/m, j = 1..⌊m/2⌋ (sin dropped at j = m/2).
  const seasonal = (t: number): number[] => {
    const f: number[] = [];
    for (let j = 1; j <= Math.floor(m / 2); j++) {
      const a = (2 * Math.PI * j * t) / m;
      f.push(cos(a));
      if (2 * j !== m) f.push(sin(a));
    }
    return f;
  };
  const rows: { y: number; z: number[]; f: number[] }[] = [];
  for (let t = 1; t < n0; t++) {
    const y = series[t], y1 = series[t - 1];
    if (!(y === y) || !(y1 === y1)) continue;
    const f = seasonal(t);
    rows.push({ y, z: [1, y1, ...f], f });
  }
  const n = rows.length;
  const k = rows[0]?.z.length ?? 0;
  if (n < 3 * m) return null;
  // OLS
  const XtX = new Float64Array(k * k);
  const Xty = new Float64Array(k);
  for (const r of rows) for (let i = 0; i < k; i++) { Xty[i] += r.z[i] * r.y; for (let j = 0; j < k; j++) XtX[i * k + j] += r.z[i] * r.z[j]; }
  const beta = solveSymmetric(XtX, Xty, k);
  const e = rows.map((r) => r.y - r.z.reduce((s, v, i) => s + v * beta[i], 0));
  const p = m - 1;
  const lags = Math.floor(4 * Math.pow(n / 100, 0.25));
  // Long-run covariance of f_t e_t (Newey–West, Bartlett weights)
  const u = rows.map((r, t) => r.f.map((v) => v * e[t]));
  const Omega = new Float64Array(p * p);
  for (let lag = 0; lag <= lags; lag++) {
    const wgt = lag === 0 ? 1 : 1 - lag / (lags + 1);
    for (let t = lag; t < n; t++) {
      for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) {
        const v = u[t][i] * u[t - lag][j];
        Omega[i * p + j] += wgt * v;
        if (lag > 0) Omega[j * p + i] += wgt * v;
      }
    }
  }
  for (let i = 0; i < p * p; i++) Omega[i] /= n;
  const F = new Float64Array(p);
  let L = 0;
  for (let t = 0; t < n; t++) {
    for (let i = 0; i < p; i++) F[i] += u[t][i];
    const s = solveSymmetric(Omega, F, p);
    for (let i = 0; i < p; i++) L += F[i] * s[i];
  }
  L /= n * n;
  const critical = VM_CRITICAL_5[p - 1];
  return { stat: L, critical, reject5: L > critical, lags };
}
