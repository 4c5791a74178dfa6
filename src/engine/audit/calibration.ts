// Calibration of quantile forecasts: per quantile, the share of actuals at or below it (its hit
// rate), a test of that share against the promised probability, its pinball loss, and exact binomial
// error bars; pairs of quantiles p and 1 − p also read as central intervals.
import betainc from "@stdlib/math-base-special-betainc";
import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import { isBlank } from "../_lib/cells";
import type { RawCell } from "../series/screen";
import { kupiec, LrTest } from "./coverage-tests";
import { pinball } from "./scores";

/**
 * Clopper–Pearson exact interval for a binomial proportion x/n at confidence `conf`: the bounds
 * solve I_lo(x, n − x + 1) = (1 − conf)/2 and I_hi(x + 1, n − x) = 1 − (1 − conf)/2 (Clopper &
 * Pearson 1934, Biometrika 26:404–413), found by bisection on the regularised incomplete beta.
 * @example clopperPearson(8, 10, 0.95) // [0.4439, 0.9748] (4 d.p.)
 */
export function clopperPearson(x: number, n: number, conf = 0.95): [number, number] {
  if (!Number.isInteger(n) || n < 1 || !Number.isInteger(x) || x < 0 || x > n) throw new EngineError("input", `Need whole numbers 0 ≤ x ≤ n with n ≥ 1; got ${x} of ${n}.`);
  if (!(conf > 0 && conf < 1)) throw new EngineError("input", `The confidence must be strictly between 0 and 1; got ${conf}.`);
  const a = (1 - conf) / 2;
  // P(X ≥ x | π) = I_π(x, n − x + 1) rises with π; the lower bound makes it a.
  const solve = (f: (pi: number) => number, target: number): number => {
    let lo = 0, hi = 1;
    for (let k = 0; k < 200 && hi - lo > 1e-15; k++) {
      const mid = (lo + hi) / 2;
      if (f(mid) < target) lo = mid; else hi = mid;
    }
    return (lo + hi) / 2;
  };
  const lower = x === 0 ? 0 : solve((pi) => betainc(pi, x, n - x + 1), a);
  const upper = x === n ? 1 : solve((pi) => betainc(pi, x + 1, n - x), 1 - a);
  return [lower, upper];
}

/** One quantile column of a forecast log. */
export interface QuantileColumn {
  /** The probability the column's values are quantiles for, strictly between 0 and 1. */
  p: number;
  cells: readonly RawCell[];
}

/** One line of the calibration table. */
export interface CalibrationRow {
  p: number;
  n: number;
  /** Actuals at or below the quantile. */
  atOrBelow: number;
  /** atOrBelow / n: should be near p. */
  hitRate: number;
  /** Clopper–Pearson 95% interval of the hit rate. */
  interval: [number, number];
  /** Kupiec's test of the hit rate against p. */
  test: LrTest;
  pinball: number;
}

/** A central interval formed by the quantiles p and 1 − p. */
export interface CalibrationInterval {
  level: number;
  n: number;
  inside: number;
  coverage: number;
  interval: [number, number];
  test: LrTest;
}

/** The calibration table. */
export interface Calibration {
  rows: CalibrationRow[];
  intervals: CalibrationInterval[];
  used: number;
  skipped: number;
}

/**
 * Calibration table of quantile forecasts: for each probability p, the share of actuals at or below
 * the p-quantile (which a calibrated forecast makes p; Gneiting, Balabdaoui & Raftery 2007, JRSS B
 * 69:243–268), Kupiec's (1995) likelihood-ratio test of that share against p, a Clopper–Pearson
 * (1934) 95% interval, and the mean pinball loss (Koenker & Bassett 1978); and for each pair p,
 * 1 − p the coverage of the central 100(1 − 2p)% interval. Probabilities must rise from column to
 * column and the quantiles of a row must not fall; a row with any blank is skipped.
 * @example calibrationTable(y, [{ p: 0.1, cells: q10 }, { p: 0.5, cells: q50 }, { p: 0.9, cells: q90 }]).rows[0].hitRate
 */
