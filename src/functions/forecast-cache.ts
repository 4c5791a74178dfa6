// Fit once, evaluate many: FW.FAN, FW.TOTAL, FW.MODELINFO and FW.QUANTILES pointing at the same
// range and options share one fitted model. A small least-recently-used cache keyed by the
// range's contents and the options.
import { fitForecast, Forecaster, ForecastOptions, RawCell } from "../engine";

const LIMIT = 64;
const cache = new Map<string, Forecaster>();
let hits = 0;
let misses = 0;

/**
 * The fitted forecaster for these cells and options, from the cache when the same inputs were
 * fitted before in this session. Errors are not cached (they are cheap to reproduce).
 * @example cachedForecast([1, 2, 3, 4, 5, 6], { method: "naive" }) === cachedForecast([1, 2, 3, 4, 5, 6], { method: "naive" }) // true
 */
export function cachedForecast(cells: readonly RawCell[], options: ForecastOptions): Forecaster {
  const key = JSON.stringify([cells, options.method ?? null, options.lambda ?? null, options.transform ?? null, options.shift ?? null, options.period ?? null, options.label ?? null, options.firstRow ?? null, options.zeros ?? null]);
  const hit = cache.get(key);
  if (hit) {
    hits++;
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  misses++;
  const f = fitForecast(cells, options);
  cache.set(key, f);
  if (cache.size > LIMIT) cache.delete(cache.keys().next().value as string);
  return f;
}

/** Cache statistics, for tests and diagnostics. */
export function cacheStats(): { size: number; hits: number; misses: number } {
  return { size: cache.size, hits, misses };
}

/** Empties the cache (tests). */
export function clearForecastCache(): void {
  cache.clear();
  hits = 0;
  misses = 0;
}
