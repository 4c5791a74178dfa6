// The analytic gradient of the smoothing sum of squares (src/engine/models/ets-gradient.ts), which
// the smoothing fits now follow. Checked (1) against central differences of the filter's own SSE at
// arbitrary states (the standard gradient check; common practice), and (2) at the least-squares
// initial states against central differences of the concentrated SSE n·σ² that smoothingAtParams
// reports, which by the envelope theorem it must equal (Magnus & Neudecker 1999, ch. 7). Data:
// log AirPassengers and log UKgas (R's datasets, test/fixtures/datasets).
import { smoothingAtParams } from "../../src/engine";
import type { SmoothingMethod } from "../../src/engine";
import { createRandom } from "../../src/engine/_lib/random";
import { sseGradient } from "../../src/engine/models/ets-gradient";
import { concentratedObjective } from "../../src/engine/models/ets";
import { boxParams } from "../helpers/smoothing-box";
import { dataset, expectClose } from "../helpers/reference";

const FORMS: [SmoothingMethod, { trend: boolean; damped: boolean; seasonal: boolean }][] = [
  ["ses", { trend: false, damped: false, seasonal: false }],
  ["holt", { trend: true, damped: false, seasonal: false }],
  ["damped", { trend: true, damped: true, seasonal: false }],
  ["seasonal-ses", { trend: false, damped: false, seasonal: true }],
  ["holt-winters", { trend: true, damped: false, seasonal: true }],
  ["damped-holt-winters", { trend: true, damped: true, seasonal: true }],
];

const NAMES = ["alpha", "beta", "gamma", "phi"] as const;

function used(form: { trend: boolean; damped: boolean; seasonal: boolean }): number[] {
  return [0, ...(form.trend ? [1] : []), ...(form.seasonal ? [2] : []), ...(form.damped ? [3] : [])];
}

describe("∂SSE/∂(α, β, γ, φ) against central differences", () => {
  for (const [data, period] of [["AirPassengers", 12], ["UKgas", 4]] as const) {
    const y = dataset(data).map(Math.log);
    for (const [method, form] of FORMS) {
      test(`${data}, ${method}: at arbitrary states (relative 1e-6)`, () => {
        const m = form.seasonal ? period : 1;
        const spec = { ...form, m };
        const rng = createRandom(7);
        const x = [y[0] + 0.1 * rng.normal(), ...(form.trend ? [0.01 * rng.normal()] : []), ...(form.seasonal ? Array.from({ length: m - 1 }, () => 0.1 * rng.normal()) : [])];
        const th = [0.35, 0.05, 0.2, 0.9];
        const ring = new Float64Array(5 * m);
        const g = new Float64Array(4);
        const scratch = new Float64Array(4);
        const sse = (t: number[]): number => sseGradient(y, spec, t[0], t[1], t[2], t[3], x, ring, scratch);
        sseGradient(y, spec, th[0], th[1], th[2], th[3], x, ring, g);
        for (const i of used(form)) {
          const h = 1e-6;
          const up = th.slice();
          const down = th.slice();
          up[i] += h;
          down[i] -= h;
          const numeric = (sse(up) - sse(down)) / (2 * h);
          expectClose(g[i], numeric, { rtol: 1e-6, atol: 1e-6 * Math.abs(sse(th)) }, `${NAMES[i]}`);
        }
      });
    }
  }
});

describe("at the least-squares initial states it is the gradient of the concentrated SSE (envelope theorem)", () => {
  const y = dataset("AirPassengers").map(Math.log);
  for (const [method, form] of FORMS) {
    test(`AirPassengers, ${method} (relative 1e-5)`, () => {
      const m = form.seasonal ? 12 : 1;
      const p = { alpha: 0.4, beta: form.trend ? 0.04 : 0, gamma: form.seasonal ? 0.15 : 0, phi: form.damped ? 0.92 : 1 };
      const concentrated = (q: typeof p): number => {
        const f = smoothingAtParams(y, method, m, q);
        return f.n * f.sigma * f.sigma;
      };
      const fit = smoothingAtParams(y, method, m, p);
      const params = fit.params as Record<string, number>;
      const x = [params.level0, ...(form.trend ? [params.trend0] : []), ...(form.seasonal ? Array.from({ length: m - 1 }, (_, j) => params[`season${j + 2}`]) : [])];
      const g = new Float64Array(4);
      const sse = sseGradient(y, { ...form, m }, p.alpha, p.beta, p.gamma, p.phi, x, new Float64Array(5 * m), g);
      expectClose(sse, concentrated(p), { rtol: 1e-10 }, "SSE at the least-squares states");
      for (const i of used(form)) {
        const h = 1e-5;
        const key = NAMES[i];
        const numeric = (concentrated({ ...p, [key]: p[key] + h }) - concentrated({ ...p, [key]: p[key] - h })) / (2 * h);
        expectClose(g[i], numeric, { rtol: 1e-5, atol: 1e-7 }, key);
      }
    });
  }
});

describe("the fit's objective ln SSE*(u) and its gradient in the box's unit coordinates", () => {
  // Against central differences of ln(n·σ²) from smoothingAtParams at the same point (the chain
  // rule through β = α·β*, γ = (1 − α)·γ*), at points inside the box, near its edges and at γ*
  // near 1, where the α-derivative's γ term is largest. Common practice (gradient check).
  const y = dataset("AirPassengers").map(Math.log);
  for (const [method, form] of FORMS) {
    test(`AirPassengers, ${method} (relative 1e-5)`, () => {
      const m = form.seasonal ? 12 : 1;
      const d = used(form).length;
      const objective = concentratedObjective(y, method, m);
      const reference = (u: number[]): number => {
        const f = smoothingAtParams(y, method, m, boxParams(u, form, true));
        return Math.log(f.n * f.sigma * f.sigma);
      };
      for (const base of [[0.3, 0.2, 0.4, 0.5], [0.05, 0.9, 0.97, 0.1], [0.6, 0.02, 0.05, 0.95]]) {
        const u = base.slice(0, d);
        const g = new Float64Array(d);
        expectClose(objective(u, g), reference(u), { atol: 1e-10 }, `ln SSE* at ${u}`);
        for (let i = 0; i < d; i++) {
          const h = 1e-6;
          const up = u.slice();
          const down = u.slice();
          up[i] += h;
          down[i] -= h;
          expectClose(g[i], (reference(up) - reference(down)) / (2 * h), { rtol: 1e-5, atol: 1e-6 }, `∂/∂u${i} at ${u}`);
        }
      }
    });
  }
});
