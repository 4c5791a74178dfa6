// The foundation's bad-input list, through the cell layer: every problem becomes a
// CustomFunctions.Error with a message that says what to fix; nothing escapes, nothing is NaN.
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";

const N = null as unknown as undefined;

function outcome(f: () => unknown): unknown {
  try {
    return f();
  } catch (e) {
    return e;
  }
}
async function outcomeAsync(f: () => Promise<unknown>): Promise<unknown> {
  try {
    return await f();
  } catch (e) {
    return e;
  }
}
/** The error, whether thrown for the whole call or returned in the first cell. */
function firstError(v: unknown): ShimError | null {
  if (v instanceof ShimError) return v;
  if (Array.isArray(v) && Array.isArray(v[0])) {
    const hit = (v[0] as unknown[]).find((x) => x instanceof ShimError);
    if (hit) return hit as ShimError;
  }
  return null;
}
function expectCellError(v: unknown, code: string, pattern: RegExp): void {
  const e = firstError(v);
  if (!e) throw new Error(`expected a cell error, got ${JSON.stringify(v)}`);
  expect(e.code).toBe(code);
  expect(e.message).toMatch(pattern);
}
function noNaN(v: unknown): void {
  if (Array.isArray(v)) v.flat().forEach((x) => expect(typeof x === "number" ? Number.isFinite(x) : true).toBe(true));
}

