// The smoothing fit's parameter box in unit coordinates, written out again for the tests (not
// imported from the engine, so a wrong mapping there cannot hide itself): α = lo + span·u0,
// β = α·(lo + span·u1), γ = (1 − α)·(lo + span·u2), φ = φ_lo + (φ_hi − φ_lo)·u3, coordinates a model
// does not have skipped or ignored. The box is the one fitSmoothing documents (Hyndman et al. 2008, ch. 5).
import { PHI_HI, PHI_LO, SMOOTH_HI, SMOOTH_LO } from "../../src/engine";

/** Which components a smoothing form has. */
export interface SmoothingForm { trend: boolean; seasonal: boolean; damped: boolean }

/**
 * The parameters at unit point u. `packed`: u holds only the form's own coordinates, in the order
 * α, β, γ, φ (as the engine's objective takes them); otherwise u always has four, unused ones ignored.
 */
export function boxParams(u: number[], form: SmoothingForm, packed = false): { alpha: number; beta: number; gamma: number; phi: number } {
  const span = SMOOTH_HI - SMOOTH_LO;
  const alpha = SMOOTH_LO + span * u[0];
  let i = 1;
  const at = (slot: number): number => (packed ? u[i++] : u[slot]);
  const beta = form.trend ? alpha * (SMOOTH_LO + span * at(1)) : 0;
  const gamma = form.seasonal ? (1 - alpha) * (SMOOTH_LO + span * at(2)) : 0;
  const phi = form.damped ? PHI_LO + (PHI_HI - PHI_LO) * at(3) : 1;
  return { alpha, beta, gamma, phi };
}
