// The error a cell function returns (as its first error cell) or throws, for tests of messages.
import { isCellError, ShimError } from "./custom-functions-shim";

/**
 * The error a cell function's call gives: a thrown error, or the first error cell of the row it
 * returns; fails the test when it returns numbers.
 * @example (await failure(() => FW.TOTALFROMINTERVALS(m, l, u, 0.8))).message // "… in percent …"
 */
export async function failure(p: Promise<unknown> | (() => unknown)): Promise<ShimError> {
  try {
    const v = typeof p === "function" ? p() : await p;
    const first = Array.isArray(v) && Array.isArray(v[0]) ? (v[0] as unknown[]).find((c) => isCellError(c)) : undefined;
    if (first) return first as ShimError;
  } catch (e) {
    return e as ShimError;
  }
  throw new Error("expected the call to fail");
}
