// Every bad input of the foundation issue gets a clear EngineError naming what to fix; none
// crashes or returns NaN (DESIGN.md habit 4).
import {
  backtransformMean, backtransformMedian, backtransformQuantile, boxCox, boxCoxInverse, EngineError, fitLambda, lambdaMle,
  meanFromInterval, screenSeries, cleanSeries, impliedLambda,
} from "../../src/engine";

function expectEngineError(f: () => unknown, pattern: RegExp): void {
  let thrown: unknown;
  try {
    const v = f();
    if (typeof v === "number" && !Number.isFinite(v)) throw new Error(`returned ${v}`);
  } catch (e) {
    thrown = e;
  }
  expect(thrown).toBeInstanceOf(EngineError);
  expect((thrown as Error).message).toMatch(pattern);
}

describe("bad input gives a message that says what to fix", () => {
  test("empty range", () => {
    expectEngineError(() => lambdaMle([]), /no numbers/);
    expectEngineError(() => cleanSeries([]), /no numbers/);
  });
  test("one value", () => {
    expectEngineError(() => lambdaMle([5]), /too short.*1 value.*at least 4/);
    expect(screenSeries([5]).fix).toBe("too-short");
  });
  test("all blanks", () => {
    expectEngineError(() => cleanSeries([null, null, ""]), /no numbers/);
    expect(screenSeries([null, null]).message).toMatch(/no numbers/);
  });
  test("text and booleans mixed in", () => {
    const r = screenSeries([1, "abc", 2, false, 3, 4]);
    expect(r.textCells).toBe(2);
    expectEngineError(() => cleanSeries([1, "abc", 2]), /text/);
    expectEngineError(() => cleanSeries([1, false, 2]), /text/);
  });
  test("zeros and negatives for Box-Cox", () => {
    expectEngineError(() => boxCox(0, 0.5), /values > 0.*Yeo-Johnson/);
    expectEngineError(() => boxCox(-2, 0), /values > 0/);
    expectEngineError(() => fitLambda([1, 2, -3, 4, 5, 6]), /1 negative value/);
  });
  test("λ outside [-5, 5] or not a number", () => {
    expectEngineError(() => boxCox(2, 7), /between -5 and 5/);
    expectEngineError(() => boxCoxInverse(2, -6), /between -5 and 5/);
    expectEngineError(() => boxCox(2, "auto" as unknown as number), /lambda must be a finite number; got the text "auto"/);
    expectEngineError(() => backtransformMean(1, 0.1, NaN), /lambda must be a finite number/);
  });
  test("level not in (0, 100)", () => {
    expectEngineError(() => meanFromInterval(100, 80, 120, 100), /strictly between 0 and 100/);
    expectEngineError(() => meanFromInterval(100, 80, 120, 0), /strictly between 0 and 100/);
    expectEngineError(() => meanFromInterval(100, 80, 120, 0.95), /in percent: give 95/);
  });
  test("p not in (0, 1)", () => {
    expectEngineError(() => backtransformQuantile(1, 0.1, 0, 0), /strictly between 0 and 1/);
    expectEngineError(() => backtransformQuantile(1, 0.1, 0, 1), /strictly between 0 and 1/);
    expectEngineError(() => backtransformQuantile(1, 0.1, 0, 95), /For a 90th percentile use 0.9/);
  });
  test("σ ≤ 0", () => {
    expectEngineError(() => backtransformMean(1, 0, 0), /sd .*greater than 0/);
    expectEngineError(() => backtransformMedian(1, -1, 0), /greater than 0/);
  });
  test("mismatched interval ends", () => {
    expectEngineError(() => meanFromInterval(100, 120, 80, 80), /lower < median < upper/);
    expectEngineError(() => impliedLambda(100, 100, 120), /lower < median < upper/);
  });
  test("NaN and Infinity", () => {
    expectEngineError(() => boxCox(NaN, 1), /finite number/);
    expectEngineError(() => boxCox(Infinity, 1), /finite number/);
    expectEngineError(() => lambdaMle([1, 2, NaN, 4, 5]), /not a finite number at position 3/);
    expectEngineError(() => cleanSeries([1, Infinity, 3]), /not a finite number in row 2/);
  });
  test("1e308 and 1e-308 are handled without overflow or NaN", () => {
    const big = [1e308, 5e307, 8e307, 2e307, 9e307];
    const tiny = [1e-308, 5e-308, 8e-308, 2e-308, 9e-308];
    for (const x of [big, tiny]) {
      const r = lambdaMle(x);
      expect(Number.isFinite(r.lambda)).toBe(true);
      expect(Number.isFinite(r.loglik)).toBe(true);
    }
    expect(Number.isFinite(boxCox(1e308, 0.5))).toBe(true);
    expectEngineError(() => boxCox(1e308, 2), /too large to represent/);
    expectEngineError(() => boxCoxInverse(1e308, 0), /too large to represent/);
    expectEngineError(() => backtransformMean(709, 2, 0, "exact"), /too large to represent/);
    expectEngineError(() => backtransformMean(709, 2, 0, "taylor"), /too large to represent/);
  });
});
