// Edges of the transform specification that the mutation run (MUTATION.md §2) found unguarded. Each
// expectation is computed in the test from an independent route: the inverse transform itself
// (Box & Cox 1964; Yeo & Johnson 2000), central finite differences for its second derivative, and
// standard normal table values.
import {
  createRandom, describeTransform, fitLambda, parseShift, inverseSecondDerivative, makeTransform, normalCdf, poleProbability, transformInverse, yeoJohnsonInverse,
} from "../../src/engine";
import { dataset } from "../helpers/reference";
import type { TransformSpec } from "../../src/engine";
import { checkLambdaBounds } from "../../src/engine/transform/bounds";

/** f(w) from the inverse transform, for finite differences. */
function inv(t: TransformSpec, w: number): number {
  const r = transformInverse(t, w);
  if (r.status !== "ok") throw new Error(`inverse not ok at ${w}`);
  return r.value;
}

describe("the Taylor mean's f″(w) equals the inverse's central second difference (f(w+h) − 2f(w) + f(w−h))/h²", () => {
  const cases: Array<[string, TransformSpec, number[]]> = [
    ["Box-Cox λ = 0", makeTransform("box-cox", 0), [-1, 0, 2]],
    ["Box-Cox λ = 0.5", makeTransform("box-cox", 0.5), [-1, 0.3, 4]],
    ["Box-Cox λ = −0.5", makeTransform("box-cox", -0.5), [-1, 0.5, 1.5]],
    ["Box-Cox λ = 1.5, shift 2", makeTransform("box-cox", 1.5, 2), [0, 1]],
    ["Yeo-Johnson λ = 0.5 (both branches)", makeTransform("yeo-johnson", 0.5), [-2, -0.4, 0.4, 2]],
    ["Yeo-Johnson λ = 2 (log branch below 0)", makeTransform("yeo-johnson", 2), [-1.5, -0.2, 0.7]],
    ["Yeo-Johnson λ = 3 (negative branch with a pole)", makeTransform("yeo-johnson", 3), [-0.5, -0.1]],
  ];
  for (const [name, t, ws] of cases) {
    test(name, () => {
      for (const w of ws) {
        const h = 1e-4;
        const fd = (inv(t, w + h) - 2 * inv(t, w) + inv(t, w - h)) / (h * h);
        const d2 = inverseSecondDerivative(t, w);
        expect(Math.abs(d2 - fd)).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(fd)));
      }
    });
  }
  test("no transform: f″ = 0; outside the domain: not a number (the callers turn it into a note)", () => {
    expect(inverseSecondDerivative(makeTransform("none", null), 5)).toBe(0);
    expect(Number.isNaN(inverseSecondDerivative(makeTransform("box-cox", 0.5), -3))).toBe(true); // 1 + λw < 0
    expect(Number.isNaN(inverseSecondDerivative(makeTransform("yeo-johnson", 3), -2))).toBe(true); // past the pole at −1
  });
});

describe("the share of the normal past a pole, against where the inverse itself stops", () => {
  test("Box-Cox λ ≥ 0 and no transform have no pole: 0", () => {
    expect(poleProbability(makeTransform("box-cox", 0.5), 5, 1)).toBe(0);
    expect(poleProbability(makeTransform("box-cox", 0), 5, 1)).toBe(0);
    expect(poleProbability(makeTransform("yeo-johnson", 1), 0, 3)).toBe(0);
  });
  test("Box-Cox λ = −1: the pole at w = 1; P(w > 1) for N(0.5, 0.25²) is P(z > 2) = 0.02275 (normal table)", () => {
    expect(transformInverse(makeTransform("box-cox", -1), 0.999).status).toBe("ok");
    expect(transformInverse(makeTransform("box-cox", -1), 1.001).status).toBe("pole");
    expect(poleProbability(makeTransform("box-cox", -1), 0.5, 0.25)).toBeCloseTo(1 - normalCdf(2), 14);
  });
  test("Yeo-Johnson λ = 3: the pole is at w = −1/(λ − 2) = −1 (where the inverse stops), so N(0, 1) puts Φ(−1) = 0.1587 past it", () => {
    const t = makeTransform("yeo-johnson", 3);
    expect(transformInverse(t, -0.999).status).toBe("ok");
    expect(transformInverse(t, -1.001).status).toBe("low-pole");
    expect(poleProbability(t, 0, 1)).toBeCloseTo(0.15865525393145707, 12); // scipy.stats.norm.cdf(-1)
    expect(poleProbability(t, 0.5, 0.25)).toBeCloseTo(normalCdf(-6), 14); // (−1 − 0.5)/0.25 = −6
  });
});