export function calibrationTable(actual: readonly RawCell[], quantiles: readonly QuantileColumn[], firstRow = 1): Calibration {
  if (quantiles.length === 0) throw new EngineError("input", "Give at least one quantile column with its probability.");
  quantiles.forEach((q, k) => {
    if (!(typeof q.p === "number" && q.p > 0 && q.p < 1)) throw new EngineError("input", `Quantile column ${k + 1}: its probability must be strictly between 0 and 1 (e.g. 0.1); got ${String(q.p)}.`);
    if (q.cells.length !== actual.length) throw new EngineError("input", `Quantile column ${k + 1} (p = ${fmt(q.p)}) has ${q.cells.length} rows; actuals have ${actual.length}.`);
    if (k > 0 && !(q.p > quantiles[k - 1].p)) {
      throw new EngineError("input", `The quantile columns are out of order: p = ${fmt(q.p)} comes after p = ${fmt(quantiles[k - 1].p)}. List them from the lowest probability to the highest, each once.`);
    }
  });
  const K = quantiles.length;
  const below = new Array<number>(K).fill(0);
  const loss = new Array<number>(K).fill(0);
  const pairs: [number, number][] = [];
  for (let a = 0; a < K; a++) for (let b = K - 1; b > a; b--) if (Math.abs(quantiles[a].p + quantiles[b].p - 1) < 1e-9) pairs.push([a, b]);
  const inside = new Array<number>(pairs.length).fill(0);
  let used = 0, skipped = 0;
  for (let i = 0; i < actual.length; i++) {
    const row = firstRow + i;
    if (isBlank(actual[i]) || quantiles.some((q) => isBlank(q.cells[i]))) { skipped++; continue; }
    const y = actual[i];
    if (typeof y !== "number" || !Number.isFinite(y)) throw new EngineError("input", `Row ${row}: the actual is not a number (${JSON.stringify(y).slice(0, 20)}).`);
    const qs = quantiles.map((q) => {
      const v = q.cells[i];
      if (typeof v !== "number" || !Number.isFinite(v)) throw new EngineError("input", `Row ${row}: the ${fmt(q.p)} quantile is not a number (${JSON.stringify(v).slice(0, 20)}).`);
      return v;
    });
    for (let k = 1; k < K; k++) {
      if (qs[k] < qs[k - 1]) throw new EngineError("input", `Row ${row}: the ${fmt(quantiles[k].p)} quantile (${fmt(qs[k])}) is below the ${fmt(quantiles[k - 1].p)} quantile (${fmt(qs[k - 1])}). Quantiles must not fall as p rises: check the column order.`);
    }
    used++;
    qs.forEach((q, k) => {
      if (y <= q) below[k]++;
      loss[k] += pinball(q, y, quantiles[k].p);
    });
    pairs.forEach(([a, b], j) => { if (y >= qs[a] && y <= qs[b]) inside[j]++; });
  }
  if (used < 2) throw new EngineError("input", `At least 2 rows with an actual and every quantile are needed; there ${used === 1 ? "is 1" : `are ${used}`}${skipped ? ` (${skipped} skipped for blanks)` : ""}.`);
  const rows = quantiles.map((q, k) => ({
    p: q.p, n: used, atOrBelow: below[k], hitRate: below[k] / used, interval: clopperPearson(below[k], used),
    test: kupiec(below[k], used, q.p), pinball: loss[k] / used,
  }));
  const intervals = pairs.map(([a, b], j) => {
    const c = quantiles[b].p - quantiles[a].p;
    return { level: Number((100 * c).toPrecision(12)), n: used, inside: inside[j], coverage: inside[j] / used, interval: clopperPearson(inside[j], used), test: kupiec(used - inside[j], used, 1 - c) };
  }).sort((x, y) => x.level - y.level);
  return { rows, intervals, used, skipped };
}
