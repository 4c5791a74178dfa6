// The Newton search for the maximum-likelihood λ (issue 17 §1) on its edge cases: λ at or near 0,
// a series whose |λ·ln y| passes 300, a nearly constant series, the bounds, and the fallback when a
// Newton step misbehaves. Outside references: test/fixtures/lambda-mle/make_lambda_mle.py (the
// profile log-likelihood of Box & Cox 1964 at 60 digits in mpmath 1.2.1, its maximiser and interval
// ends by mpmath.findroot; scipy 1.10.1 boxcox_normmax / boxcox where scipy can evaluate the series).
import * as fs from "fs";
import * as path from "path";
import { boxCoxLogLik, createRandom, fitLambda, lambdaMle } from "../../src/engine";
import { BoxCoxProfile, ProfileFunction, ProfilePoint } from "../../src/engine/transform/box-cox-profile";
import { intervalEnd, maximiseProfile } from "../../src/engine/transform/lambda-mle";
import { check, dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ref: any = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "fixtures", "lambda-mle", "lambda-mle.json"), "utf8"));
const WIDE = { lower: -5, upper: 5 };

describe("λ at and near 0 (mpmath 60 digits; scipy 1.10.1 boxcox_normmax / boxcox(alpha=0.05))", () => {
  test("ln y symmetric about its mean: the profile is even, so λ̂ = 0 (mpmath: 5e-17); the interval is symmetric", () => {
    const c = ref.symmetric;
    const r = lambdaMle(c.values, WIDE);
    expect(Math.abs(r.lambda)).toBeLessThan(1e-12);
    expectClose(r.loglik, c.loglik, { rtol: 1e-12 }, "ℓ(λ̂)");
    expectClose(r.interval[0] as number, c.ci95[0], { atol: 1e-9 }, "ci low (mpmath)");
    expectClose(r.interval[1] as number, c.ci95[1], { atol: 1e-9 }, "ci high (mpmath)");
    expectClose(r.lambda, c.scipy.lambda, { atol: 1e-6 }, "λ (scipy)");
    expectClose(r.interval[0] as number, c.scipy.ci95[0], { atol: 1e-6 }, "ci low (scipy)");
  });
  test("λ̂ ≈ −5e-5, where (y^λ − 1)/λ in closed form cancels digits: the series form keeps λ̂ to 1e-10 (mpmath)", () => {
    const c = ref.near_zero;
    const r = lambdaMle(c.values, WIDE);
    expectClose(r.lambda, c.lambda, { atol: 1e-10 }, "λ (mpmath)");
    expectClose(r.loglik, c.loglik, { rtol: 1e-12 }, "ℓ(λ̂)");
    expectClose(r.interval[0] as number, c.ci95[0], { atol: 1e-9 }, "ci low");
    expectClose(r.interval[1] as number, c.ci95[1], { atol: 1e-9 }, "ci high");
    expectClose(r.lambda, c.scipy.lambda, { atol: 1e-6 }, "λ (scipy)");
  });
  test("the analytic slope and curvature agree with central differences of ℓ (whose values match scipy.stats.boxcox_llf), at λ = 0 and around it", () => {
    const air = dataset("AirPassengers");
    const p = new BoxCoxProfile(air);
    for (const l of [0, 1e-9, -3e-4, 0.05, 0.3, -1.7, 4]) {
      const h = 1e-4;
      const at = p.at(l);
      const fd1 = (p.at(l + h).loglik - p.at(l - h).loglik) / (2 * h);
      const fd2 = (p.at(l + h).loglik - 2 * at.loglik + p.at(l - h).loglik) / (h * h);
      expectClose(at.slope, fd1, { rtol: 1e-6, atol: 1e-6 }, `ℓ′(${l})`);
      expectClose(at.curvature, fd2, { rtol: 1e-4 }, `ℓ″(${l})`);
      expect(at.curvature).toBeLessThan(0);
    }
  });
});

