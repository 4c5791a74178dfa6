// The rolling-origin backtest (Tashman 2000) recomputed origin by origin in the test: at every
// origin t the model is refitted on y[0..t) and its fan gives the interval; the interval score is
// written out here from its definition (Winkler 1972; Gneiting & Raftery 2007, eq. 43) with
// α = 1 − level/100, coverage counts an actual on an interval end as inside (a closed interval,
// as the README's audit promises), and the errors are actual − forecast.
import { backtest, fanTable, fitForecast } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

/** Winkler's interval score of the central (1 − α) interval [l, u] for the outcome y. */
function winkler(l: number, u: number, y: number, alpha: number): number {
  return u - l + (y < l ? (2 / alpha) * (l - y) : 0) + (y > u ? (2 / alpha) * (y - u) : 0);
}

describe("backtest rows equal a per-origin recomputation (Tashman 2000; Winkler 1972 / Gneiting & Raftery 2007 eq. 43)", () => {
  const cases = [
    { data: "airmiles", method: "drift", lambda: 0, level: 70, first: 10, H: 3, period: 1 },
    { data: "AirPassengers", method: "seasonal-naive", lambda: 0.5, level: 80, first: 120, H: 4, period: 12 },
    { data: "nile", method: "ses", lambda: "none", level: 60, first: 80, H: 2, period: 1 },
    { data: "lynx", method: "ses", lambda: 0, level: 90, first: 90, H: 3, period: 1 },
  ] as const;
  // Each case has misses at every step (else the score would not depend on α at all), and no
  // level is 50% (where α = 1 − level/100 and α = level/100 coincide).
  for (const c of cases) {
    test(`${c.data}, ${c.method}, λ = ${c.lambda}, ${c.level}% intervals, first = ${c.first}, H = ${c.H}`, () => {
      const y = dataset(c.data);
      const alpha = 1 - c.level / 100;
      const acc = Array.from({ length: c.H }, () => ({ n: 0, inside: 0, is: 0, emed: 0, amed: 0 }));
      for (let t = c.first; t < y.length; t++) {
        const steps = Math.min(c.H, y.length - t);
        const fan = fanTable(fitForecast(y.slice(0, t), { method: c.method, lambda: c.lambda, period: c.period }), steps, { levels: [c.level] });
        fan.rows.forEach((r, j) => {
          const [lo, hi] = r.intervals[String(c.level)].map((x) => x.value as number);
          const actual = y[t + j];
          const a = acc[j];
          a.n++;
          if (lo <= actual && actual <= hi) a.inside++;
          a.is += winkler(lo, hi, actual, alpha);
          a.emed += actual - (r.median.value as number);
          a.amed += Math.abs(actual - (r.median.value as number));
        });
      }
      const bt = backtest(y, c.H, { method: c.method, lambda: c.lambda, period: c.period, level: c.level, first: c.first });
      expect(bt.failures).toBe(0);
      expect(bt.rows).toHaveLength(c.H);
      bt.rows.forEach((row, j) => {
        const a = acc[j];
        expect(a.inside).toBeLessThan(a.n);
        expect(row.origins).toBe(a.n);
        expect(row.origins).toBe(y.length - c.first - j);
        expectClose(row.coverage as number, a.inside / a.n, { rtol: 1e-12 }, `coverage h=${j + 1}`);
        expectClose(row.intervalScore as number, a.is / a.n, { rtol: 1e-10 }, `interval score h=${j + 1}`);
        expectClose(row.meanErrorOfMedian as number, a.emed / a.n, { rtol: 1e-9, atol: 1e-9 }, `mean error of the median h=${j + 1}`);
        expectClose(row.maeOfMedian as number, a.amed / a.n, { rtol: 1e-10 }, `MAE of the median h=${j + 1}`);
      });
    });
  }
  test("the interval score grows with the level's α as the definition says: a miss costs 2/α times its distance", () => {
    // One origin, one step, an actual far below the interval: the score is (u − l) + (2/α)(l − y).
    const y = [100, 101, 99, 100, 102, 100, 101, 99, 100, 60];
    const fan = fanTable(fitForecast(y.slice(0, 9), { method: "mean", lambda: "none" }), 1, { levels: [90] });
    const [lo, hi] = fan.rows[0].intervals["90"].map((x) => x.value as number);
    const row = backtest(y, 1, { method: "mean", lambda: "none", level: 90, first: 9 }).rows[0];
    expect(row.coverage).toBe(0);
    expectClose(row.intervalScore as number, hi - lo + (2 / 0.1) * (lo - 60), { rtol: 1e-12 }, "score of one miss");
  });
});