describe("bad input through the cell layer", () => {
  test("an empty or ragged range", () => {
    expectCellError(outcome(() => FW.FITLAMBDA([] as never)), "#VALUE!", /must be a range/);
    expectCellError(outcome(() => FW.SCREEN([[]] as never)), "#VALUE!", /must be a range/);
    expectCellError(outcome(() => FW.SCREEN([[1, 2], [3]] as never)), "#VALUE!", /rectangular/);
  });
  test("one value, all blanks", async () => {
    expectCellError(outcome(() => FW.FITLAMBDA([[5]])), "#VALUE!", /too short/);
    expectCellError(await outcomeAsync(() => FW.FAN([[5]], 3)), "#VALUE!", /too short/);
    expectCellError(outcome(() => FW.FITLAMBDA([[null], [null]])), "#VALUE!", /no numbers/);
    expectCellError(await outcomeAsync(() => FW.TOTAL([[null], [""]], 3)), "#VALUE!", /no numbers/);
  });
  test("text and booleans inside a series are refused with the row; counted by FW.SCREEN", async () => {
    expectCellError(await outcomeAsync(() => FW.FAN([[1], ["x"], [3], [4]], 2, "naive")), "#VALUE!", /text \("x"\) in row 2/);
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [true], [3], [4]], 2, "naive")), "#VALUE!", /text \("true"\) in row 2/);
    const s = FW.SCREEN([[1], ["x"], [true], [3], [4], [5]]);
    expect(s[0][2]).toBe(2);
  });
  test("error values in the input name their cell", () => {
    const err = new ShimError("#N/A", "");
    expectCellError(outcome(() => FW.FITLAMBDA([[1], [err], [3]])), "#VALUE!", /row 2, column A holds the error #N\/A/);
  });
  test("zeros and negatives for Box-Cox", async () => {
    expectCellError(outcome(() => FW.FITLAMBDA([[1], [0], [3], [4], [5]])), "#VALUE!", /1 zero/);
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [-2], [3], [4], [5]], 2)), "#VALUE!", /1 negative value/);
    // …and allowed without a transform
    const ok = await FW.FAN([[1], [-2], [3], [4], [5]], 2, "naive", "none");
    expect(ok[0][2]).toBe(5);
  });
  test("λ outside [-5, 5] or not a number", async () => {
    expectCellError(outcome(() => FW.BOXCOX([[2]], 9)), "#VALUE!", /between -5 and 5/);
    expectCellError(outcome(() => FW.BTMEAN([[2]], [[0.1]], "zero" as never)), "#VALUE!", /lambda must be a number/);
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [2], [3], [4]], 2, "naive", "loggy")), "#VALUE!", /Unknown lambda "loggy"/);
    expect((await FW.FAN([[1], [2], [3], [4], [5], [6]], 2, "naive", "AUTO"))[0][0]).toBe(1);
  });
  test("level not in (0, 100), p not in (0, 1), σ ≤ 0", async () => {
    expectCellError(outcome(() => FW.MEANFROMINTERVAL([[100]], [[80]], [[120]], 0)), "#VALUE!", /between 0 and 100/);
    expectCellError(await outcomeAsync(() => FW.TOTAL([[1], [2], [3], [4]], 2, "naive", 0, 100)), "#VALUE!", /between 0 and 100/);
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [2], [3], [4]], 2, "naive", 0, [["80;100"]])), "#VALUE!", /between 0 and 100/);
    expectCellError(outcome(() => FW.BTQUANTILE([[1]], [[0.1]], 0, [[1.5]])), "#VALUE!", /between 0 and 1/);
    expectCellError(await outcomeAsync(() => FW.QUANTILES([[1], [2], [3], [4]], 2, [[0]], "naive", 0)), "#VALUE!", /between 0 and 1/);
    expectCellError(outcome(() => FW.BTMEAN([[1]], [[0]], 0)), "#VALUE!", /greater than 0/);
    expectCellError(outcome(() => FW.BTMEAN([[1]], [[-1]], 0)), "#VALUE!", /greater than 0/);
  });
  test("mismatched range sizes", () => {
    expectCellError(outcome(() => FW.MEANFROMINTERVAL([[100], [110]], [[80]], [[120], [130], [140]], 80)), "#VALUE!", /same size/);
    expectCellError(outcome(() => FW.BTQUANTILE([[1], [2]], [[0.1], [0.1], [0.1]], 0, [[0.5]])), "#VALUE!", /same size as mu/);
  });
  test("NaN and Infinity in the input", () => {
    expectCellError(outcome(() => FW.FITLAMBDA([[1], [NaN], [3]])), "#VALUE!", /not a finite number/);
    expectCellError(outcome(() => FW.BOXCOX([[Infinity]], 0)), "#VALUE!", /not a finite number/);
  });
  test("1e308 and 1e-308 give numbers or clear errors, never NaN or Infinity", async () => {
    const big = [[1e308], [5e307], [8e307], [2e307], [9e307], [3e307]];
    noNaN(FW.FITLAMBDA(big, "mle"));
    noNaN(FW.BOXCOX(big, 2));
    expectCellError(FW.BOXCOX(big, 2), "#NUM!", /too large to represent/);
    noNaN(await FW.FAN(big, 3, "naive", 0));
    const tiny = [[1e-308], [5e-308], [8e-308], [2e-308], [9e-308], [3e-308]];
    noNaN(FW.FITLAMBDA(tiny, "mle"));
    noNaN(await FW.FAN(tiny, 3, "naive", 0));
  });
  test("a range with only a header", async () => {
    expectCellError(await outcomeAsync(() => FW.FAN([["Harbour Street"]], 3)), "#VALUE!", /only a header/);
  });
  test("horizon as text, levels as text that is not numbers, a misspelt method", async () => {
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [2], [3]], "12" as never)), "#VALUE!", /horizon must be a number; got the text "12"/);
    expectCellError(await outcomeAsync(() => FW.FAN([[1], [2], [3], [4]], 2, "naive", 0, [["abc"]])), "#VALUE!", /"abc" is not a number/);
    expectCellError(await outcomeAsync(() => FW.TOTAL([[1], [2], [3], [4]], 2, "Holt Winters")), "#VALUE!", /Unknown method "Holt Winters". Use one of/);
    const ok = await FW.FAN([[1], [2], [3], [4], [5], [6]], 2, "naive", 0, [["80;95"]]);
    expect(ok[0]).toHaveLength(1 + 2 + 4);
  });
  test("optional arguments omitted as null get their defaults", async () => {
    const a = await FW.FAN([[1], [2], [3], [4], [5], [6]], 2, N, N, N, N, N);
    const b = await FW.FAN([[1], [2], [3], [4], [5], [6]], 2, "auto", "auto", [["80,95"]], 1, false);
    expect(a).toEqual(b);
  });
});

test("every thrown error is a CustomFunctions.Error with a message (never a bare exception)", async () => {
  const calls: (() => unknown)[] = [
    () => FW.BOXCOX("x" as never, 0), () => FW.FITLAMBDA(42 as never), () => FW.SCREEN(undefined as never),
    () => FW.FAN(null as never, 1), () => FW.MODELINFO({} as never), () => FW.IMPLIEDLAMBDA([[1]], [[2]], [[3]]),
  ];
  for (const c of calls) {
    const r = await outcomeAsync(async () => c());
    const e = firstError(r) ?? (r instanceof ShimError ? r : null);
    if (e) {
      expect(e).toBeInstanceOf(ShimError);
      expect(e.message.length).toBeGreaterThan(0);
    } else {
      expect(Array.isArray(r)).toBe(true);
    }
    expect(isCellError(r, undefined) || Array.isArray(r)).toBe(true);
  }
});
