// Property-based fuzzing of the budget owners' functions (issue 13): FW.TOTALFROMINTERVALS,
// FW.TOTALACROSS and FW.SMEARMEAN (fast-check, seeded), with hostile published figures, histories
// and arguments. Every outcome must obey checkOutcome (test/helpers/hostile-cells.ts): no uncaught
// exception, no NaN/Infinity in a cell, every error a CustomFunctions.Error with a message.
// Expectations are the project's own contract (README "How Fanwise reads cells"), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { anyCell, anyRange, FUZZ_RUNS, FUZZ_TIMEOUT, fuzzRunner, goodHorizon, goodLambda, goodLevel, goodPeriod, intervalTriple, lambdaMostlyNumber, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
const dependence = optional(fc.oneof(fc.constantFrom("implied", "independent", "comonotone", "IMPLIED", "0.5", "strong"), fc.double({ min: -0.5, max: 1.5, noNaN: true })));
const lambdaPublished = optional(fc.oneof(goodLambda, fc.constantFrom("implied", "Implied", "auto", "log")));
// the benchmarks are cheap, the smoothing models (and "auto", which fits them all per series) are not
const method = fc.oneof(
  { weight: 10, arbitrary: fc.constantFrom("naive", "mean", "drift", "seasonal-naive") },
  { weight: 2, arbitrary: fc.constantFrom("ses", "holt") },
  { weight: 1, arbitrary: fc.constantFrom("auto", "arima", "", null) },
);
const seed = optional(fc.oneof({ weight: 5, arbitrary: fc.integer({ min: 0, max: 1e6 }) }, { weight: 1, arbitrary: fc.constantFrom(-1, 1.5, 1e20) }));
const from = optional(fc.oneof({ weight: 5, arbitrary: fc.integer({ min: 1, max: 6 }) }, { weight: 1, arbitrary: fc.constantFrom(0, -1, 2.5, 1e9) }));
const residuals = fc.oneof(
  { weight: 6, arbitrary: fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 0, maxLength: 12 }).map((r) => r.map((x) => [x])) },
  { weight: 1, arbitrary: anyRange },
  { weight: 1, arbitrary: fc.array(anyCell, { minLength: 1, maxLength: 5 }).map((r) => r.map((x) => [x])) },
);
// several shops' histories (2–4 columns, 0–36 rows, some starting late), lightly corrupted, or any range
const shops = fc.oneof(
  { weight: 2, arbitrary: fc.record({
    n: fc.integer({ min: 0, max: 36 }),
    w: fc.integer({ min: 2, max: 4 }),
    late: fc.integer({ min: 0, max: 20 }),
    noise: fc.double({ min: 0.001, max: 0.3, noNaN: true }),
    seed: fc.integer({ min: 1, max: 1e6 }),
    corrupt: fc.array(fc.tuple(fc.nat(), fc.nat(), anyCell), { maxLength: 1 }),
  }).map((p) => {
    let s = p.seed;
    const rnd = (): number => ((s = (s * 16807) % 2147483647) / 2147483647);
    const rows: unknown[][] = Array.from({ length: p.n }, (_, i) => Array.from({ length: p.w }, (__, j) => (j === p.w - 1 && i < p.late ? null : 1000 * (j + 1) * (1 + p.noise * (rnd() - 0.5)))));
    for (const [r, c, v] of p.corrupt) if (rows.length) rows[r % rows.length][c % p.w] = v;
    return rows.length ? rows : [[null]];
  }) },
  { weight: 1, arbitrary: anyRange },
);
// short horizons mostly: each call that gets through simulates 10,000 joint paths of every series
const horizon = fc.oneof({ weight: 4, arbitrary: fc.integer({ min: 2, max: 12 }) }, { weight: 1, arbitrary: goodHorizon });
const mu = fc.oneof({ weight: 6, arbitrary: fc.array(fc.double({ min: -3, max: 12, noNaN: true }), { minLength: 1, maxLength: 4 }).map((r) => r.map((x) => [x])) }, { weight: 1, arbitrary: anyRange });

describe(`the budget owners' functions survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.TOTALFROMINTERVALS", () => run("FW.TOTALFROMINTERVALS", fc.tuple(intervalTriple, required(goodLevel), lambdaPublished, dependence).map(([t, ...rest]) => [...t, ...rest]), FW.TOTALFROMINTERVALS, 31), FUZZ_TIMEOUT);
  test("FW.TOTALACROSS", () => run("FW.TOTALACROSS", fc.tuple(shops, required(horizon), method, lambdaMostlyNumber, optional(goodLevel), optional(goodPeriod), seed, from), FW.TOTALACROSS, 32), FUZZ_TIMEOUT);
  test("FW.SMEARMEAN", () => run("FW.SMEARMEAN", fc.tuple(mu, residuals, required(goodLambda)), FW.SMEARMEAN, 33), FUZZ_TIMEOUT);
});
