// Pure geometry and SVG for the calibration chart: promised (nominal) against observed coverage,
// one point per level or quantile, each with its binomial error bar, and the diagonal where a
// calibrated forecast lies.
import { AUDIT_COLORS, esc, FONT } from "./svg-text";

/** One point: promised and observed shares (0–1), the observed share's error bar, a label. */
export interface CalibrationPoint {
  nominal: number;
  observed: number;
  low: number;
  high: number;
  label: string;
  /** Rows behind the point. */
  n: number;
}

/** What the chart shows. */
export interface CalibrationChartInput {
  points: readonly CalibrationPoint[];
  title?: string;
  /** "coverage" (intervals: share inside) or "quantile" (share at or below). */
  kind?: "coverage" | "quantile";
  /** Square plot side plus margins (default 300). */
  width?: number;
}

/** Where everything goes, in pixels. */
export interface CalibrationGeometry {
  width: number;
  height: number;
  plot: { left: number; right: number; top: number; bottom: number };
  /** Axis range (shares), the same on both axes. */
  range: [number, number];
  ticks: number[];
  x: (share: number) => number;
  y: (share: number) => number;
  points: { cx: number; cy: number; y1: number; y2: number; label: string; inside: boolean }[];
}

/**
 * Lays out the chart: the same range on both axes (from the lowest to the highest share among the
 * nominal values and error bars, rounded out to 10%), so the diagonal is at 45°; a point whose
 * error bar misses the diagonal is flagged (`inside: false`). Common practice for reliability
 * diagrams; the bars are Clopper–Pearson 95% intervals (Clopper & Pearson 1934).
 * @example calibrationGeometry({ points: [{ nominal: 0.8, observed: 0.7, low: 0.6, high: 0.78, label: "80%", n: 100 }] }).points[0].inside // false
 */
export function calibrationGeometry(input: CalibrationChartInput): CalibrationGeometry {
  const width = input.width ?? 300;
  const top = input.title ? 24 : 10;
  const left = 40;
  const side = width - left - 12;
  const plot = { left, right: left + side, top, bottom: top + side };
  const vals = input.points.flatMap((p) => [p.nominal, p.low, p.high, p.observed]);
  let lo = Math.max(0, Math.floor((Math.min(...vals, 1) - 0.02) * 10) / 10);
  let hi = Math.min(1, Math.ceil((Math.max(...vals, 0) + 0.02) * 10) / 10);
  if (!(hi > lo)) { lo = 0; hi = 1; }
  const step = hi - lo > 0.5 ? 0.2 : 0.1;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step - 1e-9) * step; t <= hi + 1e-9; t += step) ticks.push(Number(t.toFixed(6)));
  const x = (s: number): number => plot.left + ((s - lo) / (hi - lo)) * side;
  const y = (s: number): number => plot.bottom - ((s - lo) / (hi - lo)) * side;
  const points = input.points.map((p) => ({ cx: x(p.nominal), cy: y(p.observed), y1: y(p.high), y2: y(p.low), label: p.label, inside: p.low <= p.nominal && p.nominal <= p.high }));
  return { width, height: plot.bottom + 56, plot, range: [lo, hi], ticks, x, y, points };
}

/**
 * The calibration chart as a self-contained SVG (no scripts, no external references).
 * @example calibrationChartSvg({ points: [{ nominal: 0.8, observed: 0.7, low: 0.6, high: 0.78, label: "80%", n: 100 }] }).startsWith("<svg") // true
 */