describe("huge and tiny values", () => {
  test("y spanning about 1e-150 to 1e150 (|λ·ln y| > 300 inside [−5, 5], where scipy's y**λ overflows): ℓ, λ̂ and interval match mpmath", () => {
    const c = ref.huge_range;
    expect(c.scipy.error).toBe("FloatingPointError");
    for (const [l, v] of Object.entries(c.llf_grid)) expectClose(boxCoxLogLik(c.values, Number(l)), v as number, { rtol: 1e-12 }, `ℓ(${l})`);
    // where |λ·ln(y/geometric mean)| > 300 the terms are scaled by the largest: its slope and curvature too
    const p = new BoxCoxProfile(c.values);
    for (const l of [-4, -1.5, 2, 4.5]) {
      const h = 1e-5;
      const fd1 = (p.at(l + h).loglik - p.at(l - h).loglik) / (2 * h);
      const k = 1e-2; // ℓ is about 1e4 here: a wider step keeps rounding out of the second difference
      const fd2 = (p.at(l + k).loglik - 2 * p.at(l).loglik + p.at(l - k).loglik) / (k * k);
      expectClose(p.at(l).slope, fd1, { rtol: 1e-6 }, `ℓ′(${l})`);
      expectClose(p.at(l).curvature, fd2, { rtol: 1e-4 }, `ℓ″(${l})`);
    }
    const r = lambdaMle(c.values, WIDE);
    expectClose(r.lambda, c.lambda, { atol: 1e-12 }, "λ");
    expectClose(r.interval[0] as number, c.ci95[0], { atol: 1e-12 }, "ci low");
    expectClose(r.interval[1] as number, c.ci95[1], { atol: 1e-12 }, "ci high");
  });
  test("λ̂ does not depend on the unit: AirPassengers × 1e-200 and × 1e200 give scipy's λ̂ for the series itself (Box & Cox 1964: ℓ depends on y through y / geometric mean, up to a constant)", () => {
    const air = dataset("AirPassengers");
    const e = check("lambda.mle.AirPassengers").expected;
    for (const scale of [1e-200, 1e200]) {
      const r = lambdaMle(air.map((v) => v * scale), { lower: -3, upper: 3 });
      expectClose(r.lambda, e.lambda_boxcox_normmax, { atol: 1e-6 }, `λ at scale ${scale}`);
      expectClose(r.interval[0] as number, e.ci95[0], { atol: 1e-6 }, "ci low");
      expectClose(r.interval[1] as number, e.ci95[1], { atol: 1e-6 }, "ci high");
      expect(Number.isFinite(r.loglik)).toBe(true);
    }
  });
  test("a nearly constant series (relative spread 1e-8): ℓ rises all the way to λ = 5 (mpmath), so λ̂ is the upper bound and the interval is open", () => {
    const c = ref.nearly_constant;
    const grid = Object.entries(c.llf_grid).map(([l, v]) => [Number(l), v as number]).sort((a, b) => a[0] - b[0]);
    for (const [l, v] of grid) expectClose(boxCoxLogLik(c.values, l), v, { rtol: 1e-9 }, `ℓ(${l})`);
    for (let i = 1; i < grid.length; i++) expect(grid[i][1]).toBeGreaterThan(grid[i - 1][1]);
    const r = lambdaMle(c.values, WIDE);
    expect(r.lambda).toBe(5);
    expect(r.onBound).toBe("upper");
    expect(r.interval).toEqual([null, null]);
    const f = fitLambda(c.values, { method: "mle" });
    expect(f.note).toMatch(/upper end/);
  });
});

describe("the bounds", () => {
  test("AirPassengers in [0.5, 2] (λ̂ = 0.148 lies below): λ is the bound 0.5 exactly, ℓ is scipy.stats.boxcox_llf(0.5), the interval is measured from ℓ(0.5) (mpmath)", () => {
    const c = ref.bound_low;
    const r = lambdaMle(dataset(c.dataset), { lower: c.bounds[0], upper: c.bounds[1] });
    expect(r.lambda).toBe(0.5);
    expect(r.onBound).toBe("lower");
    expectClose(r.loglik, c.scipy_llf_at_bound, { rtol: 1e-12 }, "ℓ(0.5)");
    expectClose(r.interval[0] as number, c.ci95[0], { atol: 1e-9 }, "ci low");
    expectClose(r.interval[1] as number, c.ci95[1], { atol: 1e-9 }, "ci high");
  });
  test("bounds that do not contain 0 start from the nearer bound; λ̂ inside them is still scipy's (lynx: 0.146 in [0.1, 0.3] and [-2, 0.2])", () => {
    const e = check("lambda.mle.lynx").expected;
    for (const [lower, upper] of [[0.1, 0.3], [-2, 0.2]]) {
      const r = lambdaMle(dataset("lynx"), { lower, upper });
      expectClose(r.lambda, e.lambda_boxcox_normmax, { atol: 1e-6 }, `λ in [${lower}, ${upper}]`);
      expect(r.onBound).toBeNull();
    }
  });
});

/** ℓ(λ) = −k·√(1 + (λ − c)²): concave, but Newton's method on ℓ′ diverges from |λ − c| > 1 (each step sends λ − c to −(λ − c)³). */
function divergent(c: number, k: number): ProfileFunction & { calls: number } {
  return {
    calls: 0,
    at(lambda: number): ProfilePoint {
      this.calls++;
      const x = lambda - c;
      const r = Math.sqrt(1 + x * x);
      return { lambda, loglik: -k * r, slope: (-k * x) / r, curvature: -k / (r * r * r) };
    },
  };
}

