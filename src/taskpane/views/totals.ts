// The pane's totals: the total of the previewed series over a window of steps ("total over"), and
// the total across every selected series for the series check. Pure (no DOM, no Office).
import { alignSeries, fanTable, fitForecast, Forecaster, isEngineError, totalAcross, totalForecast } from "../../engine";
import type { PaneData } from "../view-model";

function money(x: number | null): string {
  return x === null || !Number.isFinite(x) ? "–" : Math.round(x).toLocaleString("en-GB");
}

/**
 * One sentence on the total of steps from..horizon of the previewed forecast: the mean (the sum of
 * the means), the level% interval from 5,000 seeded paths, and what the medians would add up to;
 * with the data's dates, the periods the steps are (`periodOf`, e.g. step 1 → "2026-01").
 * @example totalOverSentence(f, 1, 12, 95) // "Total of steps 1–12: mean 1,358,839; 95% interval …"
 */
export function totalOverSentence(f: Forecaster, from: number, horizon: number, level: number, periodOf?: (h: number) => string): string {
  const months = periodOf ? ` (${periodOf(from)}${horizon > from ? ` to ${periodOf(horizon)}` : ""})` : "";
  try {
    const t = totalForecast(f, horizon, { from, level, paths: 5000, seed: 1 });
    let sumMedians: number | null = 0;
    for (const r of fanTable(f, horizon, { levels: [80] }).rows.slice(from - 1)) sumMedians = sumMedians === null || r.median.value === null ? null : sumMedians + r.median.value;
    return `Total of steps ${from}–${horizon}${months}: mean ${t.mean.value === null ? `not available (${t.mean.note ?? ""})` : money(t.mean.value)}; median ${money(t.median)}; ${t.level}% interval ${money(t.interval[0])} to ${t.interval[1] === null ? "unbounded" : money(t.interval[1])}`
      + `${sumMedians !== null ? `; the monthly medians add up to ${money(sumMedians)}` : ""}.`;
  } catch (e) {
    if (isEngineError(e)) return `Total over steps ${from}–${horizon}${months}: ${e.message}`;
    throw e;
  }
}

/** The series check's total row, or why there is none. */
export type AcrossRowView = { ok: true; label: string; text: string; notes: string[] } | { ok: false; message: string };

/**
 * The total over every selected series and steps from..horizon (each series with the preview's
 * method and λ), simulated jointly, as one row of the series check; with the interval if the
 * series were independent.
 * @example acrossRowView(data, { method: "naive", lambda: "0", period: 12, from: 1, horizon: 12, level: 95 }).ok // true
 */
export function acrossRowView(data: PaneData, c: { method: string; lambda: string | number; period: number; from: number; horizon: number; level: number }): AcrossRowView {
  try {
    if (data.columns.length < 2) return { ok: false, message: "Select several series for a total across them." };
    const aligned = alignSeries(data.columns, data.names, 1 + data.headerRows);
    const fs = aligned.columns.map((cells, j) => fitForecast(cells, { method: c.method, lambda: c.lambda, period: c.period, label: data.names[j], firstRow: 1 + data.headerRows }));
    const t = totalAcross(fs, c.horizon, { from: c.from, level: c.level, paths: 5000, seed: 1 });
    const r = (x: [number, number | null]): string => `${money(x[0])} to ${x[1] === null ? "unbounded" : money(x[1])}`;
    return {
      ok: true,
      label: `All ${fs.length} series, steps ${t.from}–${t.horizon}`,
      text: `mean ${money(t.mean)}; ${t.level}% interval ${r(t.interval)} (if independent: ${r(t.independent.interval)})`,
      notes: [...(aligned.note ? [aligned.note] : []), ...t.notes],
    };
  } catch (e) {
    if (isEngineError(e)) return { ok: false, message: e.message };
    return { ok: false, message: `Fanwise could not total these series (${e instanceof Error ? e.message : String(e)}).` };
  }
}