export function calibrationChartSvg(input: CalibrationChartInput): string {
  const g = calibrationGeometry(input);
  const what = input.kind === "quantile" ? "share of actuals at or below the quantile" : "observed coverage";
  const promised = input.kind === "quantile" ? "quantile probability" : "promised coverage";
  const pct = (s: number): string => `${Number((100 * s).toFixed(1))}%`;
  const desc = `Calibration: ${what} against ${promised}, ${input.points.map((p) => `${p.label}: ${pct(p.observed)} (bar ${pct(p.low)}–${pct(p.high)})`).join("; ")}`;
  const p: string[] = [];
  p.push(`<svg xmlns="http://www.w3.org/2000/svg" class="fw-calibration" width="${g.width}" height="${g.height}" viewBox="0 0 ${g.width} ${g.height}" role="img" aria-label="${esc(desc)}" font-family="${FONT}">`);
  p.push(`<title>${esc(desc)}</title>`);
  p.push(`<rect width="100%" height="100%" fill="${AUDIT_COLORS.paper}"/>`);
  if (input.title) p.push(`<text x="${g.plot.left}" y="15" font-size="11" font-weight="600" fill="${AUDIT_COLORS.text}">${esc(input.title)}</text>`);
  for (const t of g.ticks) {
    const xx = g.x(t).toFixed(1), yy = g.y(t).toFixed(1);
    p.push(`<line x1="${g.plot.left}" x2="${g.plot.right}" y1="${yy}" y2="${yy}" stroke="${AUDIT_COLORS.grid}"/>`);
    p.push(`<line x1="${xx}" x2="${xx}" y1="${g.plot.top}" y2="${g.plot.bottom}" stroke="${AUDIT_COLORS.grid}"/>`);
    p.push(`<text x="${g.plot.left - 4}" y="${(g.y(t) + 3).toFixed(1)}" font-size="9" text-anchor="end" fill="${AUDIT_COLORS.axis}">${pct(t)}</text>`);
    p.push(`<text x="${xx}" y="${g.plot.bottom + 12}" font-size="9" text-anchor="middle" fill="${AUDIT_COLORS.axis}">${pct(t)}</text>`);
  }
  const [lo, hi] = g.range;
  p.push(`<line class="diagonal" x1="${g.x(lo).toFixed(1)}" y1="${g.y(lo).toFixed(1)}" x2="${g.x(hi).toFixed(1)}" y2="${g.y(hi).toFixed(1)}" stroke="${AUDIT_COLORS.diagonal}" stroke-dasharray="4 3"/>`);
  p.push(`<rect x="${g.plot.left}" y="${g.plot.top}" width="${g.plot.right - g.plot.left}" height="${g.plot.bottom - g.plot.top}" fill="none" stroke="${AUDIT_COLORS.axis}"/>`);
  for (const q of g.points) {
    const colour = q.inside ? AUDIT_COLORS.text : AUDIT_COLORS.above;
    p.push(`<line class="error-bar" x1="${q.cx.toFixed(1)}" x2="${q.cx.toFixed(1)}" y1="${q.y1.toFixed(1)}" y2="${q.y2.toFixed(1)}" stroke="${colour}" stroke-width="1.5"/>`);
    for (const yy of [q.y1, q.y2]) p.push(`<line x1="${(q.cx - 3).toFixed(1)}" x2="${(q.cx + 3).toFixed(1)}" y1="${yy.toFixed(1)}" y2="${yy.toFixed(1)}" stroke="${colour}" stroke-width="1.5"/>`);
    p.push(`<circle class="point${q.inside ? "" : " off"}" cx="${q.cx.toFixed(1)}" cy="${q.cy.toFixed(1)}" r="3.5" fill="${colour}"/>`);
    p.push(`<text x="${(q.cx + 6).toFixed(1)}" y="${(q.cy - 4).toFixed(1)}" font-size="9" fill="${AUDIT_COLORS.text}">${esc(q.label)}</text>`);
  }
  p.push(`<text x="${((g.plot.left + g.plot.right) / 2).toFixed(1)}" y="${g.plot.bottom + 25}" font-size="9" text-anchor="middle" fill="${AUDIT_COLORS.text}">${promised}</text>`);
  p.push(`<text class="legend" x="${g.plot.left}" y="${g.plot.bottom + 38}" font-size="9" fill="${AUDIT_COLORS.text}">dot: ${what}; dashed line: calibrated</text>`);
  p.push(`<text class="legend" x="${g.plot.left}" y="${g.plot.bottom + 50}" font-size="9" fill="${AUDIT_COLORS.text}">bar: 95% binomial interval (Clopper–Pearson)</text>`);
  p.push("</svg>");
  return p.join("\n");
}

/** The parts of an audit row the calibration chart reads (see the engine's AuditRow). */
export interface CoverageLike { level: number; coverage: number; coverageInterval: [number, number]; n: number }

/**
 * Points of the calibration chart from audit rows, one per level (promised vs observed coverage,
 * with the rows' Clopper–Pearson bars).
 * @example coveragePoints([{ level: 80, coverage: 0.75, coverageInterval: [0.66, 0.83], n: 100 }])[0].label // "80%"
 */
export function coveragePoints(rows: readonly CoverageLike[]): CalibrationPoint[] {
  return rows.map((r) => ({ nominal: r.level / 100, observed: r.coverage, low: r.coverageInterval[0], high: r.coverageInterval[1], label: `${r.level}%`, n: r.n }));
}
