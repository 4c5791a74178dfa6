// The total across series (issue 13 §3): three log-scale random walks generated with a known
// error correlation (seeded, our own generator): the mean is the sum of the series' means (each
// the lognormal mean exp(μ + σ²/2), a closed form), the residual correlation is recovered, and in
// repeated simulation the joint 95% interval covers the true future total about 95% of the time
// (binomial bounds), while the interval that ignores the correlation covers far less.
import { alignSeries, createRandom, EngineError, fitForecast, Forecaster, totalAcross, totalForecast } from "../../src/engine";
import { expectClose } from "../helpers/reference";

const RHO = 0.7;
const SIGMA = [0.05, 0.08, 0.04];
const START = [Math.log(50000), Math.log(30000), Math.log(20000)];
// Cholesky factor of the equicorrelation matrix with ρ = 0.7 (3×3), by hand
const L = (() => {
  const l11 = 1, l21 = RHO, l22 = Math.sqrt(1 - RHO * RHO), l31 = RHO;
  const l32 = (RHO - l31 * l21) / l22;
  const l33 = Math.sqrt(1 - l31 * l31 - l32 * l32);
  return [[l11, 0, 0], [l21, l22, 0], [l31, l32, l33]];
})();

/** Three correlated random walks on ln y: n history values and H future ones per series. */
function generate(seed: number, n: number, H: number): { history: number[][]; future: number[][] } {
  const rng = createRandom(seed);
  const w = START.slice();
  const paths: number[][] = [[], [], []];
  for (let t = 0; t < n + H; t++) {
    const z = [rng.normal(), rng.normal(), rng.normal()];
    for (let i = 0; i < 3; i++) {
      const e = L[i][0] * z[0] + L[i][1] * z[1] + L[i][2] * z[2];
      w[i] += SIGMA[i] * e;
      paths[i].push(Math.exp(w[i]));
    }
  }
  return { history: paths.map((p) => p.slice(0, n)), future: paths.map((p) => p.slice(n)) };
}

const fit = (history: number[][]): Forecaster[] => history.map((h, i) => fitForecast(h, { method: "naive", lambda: 0, label: `shop ${i + 1}` }));

