// The pane's Published forecast view model: three chosen columns (medians, lower and upper ends of
// a forecast made elsewhere) in; the monthly means beside the medians and the total with its range
// out. Pure (no DOM, no Office).
import { isEngineError, publishedTotal, PublishedTotal, RawCell } from "../../engine";
import type { PaneData } from "../view-model";

/** What the Published forecast view shows, or why it cannot. */
export type PublishedView =
  | { ok: true; total: PublishedTotal; rows: { label: string; median: number; mean: number | null; lower: number; upper: number }[]; lines: [string, string][] }
  | { ok: false; message: string };

const blank = (c: RawCell): boolean => c === null || c === undefined || (typeof c === "string" && c.trim() === "");

function money(x: number | null): string {
  return x === null || !Number.isFinite(x) ? "–" : Math.round(x).toLocaleString("en-GB");
}

/**
 * The total of the forecast in columns `median`, `lower`, `upper` of the pane's data (rows blank in
 * all three are skipped; a row blank in only some is refused, naming it), at `level` percent, on
 * λ `lambda` (a number or "implied") with the chosen dependence — the engine's publishedTotal.
 * @example publishedView(data, 0, 1, 2, 80, "0", "implied").ok // true
 */
export function publishedView(data: PaneData, median: number, lower: number, upper: number, level: number, lambda: string, dependence: string): PublishedView {
  try {
    const cols = [data.columns[median] ?? [], data.columns[lower] ?? [], data.columns[upper] ?? []];
    const which = ["median", "lower end", "upper end"];
    const where = (i: number): string => data.rowLabels?.[i] ?? `row ${i + 1 + data.headerRows}`;
    const m: number[] = [];
    const l: number[] = [];
    const u: number[] = [];
    const labels: string[] = [];
    const n = Math.max(...cols.map((c) => c.length));
    for (let i = 0; i < n; i++) {
      const row = cols.map((c) => c[i] ?? null);
      if (row.every(blank)) continue;
      const bad = row.findIndex((v) => typeof v !== "number");
      if (bad >= 0) return { ok: false, message: `${where(i)}: the ${which[bad]} ${blank(row[bad]) ? "is blank" : "is not a number"}; every month needs a median, a lower and an upper end.` };
      m.push(row[0] as number);
      l.push(row[1] as number);
      u.push(row[2] as number);
      labels.push(where(i));
    }
    if (m.length === 0) return { ok: false, message: "The chosen columns hold no months; choose the median, lower-end and upper-end columns." };
    const lam = lambda.trim() === "" ? 0 : lambda.trim().toLowerCase() === "implied" ? "implied" : Number(lambda);
    if (typeof lam === "number" && !Number.isFinite(lam)) return { ok: false, message: `λ must be a number (0 for a log-scale forecast) or "implied"; got "${lambda}".` };
    const t = publishedTotal(m, l, u, level, { lambda: lam, dependence });
    const range = (r: [number, number | null]): string => `${money(r[0])} to ${r[1] === null ? "unbounded" : money(r[1])}`;
    const used = t.used === "local-level" ? "as the intervals' widening implies (local level)" : t.used === "correlation" ? `with correlation ${t.correlation}` : t.used === "comonotone" ? "together (comonotone)" : "independently";
    const lines: [string, string][] = [
      ["mean of the total", `${money(t.mean)}${t.meanMethod === "taylor" ? " (Taylor approximation)" : ""}`],
      ["median of the total", money(t.median)],
      [`${t.level}% interval`, range(t.interval)],
      ["months move", used],
      ["if independent", range(t.independent.interval)],
      ["if comonotone", range(t.comonotone.interval)],
      ["λ", `${Number(t.lambda.toPrecision(4))} (${t.lambdaSource})`],
      ["Σ medians", money(m.reduce((s, x) => s + x, 0))],
    ];
    return { ok: true, total: t, rows: t.months.map((mo, i) => ({ label: labels[i], median: mo.median, mean: mo.mean, lower: mo.lower, upper: mo.upper })), lines };
  } catch (e) {
    if (isEngineError(e)) return { ok: false, message: e.message };
    return { ok: false, message: `Fanwise could not total this (${e instanceof Error ? e.message : String(e)}).` };
  }
}
