// One verdict per audited set of intervals, combining the traffic-light zone (a miss count) with the
// likelihood-ratio tests (Kupiec 1995; Christoffersen 1998), two-sided, so that a rejecting test can
// never sit beside a reading of "pass".
import type { LrTest, Zone } from "./coverage-tests";

/** What the verdict found. */
export type VerdictCode = "too-many-misses" | "misses-cluster" | "too-wide" | "consistent" | "too-few-rows";

/** A verdict with its headline, the numbers behind it, and the colour a face shows. */
export interface Verdict {
  code: VerdictCode;
  /** "Too many misses", "Misses cluster", "Intervals too wide (too few misses)", "Consistent with the promised coverage", "Too few rows to judge". */
  headline: string;
  /** The numbers behind the headline, in a sentence or two. */
  text: string;
  /**
   * The zone a face prints: the miss-count zone, raised to at least yellow when any test rejects
   * (red when a rejecting p-value is below 1%), so it is green only beside a clean verdict.
   */
  colour: Zone;
  /** The zone by miss count alone (Basel Committee 1996 style), for reference. */
  countZone: Zone;
}

/** Everything the verdict rule reads. */
export interface VerdictInput {
  n: number;
  misses: number;
  coverage: number;
  nominal: number;
  kupiec: LrTest;
  independence: LrTest;
  conditional: LrTest;
  zone: Zone;
  /** Significance level of the tests (default 0.05). */
  alpha?: number;
}

/** Headlines of the verdict codes (stable wording, used in every face and the README). */
export const VERDICT_HEADLINES: Record<VerdictCode, string> = {
  "too-many-misses": "Too many misses",
  "misses-cluster": "Misses cluster",
  "too-wide": "Intervals too wide (too few misses)",
  consistent: "Consistent with the promised coverage",
  "too-few-rows": "Too few rows to judge",
};

function pv(p: number): string {
  return p < 0.001 ? p.toExponential(1) : p.toFixed(3);
}

function pct(x: number): string {
  return `${(100 * x).toFixed(1)}%`;
}

/**
 * The verdict rule, at significance α (default 5%), two-sided:
 * 1. fewer than 2 rows → "Too few rows to judge";
 * 2. Kupiec rejects with observed coverage below the promise, or the zone is red → "Too many misses"
 *    (", and they cluster" when the independence test rejects too);
 * 3. otherwise the independence test rejects → "Misses cluster";
 * 4. otherwise Kupiec rejects with coverage above the promise → "Intervals too wide (too few misses)";
 * 5. otherwise the conditional-coverage test alone rejects → the larger of its two parts names the
 *    finding (miss rate → too many / too wide by direction; independence → misses cluster);
 * 6. otherwise → "Consistent with the promised coverage".
 * The colour is the miss-count zone, raised to yellow when a test rejects and to red when a
 * rejecting p-value is below α/5; a too-wide verdict is yellow. Tests: Kupiec (1995), J.
 * Derivatives 3(2):73–84; Christoffersen (1998), International Economic Review 39:841–862; zones:
 * Basel Committee on Banking Supervision (1996).
 * @example verdictOf({ n: 100, misses: 30, coverage: 0.7, nominal: 0.8, kupiec, independence, conditional, zone: "red" }).headline // "Too many misses"
 */
export function verdictOf(v: VerdictInput): Verdict {
  const alpha = v.alpha ?? 0.05;
  const { kupiec: uc, independence: ind, conditional: cc } = v;
  const counts = `${v.n - v.misses} of ${v.n} inside (${pct(v.coverage)}; ${pct(v.nominal)} promised), ${v.misses} ${v.misses === 1 ? "miss" : "misses"}`;
  const nums = `Kupiec p = ${pv(uc.p)}; independence p = ${ind.note && ind.lr === 0 ? "n/a" : pv(ind.p)}; conditional coverage p = ${pv(cc.p)}`;
  if (v.n < 2) {
    return { code: "too-few-rows", headline: VERDICT_HEADLINES["too-few-rows"], text: `Only ${v.n} row: no test can judge it (${counts}).`, colour: "yellow", countZone: v.zone };
  }
  const below = v.coverage < v.nominal;
  const ucRejects = uc.p < alpha;
  const indRejects = ind.p < alpha && !ind.note;
  const ccRejects = cc.p < alpha;
  let code: VerdictCode;
  let extra = "";
  if ((ucRejects && below) || v.zone === "red") {
    code = "too-many-misses";
    extra = " More actuals fell outside than chance explains: the intervals are too narrow for the promised level.";
    if (!ucRejects) extra = ` The miss count is in the red zone (P(X ≥ ${v.misses}) is below 0.01%).`;
    if (indRejects) extra += ` The misses also cluster (independence p = ${pv(ind.p)}).`;
  } else if (indRejects) {
    code = "misses-cluster";
    extra = " After a miss, another miss is more likely than the promise allows: the intervals react too slowly.";
    if (ucRejects) extra += ` The miss rate is also too low (Kupiec p = ${pv(uc.p)}): the intervals are wider than promised on average.`;
  } else if (ucRejects) {
    code = "too-wide";
    extra = " Fewer actuals fell outside than the promised level allows: the intervals are wider than they need to be.";
  } else if (ccRejects) {
    if (ind.lr > uc.lr && !ind.note) {
      code = "misses-cluster";
      extra = " Neither test alone rejects, but together they do, mostly through the clustering of misses.";
    } else {
      code = below ? "too-many-misses" : "too-wide";
      extra = ` Neither test alone rejects, but together they do, mostly through the miss rate: the intervals are too ${below ? "narrow" : "wide"}.`;
    }
  } else {
    code = "consistent";
    extra = v.zone === "yellow" ? ` No test rejects at ${100 * alpha}%, but the miss count is in the yellow zone: watch the next periods.` : ` No test rejects at ${100 * alpha}%.`;
  }
  const rejecting = [ucRejects ? uc.p : 1, indRejects ? ind.p : 1, ccRejects ? cc.p : 1];
  const minP = Math.min(...rejecting);
  const rank: Record<Zone, number> = { green: 0, yellow: 1, red: 2 };
  let colour: Zone = v.zone;
  if (code !== "consistent") {
    const fromTests: Zone = code === "too-wide" ? "yellow" : minP < alpha / 5 ? "red" : "yellow";
    colour = rank[fromTests] > rank[v.zone] ? fromTests : v.zone;
    if (code === "too-wide") colour = "yellow";
  }
  return { code, headline: VERDICT_HEADLINES[code], text: `${counts}. ${nums}.${extra}`, colour, countZone: v.zone };
}
