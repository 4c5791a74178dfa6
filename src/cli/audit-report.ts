// The audit report: one self-contained HTML page an auditor can attach to a review. No scripts, no
// outside requests (a Content-Security-Policy that allows nothing but the inline style), charts as
// inline SVG; every number carries its full-precision value (data-value), equal to --json's.
import { esc } from "../chart";
import type { AuditRowJson } from "./audit-json";

/** What the report shows. */
export interface ReportInput {
  /** The data file's name (not its folder) and its SHA-256 checksum in hex. */
  fileName: string;
  sha256: string;
  /** When the report was made (ISO 8601, UTC). */
  date: string;
  /** The settings as [option, value] pairs, and the command line. */
  settings: [string, string][];
  command: string;
  json: ReturnType<typeof import("./audit-json").auditJson>;
  /** Inline SVG charts with a heading each. */
  charts: { heading: string; svg: string }[];
  cautions: string[];
}

function num(v: number | null, kind: "p" | "pct" | "n" | "x"): string {
  if (v === null) return `<td class="num na">n/a</td>`;
  const shown = kind === "pct" ? `${(100 * v).toFixed(1)}%` : kind === "n" ? String(v) : kind === "p" ? (v < 0.001 ? v.toExponential(1) : v.toFixed(3)) : Number(v.toPrecision(5)).toString();
  return `<td class="num" data-value="${String(v)}">${shown}</td>`;
}

function inlineSvg(svg: string): string {
  // Inline SVG in HTML needs no namespace attribute; dropping it leaves no URL on the page.
  return svg.replace(' xmlns="http://www.w3.org/2000/svg"', "");
}

const STYLE = `
body{font-family:system-ui,-apple-system,'Segoe UI',Roboto,sans-serif;color:#3b3b3b;background:#fffdf8;margin:24px;max-width:1100px}
h1{font-size:20px;margin:0 0 4px}h2{font-size:15px;margin:24px 0 8px;border-bottom:1px solid #e2dccf;padding-bottom:2px}
table{border-collapse:collapse;font-size:12px;margin:4px 0}th,td{border:1px solid #e2dccf;padding:3px 6px;text-align:left;vertical-align:top}
td.num{text-align:right;font-variant-numeric:tabular-nums}.zone-green{background:#e3efd9}.zone-yellow{background:#f6e7b8}.zone-red{background:#f0cfc4}
.meta td:first-child{color:#6b665d}.verdict{min-width:280px;max-width:460px}code{font-size:12px}figure{margin:8px 0 16px}figcaption{font-size:12px;color:#6b665d}
.cautions li{margin:4px 0}`;

/**
 * The report page: header (file, checksum, date, settings), the verdict table (every row of the
 * audit: counts, coverage with its Clopper–Pearson interval, the tests, the interval score, the
 * zone and the verdict in words), the calibration table when quantiles were given, the charts
 * inline, the notes and the cautions. Self-contained: no script, no link, no outside URL.
 * @example auditReportHtml(input).startsWith("<!DOCTYPE html>") // true
 */
