// The general forecast moments of a linear innovations state-space model
// y_t = w′x_{t−1} + ε_t, x_t = F x_{t−1} + g ε_t (Hyndman, Koehler, Ord & Snyder 2008, ch. 6):
// μ_h = w′F^{h−1}x_T and σ_h² = σ²[1 + Σ_{j=1}^{h−1} c_j²], c_j = w′F^{j−1}g.
// Matrix algebra by mathjs, built from its factories for exactly `matrix` and `multiply` on plain
// numbers: the factory graph those two need, less its optional BigNumber, Complex and Fraction
// types, so neither those libraries nor mathjs's expression parser are in the bundles
// (test/build/bundles.test.ts checks both).
import {
  create, createAddScalar, createConj, createDenseMatrixClass, createDot, createEqualScalar, createMatrix, createMatrixClass,
  createMultiply, createMultiplyScalar, createSize, createSparseMatrixClass, createTyped, Matrix,
} from "mathjs";
import type { StepMoments } from "./types";
import "../_lib/mathjs-factories";

const math = create({
  createTyped, createMatrixClass, createDenseMatrixClass, createSparseMatrixClass, createMatrix, createEqualScalar,
  createAddScalar, createMultiplyScalar, createConj, createSize, createDot, createMultiply,
});

/** A state-space form: F (d×d), w (d), g (d) and the final state x_T (d). */
export interface StateSpaceForm {
  F: number[][];
  w: number[];
  g: number[];
  x: number[];
}

/**
 * Per-step forecast mean and sd from the general state-space formula, for h = 1..H.
 * Source: Hyndman et al. (2008), eqs. (6.1)–(6.2) for the class 1 (linear, additive-error) models.
 * When the final state is itself uncertain (a series with missing observations, METHODS §8),
 * `P` is its covariance divided by σ² (P̃_T) and adds w′F^{h−1} P̃_T F′^{h−1} w to each σ_h²/σ².
 * @example stateSpaceMoments({ F: [[1]], w: [1], g: [0.5], x: [10] }, 1, 3)[2].sd // √(1 + 2·0.25) ≈ 1.2247
 */
export function stateSpaceMoments(form: StateSpaceForm, sigma2: number, H: number, P?: number[][]): StepMoments[] {
  const F = math.matrix(form.F);
  let rowW: Matrix = math.matrix([form.w]); // w′F^{j−1}, starting at j = 1
  const x = math.matrix(form.x.map((v) => [v]));
  const g = math.matrix(form.g.map((v) => [v]));
  const Pm = P ? math.matrix(P) : null;
  const out: StepMoments[] = [];
  let sumC2 = 0;
  for (let h = 1; h <= H; h++) {
    const mu = (math.multiply(rowW, x) as Matrix).get([0, 0]) as number;
    let stateVar = 0;
    if (Pm) {
      const wp = math.multiply(rowW, Pm) as Matrix;
      const row = (rowW.valueOf() as number[][])[0];
      const wpRow = (wp.valueOf() as number[][])[0];
      for (let i = 0; i < row.length; i++) stateVar += wpRow[i] * row[i];
    }
    out.push({ h, mean: mu, sd: Math.sqrt(sigma2 * (1 + sumC2 + Math.max(stateVar, 0))) });
    const c = (math.multiply(rowW, g) as Matrix).get([0, 0]) as number;
    sumC2 += c * c;
    rowW = math.multiply(rowW, F) as Matrix;
  }
  return out;
}
