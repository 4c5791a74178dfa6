// Edges of the numerical helpers that the mutation run (MUTATION.md §2) found unguarded. Expected
// values are worked by hand in the comments (linear algebra) or are numpy's documented defaults.
import { semidefiniteFactor, solveSymmetric } from "../../src/engine/_lib/cholesky";
import { choleskyLower } from "../../src/engine/_lib/cholesky-factor";
import { sortedQuantile } from "../../src/engine/_lib/sorted-quantile";
import { minimizeBox } from "../../src/engine/_lib/nelder-mead";
import { createRandom } from "../../src/engine/_lib/random";
import { fitLambda } from "../../src/engine";
import { dataset } from "../helpers/reference";

// A = [[4,2,0],[2,5,1],[0,1,3]] is symmetric positive definite (leading minors 4, 16, 44).
const A = [4, 2, 0, 2, 5, 1, 0, 1, 3];

function times(L: Float64Array, d: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) {
    let s = 0;
    for (let k = 0; k < d; k++) s += L[i * d + k] * L[j * d + k];
    out.push(s);
  }
  return out;
}

describe("Cholesky solve and factor (worked by hand)", () => {
  test("A x = b with x = (1, −1, 2): b = A x = (2, −1, 5)", () => {
    const x = solveSymmetric(new Float64Array(A), new Float64Array([2, -1, 5]), 3);
    [1, -1, 2].forEach((v, i) => expect(x[i]).toBeCloseTo(v, 12));
  });
  test("L L′ = A, L lower triangular, for A and for A scaled by 1e-20 (the zero-pivot threshold is relative)", () => {
    for (const s of [1, 1e-20]) {
      const As = A.map((v) => v * s);
      const L = choleskyLower(As, 3) as Float64Array;
      expect(L[1]).toBe(0);
      expect(L[2]).toBe(0);
      expect(L[5]).toBe(0);
      times(L, 3).forEach((v, i) => expect(v / s).toBeCloseTo(A[i], 12));
    }
  });
  test("a singular correlation (perfectly correlated pair) gives a zero column, not a failure; an indefinite one gives null", () => {
    const L = choleskyLower([1, 1, 1, 1], 2) as Float64Array;
    expect(Array.from(L)).toEqual([1, 0, 1, 0]);
    expect(choleskyLower([1, 2, 2, 1], 2)).toBeNull();
  });
});

describe("sample quantiles by linear interpolation (Hyndman & Fan 1996 definition 7; numpy's default)", () => {
  test("[1, 2, 3, 4]: p = 0 → 1, 0.5 → 2.5, 0.9 → 3.7, 1 → 4 (np.quantile)", () => {
    const s = [1, 2, 3, 4];
    expect(sortedQuantile(s, 0)).toBe(1);
    expect(sortedQuantile(s, 0.5)).toBe(2.5);
    expect(sortedQuantile(s, 0.9)).toBeCloseTo(3.7, 14);
    expect(sortedQuantile(s, 1)).toBe(4);
    expect(sortedQuantile([7], 0.3)).toBe(7);
  });
});

describe("the factor of a singular covariance (draws from N(0, P) with P only semi-definite)", () => {
  test("P = [[4, 2], [2, 1]] (rank 1) gives C = [[2, 0], [1, 0]], also when P is scaled by 1e-20 (the zero-pivot tolerance is relative)", () => {
    for (const s of [1, 1e-20]) {
      const C = semidefiniteFactor(new Float64Array([4, 2, 2, 1].map((v) => v * s)), 2);
      [2, 0, 1, 0].forEach((v, i) => expect(C[i] / Math.sqrt(s)).toBeCloseTo(v, 12));
    }
  });
});

describe("seed-21 mutation sample: the singular solve at a large scale, a bounded scan", () => {
  test("a singular system with entries of 1e8 still gets a ridge it can use: A x = b holds (b in A's range)", () => {
    // [[1, 1], [1, 1]]·1e8 is singular; b = (1, 1)·1e8 is in its range, so any solution has x₁ + x₂ = 1.
    const A = new Float64Array([1e8, 1e8, 1e8, 1e8]);
    const x = solveSymmetric(A, new Float64Array([1e8, 1e8]), 2);
    expect(Math.abs(x[0] + x[1] - 1)).toBeLessThan(1e-6);
  });
  test("Guerrero's λ held to a lower bound the data would pass stays on it (AirPassengers, bounds ½…2)", () => {
    const g = fitLambda(dataset("AirPassengers"), { method: "guerrero", period: 12, lower: 0.5, upper: 2 });
    expect(g.lambda).toBeGreaterThanOrEqual(0.5);
    expect(g.lambda).toBeLessThan(0.5 + 1e-6);
    expect(g.onBound).toBe("lower");
  });
});

describe("Nelder–Mead on the unit box (Nelder & Mead 1965): the value reported is the value at the point reported", () => {
  // Seeded convex quadratics f(x) = Σ_j a_j (x_j − c_j)² + b·x₀x₁ in 3 to 6 dimensions, minimum inside
  // the box; each start away from it. Common practice: a minimiser's (x, f(x)) must agree exactly,
  // and a strictly convex quadratic's minimum is reached (here to 1e-3 in x: the tolerances are 1e-10 in f).
  const rng = createRandom(17);
  for (let d = 3; d <= 6; d++) {
    test(`d = ${d}`, () => {
      for (let rep = 0; rep < 5; rep++) {
        const a = Array.from({ length: d }, () => 0.5 + rng.uniform());
        const c = Array.from({ length: d }, () => 0.2 + 0.6 * rng.uniform());
        const f = (x: ArrayLike<number>): number => {
          let s = 0;
          for (let j = 0; j < d; j++) s += a[j] * (x[j] - c[j]) ** 2;
          return s;
        };
        const r = minimizeBox((x) => f(x), Array.from({ length: d }, (_, j) => (j % 2 ? 0.05 : 0.95)), 0.1, 1e-14, 1e-10, 20000);
        expect(r.fx).toBe(f(r.x));
        r.x.forEach((v, j) => expect(Math.abs(v - c[j])).toBeLessThan(1e-3));
      }
    });
  }
});
