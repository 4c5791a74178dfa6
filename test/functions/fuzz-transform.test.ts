// Property-based fuzzing of the element-by-element and λ cell functions (fast-check, seeded): random
// ranges mixing numbers (±0, subnormals, 1e308), blanks, text, booleans, error values, ragged shapes
// and random optional arguments. Every outcome must obey the rule in checkOutcome: no uncaught
// exception, no NaN/Infinity in a cell, every error a CustomFunctions.Error with a message.
// Expectations are the project's own contract (README "How Fanwise reads cells"), common practice.
import fc from "fast-check";
import "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { anyRange, anyCell, costlyColumn, costlyRange, FUZZ_RUNS, FUZZ_TIMEOUT, fuzzRunner, goodLambda, goodLevel, goodProb, goodPeriod, intervalTriple, optional, required } from "../helpers/hostile-cells";

const run = fuzzRunner();
const TIMEOUT = FUZZ_TIMEOUT;
const mu = fc.oneof({ weight: 6, arbitrary: fc.double({ min: -10, max: 20, noNaN: true }) }, { weight: 1, arbitrary: anyCell });
const sd = fc.oneof({ weight: 6, arbitrary: fc.double({ min: 0, max: 5, noNaN: true }) }, { weight: 1, arbitrary: anyCell });
const cellsOf = (a: fc.Arbitrary<unknown>) => fc.oneof(
  { weight: 3, arbitrary: a.map((x) => [[x]]) },
  { weight: 3, arbitrary: fc.array(a, { minLength: 1, maxLength: 4 }).map((r) => r.map((x) => [x])) },
  { weight: 1, arbitrary: anyRange },
);

describe(`cell functions survive ${FUZZ_RUNS} hostile calls each (seeded)`, () => {
  test("FW.BOXCOX", () => run("FW.BOXCOX", fc.tuple(anyRange, required(goodLambda), optional(fc.double({ min: -10, max: 10, noNaN: true }))), FW.BOXCOX, 1), TIMEOUT);
  test("FW.BOXCOXINV", () => run("FW.BOXCOXINV", fc.tuple(anyRange, required(goodLambda), optional(fc.double({ min: -10, max: 10, noNaN: true }))), FW.BOXCOXINV, 2), TIMEOUT);
  test("FW.YEOJOHNSON", () => run("FW.YEOJOHNSON", fc.tuple(anyRange, required(goodLambda)), FW.YEOJOHNSON, 3), TIMEOUT);
  test("FW.YEOJOHNSONINV", () => run("FW.YEOJOHNSONINV", fc.tuple(anyRange, required(goodLambda)), FW.YEOJOHNSONINV, 4), TIMEOUT);
  test("FW.FITLAMBDA", () => run("FW.FITLAMBDA", fc.tuple(costlyColumn, optional(fc.constantFrom("guerrero", "mle", "MLE", " Guerrero", "guerrero", "mle", "ols")), optional(goodPeriod), optional(fc.oneof(fc.double({ min: -6, max: 0.5, noNaN: true }), goodLambda)), optional(fc.oneof(fc.double({ min: 0.5, max: 6, noNaN: true }), goodLambda))), FW.FITLAMBDA, 5), TIMEOUT);
  test("FW.SCREEN", () => run("FW.SCREEN", fc.tuple(costlyRange, optional(goodPeriod)), FW.SCREEN, 6), TIMEOUT);
  test("FW.BTMEAN", () => run("FW.BTMEAN", fc.tuple(cellsOf(mu), cellsOf(sd), required(goodLambda), optional(fc.constantFrom("taylor", "exact", "EXACT", "mean"))), FW.BTMEAN, 7), TIMEOUT);
  test("FW.BTQUANTILE", () => run("FW.BTQUANTILE", fc.tuple(cellsOf(mu), cellsOf(sd), required(goodLambda), cellsOf(goodProb).map((c) => (Array.isArray(c) && c.length > 1 ? [c.map((r) => r[0])] : c))), FW.BTQUANTILE, 8), TIMEOUT);
  test("FW.MEANFROMINTERVAL", () => run("FW.MEANFROMINTERVAL", fc.tuple(intervalTriple, required(goodLevel), optional(goodLambda), optional(fc.constantFrom("taylor", "exact", "x"))).map(([t, ...rest]) => [...t, ...rest]), FW.MEANFROMINTERVAL, 9), TIMEOUT);
  test("FW.IMPLIEDLAMBDA", () => run("FW.IMPLIEDLAMBDA", intervalTriple, FW.IMPLIEDLAMBDA, 10), TIMEOUT);
});
