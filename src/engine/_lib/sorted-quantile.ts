// Sample quantiles of simulated totals: linear interpolation between order statistics (the
// definition numbered 7 by Hyndman & Fan 1996, The American Statistician 50:361–365; numpy's
// default), the convention totalForecast uses.

/** The p-quantile of values already sorted ascending (n ≥ 1). */
export function sortedQuantile(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  const x = p * (n - 1);
  const i = Math.floor(x);
  const frac = x - i;
  return i + 1 < n ? sorted[i] + frac * (sorted[i + 1] - sorted[i]) : sorted[i];
}
