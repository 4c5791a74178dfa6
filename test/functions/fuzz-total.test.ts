// Property-based fuzzing of FW.TOTAL and FW.MODELINFO (fast-check, seeded): hostile histories
// (plausible business series lightly corrupted, random cells, ragged ranges) with random horizons,
// methods, λ, levels, periods and seeds. Every outcome must obey checkOutcome: no
// uncaught exception, no NaN/Infinity in a cell, every error a CustomFunctions.Error with a message.
// Expectations are the project's own contract (README "How Fanwise reads cells"), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { METHODS } from "../../src/engine";
import { anyRange, FUZZ_RUNS, modelRange, FUZZ_TIMEOUT, fuzzRunner, goodHorizon, goodLevel, goodPeriod, lambdaKeyword, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
// The benchmarks are cheap, the smoothing models (and "auto", which fits them all) are not: weight
// the draw so 10,000 calls stay within CI's budget while every method is still drawn hundreds of times.
const method = optional(fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom("mean", "naive", "seasonal-naive", "drift", "NAIVE") },
  { weight: 3, arbitrary: fc.constantFrom(...METHODS.filter((m) => m !== "auto" && m !== "arima"), "arima:0,1,1", "arima:1,0,0", "arima:0,1,1/0,1,1") },
  { weight: 1, arbitrary: fc.constantFrom("auto", "holt winters", "arima", "arima:9,1,1", "arima:0,1", "") },
));
const seed = optional(fc.oneof({ weight: 5, arbitrary: fc.integer({ min: 0, max: 1e6 }) }, { weight: 1, arbitrary: fc.constantFrom(-1, 1.5, 1e20) }));

describe(`forecast totals and model descriptions survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.TOTAL", () => run("FW.TOTAL", fc.tuple(anyRange, required(goodHorizon), method, optional(lambdaKeyword), optional(goodLevel), optional(goodPeriod), seed, optional(fc.oneof({ weight: 5, arbitrary: fc.integer({ min: 1, max: 12 }) }, { weight: 1, arbitrary: fc.constantFrom(0, -1, 2.5, 1e9) }))), FW.TOTAL, 13), FUZZ_TIMEOUT);
  test("FW.MODELINFO", () => run("FW.MODELINFO", fc.tuple(modelRange, method, optional(lambdaKeyword), optional(goodPeriod)), FW.MODELINFO, 14), FUZZ_TIMEOUT);
});
