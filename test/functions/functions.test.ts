// The first FW cell functions, called with the argument shapes Excel passes (2-D arrays, null
import "../helpers/custom-functions-shim";
// for omitted optional arguments), checked against the engine and the scipy/statsmodels fixtures.
import { isCellError, ShimError } from "../helpers/custom-functions-shim";
import * as FW from "../../src/functions/functions";
import { check, dataset, expectClose } from "../helpers/reference";

function column(xs: (number | string | null)[]): (number | string | null)[][] {
  return xs.map((x) => [x]);
}

function thrown(f: () => unknown): ShimError {
  try {
    f();
  } catch (e) {
    return e as ShimError;
  }
  throw new Error("expected a thrown cell error");
}

describe("FW.BOXCOX / FW.BOXCOXINV", () => {
  test("transform a range element by element; blanks stay blank (source: scipy.special.boxcox grid)", () => {
    const grid = check("boxcox.forward_inverse.grid").expected.filter((e: { lmbda: number }) => e.lmbda === 0.5);
    const out = FW.BOXCOX(column(grid.map((e: { x: number }) => e.x)), 0.5, null as unknown as number);
    grid.forEach((e: { boxcox_mpmath: number }, i: number) => expectClose(out[i][0] as number, e.boxcox_mpmath, { rtol: 1e-14 }, `row ${i}`));
    expect(FW.BOXCOX([[1, null]], 0, null as unknown as number)[0][1]).toBe("");
  });
  test("a zero gives #VALUE! in its own cell with the fix; text gives #VALUE!", () => {
    const out = FW.BOXCOX([[2], [0], ["x"]], 0, null as unknown as number);
    expect(out[0][0]).toBeCloseTo(Math.log(2), 15);
    expect(isCellError(out[1][0], "#VALUE!", /values > 0/)).toBe(true);
    expect(isCellError(out[2][0], "#VALUE!", /not a number/)).toBe(true);
  });
  test("the inverse past the floor is #N/A with the reason (a message Excel shows), never NaN", () => {
    const out = FW.BOXCOXINV([[-3]], 0.5, null as unknown as number);
    expect(isCellError(out[0][0], "#N/A", /floor/)).toBe(true);
  });
  test("λ as text is refused for the whole call", () => {
    expect(isCellError(thrown(() => FW.BOXCOX([[1]], "auto" as unknown as number)), "#VALUE!", /lambda must be a number/)).toBe(true);
  });
  test("a shift makes zeros usable and the inverse undoes it", () => {
    const w = FW.BOXCOX([[0], [4]], 0.5, 1);
    const back = FW.BOXCOXINV(w as number[][], 0.5, 1);
    expect(back[0][0]).toBeCloseTo(0, 12);
    expect(back[1][0]).toBeCloseTo(4, 12);
  });
});

describe("FW.FITLAMBDA", () => {
  test("one row per series: λ, interval, readable λ (source: scipy boxcox_normmax / statsmodels Guerrero)", () => {
    const air = dataset("AirPassengers");
    const range = [["Air"], ...air.map((v) => [v])];
    const [row] = FW.FITLAMBDA(range, "mle", null as unknown as number, null as unknown as number, null as unknown as number);
    const ref = check("lambda.mle.AirPassengers").expected;
    expectClose(row[0] as number, ref.lambda_boxcox_normmax, { atol: 1e-6 }, "lambda");
    expectClose(row[1] as number, ref.ci95[0], { atol: 1e-6 }, "low");
    expectClose(row[2] as number, ref.ci95[1], { atol: 1e-6 }, "high");
    expect(row[3]).toBe(0);
    const [g] = FW.FITLAMBDA(range, "GUERRERO", 12, null as unknown as number, null as unknown as number);
    expectClose(g[0] as number, check("lambda.guerrero.AirPassengers").expected.window12_sd.lambda_tight, { atol: 1e-6 }, "guerrero");
    // Guerrero has no likelihood: no interval belongs to its λ (issue 12 §2)
    expect(isCellError(g[1], "#N/A", /no likelihood/)).toBe(true);
  });
  test("the default (auto) λ is exactly the λ FW.FAN with lambda \"auto\" uses, inside its interval (issue 12 §2)", async () => {
    const air = dataset("AirPassengers");
    const range = [["Air"], ...air.map((v) => [v])];
    const [row] = FW.FITLAMBDA(range, null as unknown as string, 12, null as unknown as number, null as unknown as number);
    const info = new Map((await FW.MODELINFO(range, null as unknown as string, null, 12)).map((r) => [r[0], r[1]]));
    expect(row[0]).toBe(info.get("lambda"));
    expect(row[1] as number).toBeLessThanOrEqual(row[0] as number);
    expect(row[2] as number).toBeGreaterThanOrEqual(row[0] as number);
  });
  test("a series with a zero gets its message in its own row; the others still compute", () => {
    const out = FW.FITLAMBDA([["A", "B"], [1, 0], [2, 3], [4, 5], [3, 6], [5, 7], [6, 9]], "mle", null as unknown as number, null as unknown as number, null as unknown as number);
    expect(typeof out[0][0]).toBe("number");
    expect(isCellError(out[1][0], "#VALUE!", /B has 1 zero/)).toBe(true);
  });
  test("a misspelt method lists the valid ones", () => {
    expect(isCellError(thrown(() => FW.FITLAMBDA([[1], [2], [3], [4]], "gurero")), "#VALUE!", /"auto", "model", "guerrero", "mle"/)).toBe(true);
  });
  test("a range with only a header is refused", () => {
    expect(isCellError(thrown(() => FW.FITLAMBDA([["Shop"]], null as unknown as string)), "#VALUE!", /only a header/)).toBe(true);
    expect(isCellError(thrown(() => FW.FITLAMBDA([["Shop", "Other"]], null as unknown as string)), "#VALUE!", /only a header/)).toBe(true);
    const blankBody = FW.FITLAMBDA([["Shop", "Other"], [null, null]], null as unknown as string);
    expect(isCellError(blankBody[0][0], "#VALUE!", /Shop has no numbers/)).toBe(true);
  });
});

