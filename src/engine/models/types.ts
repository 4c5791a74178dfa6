import type { MethodName } from "./methods";

/** The normal forecast of one step on the transformed scale. */
export interface StepMoments {
  /** Steps ahead, 1-based. */
  h: number;
  /** μ_h. */
  mean: number;
  /** σ_h. */
  sd: number;
}

/**
 * A fitted model on the (already transformed) scale: immutable, fit once, evaluate many.
 * `forecast(h)` gives per-step normal moments; `simulate(h, paths, seed)` gives sample paths
 * (row-major, paths × h) from the model's own recursion with a seeded generator.
 */
export interface FittedModel {
  readonly method: Exclude<MethodName, "auto">;
  readonly title: string;
  /** Periods fitted, from the first to the last observed value (missing ones included). */
  readonly n: number;
  /** Missing observations among them (NaN in the series); the likelihood uses the n − missing observed points. */
  readonly missing: number;
  readonly period: number;
  /** Estimated (or given) parameters by name: smoothing, damping, initial states. */
  readonly params: Readonly<Record<string, number>>;
  /** Residual standard deviation on the transformed scale. */
  readonly sigma: number;
  readonly loglik: number;
  readonly aicc: number;
  /** Parameters counted in the AICc (including σ²). */
  readonly k: number;
  /**
   * One-step residuals, in time order and ending at the last period; NaN where the period is
   * missing (or has no earlier observation to be compared with). With gaps they are standardised
   * (each has variance σ²): smoothing models divide the innovation by √s_t (METHODS §8); benchmarks
   * divide a difference over d periods by √d.
   */
  readonly residuals: readonly number[];
  forecast(h: number): StepMoments[];
  simulate(h: number, paths: number, seed: number): Float64Array;
  /**
   * Sample paths driven by given standard-normal one-step innovations (`shocks`, paths × h,
   * row-major, each scaled by the model's σ) instead of fresh draws; any other random part (a
   * parameter's estimation error) still comes from `seed`. Used to simulate several series with
   * correlated innovations. Optional: a model without it cannot be totalled across series.
   */
  simulateShocks?(h: number, paths: number, seed: number, shocks: Float64Array): Float64Array;
}
