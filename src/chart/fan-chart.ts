// Pure geometry and SVG for the fan chart (no DOM): history, 95/80/50% bands, the mean and median
// lines, a rule at the forecast origin, axes and a legend — in the look fixed for Fanwise.
import type { FanTable } from "../engine";

export const COLORS = {
  history: "#3b3b3b",
  band95: "#f4e3bf",
  band80: "#e9c27a",
  band50: "#d4973a",
  mean: "#5a2d82",
  median: "#5a2d82",
  rule: "#8a8378",
  axis: "#6b665d",
  text: "#3b3b3b",
  paper: "#fffdf8",
} as const;

/** What a chart needs: the history, the fan, and labels. */
export interface FanChartInput {
  title: string;
  history: number[];
  /** Labels for history then forecast periods (optional). */
  labels?: string[];
  fan: FanTable;
  width?: number;
  height?: number;
}

/** Screen geometry of the chart, in pixels (for tests and for the SVG). */
export interface FanGeometry {
  width: number;
  height: number;
  plot: { left: number; right: number; top: number; bottom: number };
  x: (i: number) => number;
  y: (v: number) => number;
  yTicks: number[];
  origin: number;
  history: [number, number][];
  mean: [number, number][];
  median: [number, number][];
  bands: { level: number; upper: [number, number][]; lower: [number, number][] }[];
}

function niceStep(span: number, target: number): number {
  const raw = span / Math.max(target, 1);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  for (const k of [1, 2, 2.5, 5, 10]) if (raw <= k * mag) return k * mag;
  return 10 * mag;
}

/**
 * Lays out the chart: x by period (history then steps), y from the data's range including every
 * band end that exists. Band ends that do not exist (an unbounded upper end) are drawn to the top.
 * @example fanGeometry({ title: "x", history: [1, 2], fan }).bands.length // one per level (+50%)
 */
export function fanGeometry(input: FanChartInput): FanGeometry {
  const width = input.width ?? 320;
  const height = input.height ?? 220;
  const twoRowLegend = width < 420;
  const plot = { left: 46, right: width - 8, top: 26, bottom: height - (twoRowLegend ? 52 : 40) };
  const hist = input.history;
  const rows = input.fan.rows;
  const total = hist.length + rows.length;
  const values: number[] = [...hist];
  for (const r of rows) {
    for (const m of [r.mean, r.median]) if (m.value !== null) values.push(m.value);
    for (const [lo, hi] of Object.values(r.intervals)) {
      if (lo.value !== null) values.push(lo.value);
      if (hi.value !== null) values.push(hi.value);
    }
  }
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (!(hi > lo)) { hi = lo + 1; lo = lo - 1; }
  const step = niceStep(hi - lo, 4);
  const yMin = Math.floor(lo / step) * step;
  const yMax = Math.ceil(hi / step) * step;
  const yTicks: number[] = [];
  for (let v = yMin; v <= yMax + step / 2; v += step) yTicks.push(Number(v.toPrecision(12)));
  const x = (i: number): number => plot.left + ((plot.right - plot.left) * i) / Math.max(total - 1, 1);
  const y = (v: number): number => plot.bottom - ((plot.bottom - plot.top) * (v - yMin)) / (yMax - yMin);
  const origin = hist.length - 1;
  const at = (i: number, v: number | null): [number, number] => [x(i), v === null ? plot.top : y(v)];
  const levels = Object.keys(rows[0]?.intervals ?? {}).map(Number).sort((a, b) => b - a);
  const last = hist[hist.length - 1];
  const bands = levels.map((level) => ({
    level,
    upper: [at(origin, last), ...rows.map((r, k) => at(origin + 1 + k, r.intervals[String(level)][1].value))],
    lower: [at(origin, last), ...rows.map((r, k) => at(origin + 1 + k, r.intervals[String(level)][0].value))],
  }));
  return {
    width, height, plot, x, y, yTicks, origin,
    history: hist.map((v, i) => [x(i), y(v)]),
    mean: [at(origin, last), ...rows.map((r, k) => at(origin + 1 + k, r.mean.value))],
    median: [at(origin, last), ...rows.map((r, k) => at(origin + 1 + k, r.median.value))],
    bands,
  };
}

/**
 * An SVG path through the points: "M x y L x y …", closed with Z only when asked. Lines are open
 * paths, not polylines, because some renderers close a polyline back to its first point.
 * @example pathData([[0, 0], [1, 2]]) // "M0.0 0.0 L1.0 2.0"
 */
export function pathData(p: [number, number][], close = false): string {
  return p.map(([a, b], i) => `${i === 0 ? "M" : "L"}${a.toFixed(1)} ${b.toFixed(1)}`).join(" ") + (close ? " Z" : "");
}

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

function short(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e6) return `${Number((v / 1e6).toPrecision(3))}M`;
  if (a >= 1e3) return `${Number((v / 1e3).toPrecision(3))}k`;
  return String(Number(v.toPrecision(3)));
}

/**
 * The fan chart as a self-contained SVG document (no scripts, no external references).
 * @example fanChartSvg({ title: "Harbour Street", history, fan }).startsWith("<svg") // true
 */
