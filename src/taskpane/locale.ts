// Numbers in the pane follow the user's own locale (the webview's, which Office and the browser take
// from the user's settings), not a fixed one: 12,500 in one place is 12.500 or 12 500 in another.

/**
 * A whole number with the user's digit grouping.
 * @example formatWhole(12499.6) // "12,500" in an English locale, "12.500" in German
 */
export function formatWhole(x: number): string {
  return new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 }).format(Math.round(x));
}
