// Property-based fuzzing of the audit cell functions (fast-check, seeded): forecast logs (actuals
// and interval ends, lightly corrupted), random and ragged ranges, mismatched lengths, hostile
// levels and probabilities; and backtests of hostile histories. Every outcome must obey
// checkOutcome: no uncaught exception, no NaN/Infinity, every error a CustomFunctions.Error with a
// message. Expectations are the project's own contract (README), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { anyColumn, anyRange, auditColumns, FUZZ_RUNS, FUZZ_TIMEOUT, fuzzRunner, goodHorizon, goodLevel, goodLevels, goodPeriod, goodProb, lambdaMostlyNumber, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
const log = fc.oneof({ weight: 6, arbitrary: auditColumns }, { weight: 1, arbitrary: fc.tuple(anyRange, anyRange, anyRange) });
// Groups and horizons of the log's own length (sometimes omitted, sometimes a hostile range), and
// levels sometimes given as several (so lower/upper then have too few columns: refused).
const keyed = fc.tuple(log, fc.nat({ max: 60 }), fc.nat({ max: 60 }), optional(anyColumn), optional(anyColumn)).map(([[a, l, u], gs, hs, wildG, wildH]) => {
  const n = !Array.isArray(a) ? 1 : a.length === 1 && Array.isArray(a[0]) ? a[0].length : a.length; // a log laid out in a row has one row of n cells
  const groups = gs % 4 === 0 ? null : gs % 4 === 3 ? wildG : Array.from({ length: n }, (_, i) => [["Harbour Street", "Mill Lane", 7][(i + gs) % ((gs % 3) + 1)]]);
  const horizons = hs % 4 === 0 ? null : hs % 4 === 3 ? wildH : Array.from({ length: n }, (_, i) => [1 + ((i + hs) % ((hs % 3) + 1))]);
  return [a, l, u, groups, horizons];
});
const cheapMethod = optional(fc.oneof(
  { weight: 8, arbitrary: fc.constantFrom("mean", "naive", "seasonal-naive", "drift") },
  { weight: 1, arbitrary: fc.constantFrom("ses", "holt", "damped", "x") },
));

describe(`audit cell functions survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.COVERAGE", () => run("FW.COVERAGE", fc.tuple(keyed, fc.oneof({ weight: 6, arbitrary: required(goodLevel) }, { weight: 1, arbitrary: goodLevels })).map(([[a, l, u, g, h], lv]) => [a, l, u, lv, g, h]), FW.COVERAGE, 21), FUZZ_TIMEOUT);
  test("FW.INTERVALSCORE", () => run("FW.INTERVALSCORE", fc.tuple(keyed, fc.oneof({ weight: 6, arbitrary: required(goodLevel) }, { weight: 1, arbitrary: goodLevels })).map(([[a, l, u, g, h], lv]) => [a, l, u, lv, g, h]), FW.INTERVALSCORE, 22), FUZZ_TIMEOUT);
  test("FW.PINBALL", () => run("FW.PINBALL", fc.tuple(log, required(goodProb)).map(([[a, , u], p]) => [a, u, p]), FW.PINBALL, 23), FUZZ_TIMEOUT);
  // quantile columns: the log's lower and upper ends side by side (p = 0.1, 0.9), or any range, with probabilities as a row, text or hostile cells
  const probs = fc.oneof({ weight: 4, arbitrary: fc.constant([[0.1, 0.9]]) }, { weight: 1, arbitrary: fc.constant("0.1,0.9") }, { weight: 1, arbitrary: fc.tuple(goodProb, goodProb).map(([a, b]) => [[a, b]]) }, { weight: 1, arbitrary: anyRange });
  test("FW.CALIBRATION", () => run("FW.CALIBRATION", fc.tuple(log, probs).map(([[a, l, u], p]) => [a, Array.isArray(l) && Array.isArray(u) && l.length === u.length ? (l as unknown[][]).map((r, i) => [Array.isArray(r) ? r[0] : r, Array.isArray((u as unknown[])[i]) ? (u as unknown[][])[i][0] : (u as unknown[])[i]]) : l, p]), FW.CALIBRATION, 25), FUZZ_TIMEOUT);
  test("FW.BACKTEST", () => run("FW.BACKTEST", fc.tuple(anyColumn, required(goodHorizon), cheapMethod, lambdaMostlyNumber, optional(goodLevel), optional(goodPeriod), optional(fc.oneof({ weight: 4, arbitrary: fc.integer({ min: 2, max: 30 }) }, { weight: 1, arbitrary: fc.constantFrom(0, 1, 2.5, 1e9) }))), FW.BACKTEST, 24, 0.025), FUZZ_TIMEOUT); // seven arguments, each sometimes hostile: fewer calls get through
});