describe("the safeguards when a Newton step misbehaves (worked by hand: ℓ = −k√(1 + (λ − c)²))", () => {
  test("Newton from 0 would diverge (c = 2.5): bisection inside the bracket still finds λ̂ = c", () => {
    const f = divergent(2.5, 3);
    const top = maximiseProfile(f, -5, 5);
    expect(Math.abs(top.lambda - 2.5)).toBeLessThan(1e-9);
    expect(f.calls).toBeLessThan(60);
  });
  test("the maximum beyond a bound: the bound is evaluated once and returned (c = 7 in [−5, 5])", () => {
    const f = divergent(7, 3);
    const top = maximiseProfile(f, -5, 5);
    expect(top.lambda).toBe(5);
    expect(top.slope).toBeGreaterThan(0);
  });
  test("interval ends: ℓ(λ̂) − ℓ = 1.92 at |λ − c| = √((1 + 1.92/k)² − 1)", () => {
    for (const k of [3, 0.5]) {
      const f = divergent(-1, k);
      const top = maximiseProfile(f, -5, 5);
      const d = Math.sqrt((1 + 1.92 / k) ** 2 - 1);
      const lo = intervalEnd(f, top, 1.92, -1);
      const hi = intervalEnd(f, top, 1.92, +1);
      if (d <= 10) {
        expectClose(lo as number, -1 - d, { atol: 1e-9 }, `low end, k = ${k}`);
        expectClose(hi as number, -1 + d, { atol: 1e-9 }, `high end, k = ${k}`);
      } else {
        expect([lo, hi]).toEqual([null, null]);
      }
    }
  });
  test("an end beyond 10 from λ̂ is open (null), as before", () => {
    const f = divergent(0, 0.15); // d = √((1 + 12.8)² − 1) ≈ 13.8
    const top = maximiseProfile(f, -5, 5);
    expect(intervalEnd(f, top, 1.92, -1)).toBeNull();
    expect(intervalEnd(f, top, 1.92, +1)).toBeNull();
  });
});

/** ℓ(λ) written out directly from its definition (Box & Cox 1964; the form of scipy.stats.boxcox_llf): an independent check of the prepared profile. */
function directLogLik(y: number[], lambda: number): number {
  const w = y.map((v) => (lambda === 0 ? Math.log(v) : (v ** lambda - 1) / lambda));
  const m = w.reduce((a, b) => a + b, 0) / w.length;
  const v = w.reduce((a, b) => a + (b - m) ** 2, 0) / w.length;
  return (lambda - 1) * y.reduce((a, b) => a + Math.log(b), 0) - (w.length / 2) * Math.log(v);
}

describe("work arrays (shared below 4,096 values, own above)", () => {
  test("profiles of different series evaluated in turn, and one of 5,000 values, agree with ℓ written out directly (rtol 1e-10)", () => {
    const rng = createRandom(4096);
    const series = [50, 5000, 60].map((n) => Array.from({ length: n }, () => Math.exp(3 + 0.4 * rng.normal())));
    const profiles = series.map((y) => new BoxCoxProfile(y));
    for (const l of [-0.7, 0.2, 1.3]) {
      for (let k = 0; k < 3; k++) expectClose(profiles[k].at(l).loglik, directLogLik(series[k], l), { rtol: 1e-10 }, `series ${k}, λ = ${l}`);
    }
    const r = lambdaMle(series[1]);
    const p = new BoxCoxProfile(series[1]);
    expect(Math.abs(p.at(r.lambda).slope)).toBeLessThan(1e-6 * Math.abs(p.at(r.lambda).curvature));
  });
});

describe("the search agrees with a dense scan (seeded random series; common practice: a 1001-point grid over [−5, 5] brackets the maximum to 0.01)", () => {
  test("200 series of 4 to 60 values from several shapes", () => {
    const rng = createRandom(1717);
    for (let s = 0; s < 200; s++) {
      const n = 4 + Math.floor(rng.uniform() * 57);
      const kind = s % 4;
      const y: number[] = [];
      for (let i = 0; i < n; i++) {
        const z = kind === 0 ? rng.normal() : kind === 1 ? Math.log(rng.uniform()) : kind === 2 ? (rng.uniform() < 0.5 ? 0 : 3) + 0.1 * rng.normal() : 2 * rng.normal() ** 3;
        y.push(Math.exp(z + 5));
      }
      if (y.every((v) => v === y[0])) continue;
      const r = lambdaMle(y, WIDE);
      const p = new BoxCoxProfile(y);
      let best = -5;
      let bestL = -Infinity;
      for (let i = 0; i <= 1000; i++) {
        const l = -5 + i * 0.01;
        const v = p.at(l).loglik;
        if (v > bestL) { bestL = v; best = l; }
      }
      expect(Math.abs(r.lambda - best)).toBeLessThanOrEqual(0.01 + 1e-9);
      expect(r.loglik).toBeGreaterThanOrEqual(bestL - 1e-9 * Math.abs(bestL));
    }
  });
});
