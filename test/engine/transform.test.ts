// Box-Cox / Yeo-Johnson held to scipy.special.boxcox / inv_boxcox and 50-digit mpmath values
// (scipy 1.10.1, mpmath 1.2.1 reference values in test/fixtures), and to the published formulas.
import fc from "fast-check";
import {
  boxCox, boxCoxInverse, boxCoxInverseDetailed, boxCoxShifted, boxCoxShiftedInverse, EngineError, yeoJohnson, yeoJohnsonInverse,
} from "../../src/engine";
import { check, expectClose, num } from "../helpers/reference";

describe("Box-Cox forward (source: mpmath 50-digit expm1(λ ln x)/λ, via the fixtures)", () => {
  const c = check("boxcox.forward_inverse.grid");
  test("every grid point matches mpmath to 1e-14 relative, including |λ| = 1e-10", () => {
    for (const e of c.expected) {
      expectClose(boxCox(e.x, e.lmbda), num(e.boxcox_mpmath), { rtol: 1e-14, atol: 1e-300 }, `boxcox(${e.x}, ${e.lmbda})`);
    }
  });
  test("inverse(forward(x)) returns x as closely as scipy does (its round-trip error + 1e-14)", () => {
    for (const e of c.expected) {
      const back = boxCoxInverse(boxCox(e.x, e.lmbda), e.lmbda);
      expectClose(back, e.x, { rtol: Math.max(e.roundtrip_rel_err * 4, 1e-14) }, `roundtrip(${e.x}, ${e.lmbda})`);
    }
  });
  test("boxCox(x, 0) equals ln x", () => {
    expect(boxCox(100, 0)).toBe(Math.log(100));
  });
});

describe("Box-Cox inverse at the domain edges (source: scipy.special.inv_boxcox + mpmath, via the fixtures)", () => {
  const c = check("boxcox.inverse.domain_edges");
  test("finite values match mpmath; scipy's 0 is our explicit floor, its inf and nan our pole or an error", () => {
    for (const e of c.expected) {
      const ref = num(e.mpmath);
      const d = boxCoxInverseDetailed(e.y, e.lmbda);
      if (Number.isFinite(ref) && ref > 0) {
        expect(d.status).toBe("ok");
        expectClose(d.value, ref, { rtol: c.tolerance.rtol }, `inv(${e.y}, ${e.lmbda})`);
      } else if (ref === 0) {
        expect(d.status).toBe("floor");
        expect(d.value).toBe(0);
        expect(() => boxCoxInverse(e.y, e.lmbda)).toThrow(/floor at 0/);
      } else {
        // inf (pole/overflow) or nan (negative base): never a silent NaN.
        expect(d.status === "pole" || d.status === "floor").toBe(true);
        expect(Number.isNaN(d.value)).toBe(false);
        expect(() => boxCoxInverse(e.y, e.lmbda)).toThrow(EngineError);
      }
    }
  });
  test("the pole for λ < 0 is named in the message", () => {
    expect(() => boxCoxInverse(2.5, -0.5)).toThrow(/pole/);
  });
});

describe("shifted Box-Cox (Box & Cox 1964 two-parameter form)", () => {
  test("transforms y + c and inverts back", () => {
    expect(boxCoxShifted(0, 0, 1)).toBe(0);
    expect(boxCoxShifted(-3, 0.5, 4)).toBeCloseTo(boxCox(1, 0.5), 15);
    expect(boxCoxShiftedInverse(boxCoxShifted(-3, 0.5, 4), 0.5, 4)).toBeCloseTo(-3, 12);
  });
  test("refuses a shift that leaves a value ≤ 0, saying how large it must be", () => {
    expect(() => boxCoxShifted(-3, 0.5, 2)).toThrow(/larger than 3/);
  });
});

describe("Yeo-Johnson (Yeo & Johnson 2000, Biometrika 87:954–959, eq. 2.1)", () => {
  test("matches the published piecewise formula at hand-checked points", () => {
    // y ≥ 0, λ = 0.5: ((y+1)^0.5 − 1)/0.5 ; y < 0, λ = 0.5: −((1−y)^1.5 − 1)/1.5
    expect(yeoJohnson(3, 0.5)).toBeCloseTo((Math.sqrt(4) - 1) / 0.5, 15);
    expect(yeoJohnson(-3, 0.5)).toBeCloseTo(-((4 ** 1.5) - 1) / 1.5, 13);
    expect(yeoJohnson(3, 0)).toBeCloseTo(Math.log(4), 15);
    expect(yeoJohnson(-3, 2)).toBeCloseTo(-Math.log(4), 15);
    expect(yeoJohnson(-7, 1)).toBeCloseTo(-7, 14);
    expect(yeoJohnson(0, 1.3)).toBe(0);
  });
  test("property: inverse(transform(y)) = y for any y and λ in [-3, 5]", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: -3, max: 5, noNaN: true }), (y, l) => {
        let w: number;
        try {
          w = yeoJohnson(y, l);
        } catch {
          return true;
        }
        let back: number;
        try {
          back = yeoJohnsonInverse(w, l);
        } catch (e) {
          // Only a representability limit may stop the round trip, never a NaN.
          return e instanceof EngineError;
        }
        return Math.abs(back - y) <= 1e-9 * Math.max(1, Math.abs(y));
      }),
      { seed: 20261201, numRuns: 2000 },
    );
  });
  test("refuses values outside the transform's range, with the bound in the message", () => {
    expect(() => yeoJohnsonInverse(3, -0.5)).toThrow(/bound/);
  });
});

describe("Box-Cox properties (fast-check, seeded)", () => {
  test("inverse(transform(y)) = y for y in (1e-6, 1e9) and λ in [-2, 2], within the problem's conditioning", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e9, noNaN: true }), fc.double({ min: -2, max: 2, noNaN: true }), (y, l) => {
        const w = boxCox(y, l);
        // Past y^λ ≈ 1e-16 the transform has saturated at the pole 1/|λ| in floating point, so no
        // inverse can recover y; it must then say so (an EngineError), not return NaN.
        if (Math.pow(y, l) < 1e-9) {
          try { return boxCoxInverse(w, l) > 0; } catch (e) { return e instanceof EngineError; }
        }
        const back = boxCoxInverse(w, l);
        // Near the pole (λ < 0, y^λ → 0) the inverse is ill-conditioned: 1 + λw = y^λ is computed
        // from w with absolute error ~ε, so the relative error grows like ε / y^λ.
        const tol = 1e-13 * (1 + 1 / Math.min(1, Math.pow(y, l)));
        return Math.abs(back - y) <= tol * y;
      }),
      { seed: 7, numRuns: 3000 },
    );
  });
  test("the transform is non-decreasing in y for every λ (strictly, until it saturates at 1/|λ| in floating point)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), fc.double({ min: 1.0001, max: 10, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (y, k, l) =>
        boxCox(y * k, l) >= boxCox(y, l)),
      { seed: 11, numRuns: 2000 },
    );
  });
});
