// Seasonal ARIMA held to statsmodels 0.13.5 SARIMAX (test/fixtures/arima/arima.json, made by
// make_arima.py beside it): at statsmodels' parameters the engine's log-likelihood, forecast means
// and variances agree to 1e-8 relative; fitted from scratch its log-likelihood is at least
// statsmodels' − 1e-4. KPSS against statsmodels' kpss (nlags="legacy").
import * as fs from "fs";
import * as path from "path";
import { fitArima } from "../../src/engine/models/arima/fit";
import { parseArimaMethod, formatArimaOrder, ArimaOrder } from "../../src/engine/models/arima/order";
import { expandAr, pacfToAr, arToPacf, differencingPolynomial, expandMa, toUnit } from "../../src/engine/models/arima/polynomial";
import { ArmaLikelihood } from "../../src/engine/models/arima/likelihood";
import { armaSystem, armaFilter } from "../../src/engine/models/arima/kalman";
import { kpss, canovaHansen, VM_CRITICAL_5 } from "../../src/engine/models/arima/unit-root";
import { autoArima } from "../../src/engine/models/arima/auto";
import { createRandom } from "../../src/engine/_lib/random";
import { backtest } from "../../src/engine/audit/backtest";
import { dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;
const fixture: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/arima/arima.json"), "utf8"));

function series(c: Json): number[] {
  const raw = dataset(c.dataset);
  return c.transform === "log" ? raw.map(Math.log) : raw;
}

function orderOf(c: Json): ArimaOrder {
  const [p, d, q] = c.order;
  const [P, D, Q, m] = c.seasonal_order;
  return { p, d, q, P, D, Q, m: m || 1, constant: c.trend === "c" };
}

/** statsmodels' names → ours; its intercept c is the AR equation's constant, so μ = c / (1 − Σa). */
function paramsOf(c: Json, o: ArimaOrder): { phi: number[]; Phi: number[]; theta: number[]; Theta: number[]; mu: number; sigma2: number } {
  const q = c.params;
  const pick = (prefix: string, k: number, step: number): number[] => Array.from({ length: k }, (_, i) => q[`${prefix}${(i + 1) * step}`] ?? 0);
  const phi = pick("ar.L", o.p, 1);
  const theta = pick("ma.L", o.q, 1);
  const Phi = pick("ar.S.L", o.P, o.m);
  const Theta = pick("ma.S.L", o.Q, o.m);
  const a = expandAr(phi, Phi, o.m);
  const mu = o.constant ? q.intercept / (1 - a.reduce((s, v) => s + v, 0)) : 0;
  return { phi, Phi, theta, Theta, mu, sigma2: q.sigma2 };
}

describe("seasonal ARIMA at statsmodels SARIMAX's parameters", () => {
  for (const c of fixture.cases as Json[]) {
    test(`${c.id}: log-likelihood, forecast means and variances equal the joint normal's (scipy multivariate_normal / numpy, 1e-9)`, () => {
      const o = orderOf(c);
      const m = fitArima(series(c), o, paramsOf(c, o));
      expectClose(m.loglik, c.exact_llf, { rtol: 1e-9 }, `${c.id} log-likelihood`);
      const f = m.forecast(fixture.horizon);
      f.forEach((s, i) => {
        expectClose(s.mean, c.exact_forecast_mean[i], { rtol: 1e-9 }, `${c.id} mean h=${i + 1}`);
        expectClose(s.sd * s.sd, c.exact_forecast_var[i], { rtol: 1e-9 }, `${c.id} variance h=${i + 1}`);
      });
    });
    test(`${c.id}: agrees with statsmodels 0.13.5 SARIMAX (1e-5: its filter freezes the covariance once it judges it converged)`, () => {
      const o = orderOf(c);
      const m = fitArima(series(c), o, paramsOf(c, o));
      expectClose(m.loglik, c.llf, { rtol: 1e-5 }, `${c.id} log-likelihood`);
      m.forecast(fixture.horizon).forEach((s, i) => {
        expectClose(s.mean, c.forecast_mean[i], { rtol: 1e-5 }, `${c.id} mean h=${i + 1}`);
        expectClose(s.sd * s.sd, c.forecast_var[i], { rtol: 1e-5 }, `${c.id} variance h=${i + 1}`);
      });
    });
  }
});

describe("seasonal ARIMA fitted from scratch (statsmodels 0.13.5 SARIMAX as the yardstick)", () => {
  for (const c of fixture.cases as Json[]) {
    test(`${c.id}: log-likelihood at least statsmodels' − 1e-4`, () => {
      const o = orderOf(c);
      const m = fitArima(series(c), o);
      expect(m.loglik).toBeGreaterThanOrEqual(c.llf - 1e-4);
      expect(Number.isFinite(m.aicc)).toBe(true);
    });
  }
});

describe("ARIMA algebra (published identities)", () => {
  test("the Chandrasekhar recursions (Morf, Sidhu & Kailath 1974) give the full filter's likelihood and innovations", () => {
    const x = dataset("AirPassengers").map(Math.log);
    const dx = x.slice(13).map((v, t) => v - x[t + 12] - x[t + 1] + x[t]);
    for (const [ar, ma] of [[[0.5, 0.2], [-0.4]], [[], expandMa([-0.4], [-0.55], 12)], [expandAr([0.3], [0.6], 12), [0.2]]] as number[][][]) {
      const sys = armaSystem(ar, ma);
      for (const mu of ["none", "estimate"] as const) {
        const full = armaFilter(sys, dx, mu, true);
        const fast = armaFilter(sys, dx, mu, false);
        expectClose(fast.loglik, full.loglik, { rtol: 1e-12 }, "loglik");
        expectClose(fast.mu, full.mu, { rtol: 1e-10, atol: 1e-14 }, "mu");
        fast.F.forEach((f, t) => expectClose(f, full.F[t], { rtol: 1e-10 }, `F_${t}`));
      }
    }
  });
  // The optimiser's P₀ first row comes from the step-down/Levinson autocovariances, the full filter's
  // P₀ from the linear autocovariance system, so this also checks one against the other.
  test("the optimiser's likelihood (Chandrasekhar recursions, frozen once the covariance has converged) equals the full Kalman filter's (Harvey 1989) to 1e-10", () => {
    const air = dataset("AirPassengers").map(Math.log);
    const airDx = air.slice(13).map((v, t) => v - air[t + 12] - air[t + 1] + air[t]);
    const nile = dataset("nile");
    const cases: [number[], ArimaOrder, number[]][] = [
      [airDx, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false }, [-0.45, -0.7]],
      [airDx, { p: 2, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: true }, [0.3, -0.2, -0.4, -0.6]],
      [airDx, { p: 1, d: 1, q: 0, P: 1, D: 1, Q: 0, m: 12, constant: false }, [-0.3, -0.5]],
      [airDx, { p: 1, d: 1, q: 1, P: 2, D: 1, Q: 1, m: 12, constant: true }, [0.5, -0.4, 0.3, -0.8, -0.6]],
      [nile, { p: 1, d: 0, q: 1, P: 0, D: 0, Q: 0, m: 1, constant: true }, [1.2, -0.6]],
      [nile, { p: 2, d: 0, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true }, [0.4, 0.2]],
      [nile, { p: 0, d: 0, q: 2, P: 0, D: 0, Q: 0, m: 1, constant: false }, [0.9, 0.5]],
      // close to a unit MA root: the covariance converges slowly (Θ's pacf 0.995)
      [airDx, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false }, [-0.4, 9.95]],
    ];
    let froze = 0;
    for (const [x, o, u] of cases) {
      const r = u.map(toUnit);
      const phi = pacfToAr(r.slice(0, o.p));
      const Phi = pacfToAr(r.slice(o.p, o.p + o.P));
      const theta = pacfToAr(r.slice(o.p + o.P, o.p + o.P + o.q)).map((v) => -v);
      const Theta = pacfToAr(r.slice(o.p + o.P + o.q)).map((v) => -v);
      const full = armaFilter(armaSystem(expandAr(phi, Phi, o.m), expandMa(theta, Theta, o.m)), x, o.constant ? "estimate" : "none", true);
      const lik = new ArmaLikelihood(x, o);
      const fast = -lik.negLoglik(u);
      if (lik.steadyFrom >= 0) froze++;
      expectClose(fast, full.loglik, { rtol: 1e-10 }, `${formatArimaOrder(o)} frozen from ${lik.steadyFrom}`);
      lik.allowSteady = false;
      expectClose(-lik.negLoglik(u), full.loglik, { rtol: 1e-10 }, `${formatArimaOrder(o)} never frozen`);
    }
    expect(froze).toBeGreaterThanOrEqual(3); // the switch is exercised
  });
  test("pacfToAr and arToPacf are inverse (Barndorff-Nielsen & Schou 1973 recursion)", () => {
    const r = [0.7, -0.4, 0.25];
    const back = arToPacf(pacfToAr(r)) as number[];
    back.forEach((v, i) => expectClose(v, r[i], { atol: 1e-14 }, `r${i + 1}`));
    expect(arToPacf([1.2])).toBeNull();
  });
  test("the stationary state covariance equals the series Σ_k T^k RR′ T′^k summed directly (definition)", () => {
    const cases: [number[], number[]][] = [[[0.5, 0.2], [-0.4]], [expandAr([0.3], [0.6], 12), [0.2]], [expandAr([0.5, -0.3], [0.4], 4), expandMa([0.3], [-0.5], 4)], [[0.9], [0.5, 0.25]]];
    for (const [ar, ma] of cases) {
      const sys = armaSystem(ar, ma);
      const r = sys.r;
      // brute force: iterate P ← T P T′ + RR′ from 0 for many steps
      let P = new Float64Array(r * r);
      for (let it = 0; it < 4000; it++) {
        const next = new Float64Array(r * r);
        for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) {
          const ai = i < ar.length ? ar[i] : 0, aj = j < ar.length ? ar[j] : 0;
          next[i * r + j] = ai * aj * P[0] + ai * (j + 1 < r ? P[j + 1] : 0) + aj * (i + 1 < r ? P[(i + 1) * r] : 0) + (i + 1 < r && j + 1 < r ? P[(i + 1) * r + j + 1] : 0) + sys.R[i] * sys.R[j];
        }
        P = next;
      }
      for (let i = 0; i < r * r; i++) expectClose(sys.P0[i], P[i], { rtol: 1e-9, atol: 1e-12 }, `P0[${i}]`);
    }
  });
  test("AR(1) stationary variance is σ²/(1 − φ²) (textbook identity, common practice)", () => {
    expectClose(armaSystem([0.6], []).P0[0], 1 / (1 - 0.36), { rtol: 1e-13 });
  });
  test("MA(1) variance is σ²(1 + θ²) (common practice)", () => {
    expectClose(armaSystem([], [0.5]).P0[0], 1.25, { rtol: 1e-13 });
  });
  test("the airline model's MA side has the B^13 cross term θΘ (Box & Jenkins' seasonal model)", () => {
    const b = expandMa([-0.4], [-0.6], 12);
    expect(b.length).toBe(13);
    expectClose(b[0], -0.4, { atol: 0 });
    expectClose(b[11], -0.6, { atol: 0 });
    expectClose(b[12], 0.24, { atol: 1e-15 });
  });
  test("(1 − B)(1 − B^4) = 1 − B − B^4 + B^5", () => {
    expect(differencingPolynomial(1, 1, 4)).toEqual([1, -1, 0, 0, -1, 1]);
  });
  test("random walk (arima:0,1,0): variance grows as hσ² (METHODS §3 naive rule)", () => {
    const y = [5, 5.3, 5.1, 5.6, 5.4, 5.9, 6.2, 6.0, 6.4, 6.3, 6.8, 6.6, 7.1, 7.0];
    const m = fitArima(y, { p: 0, d: 1, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: false });
    const diffs = y.slice(1).map((v, i) => v - y[i]);
    const s2 = diffs.reduce((s, v) => s + v * v, 0) / diffs.length;
    const f = m.forecast(4);
    f.forEach((s, i) => {
      expectClose(s.mean, y[y.length - 1], { rtol: 1e-12 }, "mean");
      expectClose(s.sd * s.sd, (i + 1) * s2, { rtol: 1e-10 }, "variance");
    });
  });
});

