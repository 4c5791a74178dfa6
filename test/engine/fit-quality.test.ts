// Fit quality (issue 12 §3): no smoothing fit is beaten by a point inside its own parameter box.
// Data: statsmodels' macrodata cpi (test/fixtures/fit/make_fit.py) and the R/statsmodels datasets
// in test/fixtures/datasets. The box is the one fitSmoothing documents (Hyndman et al. 2008, ch. 5).
import * as fs from "fs";
import * as path from "path";
import { boxCox, createRandom, fitSmoothing, PHI_HI, PHI_LO, SMOOTH_HI, SMOOTH_LO, smoothingAtParams } from "../../src/engine";
import type { SmoothingMethod } from "../../src/engine";
import { dataset, expectClose } from "../helpers/reference";
import { boxParams } from "../helpers/smoothing-box";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const cpi: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "fit", "fit.json"), "utf8"));

function boxPoint(u: number[], method: SmoothingMethod): { alpha: number; beta: number; gamma: number; phi: number } {
  const trend = method !== "ses" && method !== "seasonal-ses";
  const seasonal = method === "seasonal-ses" || method === "holt-winters" || method === "damped-holt-winters";
  const damped = method === "damped" || method === "damped-holt-winters";
  return boxParams(u, { trend, seasonal, damped });
}

describe("no fit is beaten by a point inside its own box", () => {
  test("macrodata cpi, damped, λ = 0.35: at least the likelihood at α = 0.9999, φ = 0.98 (issue 12: 419.605968 there, the old fit stopped at 419.605929)", () => {
    const w = cpi.values.map((v: number) => boxCox(v, cpi.lambda));
    const f = fitSmoothing(w, "damped", 1);
    const corner = (beta: number): number => smoothingAtParams(w, "damped", 1, { alpha: SMOOTH_HI, beta, gamma: 0, phi: PHI_HI }).loglik;
    let best = -Infinity;
    for (let b = 0.25; b <= 0.36; b += 0.0005) best = Math.max(best, corner(SMOOTH_HI * b));
    expect(best).toBeGreaterThan(419.60596);
    expect(f.loglik).toBeGreaterThanOrEqual(best - 1e-9);
  });
  const cases: [string, SmoothingMethod, number][] = [
    ["AirPassengers", "holt-winters", 12], ["AirPassengers", "damped-holt-winters", 12], ["UKgas", "holt-winters", 4],
    ["nile", "ses", 1], ["lynx", "damped", 1], ["macrodata_realgdp", "damped", 4], ["airmiles", "holt", 1],
  ];
  for (const [name, method, period] of cases) {
    test(`${name}, ${method}, log scale: 300 random points of the box and its corners do no better (seeded; common practice)`, () => {
      const w = dataset(name).map(Math.log);
      const f = fitSmoothing(w, method, period);
      const rng = createRandom(12);
      let best = -Infinity;
      const corners = [0, 1].flatMap((a) => [0, 1].flatMap((b) => [0, 1].flatMap((c) => [0, 1].map((d) => [a, b, c, d]))));
      const points = [...corners, ...Array.from({ length: 300 }, () => [rng.uniform(), rng.uniform(), rng.uniform(), rng.uniform()])];
      for (const u of points) best = Math.max(best, smoothingAtParams(w, method, period, boxPoint(u, method)).loglik);
      expect(f.loglik).toBeGreaterThanOrEqual(best - 1e-7);
    });
  }
});

describe("every fit meets the first-order conditions of its box (Karush–Kuhn–Tucker; common practice)", () => {
  // At a minimum of −ℓ over the box, ∂ℓ/∂u vanishes for a coordinate inside the box and points out
  // of the box for one on a bound. Derivatives by central differences of smoothingAtParams' ℓ in the
  // box's unit coordinates (one-sided on a bound); the fitted point is read back from its params.
  const span = SMOOTH_HI - SMOOTH_LO;
  const cases: [string, SmoothingMethod, number][] = [
    ["AirPassengers", "holt-winters", 12], ["AirPassengers", "damped-holt-winters", 12], ["UKgas", "holt-winters", 4],
    ["UKgas", "damped", 4], ["lynx", "damped", 1], ["macrodata_realgdp", "damped", 4], ["airmiles", "holt", 1], ["AirPassengers", "seasonal-ses", 12],
  ];
  for (const [name, method, period] of cases) {
    test(`${name}, ${method}, log scale: |∂ℓ/∂u| < 0.01 inside, outward on a bound`, () => {
      const w = dataset(name).map(Math.log);
      const f = fitSmoothing(w, method, period);
      const p = f.params as Record<string, number>;
      const trend = p.beta !== undefined;
      const seasonal = p.gamma !== undefined;
      const damped = p.phi !== undefined;
      const clamp = (v: number): number => Math.min(1, Math.max(0, v));
      const u = [clamp((p.alpha - SMOOTH_LO) / span), trend ? clamp((p.beta / p.alpha - SMOOTH_LO) / span) : 0, seasonal ? clamp((p.gamma / (1 - p.alpha) - SMOOTH_LO) / span) : 0, damped ? clamp((p.phi - PHI_LO) / (PHI_HI - PHI_LO)) : 0];
      const ll = (v: number[]): number => smoothingAtParams(w, method, period, boxPoint(v, method)).loglik;
      expectClose(ll(u), f.loglik, { atol: 1e-8 }, "ℓ at the fitted point read back");
      const active = [0, ...(trend ? [1] : []), ...(seasonal ? [2] : []), ...(damped ? [3] : [])];
      const h = 1e-6;
      for (const i of active) {
        const at = (d: number): number => { const v = u.slice(); v[i] = u[i] + d; return ll(v); };
        if (u[i] <= 1e-9) expect((at(h) - at(0)) / h).toBeLessThan(0.01); // may only fall into the box
        else if (u[i] >= 1 - 1e-9) expect((at(0) - at(-h)) / h).toBeGreaterThan(-0.01);
        else expect(Math.abs((at(h) - at(-h)) / (2 * h))).toBeLessThan(0.01);
      }
    });
  }
});

