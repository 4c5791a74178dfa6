import { EngineError } from "../errors";
import { fmt, requireFinite, requireLambda } from "../_lib/check";
import { LAMBDA_ZERO } from "./box-cox";

/**
 * Yeo-Johnson transform (Yeo & Johnson 2000, Biometrika 87:954–959), defined for any real y:
 * y ≥ 0: ((y+1)^λ − 1)/λ, or ln(y+1) at λ = 0; y < 0: −((1−y)^(2−λ) − 1)/(2−λ), or −ln(1−y) at λ = 2.
 * Evaluated with expm1/log1p for accuracy near λ = 0, λ = 2 and y = 0.
 * @example yeoJohnson(-1, 1) // -1 (λ = 1 is the identity)
 */
export function yeoJohnson(y: number, lambda: number): number {
  requireFinite(y, "value");
  requireLambda(lambda);
  if (y >= 0) {
    const l = Math.log1p(y);
    return Math.abs(lambda) < LAMBDA_ZERO ? l : Math.expm1(lambda * l) / lambda;
  }
  const k = 2 - lambda;
  const l = Math.log1p(-y);
  return Math.abs(k) < LAMBDA_ZERO ? -l : -Math.expm1(k * l) / k;
}

/**
 * Inverse Yeo-Johnson (Yeo & Johnson 2000). w ≥ 0 maps to y ≥ 0 and w < 0 to y < 0.
 * Throws a `domain` EngineError where no value exists: w ≥ −1/λ for λ < 0, or w ≤ 1/(λ − 2)
 * for λ > 2 (the transform is bounded there), or on overflow.
 * @example yeoJohnsonInverse(Math.log(2), 0) // 1
 */
export function yeoJohnsonInverse(w: number, lambda: number): number {
  requireFinite(w, "transformed value");
  requireLambda(lambda);
  let y: number;
  if (w >= 0) {
    if (Math.abs(lambda) < LAMBDA_ZERO) y = Math.expm1(w);
    else {
      if (!(lambda * w > -1)) {
        throw new EngineError("domain", `Transformed value ${fmt(w)} is at or past the Yeo-Johnson bound -1/λ = ${fmt(-1 / lambda)} for λ = ${fmt(lambda)}; no original value exists.`);
      }
      y = Math.expm1(Math.log1p(lambda * w) / lambda);
    }
  } else {
    const k = 2 - lambda;
    if (Math.abs(k) < LAMBDA_ZERO) y = -Math.expm1(-w);
    else {
      if (!(-k * w > -1)) {
        throw new EngineError("domain", `Transformed value ${fmt(w)} is at or past the Yeo-Johnson bound 1/(λ-2) = ${fmt(1 / (lambda - 2))} for λ = ${fmt(lambda)}; no original value exists.`);
      }
      y = -Math.expm1(Math.log1p(-k * w) / k);
    }
  }
  if (!Number.isFinite(y)) {
    throw new EngineError("domain", `Transformed value ${fmt(w)} with λ = ${fmt(lambda)} back-transforms to a number too large to represent.`);
  }
  return y;
}
