// Every error a function can return carries its message where Excel shows one. Excel shows a custom
// message only with #VALUE! and #N/A and drops it with #NUM! ("Handle and return errors from your
// custom function", https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-errors).
// So: something to fix → #VALUE! with the fix; a value that does not exist → #N/A with the reason;
// #NUM! only for an overflow, the one cause the README and the support page document. The fuzz
// tests hold every random call to the same rule (test/helpers/hostile-cells.ts, checkError).
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { CODES_WITH_MESSAGE, toExcelError } from "../../src/functions/excel-errors";
import { EngineError } from "../../src/engine";

const N = null as unknown as undefined;

async function errorOf(f: () => unknown): Promise<ShimError> {
  let v: unknown;
  try {
    v = await f();
  } catch (e) {
    v = e;
  }
  const first = Array.isArray(v) ? (v as unknown[][]).flat().find((x) => x instanceof ShimError) : v;
  if (!(first instanceof ShimError)) throw new Error(`expected a cell error, got ${JSON.stringify(v)}`);
  return first;
}

test("the codes whose message Excel shows are #VALUE! and #N/A (platform documentation)", () => {
  expect([...CODES_WITH_MESSAGE].sort()).toEqual(["#N/A", "#VALUE!"]);
});

describe("each kind of problem gets the error type whose message reaches the user", () => {
  const cases: [string, () => unknown, string, RegExp][] = [
    ["a zero in a Box-Cox input: something to fix", () => FW.BOXCOX([[0]], 0, N), "#VALUE!", /values > 0/],
    ["λ as text: something to fix", () => FW.BOXCOX([[1]], "x" as unknown as number, N), "#VALUE!", /lambda must be a number/],
    ["an error value inside a series: refused with its position", () => FW.FAN([["Sales"], [100], [new ShimError("#DIV/0!", "")], [120], [130], [125]], 3, "naive", 0), "#VALUE!", /row 3.*#DIV\/0!|#DIV\/0!.*row 3/],
    ["a back-transform past the floor: no original value exists", () => FW.BOXCOXINV([[-3]], 0.5, N), "#N/A", /floor/],
    ["a back-transform at the pole: the value would be infinite", () => FW.BOXCOXINV([[2]], -0.5, N), "#N/A", /pole/],
    ["a Yeo-Johnson value past its bound", () => FW.YEOJOHNSONINV([[1]], -1), "#N/A", /bound/],
    ["a quantile below the floor at 0", () => FW.BTQUANTILE([[-1.5]], [[1]], 0.5, [[0.01]]), "#N/A", /floor at 0/],
    ["the exact mean for λ < 0 does not exist", () => FW.BTMEAN([[1]], [[0.5]], -0.5, "exact"), "#N/A", /./],
  ];
  for (const [what, call, code, message] of cases) {
    test(`${what} → ${code} with a message`, async () => {
      const e = await errorOf(call);
      expect([e.code, message.test(e.message)]).toEqual([code, true]);
      expect(CODES_WITH_MESSAGE).toContain(e.code);
      expect(e.message.length).toBeGreaterThan(20);
    });
  }

  test("an overflow is the one #NUM! (shown bare in Excel; documented in the README and on the support page)", async () => {
    const big = [[1e308], [5e307], [8e307], [2e307], [9e307], [3e307]];
    const e = await errorOf(() => FW.BOXCOX(big, 2, N));
    expect(e.code).toBe("#NUM!");
    expect(e.message).toMatch(/too large to represent/);
    const score = await errorOf(() => FW.INTERVALSCORE([[1.5e308], [-1.5e308]], [[-1e308], [1e308]], [[1e308], [1e308]], 95));
    expect(score.code).toMatch(/#NUM!|#VALUE!/); // an overflow, or refused as input: never a silent Infinity
  });
});

describe("toExcelError's rule (src/functions/excel-errors.ts)", () => {
  test("input → #VALUE!, unavailable → #N/A, domain → #N/A unless it is an overflow → #NUM!", () => {
    expect(isCellError(toExcelError(new EngineError("input", "horizon must be a whole number")), "#VALUE!", /horizon/)).toBe(true);
    expect(isCellError(toExcelError(new EngineError("unavailable", "no upper end")), "#N/A", /no upper end/)).toBe(true);
    expect(isCellError(toExcelError(new EngineError("domain", "Transformed value -3 is at or below -1/λ = -2: no positive original value (the floor at 0).")), "#N/A", /floor/)).toBe(true);
    expect(isCellError(toExcelError(new EngineError("domain", "Box-Cox of 1e308 with λ = 2 is too large to represent; use a smaller λ.")), "#NUM!")).toBe(true);
    expect(isCellError(toExcelError(new EngineError("domain", "Box-Cox with λ = 3 overflows on Sales's values; use a smaller λ (e.g. 0).")), "#NUM!")).toBe(true);
    // a pole that "lies at or past the pole … (or overflows)" is a value that does not exist: #N/A with the reason
    expect(isCellError(toExcelError(new EngineError("domain", "The 1 quantile is unbounded: with λ = -1 it lies at or past the pole of the inverse transform (or overflows). Try a larger λ (e.g. 0) or a lower probability.")), "#N/A", /unbounded/)).toBe(true);
  });
  test("an unexpected exception is still #VALUE! with a message (never a bare #VALUE! from an escaped exception)", () => {
    const e = toExcelError(new TypeError("x is undefined"));
    expect(isCellError(e, "#VALUE!", /could not compute this.*Please report it/)).toBe(true);
  });
});
