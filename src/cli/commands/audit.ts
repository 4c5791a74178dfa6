// fanwise audit: did published intervals cover the actuals as often as their level says? By series
// (--by), by step ahead (--horizon-col), at several levels, and for quantile columns; with a chart
// (--chart) and a self-contained report (--report).
import * as crypto from "crypto";
import * as fs from "fs";
import * as path from "path";
import { auditLog, calibrationTable, EngineError, isEngineError, POOLED, RawCell } from "../../engine";
import type { AuditLog, Calibration } from "../../engine";
import { calibrationChartSvg, coveragePoints, hitStripSvg } from "../../chart";
import type { CalibrationPoint } from "../../chart";
import { Command, IO_OPTIONS } from "../command";
import { emit } from "../output";
import { fileArgument, readInputTable } from "../series-input";
import { CellTable, cellTable } from "../table";
import { auditJson, rowJson } from "../audit-json";
import { auditReportHtml } from "../audit-report";

const SYNOPSIS = "fanwise audit FILE --actual COL --lower COL --upper COL --level P (or --quantiles COL=P,…).";
const EXAMPLE = "fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80";
const DATE_NAMES = /^(period|date|month|year|quarter|week|day|time|origin|target)$/i;

/** Cautions printed in every report (DESIGN.md's wording, plus what the tests assume). */
export const AUDIT_CAUTIONS = [
  "Forecasts are estimates from past patterns; intervals assume the model holds. Check results before committing money, and follow your organisation's forecasting and audit policies.",
  "The tests assume the rows of each series and step are forecasts from consecutive origins, in row order; a missing row shortens the sequence without a gap.",
  "A test that does not reject is not proof of good intervals: with few rows the tests have little power.",
  "For h > 1 the tests use every h-th origin with a Bonferroni bound (Diebold, Gunther & Tay 1998); in small subsamples (about 100 rows each) the clustering test can reject a little more often than its nominal 5% (the χ² approximation).",
];

function list(v: string | undefined): string[] {
  return (v ?? "").split(",").map((s) => s.trim()).filter((s) => s !== "");
}

