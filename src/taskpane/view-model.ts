// Pure view model for the pane's series check: raw columns in, rows to render out. No DOM, no Office.
import { RawCell, screenSeries } from "../engine";

/** One row of the series-check table. */
export interface CheckRow {
  name: string;
  n: number;
  min: string;
  blanks: number;
  lambda: string;
  ready: boolean;
  badge: string | null;
  reason: string;
}

function fmt(x: number | null): string {
  if (x === null) return "–";
  return Math.abs(x) >= 1000 ? Math.round(x).toLocaleString("en-GB") : String(Number(x.toPrecision(4)));
}

/**
 * Screens each column and shapes the result for the table; a series whose minimum is ≤ 0 gets
 * the "not Box-Cox ready" badge with the reason and the fix.
 * @example checkRows([{ name: "A", cells: [1, 0, 2, 3] }], 1)[0].badge // "not Box-Cox ready"
 */
export function checkRows(columns: { name: string; cells: RawCell[] }[], period: number, rowLabels?: string[]): CheckRow[] {
  const where = rowLabels ? (i: number): string => rowLabels[i] ?? `row ${i + 1}` : (i: number): string => `row ${i + 1}`;
  return columns.map(({ name, cells }) => {
    const r = screenSeries(cells, { period, label: name, where });
    const interval = r.lambda ? r.lambda.interval : null;
    const lambda = r.suggestedLambda === null ? "–" : interval && interval[0] !== null && interval[1] !== null
      ? `${fmt(r.suggestedLambda)} (${interval[0].toFixed(2)} to ${interval[1].toFixed(2)})`
      : fmt(r.suggestedLambda);
    return {
      name,
      n: r.n,
      min: fmt(r.min),
      blanks: r.blanks,
      lambda,
      ready: r.boxCoxUsable,
      badge: r.nonPositive > 0 ? "not Box-Cox ready" : r.fix === "too-short" || r.fix === "no-numbers" ? "too short" : null,
      reason: r.message,
    };
  });
}
