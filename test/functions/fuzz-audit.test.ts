// Property-based fuzzing of the audit cell functions (fast-check, seeded): forecast logs (actuals
// and interval ends, lightly corrupted), random and ragged ranges, mismatched lengths, hostile
// levels and probabilities; and backtests of hostile histories. Every outcome must obey
// checkOutcome: no uncaught exception, no NaN/Infinity, every error a CustomFunctions.Error with a
// message. Expectations are the project's own contract (README), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { anyColumn, anyRange, auditColumns, FUZZ_RUNS, FUZZ_TIMEOUT, fuzzRunner, goodHorizon, goodLevel, goodPeriod, goodProb, lambdaKeyword, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
const log = fc.oneof({ weight: 6, arbitrary: auditColumns }, { weight: 1, arbitrary: fc.tuple(anyRange, anyRange, anyRange) });
const cheapMethod = optional(fc.oneof(
  { weight: 8, arbitrary: fc.constantFrom("mean", "naive", "seasonal-naive", "drift") },
  { weight: 1, arbitrary: fc.constantFrom("ses", "holt", "damped", "x") },
));

describe(`audit cell functions survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.COVERAGE", () => run("FW.COVERAGE", fc.tuple(log, required(goodLevel)).map(([[a, l, u], lv]) => [a, l, u, lv]), FW.COVERAGE, 21), FUZZ_TIMEOUT);
  test("FW.INTERVALSCORE", () => run("FW.INTERVALSCORE", fc.tuple(log, required(goodLevel)).map(([[a, l, u], lv]) => [a, l, u, lv]), FW.INTERVALSCORE, 22), FUZZ_TIMEOUT);
  test("FW.PINBALL", () => run("FW.PINBALL", fc.tuple(log, required(goodProb)).map(([[a, , u], p]) => [a, u, p]), FW.PINBALL, 23), FUZZ_TIMEOUT);
  test("FW.BACKTEST", () => run("FW.BACKTEST", fc.tuple(anyColumn, required(goodHorizon), cheapMethod, optional(lambdaKeyword), optional(goodLevel), optional(goodPeriod), optional(fc.oneof({ weight: 4, arbitrary: fc.integer({ min: 2, max: 30 }) }, { weight: 1, arbitrary: fc.constantFrom(0, 1, 2.5, 1e9) }))), FW.BACKTEST, 24, 0.025), FUZZ_TIMEOUT); // seven arguments, each sometimes hostile: fewer calls get through
});
