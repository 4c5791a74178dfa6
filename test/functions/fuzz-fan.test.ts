// Property-based fuzzing of FW.FAN and FW.QUANTILES (fast-check, seeded): hostile histories
// (plausible business series lightly corrupted, random cells, ragged ranges) with random horizons,
// methods, λ, levels, probabilities and periods. Every outcome must obey checkOutcome: no
// uncaught exception, no NaN/Infinity in a cell, every error a CustomFunctions.Error with a message.
// Expectations are the project's own contract (README "How Fanwise reads cells"), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { METHODS } from "../../src/engine";
import { anyRange, FUZZ_RUNS, modelRange, FUZZ_TIMEOUT, fuzzRunner, goodHorizon, goodLevels, goodPeriod, goodProb, lambdaKeyword, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
// The benchmarks are cheap, the smoothing models (and "auto", which fits them all) are not: weight
// the draw so 10,000 calls stay within CI's budget while every method is still drawn hundreds of times.
const method = optional(fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom("mean", "naive", "seasonal-naive", "drift", "NAIVE") },
  { weight: 3, arbitrary: fc.constantFrom(...METHODS.filter((m) => m !== "auto" && m !== "arima"), "arima:0,1,1", "arima:1,0,0", "arima:0,1,1/0,1,1") },
  { weight: 1, arbitrary: fc.constantFrom("auto", "holt winters", "arima", "arima:9,1,1", "arima:0,1", "") },
));
const probs = fc.oneof({ weight: 4, arbitrary: goodProb.map((p) => [[p]]) }, { weight: 4, arbitrary: fc.array(goodProb, { minLength: 1, maxLength: 4 }).map((r) => [r]) }, { weight: 1, arbitrary: anyRange });

describe(`forecast tables survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.FAN", () => run("FW.FAN", fc.tuple(modelRange, required(goodHorizon), method, optional(lambdaKeyword), optional(goodLevels), optional(goodPeriod), optional(fc.boolean())), FW.FAN, 11), FUZZ_TIMEOUT);
  test("FW.QUANTILES", () => run("FW.QUANTILES", fc.tuple(modelRange, required(goodHorizon), probs, method, optional(lambdaKeyword), optional(goodPeriod)), FW.QUANTILES, 12), FUZZ_TIMEOUT);
});
