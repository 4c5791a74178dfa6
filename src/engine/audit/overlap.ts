// Coverage tests over several hit sequences ("strands": one per group, in origin order) and, for
// forecasts h > 1 steps ahead, over the h non-overlapping subsamples of every h-th origin, combined
// with a Bonferroni bound (Diebold, Gunther & Tay 1998, International Economic Review 39:863–883,
// section 4: h-step forecasts made at consecutive origins are dependent up to lag h − 1, but every
// h-th one is independent under a correct model; test each subsample and bound the combination).
import { EngineError } from "../errors";
import { christoffersenIndependence, conditionalCoverage, independenceFromCounts, kupiec, LrTest, transitions, Transitions } from "./coverage-tests";

/** The three tests over a set of strands, with how they were combined. */
export interface StrandTests {
  kupiec: LrTest;
  independence: LrTest & Transitions;
  conditional: LrTest;
  /** Number of subsamples tested: 1 for h = 1, else the non-empty ones of the h. */
  subsamples: number;
  /** How the tests were formed, in words (empty for the plain one-step case). */
  adjustment: string;
}

function sumCounts(strands: readonly (readonly number[])[]): LrTest & Transitions {
  const c = { n00: 0, n01: 0, n10: 0, n11: 0 };
  for (const s of strands) {
    const t = transitions(s);
    c.n00 += t.n00;
    c.n01 += t.n01;
    c.n10 += t.n10;
    c.n11 += t.n11;
  }
  return independenceFromCounts(c);
}

function plain(strands: readonly (readonly number[])[], p: number): Omit<StrandTests, "subsamples" | "adjustment"> {
  let n = 0;
  let x = 0;
  for (const s of strands) for (const v of s) { n++; x += v; }
  const uc = kupiec(x, n, p);
  const ind = strands.length === 1 ? christoffersenIndependence(strands[0]) : sumCounts(strands);
  return { kupiec: uc, independence: ind, conditional: conditionalCoverage(uc, ind) };
}

// The note stays only when every subsample is degenerate (nothing to test anywhere): a note marks
// a test that cannot reject, so it must not hide a subsample that can.
function bonferroni<T extends LrTest>(tests: T[], m: number): T {
  let best = tests[0];
  for (const t of tests) if (t.p < best.p) best = t;
  return { ...best, p: Math.min(1, m * best.p), note: tests.every((t) => t.note) ? tests[0].note : "" };
}

/**
 * Kupiec, Christoffersen independence and conditional-coverage tests over strands of hits (1 = miss)
 * of forecasts `h` steps ahead. Counts of misses and transitions are summed over strands, so
 * clustering is tested within each strand only (never across the boundary between two series).
 * For h = 1 these are the usual tests (Kupiec 1995; Christoffersen 1998). For h > 1 each strand is
 * split into the h subsamples of every h-th origin (positions r, r + h, r + 2h, …), each subsample
 * is tested as above, and each test's p-value is the smallest subsample p-value times the number of
 * subsamples (Bonferroni), which keeps its size at or below nominal although consecutive h-step
 * forecasts overlap (Diebold, Gunther & Tay 1998, IER 39:863–883). The LR shown is that subsample's.
 * @example overlapTests([[0, 1, 0, 0, 1, 0]], 0.2, 2).subsamples // 2
 */
export function overlapTests(strands: readonly (readonly number[])[], p: number, h: number): StrandTests {
  if (!Number.isInteger(h) || h < 1) throw new EngineError("input", `The step ahead must be a whole number of at least 1; got ${h}.`);
  const total = strands.reduce((s, x) => s + x.length, 0);
  if (total < 1) throw new EngineError("input", "No rows to test.");
  if (h === 1) return { ...plain(strands, p), subsamples: 1, adjustment: "" };
  const parts: ReturnType<typeof plain>[] = [];
  for (let r = 0; r < h; r++) {
    const sub = strands.map((s) => s.filter((_, i) => i % h === r)).filter((s) => s.length > 0);
    if (sub.length === 0) continue;
    parts.push(plain(sub, p));
  }
  const m = parts.length;
  const how = `every ${ordinal(h)} origin (${m} non-overlapping subsamples), Bonferroni (Diebold, Gunther & Tay 1998)`;
  return {
    kupiec: bonferroni(parts.map((q) => q.kupiec), m),
    independence: bonferroni(parts.map((q) => q.independence), m),
    conditional: bonferroni(parts.map((q) => q.conditional), m),
    subsamples: m,
    adjustment: `Forecasts ${h} steps ahead from consecutive origins overlap, so the tests use ${how}.`,
  };
}

function ordinal(k: number): string {
  const s = k % 100 >= 11 && k % 100 <= 13 ? "th" : k % 10 === 1 ? "st" : k % 10 === 2 ? "nd" : k % 10 === 3 ? "rd" : "th";
  return `${k}${s}`;
}