describe("ARIMA simulation matches its analytic moments (Monte Carlo, 4 standard errors)", () => {
  test("airline model on log AirPassengers: per-step means and variances", () => {
    const w = dataset("AirPassengers").map(Math.log);
    const m = fitArima(w, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false });
    const H = 6, N = 20000;
    const paths = m.simulate(H, N, 11);
    const f = m.forecast(H);
    for (let h = 0; h < H; h++) {
      let s = 0, s2 = 0;
      for (let i = 0; i < N; i++) { const v = paths[i * H + h]; s += v; s2 += v * v; }
      const mean = s / N;
      const v = s2 / N - mean * mean;
      const sd = f[h].sd;
      expect(Math.abs(mean - f[h].mean)).toBeLessThan(4 * sd / Math.sqrt(N));
      // variance of a sample variance of normals: 2σ⁴/(N − 1)
      expect(Math.abs(v - sd * sd)).toBeLessThan(4 * sd * sd * Math.sqrt(2 / (N - 1)));
    }
  });
});

describe("ARIMA method names (the project's syntax)", () => {
  test("explicit orders, seasonal and with a constant", () => {
    expect(parseArimaMethod("arima:0,1,1/0,1,1", 12)).toEqual({ auto: false, order: { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false } });
    expect(parseArimaMethod("ARIMA:1,1,0+c", 1)).toEqual({ auto: false, order: { p: 1, d: 1, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true } });
    expect(parseArimaMethod("arima", 12)).toEqual({ auto: true });
    expect(formatArimaOrder({ p: 2, d: 0, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true })).toBe("arima:2,0,0+c");
  });
  test.each([
    ["arima:1,1", /three whole numbers/],
    ["arima:1.5,1,0", /whole number/],
    ["arima:-1,1,0", /whole number/],
    ["arima:0,1,1/0,1,1", /give the period/],
    ["arima:9,1,0", /at most 5/],
    ["arima:0,2,1+c", /quadratic trend/],
  ])("refuses %s with a message", (name, msg) => {
    expect(() => parseArimaMethod(name as string, 1)).toThrow(msg as RegExp);
  });
  test("orders too large for the series are refused with the numbers", () => {
    expect(() => fitArima([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], { p: 2, d: 1, q: 2, P: 0, D: 0, Q: 0, m: 1, constant: false })).toThrow(/needs at least \d+ values/);
  });
  test("a seasonal difference on a series too short after differencing is refused", () => {
    const y = Array.from({ length: 20 }, (_, i) => 10 + Math.sin(i) + i * 0.1);
    expect(() => fitArima(y, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false })).toThrow(/needs at least/);
  });
});

