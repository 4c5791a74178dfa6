// Coverage tests of a hit sequence (1 = miss): Kupiec (1995) proportion of failures,
// Christoffersen (1998) independence and conditional coverage, the exact binomial tail, and
// traffic-light zones in the spirit of the Basel Committee's 1996 backtesting framework.
import betainc from "@stdlib/math-base-special-betainc";
import { EngineError } from "../errors";
import { chiSquareSf } from "../distribution/chisquare";

/** x·ln(y) with 0·ln 0 = 0. */
function xlogy(x: number, y: number): number {
  return x === 0 ? 0 : x * Math.log(y);
}

function checkMissProbability(p: number): void {
  if (!(p > 0 && p < 1)) throw new EngineError("input", `The nominal miss probability must be strictly between 0 and 1; got ${p}.`);
}

/** A likelihood-ratio statistic with its chi-square p-value and a sentence on any special case. */
export interface LrTest { lr: number; p: number; df: 1 | 2; note: string }

/**
 * Kupiec's proportion-of-failures test: LR_uc = −2 ln[(1−p)^{n−x} p^x] + 2 ln[(1−π̂)^{n−x} π̂^x],
 * π̂ = x/n, against χ²₁ (Kupiec 1995, J. Derivatives 3(2):73–84). 0·ln 0 = 0, so no misses and all
 * misses are handled; LR is clamped at 0 against rounding.
 * @example kupiec(17, 250, 0.05).p // 0.2145751483097557
 */
export function kupiec(misses: number, n: number, p: number): LrTest {
  checkMissProbability(p);
  if (!Number.isInteger(n) || n < 1 || !Number.isInteger(misses) || misses < 0 || misses > n) throw new EngineError("input", `Need whole numbers 0 ≤ misses ≤ n; got ${misses} of ${n}.`);
  const x = misses;
  const pi = x / n;
  const lr = Math.max(0, -2 * (xlogy(n - x, 1 - p) + xlogy(x, p)) + 2 * (xlogy(n - x, 1 - pi) + xlogy(x, pi)));
  const note = x === 0 ? "No misses at all: the test asks whether that is plausible at the nominal rate." : x === n ? "Every actual fell outside its interval." : "";
  return { lr, p: chiSquareSf(lr, 1), df: 1, note };
}

/** Transition counts of a hit sequence (state 0 = inside, 1 = miss). */
export interface Transitions { n00: number; n01: number; n10: number; n11: number; pi01: number; pi11: number; pi: number }

/**
 * Counts transitions n_ij between consecutive hits and their rates π01 = n01/(n00 + n01),
 * π11 = n11/(n10 + n11), π = (n01 + n11)/(T − 1); a rate with a zero denominator is 0.
 * @example transitions([0, 1, 1, 0]).n11 // 1
 */
export function transitions(hits: readonly number[]): Transitions {
  let n00 = 0, n01 = 0, n10 = 0, n11 = 0;
  for (let t = 1; t < hits.length; t++) {
    const a = hits[t - 1], b = hits[t];
    if (a === 0 && b === 0) n00++;
    else if (a === 0) n01++;
    else if (b === 0) n10++;
    else n11++;
  }
  const pi01 = n00 + n01 > 0 ? n01 / (n00 + n01) : 0;
  const pi11 = n10 + n11 > 0 ? n11 / (n10 + n11) : 0;
  const total = n00 + n01 + n10 + n11;
  return { n00, n01, n10, n11, pi01, pi11, pi: total > 0 ? (n01 + n11) / total : 0 };
}

/**
 * Christoffersen's independence test: are misses clustered? LR_ind = −2 ln[(1−π)^{n00+n10} π^{n01+n11}]
 * + 2 ln[(1−π01)^{n00} π01^{n01} (1−π11)^{n10} π11^{n11}], against χ²₁ (Christoffersen 1998,
 * International Economic Review 39:841–862). Degenerate sequences (no misses, all misses, no
 * transition out of a state) give LR = 0 with a note saying the test has nothing to compare.
 * @example christoffersenIndependence(hits).p
 */