export const auditCommand: Command = {
  name: "audit",
  summary: "check published intervals against actuals: coverage, misses, tests and one verdict, by series and step",
  args: "FILE",
  options: {
    actual: { type: { kind: "text" }, value: "COL", help: "column of actual values", example: "actual", required: SYNOPSIS },
    lower: { type: { kind: "text" }, value: "COL[,COL]", help: "column(s) of interval low ends, one per level", example: "lower80" },
    upper: { type: { kind: "text" }, value: "COL[,COL]", help: "column(s) of interval high ends, one per level", example: "upper80" },
    level: { type: { kind: "text" }, value: "P[,P]", help: "the intervals' level(s) in percent, one per pair of columns", example: "80" },
    quantiles: { type: { kind: "text" }, value: "COL=P,…", help: "quantile columns and their probabilities, lowest first: a calibration table", example: "q10=0.1,q50=0.5,q90=0.9" },
    by: { type: { kind: "text" }, value: "COL", help: "column naming the series of each row: one verdict per series plus a pooled row", example: "series" },
    "horizon-col": { type: { kind: "text" }, value: "COL", help: "column of steps ahead (1, 2, …): results per step", example: "h" },
    dates: { type: { kind: "text" }, value: "COL", help: "column of dates for the hit strip's axis (default: a column named date, month, period, …)", example: "month" },
    chart: { type: { kind: "text" }, value: "FILE.svg", help: "write the calibration chart (promised vs observed, with binomial error bars)", example: "calibration.svg" },
    report: { type: { kind: "text" }, value: "FILE.html", help: "write one self-contained page: file checksum, settings, every table, verdicts, charts, cautions", example: "audit.html" },
    ...IO_OPTIONS,
  },
  details: [
    "Several levels: --lower lower80,lower95 --upper upper80,upper95 --level 80,95 (a higher level must give an interval containing the lower level's, row by row).",
    "Verdicts (5% level, two-sided): Too many misses / Misses cluster / Intervals too wide (too few misses) / Consistent with the promised coverage. The zone shown is never green beside a rejecting test.",
  ],
  examples: [EXAMPLE, "fanwise audit log.csv --actual actual --lower lower80,lower95 --upper upper80,upper95 --level 80,95 --by series --horizon-col h --report audit.html"],
  async run(p, io) {
    const file = fileArgument(p, EXAMPLE);
    // CSV and workbooks alike through the shared reader, rows in the file's order (a forecast log
    // repeats periods, so no calendar); label text is kept (dates for the hit strip's axis).
    const read = await readInputTable(p, io, EXAMPLE, { calendar: false, keepLabels: true });
    const t: CellTable = cellTable(read.table, read.notes);
    const colIndex = (name: string, flag: string): number => {
      const j = t.header.indexOf(name);
      if (j < 0) throw new EngineError("input", `No column named "${name}" (for --${flag}). Columns: ${t.header.join(", ")}.`);
      return j;
    };
    const col = (name: string, flag: string): RawCell[] => t.cells(colIndex(name, flag));
    const actual = col(p.text("actual") as string, "actual");
    const lowers = list(p.text("lower")), uppers = list(p.text("upper")), levelTexts = list(p.text("level"));
    const quant = list(p.text("quantiles"));
    if (!lowers.length && !uppers.length && !levelTexts.length && !quant.length) throw new EngineError("input", `Give the intervals (--lower, --upper, --level) or quantile columns (--quantiles): ${SYNOPSIS}`);
    let log: AuditLog | null = null;
    if (lowers.length || uppers.length || levelTexts.length) {
      for (const k of ["lower", "upper", "level"]) if (!p.has(k)) throw new EngineError("input", `--${k} is required with intervals (${SYNOPSIS})`);
      if (lowers.length !== levelTexts.length || uppers.length !== levelTexts.length) {
        throw new EngineError("input", `Give one --lower and one --upper column per level: --level has ${levelTexts.length} (${levelTexts.join(", ")}), --lower ${lowers.length}, --upper ${uppers.length}. E.g. --lower lower80,lower95 --upper upper80,upper95 --level 80,95.`);
      }
      const levels = levelTexts.map((s) => {
        const v = Number(s);
        if (!Number.isFinite(v)) throw new EngineError("input", `--level must be percentages like 80 or 80,95; "${s}" is not a number.`);
        return v;
      });
      log = atFileLines(t, () => auditLog({
        actual,
        intervals: levels.map((level, k) => ({ level, lower: col(lowers[k], "lower"), upper: col(uppers[k], "upper") })),
        groups: p.has("by") ? col(p.text("by") as string, "by") : null,
        horizons: p.has("horizon-col") ? col(p.text("horizon-col") as string, "horizon-col") : null,
        firstRow: 1,
      }));
    }
    let cal: Calibration | null = null;
    if (quant.length) {
      const qs = quant.map((s) => {
        const m = /^(.*)=\s*([0-9.eE+-]+)$/.exec(s);
        if (!m || !Number.isFinite(Number(m[2]))) throw new EngineError("input", `--quantiles lists COLUMN=PROBABILITY pairs, e.g. --quantiles q10=0.1,q50=0.5,q90=0.9; "${s}" is not one.`);
        return { p: Number(m[2]), cells: col(m[1].trim(), "quantiles") };
      });
      cal = atFileLines(t, () => calibrationTable(actual, qs, 1));
    }
    const json = auditJson(log, cal);
    const single = log && !log.groups.length && !log.horizons.length && log.levels.length === 1 && !cal;
    await emit(io, p, {
      command: "audit",
      json: () => {
        if (!single || !log) return json;
        // One level, no groups, no steps: the one-object form (stable keys), with the verdict.
        const r = rowJson(log.rows[0], false);
        return { n: r.n, misses: r.misses, coverage: r.coverage, kupiec: r.kupiec, independence: r.independence, conditional: r.conditional, binomialTail: r.binomialTail, intervalScore: r.intervalScore, level: r.level, skipped: log.skipped, zone: r.zone, verdictCode: r.verdictCode, headline: r.headline, verdict: r.verdict, above: r.above, below: r.below, coverageInterval: r.coverageInterval, notes: [...log.notes, ...r.notes] };
      },
      header: log
        ? ["group", "h", "level", "n", "misses", "above", "below", "coverage", "coverage_low", "coverage_high", "kupiec_lr", "kupiec_p", "independence_lr", "independence_p", "conditional_lr", "conditional_p", "binomial_tail", "interval_score", "zone", "verdict", "details"]
        : ["p", "n", "at_or_below", "hit_rate", "low", "high", "kupiec_p", "pinball"],
      rows: () => log
        ? json.rows.map((r) => [r.group ?? "", r.h ?? "", r.level, r.n, r.misses, r.above, r.below, r.coverage, r.coverageInterval[0], r.coverageInterval[1], r.kupiec.lr, r.kupiec.p, r.independence.lr, r.independence.p ?? "", r.conditional.lr, r.conditional.p, r.binomialTail, r.intervalScore, r.zone, r.headline, r.verdict])
        : (cal as Calibration).rows.map((q) => [q.p, q.n, q.atOrBelow, q.hitRate, q.interval[0], q.interval[1], q.test.p, q.pinball]),
      cautions: [...t.notes, ...AUDIT_CAUTIONS],
    });
    const charts = auditCharts(log, cal, t, p.text("by"), p.text("dates"));
    if (p.has("chart")) fs.writeFileSync(p.text("chart") as string, charts[0].svg);
    if (p.has("report")) {
      const settings: [string, string][] = [];
      for (const k of ["actual", "lower", "upper", "level", "quantiles", "by", "horizon-col", "dates"]) if (p.has(k)) settings.push([`--${k}`, p.text(k) as string]);
      settings.push(["significance of the tests", "5%"]);
      const html = auditReportHtml({
        fileName: path.basename(file), sha256: sha256Of(file), date: new Date().toISOString().replace(/\.\d+Z$/, "Z"),
        settings, command: ["fanwise", "audit", path.basename(file), ...settings.filter(([k]) => k.startsWith("--")).flatMap(([k, v]) => [k, /[\s,;"']/.test(v) ? `"${v}"` : v])].join(" "),
        json, charts, cautions: AUDIT_CAUTIONS,
      });
      fs.writeFileSync(p.text("report") as string, html);
    }
    return 0;
  },
};

/** Runs f; a message naming "Row N" (data rows from 1) names the file's line instead. */
function atFileLines<T>(t: CellTable, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (isEngineError(e)) throw new EngineError(e.code, e.message.replace(/\bRow (\d+)/g, (_m, r) => t.where(Number(r) - 1).replace(/^./, (c) => c.toUpperCase())));
    throw e;
  }
}

/** SHA-256 of a file, read in 1 MiB pieces. */
function sha256Of(file: string): string {
  const h = crypto.createHash("sha256");
  const fd = fs.openSync(file, "r");
  try {
    const buf = Buffer.allocUnsafe(1 << 20);
    for (let got; (got = fs.readSync(fd, buf, 0, buf.length, null)) > 0;) h.update(buf.subarray(0, got));
  } finally {
    fs.closeSync(fd);
  }
  return h.digest("hex");
}

/** The calibration chart (first), then one hit strip per series, step and level (at most 24). */
function auditCharts(log: AuditLog | null, cal: Calibration | null, t: CellTable, by: string | undefined, dates: string | undefined): { heading: string; svg: string }[] {
  const out: { heading: string; svg: string }[] = [];
  if (log) {
    // One point per level: the pooled row (or the only row) at the first step.
    const firstH = log.horizons[0] ?? null;
    const rows = log.levels.map((lv) => log.rows.find((r) => r.level === lv && r.h === firstH && (r.pooled || log.groups.length <= 1)) ?? log.rows.find((r) => r.level === lv && r.h === firstH)).filter((r) => r !== undefined);
    const who = log.groups.length > 1 ? POOLED : log.groups[0] ?? "all rows";
    out.push({ heading: `Calibration: promised vs observed coverage per level (${who}${firstH !== null ? `, ${firstH} step${firstH === 1 ? "" : "s"} ahead` : ""}); bars are 95% Clopper–Pearson intervals.`, svg: calibrationChartSvg({ points: coveragePoints(rows), title: `Calibration (${who})`, kind: "coverage" }) });
  }
  if (cal) {
    const pts: CalibrationPoint[] = cal.rows.map((q) => ({ nominal: q.p, observed: q.hitRate, low: q.interval[0], high: q.interval[1], label: String(q.p), n: q.n }));
    out.push({ heading: "Calibration of the quantiles: share of actuals at or below each quantile, with 95% Clopper–Pearson intervals.", svg: calibrationChartSvg({ points: pts, title: "Quantile calibration", kind: "quantile" }) });
  }
  if (log) {
    const dateCol = dates ? t.header.indexOf(dates) : t.header.findIndex((h, j) => DATE_NAMES.test(h) && h !== by && t.isLabel(j));
    if (dates && dateCol < 0) throw new EngineError("input", `No column named "${dates}" (for --dates). Columns: ${t.header.join(", ")}.`);
    const labels = dateCol >= 0 ? t.labels(dateCol) : null;
    const strips = log.rows.filter((r) => !r.pooled);
    for (const r of strips.slice(0, 24)) {
      const name = `${r.group || "all rows"}${r.h !== null ? `, ${r.h} step${r.h === 1 ? "" : "s"} ahead` : ""}, ${r.level}%`;
      out.push({ heading: `Hits and misses over time: ${name} (${r.verdict.headline}).`, svg: hitStripSvg({ sides: r.sides, labels: r.rows.map((i) => (labels ? labels[i] : t.where(i))), title: name, width: 640 }) });
    }
    if (strips.length > 24) out.push({ heading: `${strips.length - 24} more hit strips are left out; run the audit with fewer levels or per series to see them.`, svg: "" });
  }
  return out.filter((c) => c.svg !== "" || /left out/.test(c.heading));
}
