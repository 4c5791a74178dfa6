// Totals over a window from..horizon (issue 13 §2): the mean equals the sum of the fan's exact
// means over those steps (the lognormal mean exp(μ + σ²/2), a closed form), and the interval
// matches an independent Monte Carlo of the fitted model's joint normal (covariance of a local
// level, METHODS §10), drawn here with our own generator, not the engine's.
import { EngineError, fanTable, fitForecast, totalForecast, checkWindowStart } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";

/** mulberry32 uniforms and Box–Muller normals: a generator independent of the engine's. */
function normals(seed: number): () => number {
  let a = seed >>> 0;
  const u = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (((t ^ (t >>> 14)) >>> 0) + 0.5) / 4294967296;
  };
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const r = Math.sqrt(-2 * Math.log(u()));
    const th = 2 * Math.PI * u();
    spare = r * Math.sin(th);
    return r * Math.cos(th);
  };
}

function quantile(sorted: Float64Array, p: number): number {
  const x = p * (sorted.length - 1);
  const i = Math.floor(x);
  return i + 1 < sorted.length ? sorted[i] + (x - i) * (sorted[i + 1] - sorted[i]) : sorted[i];
}

const air = dataset("AirPassengers").slice(0, 89); // Jan 1949 – May 1956: a history ending in May
const f = fitForecast(air, { method: "ses", lambda: 0 });

describe("next calendar year from a May history end: steps 8..19 (R datasets AirPassengers, SES on ln y)", () => {
  test("the mean is the sum of FW.FAN's exact means over steps 8..19, each exp(μ_h + σ_h²/2) (lognormal mean)", () => {
    const t = totalForecast(f, 19, { from: 8, mean: "exact" });
    const rows = fanTable(f, 19, { mean: "exact" }).rows.filter((r) => r.h >= 8);
    expect(rows.length).toBe(12);
    const fanSum = rows.reduce((s, r) => s + (r.mean.value as number), 0);
    const closed = rows.reduce((s, r) => s + Math.exp(r.mu + (r.sd * r.sd) / 2), 0);
    expectClose(t.mean.value as number, fanSum, { rtol: 1e-12 }, "Σ fan means");
    expectClose(t.mean.value as number, closed, { rtol: 1e-12 }, "Σ exp(μ + σ²/2)");
    expect(t.from).toBe(8);
    expect(Math.abs((t.simulatedMean as number) - (t.mean.value as number))).toBeLessThan(4 * (t.monteCarloError as number));
  });

  test("the 95% interval matches a Monte Carlo of the fitted model's joint normal (within 0.5%)", () => {
    const H = 19;
    const alpha = f.model?.params.alpha as number;
    const s2 = (f.model?.sigma as number) ** 2;
    const steps = f.forecast(H);
    // covariance of a local level's errors: σ²(1 + (h−1)α²) on the diagonal, σ²(α + (h−1)α²) off it (h < k)
    const C = Array.from({ length: H }, (_, h) => Array.from({ length: H }, (__, k) => (h === k ? s2 * (1 + h * alpha * alpha) : s2 * (alpha + Math.min(h, k) * alpha * alpha))));
    steps.forEach((s, h) => expectClose(Math.sqrt(C[h][h]), s.sd, { rtol: 1e-9 }, `σ_${h + 1}`));
    const L = C.map((r) => r.map(() => 0));
    for (let j = 0; j < H; j++) {
      let d = C[j][j];
      for (let k = 0; k < j; k++) d -= L[j][k] ** 2;
      L[j][j] = Math.sqrt(d);
      for (let i = j + 1; i < H; i++) {
        let v = C[i][j];
        for (let k = 0; k < j; k++) v -= L[i][k] * L[j][k];
        L[i][j] = v / L[j][j];
      }
    }
    const N = 100000;
    const rnd = normals(7);
    const z = new Float64Array(H);
    const totals = new Float64Array(N);
    for (let r = 0; r < N; r++) {
      for (let h = 0; h < H; h++) z[h] = rnd();
      let t = 0;
      for (let h = 7; h < H; h++) {
        let e = 0;
        for (let k = 0; k <= h; k++) e += L[h][k] * z[k];
        t += Math.exp(steps[h].mean + e);
      }
      totals[r] = t;
    }
    totals.sort();
    const t = totalForecast(f, H, { from: 8, level: 95, paths: 100000 });
    expectClose(t.interval[0], quantile(totals, 0.025), { rtol: 0.005 }, "low end");
    expectClose(t.interval[1] as number, quantile(totals, 0.975), { rtol: 0.005 }, "high end");
    expectClose(t.median, quantile(totals, 0.5), { rtol: 0.003 }, "median");
  });

  test("from 1 is the whole horizon, the default", () => {
    const a = totalForecast(f, 12, { seed: 3 });
    const b = totalForecast(f, 12, { seed: 3, from: 1 });
    expect(b).toEqual(a);
  });
});

describe("a bad window says what to fix", () => {
  test("from after horizon", () => {
    expect(() => totalForecast(f, 12, { from: 13 })).toThrow(EngineError);
    expect(() => totalForecast(f, 12, { from: 13 })).toThrow(/from \(13\) is after horizon \(12\): the window from..horizon is empty. Give from ≤ horizon/);
  });
  test("from 0, a fraction or text", () => {
    expect(() => checkWindowStart(0, 12)).toThrow(/from \(the first step of the window\) must be a whole number of at least 1; got 0/);
    expect(() => checkWindowStart(2.5, 12)).toThrow(/whole number/);
    expect(() => checkWindowStart("8", 12)).toThrow(/whole number/);
  });
});