describe("unit-root tests", () => {
  test("KPSS statistic and lag count equal statsmodels 0.13.5 kpss (nlags='legacy' and the short l4)", () => {
    for (const k of fixture.kpss as Json[]) {
      let w = dataset(k.dataset);
      if (k.transform === "log") w = w.map(Math.log);
      if (k.diff) w = w.slice(1).map((v, i) => v - w[i]);
      const r = kpss(w, k.rule);
      expect(r.lags).toBe(k.lags);
      expectClose(r.stat, k.stat, { rtol: 1e-10 }, `${k.dataset} kpss`);
    }
  });
  test("VM(p) 5% critical values (from memory of the published tables) agree with a seeded simulation within 2%", () => {
    const vm: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/arima/vm.json"), "utf8"));
    VM_CRITICAL_5.forEach((v, i) => {
      expectClose(v, vm.q95[String(i + 1)], { rtol: 0.02 }, `VM(${i + 1})`);
    });
  });
  test("Canova–Hansen: a wandering seasonal pattern rejects, a fixed one does not (seeded simulation)", () => {
    const rng = createRandom(7);
    const n = 240, m = 12;
    const fixed: number[] = [], wandering: number[] = [];
    const pattern = Array.from({ length: m }, (_, j) => Math.sin((2 * Math.PI * j) / m));
    const walk = pattern.slice();
    for (let t = 0; t < n; t++) {
      fixed.push(10 + pattern[t % m] + 0.3 * rng.normal());
      walk[t % m] += 0.3 * rng.normal();
      wandering.push(10 + walk[t % m] + 0.1 * rng.normal());
    }
    expect(canovaHansen(fixed, m)?.reject5).toBe(false);
    expect(canovaHansen(wandering, m)?.reject5).toBe(true);
  });
});

