// The projected quasi-Newton minimiser on the unit box (src/engine/_lib/projected-bfgs.ts), checked
// against closed forms: Rosenbrock's valley (Rosenbrock 1960, start of Moré, Garbow & Hillstrom
// 1981), quadratics whose bound-constrained minimum follows from the Karush–Kuhn–Tucker conditions
// (worked by hand below), and a linear function (minimum at a corner). Common practice for
// testing an optimiser.
import { minimizeBoxWithGradient } from "../../src/engine/_lib/projected-bfgs";
import { expectClose } from "../helpers/reference";

/** Rosenbrock's function on x = 4u − 2 (the box [−2, 2]²), with its gradient in u. */
function rosenbrock(u: Float64Array, g: Float64Array): number {
  const a = 4 * u[0] - 2;
  const b = 4 * u[1] - 2;
  g[0] = 4 * (-400 * a * (b - a * a) - 2 * (1 - a));
  g[1] = 4 * 200 * (b - a * a);
  return 100 * (b - a * a) ** 2 + (1 - a) ** 2;
}

test("Rosenbrock's valley from the standard start (−1.2, 1): the minimum (1, 1) inside the box", () => {
  const r = minimizeBoxWithGradient(rosenbrock, [0.2, 0.75], { maxIterations: 500, firstStep: 0.1, firstFall: Infinity });
  expectClose(4 * r.x[0] - 2, 1, { atol: 1e-6 }, "x");
  expectClose(4 * r.x[1] - 2, 1, { atol: 1e-6 }, "y");
  expect(r.fx).toBeLessThan(1e-12);
  expect(r.converged).toBe(true);
  expect(r.evaluations).toBeLessThan(200); // 52 when written
});

test("a coupled quadratic whose minimum has one coordinate on a bound: (1, 0.45) by the KKT conditions", () => {
  // f = d′Qd with d = x − (1.5, 0.2), Q = [[2, 1], [1, 2]]. The unconstrained minimum (1.5, 0.2)
  // is outside the box; at x0 = 1, f = 0.5 − d1 + 2d1² is least at d1 = 0.25, i.e. x1 = 0.45, and
  // ∂f/∂x0 = 4d0 + 2d1 = −1.5 < 0 there, so x0 = 1 is held by its bound (KKT).
  const f = (x: Float64Array, g: Float64Array): number => {
    const d0 = x[0] - 1.5;
    const d1 = x[1] - 0.2;
    g[0] = 4 * d0 + 2 * d1;
    g[1] = 2 * d0 + 4 * d1;
    return 2 * d0 * d0 + 2 * d0 * d1 + 2 * d1 * d1;
  };
  for (const start of [[0.1, 0.9], [0.5, 0.5], [0.99, 0.01]]) {
    const r = minimizeBoxWithGradient(f, start);
    expect(r.x[0]).toBe(1);
    expectClose(r.x[1], 0.45, { atol: 1e-7 }, `x1 from ${start}`);
    expect(r.converged).toBe(true);
  }
});

test("a linear function ends exactly on its corner; a separable quadratic on the clamped centre", () => {
  const lin = minimizeBoxWithGradient((x, g) => { g[0] = 3; g[1] = -0.01; g[2] = 2; return 3 * x[0] - 0.01 * x[1] + 2 * x[2]; }, [0.5, 0.5, 0.5]);
  expect(lin.x).toEqual([0, 1, 0]);
  const c = [-0.3, 0.4, 1.7];
  const quad = minimizeBoxWithGradient((x, g) => {
    let v = 0;
    for (let i = 0; i < 3; i++) { g[i] = 2 * (i + 1) * (x[i] - c[i]); v += (i + 1) * (x[i] - c[i]) ** 2; }
    return v;
  }, [0.9, 0.9, 0.1]);
  expect(quad.x[0]).toBe(0);
  expectClose(quad.x[1], 0.4, { atol: 1e-8 }, "interior coordinate");
  expect(quad.x[2]).toBe(1);
});

test("the first step stays in the start's basin: a narrow dip near 0.006 is found from 0.02, not jumped to the bound (common practice)", () => {
  // f(u) = 30u − exp(−((u − 0.006)/0.002)²): a local minimum on the bound u = 0 (f′(0) = 30 > 0)
  // and a deeper one inside a narrow dip, where f′ = 0 at u = 0.006 + 0.002a with a·e^(−a²) = −0.03
  // (a = −0.03003, by fixed-point iteration): u* = 0.0059399. The shape the smoothing likelihood
  // has in α for some series (bench/README.md).
  const f = (x: Float64Array, g: Float64Array): number => {
    const a = (x[0] - 0.006) / 0.002;
    const e = Math.exp(-a * a);
    g[0] = 30 + (2 * a * e) / 0.002;
    return 30 * x[0] - e;
  };
  const r = minimizeBoxWithGradient(f, [0.02]);
  expectClose(r.x[0], 0.0059399, { atol: 1e-7 }, "narrow interior minimum");
  // with an unlimited first step the same start lands on the bound's minimum
  const jump = minimizeBoxWithGradient(f, [0.02], { firstStep: 1, firstFall: Infinity });
  expect(jump.x[0]).toBe(0);
});

test("a non-finite start is reported, not iterated; a non-finite trial point is stepped back from", () => {
  const bad = minimizeBoxWithGradient((_x, g) => { g[0] = 0; return NaN; }, [0.5]);
  expect(bad.converged).toBe(false);
  expect(bad.evaluations).toBe(1);
  // f is infinite beyond 0.6: the search must stay below and find the minimum at 0.55
  const walled = minimizeBoxWithGradient((x, g) => {
    g[0] = 2 * (x[0] - 0.55);
    return x[0] > 0.6 ? Infinity : (x[0] - 0.55) ** 2;
  }, [0.1], { firstStep: 1, firstFall: Infinity });
  expectClose(walled.x[0], 0.55, { atol: 1e-7 }, "minimum next to the wall");
});

test("it stops once a step promises less than f's rounding noise, instead of chasing the noise (common practice)", () => {
  // a coupled quadratic with noise 1e-13 on its value (as a concentrated sum of squares has) and an
  // exact gradient: the minimum (0.3, 0.6) is reached in a few steps, after which no step can show
  // a fall that is not noise
  const f = (x: Float64Array, g: Float64Array): number => {
    const a = x[0] - 0.3;
    const b = x[1] - 0.6;
    g[0] = 2 * a + 4 * b;
    g[1] = 4 * a + 10 * b;
    return 1 + a * a + 4 * a * b + 5 * b * b + 1e-13 * Math.sin(1e9 * x[0]);
  };
  const r = minimizeBoxWithGradient(f, [0.9, 0.1], { gTol: 1e-14 });
  expectClose(r.x[0], 0.3, { atol: 1e-6 }, "x");
  expectClose(r.x[1], 0.6, { atol: 1e-6 }, "y");
  expect(r.evaluations).toBeLessThan(20); // 12 when written; 27 without the noise rule
});
