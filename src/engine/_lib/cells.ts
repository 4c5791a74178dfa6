// Private helpers shared by the series and audit modules: what counts as a blank cell, and how a
// label starts a sentence.
import type { RawCell } from "../series/screen";

/** A blank cell: null, undefined, or text that is only spaces. */
export function isBlank(c: RawCell): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

/** Capitalises a generic label ("the series") at the start of a sentence; names stay as written. */
export function cap(s: string): string {
  return s.startsWith("the ") ? "T" + s.slice(1) : s;
}