describe("automatic ARIMA (stepwise search, Hyndman & Khandakar 2008)", () => {
  test("recovers an AR(1) with mean from a simulated series, or finds one with a lower AICc (seeded)", () => {
    const rng = createRandom(3);
    const y: number[] = [];
    let v = 0;
    for (let t = 0; t < 200; t++) { v = 0.7 * v + rng.normal(); y.push(50 + v); }
    const s = autoArima(y, 1);
    const truth = fitArima(y, { p: 1, d: 0, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true });
    expect(s.model.order.d).toBe(0);
    expect(s.model.aicc).toBeLessThanOrEqual(truth.aicc + 1e-9);
  });
  test("a random walk is differenced once by KPSS (seeded)", () => {
    const rng = createRandom(5);
    const y: number[] = [];
    let v = 100;
    for (let t = 0; t < 150; t++) { v += rng.normal(); y.push(v); }
    const s = autoArima(y, 1);
    expect(s.notes.join(" ")).toMatch(/KPSS after 0 differences: [0-9.]+ > 0.463/);
    expect(s.model.order.d).toBe(1);
  });
});

describe("ARIMA intervals in a rolling-origin backtest (seeded simulation; Tashman 2000)", () => {
  test("80% one-step intervals of arima:0,1,1 on simulated ARIMA(0,1,1) data cover about 80% (within 3 binomial standard errors)", () => {
    const rng = createRandom(2026);
    let hits = 0, total = 0;
    for (let s = 0; s < 6; s++) {
      const y: number[] = [];
      let level = 100, ePrev = 0;
      for (let t = 0; t < 110; t++) {
        const e = rng.normal();
        level += e - 0.5 * ePrev;
        ePrev = e;
        y.push(level);
      }
      const bt = backtest(y, 1, { method: "arima:0,1,1", lambda: "none", level: 80, first: 60 });
      const row = bt.rows[0];
      hits += (row.coverage as number) * row.origins;
      total += row.origins;
    }
    const cover = hits / total;
    const se = Math.sqrt((0.8 * 0.2) / total);
    expect(Math.abs(cover - 0.8)).toBeLessThan(3 * se);
  });
  test("a non-stationary AR part given as parameters is refused with what to do (an explosive fit)", () => {
    expect(() => armaSystem([1.2], [])).toThrow(/not stationary.*difference/);
  });
});

