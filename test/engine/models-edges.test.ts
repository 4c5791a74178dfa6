// Edges of the model layer that the mutation run (MUTATION.md §2) found unguarded. Expected values
// come from closed forms (the lognormal mean; the shift rule stated in the README) computed here.
import { describeForecaster, fitForecast } from "../../src/engine";

describe("the model description's mean rows (the lognormal closed forms)", () => {
  test("log scale: 'Taylor vs exact mean at step 1' is 100·((1 + σ²/2)/e^{σ²/2} − 1)", () => {
    // INVENTED monthly revenue of a shop (positive, mild growth).
    const y = Array.from({ length: 36 }, (_, i) => 500 * Math.exp(0.01 * i + 0.08 * Math.sin(1.3 * i)));
    const f = fitForecast(y, { method: "naive", lambda: 0 });
    const s2 = (f.model?.sigma as number) ** 2;
    const rows = describeForecaster(f);
    const row = rows.find((r) => r[0] === "Taylor vs exact mean at step 1 (%)");
    expect(row).toBeDefined();
    expect(row?.[1] as number).toBeCloseTo(100 * ((1 + s2 / 2) / Math.exp(s2 / 2) - 1), 9);
  });
});

describe("messages for values Box-Cox cannot take, and for λ out of range", () => {
  test("zeros and negatives are counted, the first is named with its row, and shift auto's amount is given", () => {
    // shift auto = −minimum + half the smallest step above it: −(−5) + (−3 − (−5))/2 = 6 (README, shift).
    const y = [120, -3, 130, 0, 140, 150, -5, 160, 170, 165];
    expect(() => fitForecast(y, { method: "naive", lambda: 0 })).toThrow(/has 1 zero and 2 negative values \(first: -3 in row 2\).*adds 6/);
  });
  test("λ outside −5…5 is refused with the range", () => {
    expect(() => fitForecast([1, 2, 3, 4, 5, 6], { method: "naive", lambda: 7 })).toThrow(/lambda must be between -5 and 5/);
  });
});
