// The private numeric helpers, checked against closed forms (common practice: known integrals,
// roots and minima of elementary functions).
import { findRoot, minimizeBounded } from "../../src/engine/_lib/brent";
import { integrate } from "../../src/engine/_lib/quadrature";
import { createRandom } from "../../src/engine/_lib/random";
import { expectClose } from "../helpers/reference";

test("Brent's minimiser finds interior minima and minima at an end", () => {
  expectClose(minimizeBounded((x) => (x - 1.3) ** 2 + 2, -5, 5).x, 1.3, { atol: 1e-8 }, "quadratic");
  expectClose(minimizeBounded((x) => Math.cos(x), 2, 4).x, Math.PI, { atol: 1e-8 }, "cos");
  expect(minimizeBounded((x) => x, 0, 1).x).toBe(0);
  expect(minimizeBounded((x) => -x, 0, 1).x).toBe(1);
});

test("Brent's root finder meets its tolerance (1e-13) and reports a bracket without a sign change", () => {
  expectClose(findRoot((x) => x * x - 2, 0, 2), Math.SQRT2, { atol: 1e-13 }, "sqrt 2");
  expectClose(findRoot((x) => Math.cos(x) - x, 0, 1), 0.7390851332151607, { atol: 1e-13 }, "Dottie number (from memory)");
  expect(Number.isNaN(findRoot((x) => x * x + 1, -1, 1))).toBe(true);
});

test("Gauss–Kronrod integration of known integrals", () => {
  expectClose(integrate((x) => Math.exp(-x * x), -10, 10).value, Math.sqrt(Math.PI), { rtol: 1e-14 }, "√π");
  expectClose(integrate((x) => Math.sqrt(x), 0, 1).value, 2 / 3, { rtol: 1e-12 }, "√x (end singularity in the derivative)");
  expectClose(integrate((x) => 1 / (1 + x * x), -1, 1).value, Math.PI / 2, { rtol: 1e-14 }, "arctan");
});

describe("seeded generator", () => {
  test("same seed, same stream; another seed, another stream", () => {
    const a = createRandom(99), b = createRandom(99), c = createRandom(100);
    const xs = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xs);
  });
  test("uniforms lie in (0, 1) with mean ½ and variance 1/12; normals have mean 0 and variance 1 (within 4 s.e.)", () => {
    const r = createRandom(12345);
    const n = 200000;
    let su = 0, su2 = 0, sz = 0, sz2 = 0, min = 1, max = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      min = Math.min(min, u); max = Math.max(max, u);
      su += u; su2 += u * u;
      const z = r.normal();
      sz += z; sz2 += z * z;
    }
    expect(min).toBeGreaterThan(0);
    expect(max).toBeLessThan(1);
    expect(Math.abs(su / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - (su / n) ** 2 - 1 / 12)).toBeLessThan(4 * Math.sqrt(1 / 180 / n));
    expect(Math.abs(sz / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sz2 / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });
});