describe("ARIMA paths driven by given shocks (for totals across series)", () => {
  test("arima:0,1,0 with given shocks is exactly the last value plus σ times their running sum (the random walk's definition)", () => {
    const y = Array.from({ length: 30 }, (_, i) => 5 + Math.sin(i) + 0.05 * i);
    const m = fitArima(y, { p: 0, d: 1, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: false });
    const shocks = Float64Array.from([0.5, -1, 2, 0.25, 1, -0.5]);
    const sim = m.simulateShocks?.(3, 2, 7, shocks) as Float64Array;
    const s = m.sigma;
    const expected = [y[29] + 0.5 * s, y[29] - 0.5 * s, y[29] + 1.5 * s, y[29] + 0.25 * s, y[29] + 1.25 * s, y[29] + 0.75 * s];
    expected.forEach((e, i) => expectClose(sim[i], e, { rtol: 1e-14 }, `path value ${i}`));
  });
  test("arima:1,1,1 on log AirPassengers: independent shocks give each step the forecast's own mean and variance (20,000 paths, within 4 Monte Carlo standard errors)", () => {
    const y = dataset("AirPassengers").map(Math.log);
    const m = fitArima(y, { p: 1, d: 1, q: 1, P: 0, D: 0, Q: 0, m: 1, constant: false });
    const H = 6, N = 20000;
    const rng = createRandom(3);
    const shocks = new Float64Array(N * H);
    for (let i = 0; i < shocks.length; i++) shocks[i] = rng.normal();
    const sim = m.simulateShocks?.(H, N, 11, shocks) as Float64Array;
    m.forecast(H).forEach((st, j) => {
      let mean = 0, sq = 0;
      for (let r = 0; r < N; r++) mean += sim[r * H + j];
      mean /= N;
      for (let r = 0; r < N; r++) sq += (sim[r * H + j] - mean) ** 2;
      const sd = Math.sqrt(sq / (N - 1));
      expect(Math.abs(mean - st.mean)).toBeLessThan(4 * st.sd / Math.sqrt(N));
      expect(Math.abs(sd / st.sd - 1)).toBeLessThan(4 / Math.sqrt(2 * N)); // sd of a sample sd ≈ σ/√(2N) (normal theory)
    });
  });
});

describe("ARIMA with a mistyped period", () => {
  test("a seasonal period longer than the series is refused before anything is allocated", () => {
    const y = Array.from({ length: 40 }, (_, i) => 10 + i * 0.1 + Math.sin(i));
    expect(() => fitArima(y, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 1e9, constant: false })).toThrow(/needs at least .* values \(period 1000000000\)/);
  });
  test("the automatic search with a period of 1e9 tries no seasonal terms, says so, and allocates nothing of that size", () => {
    const y = Array.from({ length: 40 }, (_, i) => 10 + i * 0.1 + Math.sin(i));
    const search = autoArima(y, 1e9);
    expect(search.model.order.P + search.model.order.Q + search.model.order.D).toBe(0);
    expect(search.notes.join(" ")).toMatch(/Period 1000000000 is not shorter than the series \(40 values\): no seasonal terms/);
  });
  test("the differencing polynomial without a seasonal difference ignores the period (common practice: (1 − B)^d only)", () => {
    expect(differencingPolynomial(1, 0, 1e9)).toEqual([1, -1]);
  });
});