describe("FW.SCREEN", () => {
  test("one row per series with the documented columns", () => {
    const out = FW.SCREEN([["Old Quay"], [120], [0], [130], [140], [150]], null as unknown as number);
    expect(out[0].slice(0, 7)).toEqual([5, 0, 0, 0, 1, false, ""]);
    expect(out[0][7]).toMatch(/Not Box-Cox ready/);
  });
});

describe("FW.BTMEAN / FW.BTQUANTILE (source: scipy 1.10.1 backtransform.grid)", () => {
  const e = check("backtransform.grid").expected.find((x: { lmbda: number; mu: number; sigma: number }) => x.lmbda === 0 && x.mu === 2 && x.sigma === 1);
  test("exact by default where it exists (λ ≥ 0; issue 12 §1), Taylor on request, Taylor by default for λ < 0", () => {
    expectClose(FW.BTMEAN([[2]], [[1]], 0, null as unknown as string)[0][0] as number, e.mean_exact_quad, { rtol: 1e-9 }, "default (auto)");
    expectClose(FW.BTMEAN([[2]], [[1]], 0, "taylor")[0][0] as number, e.mean_taylor, { rtol: 1e-12 }, "taylor");
    expectClose(FW.BTMEAN([[2]], [[1]], 0, "exact")[0][0] as number, e.mean_exact_quad, { rtol: 1e-9 }, "exact");
    expect(FW.BTMEAN([[1]], [[0.1]], -0.3, null as unknown as string)[0][0]).toBeCloseTo(FW.BTMEAN([[1]], [[0.1]], -0.3, "taylor")[0][0] as number, 12);
  });
  test("the exact mean for λ < 0 is #N/A with the reason", () => {
    expect(isCellError(FW.BTMEAN([[1]], [[0.1]], -0.3, "exact")[0][0], "#N/A", /does not exist/)).toBe(true);
  });
  test("quantiles: one row per mu, one column per p", () => {
    const out = FW.BTQUANTILE([[2], [2]], [[1]], 0, [[0.025, 0.975]]);
    expect(out.length).toBe(2);
    expectClose(out[1][0] as number, e.quantiles["0.025"], { rtol: 1e-12 }, "q0.025");
    expectClose(out[1][1] as number, e.quantiles["0.975"], { rtol: 1e-12 }, "q0.975");
  });
  test("p of 0 or 1 is #VALUE! in that cell", () => {
    const out = FW.BTQUANTILE([[2]], [[1]], 0, [[0, 0.5, 1]]);
    expect(isCellError(out[0][0], "#VALUE!", /between 0 and 1/)).toBe(true);
    expect(out[0][1]).toBeCloseTo(Math.exp(2), 12);
    expect(isCellError(out[0][2], "#VALUE!")).toBe(true);
  });
  test("mismatched range sizes are refused", () => {
    expect(isCellError(thrown(() => FW.BTMEAN([[1], [2]], [[0.1], [0.2], [0.3]], 0)), "#VALUE!", /same size/)).toBe(true);
  });
});

describe("FW.MEANFROMINTERVAL / FW.IMPLIEDLAMBDA", () => {
  test("a log-scale median and 95% interval give the lognormal mean", () => {
    const z = 1.959963984540054;
    const m = Math.exp(5), lo = Math.exp(5 - z * 0.2), hi = Math.exp(5 + z * 0.2);
    expectClose(FW.MEANFROMINTERVAL([[m]], [[lo]], [[hi]], 95, null as unknown as number, "exact")[0][0] as number, Math.exp(5 + 0.02), { rtol: 1e-12 }, "mean");
    expectClose(FW.IMPLIEDLAMBDA([[m]], [[lo]], [[hi]])[0][0] as number, 0, { atol: 1e-12 }, "lambda");
  });
  test("a level of 100 is refused", () => {
    expect(isCellError(thrown(() => FW.MEANFROMINTERVAL([[100]], [[80]], [[120]], 100)), "#VALUE!", /between 0 and 100/)).toBe(true);
  });
});
