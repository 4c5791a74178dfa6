// Forecasts on Yeo-Johnson and shifted Box-Cox scales (issue 11 §5 and §7), back on the original
// scale. References: scipy 1.10.1 stats.yeojohnson with brentq inverses and a numpy Monte Carlo
// (test/fixtures/transform/make_yeojohnson.py, on an INVENTED series with zeros and a credit month).
import * as fs from "fs";
import * as path from "path";
import { autoShift, fanTable, fitForecast, quantileTable, totalForecast, transformForward, makeTransform } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ref: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "transform", "yeojohnson.json"), "utf8"));

describe("Yeo-Johnson forecasts (scipy 1.10.1 yeojohnson + brentq inverse; numpy Monte Carlo, 400,000 draws)", () => {
  for (const c of ref.cases) {
    const f = fitForecast(ref.values, { method: "naive", transform: "yeo-johnson", lambda: c.lambda });
    test(`λ = ${c.lambda}: the transformed series equals scipy's`, () => {
      ref.values.forEach((y: number, i: number) => expectClose(transformForward(f.transform, y), c.w[i], { rtol: 1e-12, atol: 1e-12 }, `w[${i}]`));
      expectClose((f.model?.sigma as number) ** 2, c.sigma2, { rtol: 1e-12 }, "σ²");
    });
    test(`λ = ${c.lambda}: quantiles equal scipy's inverse, the default (exact) mean lies within 4 s.e. of the Monte Carlo`, () => {
      const probs = Object.keys(c.steps[0].quantiles).map(Number);
      const q = quantileTable(f, c.steps.length, probs);
      const fan = fanTable(f, c.steps.length);
      c.steps.forEach((s: { h: number; quantiles: Record<string, number>; mc_mean: number; mc_se: number }, i: number) => {
        probs.forEach((p, j) => expectClose(q[i][j].value as number, s.quantiles[String(p)], { rtol: 1e-9, atol: 1e-9 }, `h${s.h} q${p}`));
        const m = fan.rows[i].meanDetail;
        expect(m.used).toBe("exact");
        expect(Math.abs((m.value as number) - s.mc_mean)).toBeLessThanOrEqual(4 * s.mc_se);
      });
    });
  }
  test("the total's mean is the sum of the step means and agrees with the engine's simulated total (4 s.e.)", () => {
    const f = fitForecast(ref.values, { method: "naive", transform: "yeo-johnson", lambda: 0.5 });
    const t = totalForecast(f, 6, { paths: 100000, seed: 3 });
    const sum = fanTable(f, 6).rows.reduce((a, r) => a + (r.mean.value as number), 0);
    expectClose(t.mean.value as number, sum, { rtol: 1e-12 }, "total mean");
    expect(Math.abs((t.mean.value as number) - (t.simulatedMean as number))).toBeLessThanOrEqual(4 * (t.monteCarloError as number));
  });
  test("λ chosen for the transform in use: auto's λ is a readable one, or the Yeo-Johnson likelihood's own maximum when it rejects them all, and says which", () => {
    const f = fitForecast(ref.values, { method: "naive", transform: "yeo-johnson" });
    expect(f.transform.kind).toBe("yeo-johnson");
    if ([1, 0.5, 1 / 3, 0, -0.5, -1].includes(f.lambda as number)) expect(f.notes.join(" ")).toMatch(/auto: λ chosen for naive/);
    else expect(f.notes.join(" ")).toMatch(/rejects every readable λ .* own maximum λ = /);
  });
});

describe("shifted Box-Cox: a shifted forecast is the unshifted forecast of the shifted series, minus the shift (Box & Cox 1964's two-parameter form; identity by definition)", () => {
  const air = dataset("AirPassengers");
  for (const [method, lambda, c] of [["naive", 0, 50], ["holt-winters", 0.5, 10], ["drift", -0.5, 3]] as [string, number, number][]) {
    test(`${method}, λ = ${lambda}, shift ${c}`, () => {
      const shifted = fitForecast(air, { method, lambda, period: 12, shift: c });
      const moved = fitForecast(air.map((v) => v + c), { method, lambda, period: 12 });
      const a = fanTable(shifted, 12);
      const b = fanTable(moved, 12);
      a.rows.forEach((r, i) => {
        expectClose(r.median.value as number, (b.rows[i].median.value as number) - c, { rtol: 1e-9 }, `median ${r.h}`);
        expectClose(r.mean.value as number, (b.rows[i].mean.value as number) - c, { rtol: 1e-9 }, `mean ${r.h}`);
        expectClose(r.intervals["95"][1].value as number, (b.rows[i].intervals["95"][1].value as number) - c, { rtol: 1e-9 }, `high ${r.h}`);
      });
      const ta = totalForecast(shifted, 12);
      const tb = totalForecast(moved, 12);
      expectClose(ta.mean.value as number, (tb.mean.value as number) - 12 * c, { rtol: 1e-9 }, "total mean");
      expectClose(ta.median, tb.median - 12 * c, { rtol: 1e-9 }, "total median");
    });
  }
  test("shift \"auto\" is small: half the smallest step above the minimum (zeros → half the smallest positive value)", () => {
    expect(autoShift([0, 120, 130, 0, 150])).toBe(60);
    expect(autoShift([3, 4, 5])).toBe(0);
    const f = fitForecast([120, 0, 130, 140, 150, 160, 155, 170], { method: "naive", lambda: 0, shift: "auto" });
    expect(f.transform).toEqual(makeTransform("box-cox", 0, 60));
    expect(f.notes.join(" ")).toMatch(/shift auto/);
  });
  test("a zero without a shift is refused, naming the arguments that work", () => {
    expect(() => fitForecast([120, 0, 130, 140, 150], { method: "naive" })).toThrow(/shift "auto".*transform "yeo-johnson"/);
  });
});