describe("inverse statuses, names and argument messages", () => {
  test("Box-Cox below the floor (λ > 0) gives the floor value −shift; past the pole (λ < 0) gives +∞", () => {
    expect(transformInverse(makeTransform("box-cox", 0.5, 3), -2.5)).toEqual({ value: -3, status: "floor" });
    expect(transformInverse(makeTransform("box-cox", -0.5), 2.5)).toEqual({ value: Infinity, status: "pole" });
  });
  test("each transform's short name", () => {
    expect(describeTransform(makeTransform("none", null))).toBe("no transform");
    expect(describeTransform(makeTransform("yeo-johnson", 1))).toBe("Yeo-Johnson λ = 1");
    expect(describeTransform(makeTransform("box-cox", 0, 1))).toBe("shifted Box-Cox λ = 0, shift 1");
    expect(describeTransform(makeTransform("box-cox", 0.5))).toBe("Box-Cox λ = 0.5");
  });
  test("a shift read from text: a number, auto, blank (0), anything else refused (never NaN)", () => {
    expect(parseShift("1.5")).toBe(1.5);
    expect(parseShift(" AUTO ")).toBe("auto");
    expect(parseShift("")).toBe(0);
    expect(() => parseShift("abc")).toThrow(/shift must be a number.*got "abc"/);
    expect(() => parseShift(Number.NaN)).toThrow(/shift must be a finite number/);
  });
  test("a shift with Yeo-Johnson is refused, saying shift is for Box-Cox", () => {
    expect(() => makeTransform("yeo-johnson", 1, 2)).toThrow(/shift applies to Box-Cox only/);
  });
  test("a bad λ bound is named as the lower or upper bound; a bad period for λ is refused", () => {
    expect(() => checkLambdaBounds(Number.NaN, 1)).toThrow(/lower bound for λ/);
    expect(() => checkLambdaBounds(-1, Number.NaN)).toThrow(/upper bound for λ/);
    const y = Array.from({ length: 48 }, (_, i) => 100 + i + 10 * Math.sin(i));
    expect(() => fitLambda(y, { period: 0 })).toThrow(/period must be a whole number of at least 1/);
    expect(() => fitLambda(y, { period: 2.5 })).toThrow(/period must be a whole number of at least 1/);
  });
});

describe("seed-21 mutation sample: the inverse with no transform, Yeo-Johnson's negative side, Guerrero's note", () => {
  test("no transform: the inverse is the value itself; ±∞ are the poles", () => {
    expect(transformInverse(makeTransform("none", null), 7.5)).toEqual({ value: 7.5, status: "ok" });
    expect(transformInverse(makeTransform("none", null), -2)).toEqual({ value: -2, status: "ok" });
    expect(transformInverse(makeTransform("none", null), Number.POSITIVE_INFINITY).status).toBe("pole");
  });
  test("Yeo-Johnson's inverse on the negative side returns scipy 1.10.1's inputs (stats.yeojohnson(y, lmbda))", () => {
    // scipy: yeojohnson(−3, 0.5) = −4.666666666666665; (−0.2, 3) = −0.16666666666666669; (−5, −1) = −71.66666666666669
    const cases: [number, number, number][] = [[-4.666666666666665, 0.5, -3], [-0.16666666666666669, 3, -0.2], [-71.66666666666669, -1, -5]];
    for (const [w, l, y] of cases) expect(Math.abs(yeoJohnsonInverse(w, l) - y)).toBeLessThan(1e-12 * Math.abs(y));
  });
  test("Guerrero's λ is flagged only when the i.i.d. likelihood interval leaves it out", () => {
    // AirPassengers (R datasets): Guerrero's λ −0.2947 is below the i.i.d. interval −0.238 … 0.534
    const air = fitLambda(dataset("AirPassengers"), { method: "guerrero", period: 12 });
    expect(air.lambda).toBeCloseTo(-0.29472, 4);
    expect(air.note).toMatch(/disagrees: its 95% interval, -0\.238 to 0\.534, leaves Guerrero's λ out/);
    // INVENTED: a seasonal log-normal series; Guerrero's λ (−0.09) sits inside the interval (−0.97 … 0.97)
    const r = createRandom(1);
    const y = Array.from({ length: 96 }, (_, i) => Math.exp(Math.log(200) + 0.005 * i + 0.1 * r.normal() + 0.15 * Math.sin((2 * Math.PI * i) / 12)));
    const g = fitLambda(y, { method: "guerrero", period: 12 });
    const m = fitLambda(y, { method: "mle" });
    expect(g.lambda).toBeGreaterThan(m.interval[0] as number);
    expect(g.lambda).toBeLessThan(m.interval[1] as number);
    expect(g.note).not.toMatch(/disagrees/);
  });
});
