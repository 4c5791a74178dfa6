import type { RawCell } from "./screen";

/**
 * The one header rule: a first row is a header (it names the series) when at least one of its
 * cells is non-blank text and all of them are text or empty. Used by the cell functions and by the
 * pane alike.
 * @example isHeaderRow(["Harbour Street", null]) // true
 */
export function isHeaderRow(row: readonly RawCell[]): boolean {
  return row.some((c) => typeof c === "string" && c.trim() !== "") && row.every((c) => c === null || c === undefined || typeof c === "string");
}
