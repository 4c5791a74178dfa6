/**
 * The engine's one error type. Every structural or numeric problem a user can act on is thrown
 * as an {@link EngineError} whose message says what to fix; faces map the `code`:
 * - `input`: the user can fix the input (cells show `#VALUE!` with the message);
 * - `domain`: a numeric domain failure, e.g. a back-transform past its pole (`#NUM!`);
 * - `unavailable`: the value does not exist, e.g. the exact mean for λ < 0 (`#N/A`).
 *
 * @example
 * throw new EngineError("input", "Box-Cox needs values > 0; column B has 2 zeros.");
 */
export type EngineErrorCode = "input" | "domain" | "unavailable";

export class EngineError extends Error {
  /** Which kind of problem this is; see the module comment. */
  readonly code: EngineErrorCode;
  /** Optional machine-readable details (e.g. the Taylor value offered instead of an exact mean). */
  readonly details?: Readonly<Record<string, number | string | boolean | null>>;

  constructor(code: EngineErrorCode, message: string, details?: Record<string, number | string | boolean | null>) {
    super(message);
    this.name = "EngineError";
    this.code = code;
    if (details) this.details = Object.freeze({ ...details });
  }
}

/** True when `e` is an {@link EngineError}. @example isEngineError(new EngineError("input", "x")) // true */
export function isEngineError(e: unknown): e is EngineError {
  return e instanceof EngineError;
}