export function auditReportHtml(r: ReportInput): string {
  const j = r.json;
  const p: string[] = [];
  p.push("<!DOCTYPE html>");
  p.push(`<html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(`Coverage audit of ${r.fileName}`)}</title><style>${STYLE}</style></head><body>`);
  p.push(`<h1>Coverage audit of ${esc(r.fileName)}</h1>`);
  p.push(`<table class="meta"><tbody>`);
  p.push(`<tr><td>data file</td><td id="file-name">${esc(r.fileName)}</td></tr>`);
  p.push(`<tr><td>SHA-256</td><td><code id="sha256">${esc(r.sha256)}</code></td></tr>`);
  p.push(`<tr><td>made</td><td id="date">${esc(r.date)} by fanwise audit</td></tr>`);
  p.push(`<tr><td>command</td><td><code>${esc(r.command)}</code></td></tr>`);
  for (const [k, v] of r.settings) p.push(`<tr><td>${esc(k)}</td><td>${esc(v)}</td></tr>`);
  p.push(`<tr><td>rows</td><td>${j.used} used, ${j.skipped} skipped for blanks</td></tr>`);
  p.push(`</tbody></table>`);
  if (j.rows.length) {
    p.push(`<h2>Verdicts</h2>`);
    p.push(`<table id="verdicts"><thead><tr>${["group", "step", "level", "n", "misses", "above", "below", "coverage", "95% interval", "Kupiec p", "independence p", "conditional p", "binomial tail", "interval score", "zone", "verdict"].map((h) => `<th>${h}</th>`).join("")}</tr></thead><tbody>`);
    for (const row of j.rows as AuditRowJson[]) {
      p.push(`<tr class="zone-${row.zone}">`
        + `<td class="group">${esc(row.group ?? "")}</td><td class="num" data-value="${row.h ?? ""}">${row.h ?? ""}</td><td class="num" data-value="${row.level}">${row.level}%</td>`
        + num(row.n, "n") + num(row.misses, "n") + num(row.above, "n") + num(row.below, "n") + num(row.coverage, "pct")
        + `<td class="num">${(100 * row.coverageInterval[0]).toFixed(1)}–${(100 * row.coverageInterval[1]).toFixed(1)}%</td>`
        + num(row.kupiec.p, "p") + num(row.independence.p, "p") + num(row.conditional.p, "p") + num(row.binomialTail, "p") + num(row.intervalScore, "x")
        + `<td class="zone">${row.zone}</td><td class="verdict"><strong>${esc(row.headline)}</strong>. ${esc(row.verdict.slice(row.headline.length + 2))}</td></tr>`);
    }
    p.push(`</tbody></table>`);
  }
  const cal = j.calibration as { quantiles: { p: number; n: number; atOrBelow: number; hitRate: number; interval: [number, number]; kupiec: { p: number }; pinball: number }[]; intervals: { level: number; n: number; coverage: number; interval: [number, number]; kupiec: { p: number } }[] } | undefined;
  if (cal) {
    p.push(`<h2>Calibration of the quantiles</h2>`);
    p.push(`<table id="calibration"><thead><tr>${["p", "n", "at or below", "hit rate", "95% interval", "Kupiec p", "pinball loss"].map((h) => `<th>${h}</th>`).join("")}</tr></thead><tbody>`);
    for (const q of cal.quantiles) p.push(`<tr>${num(q.p, "x")}${num(q.n, "n")}${num(q.atOrBelow, "n")}${num(q.hitRate, "pct")}<td class="num">${(100 * q.interval[0]).toFixed(1)}–${(100 * q.interval[1]).toFixed(1)}%</td>${num(q.kupiec.p, "p")}${num(q.pinball, "x")}</tr>`);
    p.push(`</tbody></table>`);
    if (cal.intervals.length) {
      p.push(`<table id="calibration-intervals"><thead><tr>${["central interval", "n", "coverage", "95% interval", "Kupiec p"].map((h) => `<th>${h}</th>`).join("")}</tr></thead><tbody>`);
      for (const i of cal.intervals) p.push(`<tr>${num(i.level, "x")}${num(i.n, "n")}${num(i.coverage, "pct")}<td class="num">${(100 * i.interval[0]).toFixed(1)}–${(100 * i.interval[1]).toFixed(1)}%</td>${num(i.kupiec.p, "p")}</tr>`);
      p.push(`</tbody></table>`);
    }
  }
  if (r.charts.length) {
    p.push(`<h2>Charts</h2>`);
    for (const c of r.charts) p.push(`<figure>${inlineSvg(c.svg)}<figcaption>${esc(c.heading)}</figcaption></figure>`);
  }
  p.push(`<h2>How the verdict is reached</h2>`);
  p.push(`<p>Each row is judged at the 5% level, two-sided: <strong>Too many misses</strong> when Kupiec's test rejects with coverage below the promise (or the miss count is in the red zone); otherwise <strong>Misses cluster</strong> when Christoffersen's independence test rejects; otherwise <strong>Intervals too wide (too few misses)</strong> when Kupiec's test rejects with coverage above the promise; a rejection by the conditional-coverage test alone is named by its larger part; otherwise <strong>Consistent with the promised coverage</strong>. The zone shown is the miss-count zone raised to yellow (red below 1%) whenever a test rejects, so it is green only beside a clean verdict.</p>`);
  const notes = [...j.notes];
  if (notes.length) p.push(`<h2>How the data were read</h2><ul>${notes.map((n) => `<li>${esc(n)}</li>`).join("")}</ul>`);
  p.push(`<h2>Cautions</h2><ul class="cautions">${r.cautions.map((c) => `<li>${esc(c)}</li>`).join("")}</ul>`);
  p.push(`</body></html>`);
  return p.join("\n") + "\n";
}