describe("three log-scale random walks with error correlation 0.7 (seeded simulation)", () => {
  const { history } = generate(1, 72, 12);
  const fs = fit(history);
  const t = totalAcross(fs, 12, { level: 95 });

  test("the mean is the sum of the series' means, each Σ_h exp(w_T + hσ̂²/2) (lognormal mean of a random walk)", () => {
    const closed = fs.reduce((s, f) => {
      const s2 = (f.model?.sigma as number) ** 2;
      let m = 0;
      for (let h = 1; h <= 12; h++) m += f.lastValue * Math.exp((h * s2) / 2);
      return s + m;
    }, 0);
    expectClose(t.mean as number, closed, { rtol: 1e-12 }, "Σ lognormal means");
    const perSeries = fs.reduce((s, f) => s + (totalForecast(f, 12, { mean: "exact" }).mean.value as number), 0);
    expectClose(t.mean as number, perSeries, { rtol: 1e-12 }, "Σ FW.TOTAL means");
    expect(Math.abs((t.simulatedMean as number) - (t.mean as number))).toBeLessThan(4 * (t.monteCarloError as number));
  });

  test("the residual correlation is recovered (Pearson over the 71 common periods; sampling error about 0.06)", () => {
    expect(t.commonPeriods).toBe(71);
    expect(t.estimator).toMatch(/Pearson correlation of the series' transformed-scale one-step residuals over the 71 periods/);
    for (const [i, j] of [[0, 1], [0, 2], [1, 2]]) expect(Math.abs(t.correlation[i][j] - RHO)).toBeLessThan(0.2);
  });

  test("the joint interval is wider than the one assuming independence", () => {
    expect(t.interval[0]).toBeLessThan(t.independent.interval[0]);
    expect(t.interval[1] as number).toBeGreaterThan(t.independent.interval[1] as number);
  });

  test("a window from..horizon sums only those steps", () => {
    const w = totalAcross(fs, 12, { level: 95, from: 7 });
    const perSeries = fs.reduce((s, f) => s + (totalForecast(f, 12, { mean: "exact", from: 7 }).mean.value as number), 0);
    expectClose(w.mean as number, perSeries, { rtol: 1e-12 }, "Σ window means");
    expect(w.from).toBe(7);
  });
});

test("coverage in 200 repeated simulations: the joint 95% interval covers the true total within binomial bounds; independence under-covers", () => {
  const R = 200;
  let joint = 0;
  let indep = 0;
  for (let r = 0; r < R; r++) {
    const { history, future } = generate(1000 + r, 72, 12);
    const t = totalAcross(fit(history), 12, { level: 95, paths: 2000, seed: r + 1 });
    const truth = future.reduce((s, f) => s + f.reduce((a, b) => a + b, 0), 0);
    if (truth >= t.interval[0] && truth <= (t.interval[1] as number)) joint++;
    if (truth >= t.independent.interval[0] && truth <= (t.independent.interval[1] as number)) indep++;
  }
  // Binomial(200, 0.95) (scipy 1.10.1 scipy.stats.binom): P(X ≤ 177) = 1.9e-4, P(X ≤ 181) = 0.0058,
  // P(X = 200) = 3.5e-5. 178 leaves room for the estimation error in σ̂ (71 residuals per series).
  expect(joint).toBeGreaterThanOrEqual(178);
  expect(joint).toBeLessThanOrEqual(200);
  // with ρ = 0.7 the independent interval's sd is √(3/7.2) ≈ 0.65 of the truth's: coverage near 79%
  expect(indep).toBeLessThan(joint - 10);
  console.log(`coverage of 200 repetitions: joint ${joint}/200, independent ${indep}/200`);
});

describe("series of different lengths and bad input", () => {
  const { history } = generate(5, 40, 0);
  test("series ending at different periods are aligned on the latest common period, and the note says so", () => {
    const cols = history.map((h) => h.slice() as (number | null)[]);
    cols[1][38] = null;
    cols[1][39] = null; // shop 2 ends two periods early
    const a = alignSeries(cols, ["shop 1", "shop 2", "shop 3"]);
    expect(a.rows).toBe(38);
    expect(a.cut).toEqual(["shop 1", "shop 3"]);
    expect(a.note).toMatch(/shop 1, shop 3 have values after row 38, the latest period every series has; they are cut there/);
    const fs = a.columns.map((c, i) => fitForecast(c, { method: "naive", lambda: 0, label: `shop ${i + 1}` }));
    const t = totalAcross(fs, 6);
    expect(t.commonPeriods).toBe(37);
  });
  test("a later start only shortens the common history", () => {
    const cols = history.map((h) => h.slice() as (number | null)[]);
    for (let i = 0; i < 20; i++) cols[2][i] = null;
    const a = alignSeries(cols, ["shop 1", "shop 2", "shop 3"]);
    expect(a.note).toBeNull();
    const t = totalAcross(a.columns.map((c, i) => fitForecast(c, { method: "naive", lambda: 0, label: `shop ${i + 1}` })), 6);
    expect(t.commonPeriods).toBe(19);
  });
  test("series not aligned are refused with what to do", () => {
    const fs = [fitForecast(history[0], { method: "naive", lambda: 0, label: "A" }), fitForecast(history[1].slice(0, 30), { method: "naive", lambda: 0, label: "B" })];
    expect(() => totalAcross(fs, 6)).toThrow(/end at different periods .* align them on their latest common period first/);
  });
  test("a single series is refused with a clear message", () => {
    const f = fitForecast(history[0], { method: "naive", lambda: 0 });
    expect(() => totalAcross([f], 6)).toThrow(EngineError);
    expect(() => totalAcross([f], 6)).toThrow(/needs at least two series \(one per column\); got 1. For one series use the per-series total/);
  });
  test("fewer than 8 common periods", () => {
    const cols = history.map((h) => h.slice() as (number | null)[]);
    for (let i = 0; i < 33; i++) cols[2][i] = null; // 7 values: 6 residuals
    const fs = cols.map((c, i) => fitForecast(c, { method: "naive", lambda: 0, label: `shop ${i + 1}` }));
    expect(() => totalAcross(fs, 3)).toThrow(/share only 6 periods with one-step residuals; at least 8 are needed/);
  });
  test("a window whose from exceeds horizon", () => {
    const fs = fit(history);
    expect(() => totalAcross(fs, 6, { from: 7 })).toThrow(/from \(7\) is after horizon \(6\)/);
  });
});

describe("ARIMA series are simulated jointly too (arima:0,1,0 is the random walk the data follow)", () => {
  const fitArima = (history: number[][]): Forecaster[] => history.map((h, i) => fitForecast(h, { method: "arima:0,1,0", lambda: 0, label: `shop ${i + 1}` }));
  test("the mean is the sum of the per-series exact means and the residual correlation is recovered", () => {
    const fs = fitArima(generate(1, 72, 12).history);
    const t = totalAcross(fs, 12, { level: 95 });
    const perSeries = fs.reduce((s, f) => s + (totalForecast(f, 12, { mean: "exact" }).mean.value as number), 0);
    expectClose(t.mean as number, perSeries, { rtol: 1e-12 }, "Σ FW.TOTAL means");
    expect(Math.abs((t.simulatedMean as number) - (t.mean as number))).toBeLessThan(4 * (t.monteCarloError as number));
    for (const [i, j] of [[0, 1], [0, 2], [1, 2]]) expect(Math.abs(t.correlation[i][j] - RHO)).toBeLessThan(0.2);
    expect(t.interval[1] as number).toBeGreaterThan(t.independent.interval[1] as number);
  });
  test("coverage in 100 repeated simulations: the joint 95% interval covers the true total within binomial bounds", () => {
    let joint = 0;
    for (let r = 0; r < 100; r++) {
      const { history, future } = generate(5000 + r, 72, 12);
      const t = totalAcross(fitArima(history), 12, { level: 95, paths: 2000, seed: r + 1 });
      const truth = future.reduce((s, f) => s + f.reduce((a, b) => a + b, 0), 0);
      if (truth >= t.interval[0] && truth <= (t.interval[1] as number)) joint++;
    }
    // Binomial(100, 0.95) (scipy 1.17.1 scipy.stats.binom): P(X ≤ 88) = 0.0043, P(X = 100) = 0.0059
    expect(joint).toBeGreaterThanOrEqual(89);
    console.log(`ARIMA coverage of 100 repetitions: joint ${joint}/100`);
  });
});