export function fanChartSvg(input: FanChartInput): string {
  const g = fanGeometry(input);
  const bandColor = (l: number): string => (l >= 95 ? COLORS.band95 : l >= 80 ? COLORS.band80 : COLORS.band50);
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${g.width}" height="${g.height}" viewBox="0 0 ${g.width} ${g.height}" role="img" aria-label="${esc(`Fan chart: ${input.title}`)}" font-family="system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif">`);
  parts.push(`<title>${esc(`Fan chart: ${input.title}`)}</title>`);
  parts.push(`<rect width="100%" height="100%" fill="${COLORS.paper}"/>`);
  parts.push(`<text x="${g.plot.left}" y="16" font-size="12" font-weight="600" fill="${COLORS.text}">${esc(input.title)}</text>`);
  for (const t of g.yTicks) {
    const yy = g.y(t).toFixed(1);
    parts.push(`<line x1="${g.plot.left}" x2="${g.plot.right}" y1="${yy}" y2="${yy}" stroke="#ece6da" stroke-width="1"/>`);
    parts.push(`<text x="${g.plot.left - 4}" y="${(g.y(t) + 3).toFixed(1)}" font-size="9" text-anchor="end" fill="${COLORS.axis}">${short(t)}</text>`);
  }
  for (const b of g.bands) {
    parts.push(`<path class="band band-${b.level}" d="${pathData([...b.upper, ...b.lower.slice().reverse()], true)}" fill="${bandColor(b.level)}" stroke="none"/>`);
  }
  const ox = g.x(g.origin).toFixed(1);
  parts.push(`<line class="origin" x1="${ox}" x2="${ox}" y1="${g.plot.top}" y2="${g.plot.bottom}" stroke="${COLORS.rule}" stroke-width="1"/>`);
  parts.push(`<path class="history" d="${pathData(g.history)}" fill="none" stroke="${COLORS.history}" stroke-width="1.5"/>`);
  parts.push(`<path class="mean" d="${pathData(g.mean)}" fill="none" stroke="${COLORS.mean}" stroke-width="2"/>`);
  parts.push(`<path class="median" d="${pathData(g.median)}" fill="none" stroke="${COLORS.median}" stroke-width="1"/>`);
  for (const [a, b] of g.median.slice(1)) {
    parts.push(`<path class="median-marker" d="M${a.toFixed(1)} ${(b - 3).toFixed(1)} l3 3 l-3 3 l-3 -3 z" fill="${COLORS.median}"/>`);
  }
  parts.push(`<line x1="${g.plot.left}" x2="${g.plot.right}" y1="${g.plot.bottom}" y2="${g.plot.bottom}" stroke="${COLORS.axis}" stroke-width="1"/>`);
  const labels = input.labels;
  if (labels && labels.length) {
    const first = labels[0];
    const atOrigin = labels[g.origin] ?? "";
    const lastLabel = labels[labels.length - 1] ?? "";
    // Three labels under the axis: the first period, the last observed one (at the divider) and the
    // last forecast one. Widths are estimated (about 5.5 px a character at 9 px): when the divider's
    // label would run into the last one it ends at the divider instead, and it is left out when it
    // would then run into the first.
    const width = (t: string): number => 5.5 * t.length;
    const o = g.x(g.origin);
    const firstEnd = g.plot.left + width(first) + 4;
    const lastStart = g.plot.right - width(lastLabel) - 4;
    parts.push(`<text x="${g.plot.left}" y="${g.plot.bottom + 11}" font-size="9" fill="${COLORS.axis}">${esc(first)}</text>`);
    if (o + width(atOrigin) / 2 <= lastStart && o - width(atOrigin) / 2 >= firstEnd) {
      parts.push(`<text x="${ox}" y="${g.plot.bottom + 11}" font-size="9" text-anchor="middle" fill="${COLORS.axis}">${esc(atOrigin)}</text>`);
    } else if (o - width(atOrigin) >= firstEnd && o <= lastStart + 2) {
      parts.push(`<text x="${ox}" y="${g.plot.bottom + 11}" font-size="9" text-anchor="end" fill="${COLORS.axis}">${esc(atOrigin)}</text>`);
    }
    parts.push(`<text x="${g.plot.right}" y="${g.plot.bottom + 11}" font-size="9" text-anchor="end" fill="${COLORS.axis}">${esc(lastLabel)}</text>`);
  }
  // legend (two rows in a narrow pane)
  const twoRows = g.width < 420;
  let ly = g.height - (twoRows ? 24 : 12);
  let lx = g.plot.left;
  const item = (kind: "mean" | "median" | number, label: string, w: number): void => {
    if (kind === "mean") parts.push(`<line x1="${lx}" x2="${lx + 12}" y1="${ly}" y2="${ly}" stroke="${COLORS.mean}" stroke-width="2"/>`);
    else if (kind === "median") parts.push(`<line x1="${lx}" x2="${lx + 12}" y1="${ly}" y2="${ly}" stroke="${COLORS.median}" stroke-width="1"/><path d="M${lx + 6} ${ly - 3} l3 3 l-3 3 l-3 -3 z" fill="${COLORS.median}"/>`);
    else parts.push(`<rect x="${lx}" y="${ly - 4}" width="12" height="8" fill="${bandColor(kind)}"/>`);
    parts.push(`<text x="${lx + 16}" y="${ly + 3}" font-size="9" fill="${COLORS.text}">${label}</text>`);
    lx += w;
  };
  item("mean", "mean", 44);
  item("median", "median", 52);
  if (twoRows) {
    ly += 12;
    lx = g.plot.left;
  }
  for (const b of g.bands.slice().sort((a, c) => a.level - c.level)) item(b.level, `${b.level}% band`, 66);
  parts.push("</svg>");
  return parts.join("\n");
}
