// Private argument checks shared by the engine. Each throws an EngineError naming the argument.
import { EngineError } from "../errors";

/** Formats a number for a message: short, without trailing noise. */
export function fmt(x: number): string {
  if (Number.isNaN(x)) return "not a number";
  if (!Number.isFinite(x)) return x > 0 ? "infinite" : "minus infinite";
  if (x !== 0 && (Math.abs(x) >= 1e6 || Math.abs(x) < 1e-4)) return x.toExponential(3);
  return String(Number(x.toPrecision(6)));
}

/** Requires a finite number. */
export function requireFinite(x: unknown, name: string): number {
  if (typeof x !== "number" || !Number.isFinite(x)) {
    throw new EngineError("input", `${name} must be a finite number; got ${describe(x)}.`);
  }
  return x;
}

/**
 * Requires λ finite and within [−5, 5] (wider values are almost surely a typo); returns it.
 * @example requireLambda(0.5) // 0.5
 */
export function requireLambda(lambda: unknown, name = "lambda"): number {
  const l = requireFinite(lambda, name);
  if (l < -5 || l > 5) {
    throw new EngineError("input", `${name} must be between -5 and 5; got ${fmt(l)}. Typical values are 0 (log), 0.5 (square root) or 1 (no change).`);
  }
  return l;
}

/** Requires σ > 0 and finite. */
export function requireSigma(sigma: unknown, name = "sd"): number {
  const s = requireFinite(sigma, name);
  if (!(s > 0)) throw new EngineError("input", `${name} must be greater than 0; got ${fmt(s)}.`);
  return s;
}

/** Requires a probability strictly inside (0, 1). */
export function requireProbability(p: unknown, name = "p"): number {
  const v = requireFinite(p, name);
  if (!(v > 0 && v < 1)) {
    throw new EngineError("input", `${name} must be strictly between 0 and 1; got ${fmt(v)}. For a 90th percentile use 0.9.`);
  }
  return v;
}

/**
 * Requires a coverage level in percent, strictly inside (0, 100) and at least 1 (a smaller value
 * is almost surely a fraction typed for a percentage); returns it as a fraction.
 * @example requireLevelPercent(95) // 0.95
 */
export function requireLevelPercent(level: unknown, name = "level"): number {
  const v = requireFinite(level, name);
  if (!(v > 0 && v < 100)) {
    throw new EngineError("input", `${name} must be a percentage strictly between 0 and 100 (e.g. 80 or 95); got ${fmt(v)}.`);
  }
  if (v < 1) {
    // A level below 1% is almost surely a fraction typed for a percentage.
    // The example matches what was typed: 0.8 → "give 80 for an 80% interval".
    const pct = fmt(Number((v * 100).toPrecision(12)));
    throw new EngineError("input", `${name} is in percent: give ${pct} for ${/^(8|11|18)/.test(pct) ? "an" : "a"} ${pct}% interval, not ${fmt(v)}.`);
  }
  return v / 100;
}

function describe(x: unknown): string {
  if (typeof x === "number") return fmt(x);
  if (typeof x === "string") return `the text "${x.length > 20 ? x.slice(0, 20) + "…" : x}"`;
  if (x === null || x === undefined) return "nothing (blank)";
  return typeof x;
}
