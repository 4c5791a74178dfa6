// Normal and chi-square functions held to scipy 1.10.1 + mpmath 1.2.1 (fixtures) and to the
// Abramowitz & Stegun (1964) Table 26.5 values quoted in METHODS §6.
import { chiSquareQuantile, chiSquareSf, normalCdf, normalQuantile, normalSf } from "../../src/engine";
import { check, expectClose } from "../helpers/reference";

describe("normal quantile (source: scipy.stats.norm.ppf and mpmath, via the fixtures)", () => {
  test("matches mpmath to 1e-13 relative from p = 1e-10 to 1 − 1e-10", () => {
    for (const e of check("dist.norm.ppf").expected) {
      if (e.mpmath === 0) expect(normalQuantile(e.p)).toBe(0);
      else expectClose(normalQuantile(e.p), e.mpmath, { rtol: 1e-13 }, `ppf(${e.p})`);
    }
  });
  test("matches the handbook to 10 digits (Abramowitz & Stegun 1964, Table 26.5; from memory, confirmed by the scipy fixture)", () => {
    const table: [number, number][] = [[0.9, 1.2815515655], [0.95, 1.644853627], [0.975, 1.9599639845], [0.99, 2.326347874], [0.995, 2.5758293035]];
    for (const [p, z] of table) expectClose(normalQuantile(p), z, { atol: 6e-11 }, `z_${p}`);
  });
  test("refuses p outside (0, 1)", () => {
    expect(() => normalQuantile(0)).toThrow(/between 0 and 1/);
    expect(() => normalQuantile(1)).toThrow(/between 0 and 1/);
  });
});

describe("normal CDF (source: scipy.stats.norm.cdf and mpmath, via the fixtures)", () => {
  test("matches scipy to the fixture's 1e-14 relative", () => {
    const c = check("dist.norm.cdf");
    for (const e of c.expected) expectClose(normalCdf(e.z), e.cdf, { rtol: c.tolerance.rtol }, `cdf(${e.z})`);
  });
  test("stays accurate in the far tails (Φ(−10) = 7.6198530241605e-24, from memory of A&S Table 26.1's tail values)", () => {
    expectClose(normalCdf(-10), 7.6198530241605e-24, { rtol: 1e-12 }, "cdf(-10)");
    expectClose(normalSf(10), 7.6198530241605e-24, { rtol: 1e-12 }, "sf(10)");
    expect(normalCdf(-40)).toBeGreaterThanOrEqual(0);
    expect(normalCdf(40)).toBe(1);
  });
  test("CDF and quantile are inverse to 1e-14 in the body", () => {
    for (let p = 0.01; p < 1; p += 0.01) expectClose(normalCdf(normalQuantile(p)), p, { rtol: 1e-14 }, `p=${p}`);
  });
});

describe("chi-square tails for the likelihood-ratio tests (source: mpmath values in the fixtures)", () => {
  test("survival function for df 1 and 2 matches mpmath to 1e-13 (scipy itself is off by ~1e-14 near 1–2)", () => {
    for (const e of check("dist.chi2.sf").expected) {
      expectClose(chiSquareSf(e.x, 1), e.sf_df1_mpmath, { rtol: 1e-13, atol: 1e-300 }, `sf1(${e.x})`);
      expectClose(chiSquareSf(e.x, 2), e.sf_df2_mpmath, { rtol: 1e-13, atol: 1e-300 }, `sf2(${e.x})`);
    }
  });
  test("critical values match scipy.stats.chi2.ppf", () => {
    for (const e of check("dist.chi2.ppf").expected) {
      expectClose(chiSquareQuantile(e.q, 1), e.ppf_df1, { rtol: 1e-13 }, `ppf1(${e.q})`);
      expectClose(chiSquareQuantile(e.q, 2), e.ppf_df2, { rtol: 1e-13 }, `ppf2(${e.q})`);
    }
  });
});
