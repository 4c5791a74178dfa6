// Pure geometry and SVG for the hit strip: one cell per audited row, oldest first, coloured by
// whether the actual fell inside its interval, above it or below it, with a legend and a time axis.
import { AUDIT_COLORS, esc, FONT } from "./svg-text";

/** What the strip shows. */
export interface HitStripInput {
  /** Per row, oldest first: 0 inside (a hit), 1 above the upper end, −1 below the lower end. */
  sides: readonly (-1 | 0 | 1)[];
  /** Label of each row (a date or period); rows without one are named by position. */
  labels?: readonly (string | undefined)[];
  title?: string;
  /** Total width in pixels (default 320). */
  width?: number;
}

/** Where everything goes, in pixels. */
export interface HitStripGeometry {
  width: number;
  height: number;
  plot: { left: number; right: number; top: number; bottom: number };
  cells: { x: number; w: number; side: -1 | 0 | 1 }[];
  ticks: { x: number; label: string }[];
  legend: { x: number; y: number; kind: "hit" | "above" | "below"; label: string }[];
}

const LEGEND: { kind: "hit" | "above" | "below"; label: string }[] = [
  { kind: "hit", label: "hit (inside)" },
  { kind: "above", label: "miss above" },
  { kind: "below", label: "miss below" },
];

/**
 * Lays out the strip: cells fill the plot width (at most 12 px each), up to five ticks on the time
 * axis at evenly spaced rows (first and last always), and the legend below. Common practice for a
 * sequence chart.
 * @example hitStripGeometry({ sides: [0, 1, -1] }).cells.length // 3
 */
export function hitStripGeometry(input: HitStripInput): HitStripGeometry {
  const n = input.sides.length;
  const width = input.width ?? 320;
  const left = 8;
  const span = Math.min(width - 2 * left, Math.max(n, 1) * 12);
  const plot = { left, right: left + span, top: input.title ? 22 : 6, bottom: (input.title ? 22 : 6) + 18 };
  const w = span / Math.max(n, 1);
  const cells = input.sides.map((side, i) => ({ x: left + i * w, w, side }));
  const label = (i: number): string => input.labels?.[i] ?? `row ${i + 1}`;
  const ticks: { x: number; label: string }[] = [];
  if (n > 0) {
    const k = Math.min(n, 5);
    const seen = new Set<number>();
    for (let j = 0; j < k; j++) {
      const i = k === 1 ? 0 : Math.round((j * (n - 1)) / (k - 1));
      if (seen.has(i)) continue;
      seen.add(i);
      ticks.push({ x: left + (i + 0.5) * w, label: label(i) });
    }
  }
  const ly = plot.bottom + 30;
  const legend = LEGEND.map((l, j) => ({ ...l, x: left + j * 96, y: ly }));
  return { width, height: ly + 10, plot, cells, ticks, legend };
}

function fill(kind: "hit" | "above" | "below"): string {
  return AUDIT_COLORS[kind];
}

/**
 * The hit strip as a self-contained SVG (no scripts, no external references): cells, a time axis
 * with the rows' dates, and a legend (hit / miss above / miss below).
 * @example hitStripSvg({ sides: [0, 1, -1], labels: ["2024-01", "2024-02", "2024-03"] }).includes("miss below") // true
 */
export function hitStripSvg(input: HitStripInput): string {
  const g = hitStripGeometry(input);
  const above = input.sides.filter((s) => s === 1).length;
  const below = input.sides.filter((s) => s === -1).length;
  const n = input.sides.length;
  const desc = `Hits and misses over time, oldest first: ${n - above - below} inside, ${above} above, ${below} below`;
  const p: string[] = [];
  p.push(`<svg xmlns="http://www.w3.org/2000/svg" class="fw-hit-strip" width="${g.width}" height="${g.height}" viewBox="0 0 ${g.width} ${g.height}" role="img" aria-label="${esc(desc)}" font-family="${FONT}">`);
  p.push(`<title>${esc(input.title ? `${input.title}: ${desc}` : desc)}</title>`);
  if (input.title) p.push(`<text x="${g.plot.left}" y="14" font-size="11" font-weight="600" fill="${AUDIT_COLORS.text}">${esc(input.title)}</text>`);
  const gap = g.cells.length && g.cells[0].w > 3 ? 1 : 0;
  for (const c of g.cells) {
    const kind = c.side === 0 ? "hit" : c.side === 1 ? "above" : "below";
    const hh = g.plot.bottom - g.plot.top;
    // misses above sit in the upper half's colour block, below in the lower: the shape says it too
    const y = c.side === 1 ? g.plot.top : c.side === -1 ? g.plot.top + hh / 3 : g.plot.top + hh / 6;
    const h = (2 * hh) / 3;
    p.push(`<rect class="${c.side === 0 ? "hit" : `miss miss-${kind}`}" x="${c.x.toFixed(2)}" y="${y.toFixed(1)}" width="${Math.max(c.w - gap, 0.5).toFixed(2)}" height="${h.toFixed(1)}" fill="${fill(kind)}"/>`);
  }
  p.push(`<line x1="${g.plot.left}" x2="${g.plot.right.toFixed(1)}" y1="${g.plot.bottom + 1}" y2="${g.plot.bottom + 1}" stroke="${AUDIT_COLORS.axis}" stroke-width="1"/>`);
  g.ticks.forEach((t, j) => {
    const anchor = g.ticks.length > 1 && j === 0 ? "start" : j === g.ticks.length - 1 && g.ticks.length > 1 ? "end" : "middle";
    const tx = anchor === "start" ? g.plot.left : anchor === "end" ? g.plot.right : t.x;
    p.push(`<line x1="${t.x.toFixed(1)}" x2="${t.x.toFixed(1)}" y1="${g.plot.bottom + 1}" y2="${g.plot.bottom + 4}" stroke="${AUDIT_COLORS.axis}" stroke-width="1"/>`);
    p.push(`<text class="tick" x="${tx.toFixed(1)}" y="${g.plot.bottom + 14}" font-size="9" text-anchor="${anchor}" fill="${AUDIT_COLORS.axis}">${esc(t.label)}</text>`);
  });
  for (const l of g.legend) {
    p.push(`<rect x="${l.x}" y="${l.y - 7}" width="10" height="8" fill="${fill(l.kind)}"/>`);
    p.push(`<text class="legend" x="${l.x + 14}" y="${l.y}" font-size="9" fill="${AUDIT_COLORS.text}">${l.label}</text>`);
  }
  p.push("</svg>");
  return p.join("\n");
}
