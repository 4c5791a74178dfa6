// The private numeric helpers, checked against closed forms (common practice: known integrals,
// roots and minima of elementary functions).
import { findRoot, minimizeBounded } from "../../src/engine/_lib/brent";
import { forwardGradient, minimizeBfgs, numericGradient } from "../../src/engine/_lib/bfgs";
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

test("BFGS finds the minimum of Rosenbrock's valley (Rosenbrock 1960) from the standard start (−1.2, 1) of Moré, Garbow & Hillstrom 1981", () => {
  const r = minimizeBfgs((x) => 100 * (x[1] - x[0] ** 2) ** 2 + (1 - x[0]) ** 2, [-1.2, 1], 1e-8, 1e-15, 500);
  expectClose(r.x[0], 1, { atol: 1e-4 }, "x");
  expectClose(r.x[1], 1, { atol: 1e-4 }, "y");
  expect(r.fx).toBeLessThan(1e-8);
});

test("BFGS on a badly scaled quadratic (gradient ~1e4 at the start) reaches the minimum; a stop rule ends it early without claiming convergence (common practice)", () => {
  const f = (x: number[]): number => 1000 * ((x[0] - 3) ** 2 + 10 * (x[1] + 1) ** 2);
  const r = minimizeBfgs(f, [0, 0], 1e-7, 1e-15, 200);
  expectClose(r.x[0], 3, { atol: 1e-6 }, "x");
  expectClose(r.x[1], -1, { atol: 1e-6 }, "y");
  expect(r.evaluations).toBeLessThan(80); // 43 when written
  const early = minimizeBfgs(f, [0, 0], 1e-7, 1e-15, 200, (x) => Math.abs(x[0] - 3) < 0.5);
  expect(early.converged).toBe(false);
  expect(early.evaluations).toBeLessThan(r.evaluations);
});

test("finite-difference gradients of exp at 1 equal e (calculus): central to 1e-9, forward to 1e-6", () => {
  expectClose(numericGradient((x) => Math.exp(x[0]), [1])[0], Math.E, { rtol: 1e-9 }, "central");
  expectClose(forwardGradient((x) => Math.exp(x[0]), [1], Math.E)[0], Math.E, { rtol: 1e-6 }, "forward");
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
