import { fmt, requireLevelPercent } from "../_lib/check";
import type { RawCell } from "../series/screen";
import { binomialTail, christoffersenIndependence, conditionalCoverage, kupiec, LrTest, trafficLight, Zone } from "./coverage-tests";
import { hitSequence } from "./hits";
import { intervalScore } from "./scores";

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
  zone: Zone;
  zoneCumulative: number;
  intervalScore: number;
  hits: number[];
  /** Plain-language verdict. */
  verdict: string;
}

/**
 * Audits intervals of `levelPercent`% against actuals: hit sequence (inclusive ends, blanks
 * skipped), Kupiec's and Christoffersen's tests, the binomial tail, the traffic-light zone and the
 * mean interval score, with a verdict in words.
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
  const pct = (x: number): string => `${(100 * x).toFixed(1)}%`;
  const parts: string[] = [];
  parts.push(`${n - misses} of ${n} actuals (${pct(coverage)}) fell inside the ${fmt(levelPercent)}% intervals; ${pct(c)} was promised.`);
  if (uc.p < 0.05) parts.push(coverage < c ? `That is too few to be chance (Kupiec p = ${uc.p.toPrecision(2)}): the intervals are too narrow.` : `That is more than chance explains (Kupiec p = ${uc.p.toPrecision(2)}): the intervals are wider than they need to be.`);
  else parts.push(`The difference is within what chance explains (Kupiec p = ${uc.p.toPrecision(2)}).`);
  if (ind.note) parts.push(ind.note);
  else if (ind.p < 0.05) parts.push(`Misses come in clusters (independence p = ${ind.p.toPrecision(2)}): after a miss, another is more likely, so the intervals react too slowly.`);
  else parts.push(`No sign that misses cluster (independence p = ${ind.p.toPrecision(2)}).`);
  parts.push(`Zone: ${tl.zone} (${misses} ${misses === 1 ? "miss" : "misses"}; P(X ≤ ${misses}) = ${tl.cumulative.toPrecision(4)} at the nominal rate).`);
  return {
    n, skipped: h.skipped, misses, coverage, nominal: c, kupiec: uc, independence: ind, conditional: cc,
    binomialTail: tail, zone: tl.zone, zoneCumulative: tl.cumulative, intervalScore: is, hits: h.hits, verdict: parts.join(" "),
  };
}