export function christoffersenIndependence(hits: readonly number[]): LrTest & Transitions {
  return independenceFromCounts(transitions(hits));
}

/**
 * Christoffersen's independence test from transition counts alone (so counts summed over several
 * sequences — groups, or the non-overlapping subsamples of h-step forecasts — are tested as one):
 * the same LR_ind as {@link christoffersenIndependence}, with π01, π11 and π recomputed from the counts
 * (Christoffersen 1998, International Economic Review 39:841–862).
 * @example independenceFromCounts({ n00: 80, n01: 10, n10: 10, n11: 0 }).p // ≈ 0.083
 */
export function independenceFromCounts(counts: { n00: number; n01: number; n10: number; n11: number }): LrTest & Transitions {
  const { n00, n01, n10, n11 } = counts;
  const pi01 = n00 + n01 > 0 ? n01 / (n00 + n01) : 0;
  const pi11 = n10 + n11 > 0 ? n11 / (n10 + n11) : 0;
  const total = n00 + n01 + n10 + n11;
  const pi = total > 0 ? (n01 + n11) / total : 0;
  const l0 = xlogy(n00 + n10, 1 - pi) + xlogy(n01 + n11, pi);
  const l1 = xlogy(n00, 1 - pi01) + xlogy(n01, pi01) + xlogy(n10, 1 - pi11) + xlogy(n11, pi11);
  const lr = Math.max(0, -2 * l0 + 2 * l1);
  let note = "";
  if (total === 0) note = "No pair of consecutive rows: there is no clustering to test.";
  else if (n01 + n11 === 0) note = "No misses after the first row: there is no clustering to test.";
  else if (n00 + n10 === 0) note = "Every row after the first is a miss: there is no clustering to test.";
  else if (n10 + n11 === 0) note = "No row follows a miss, so the rate after a miss cannot be estimated.";
  return { n00, n01, n10, n11, pi01, pi11, pi, lr, p: chiSquareSf(lr, 1), df: 1, note };
}

/**
 * Christoffersen's conditional-coverage test LR_cc = LR_uc + LR_ind, against χ²₂.
 * @example conditionalCoverage(kupiec(17, 250, 0.05), christoffersenIndependence(hits)).p
 */
export function conditionalCoverage(uc: LrTest, ind: LrTest): LrTest {
  const lr = uc.lr + ind.lr;
  return { lr, p: chiSquareSf(lr, 2), df: 2, note: "" };
}

/**
 * Exact binomial tail P(X ≥ x) for X ~ Binomial(n, p): the regularised incomplete beta I_p(x, n − x + 1)
 * (@stdlib/math-base-special-betainc), accurate far into the tail.
 * @example binomialTail(10, 250, 0.01) // ≈ 0.000289
 */
export function binomialTail(x: number, n: number, p: number): number {
  checkMissProbability(p);
  if (x <= 0) return 1;
  if (x > n) return 0;
  return betainc(p, x, n - x + 1);
}

/** Traffic-light zone of a miss count. */
export type Zone = "green" | "yellow" | "red";

/**
 * Zone of a miss count in the spirit of the Basel Committee's 1996 backtesting framework,
 * generalised to any level and count: green while the cumulative probability P(X ≤ misses) is
 * below 95%, yellow below 99.99%, red beyond (Basel Committee on Banking Supervision, Supervisory
 * framework for the use of "backtesting"…, January 1996). For 250 observations at 99% this gives
 * green 0–4, yellow 5–9, red 10 or more. A count at or below the expected n·p is always green
 * (zero misses in 4 rows at 99% would otherwise read yellow).
 * @example trafficLight(5, 250, 0.01).zone // "yellow"
 */
export function trafficLight(misses: number, n: number, p: number): { zone: Zone; cumulative: number } {
  const cumulative = 1 - binomialTail(misses + 1, n, p);
  // No more misses than expected is never a warning: with few rows at a high level, P(X ≤ 0)
  // alone can exceed 95%, which the framework's 250-row table never meets.
  if (misses <= n * p) return { zone: "green", cumulative };
  return { zone: cumulative < 0.95 ? "green" : cumulative < 0.9999 ? "yellow" : "red", cumulative };
}
