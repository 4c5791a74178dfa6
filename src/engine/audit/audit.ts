import { requireLevelPercent } from "../_lib/check";
import type { RawCell } from "../series/screen";
import { binomialTail, christoffersenIndependence, conditionalCoverage, kupiec, LrTest, trafficLight, Zone } from "./coverage-tests";
import { hitSequence } from "./hits";
import { intervalScore } from "./scores";
import { Verdict, verdictOf } from "./verdict";

/** A coverage audit of published intervals against actuals. */
export interface CoverageAudit {
  n: number;
  skipped: number;
  misses: number;
  /** Observed share of actuals inside their intervals. */
  coverage: number;
  nominal: number;
  kupiec: LrTest;
  independence: LrTest;
  conditional: LrTest;
  /** P(X ≥ misses) under the nominal miss rate. */
  binomialTail: number;
  /** The zone by miss count alone; show `finding.colour`, which a rejecting test raises. */
  zone: Zone;
  zoneCumulative: number;
  intervalScore: number;
  hits: number[];
  /** Side of each hit: 0 inside, 1 above the upper end, −1 below the lower end. */
  sides: (-1 | 0 | 1)[];
  /** Input row (0-based) of each hit. */
  rows: number[];
  /** The verdict (headline, numbers, the colour to show). */
  finding: Verdict;
  /** The verdict in words: headline, then the numbers. */
  verdict: string;
}

/**
 * Audits intervals of `levelPercent`% against actuals: hit sequence (inclusive ends, blanks
 * skipped), Kupiec's and Christoffersen's tests, the binomial tail, the traffic-light zone and the
 * mean interval score, with one verdict ({@link verdictOf}: two-sided, never a pass beside a
 * rejecting test).
 * @example auditCoverage(actual, low80, high80, 80).verdict
 */
export function auditCoverage(actual: readonly RawCell[], lower: readonly RawCell[], upper: readonly RawCell[], levelPercent: number, firstRow = 1): CoverageAudit {
  const c = requireLevelPercent(levelPercent);
  const p = 1 - c;
  const h = hitSequence(actual, lower, upper, firstRow);
  const n = h.hits.length;
  const misses = h.hits.reduce((s, v) => s + v, 0);
  const uc = kupiec(misses, n, p);
  const ind = christoffersenIndependence(h.hits);
  const cc = conditionalCoverage(uc, ind);
  const tail = binomialTail(misses, n, p);
  const tl = trafficLight(misses, n, p);
  let is = 0;
  for (let i = 0; i < n; i++) is += intervalScore(h.lower[i], h.upper[i], h.actual[i], p);
  is /= n;
  const coverage = 1 - misses / n;
  const finding = verdictOf({ n, misses, coverage, nominal: c, kupiec: uc, independence: ind, conditional: cc, zone: tl.zone });
  const sides = h.hits.map((v, i): -1 | 0 | 1 => (v === 0 ? 0 : h.actual[i] > h.upper[i] ? 1 : -1));
  return {
    n, skipped: h.skipped, misses, coverage, nominal: c, kupiec: uc, independence: ind, conditional: cc,
    binomialTail: tail, zone: tl.zone, zoneCumulative: tl.cumulative, intervalScore: is, hits: h.hits, sides, rows: h.rows,
    finding, verdict: `${finding.headline}. ${finding.text}`,
  };
}
