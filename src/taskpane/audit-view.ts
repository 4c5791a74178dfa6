// The coverage-audit view's model: the chosen columns (and an optional group column) in; per
// group the readout, the verdict with its colour, the hit strip with dates, and a calibration chart
// over every level whose lower/upper columns are named alike (lower80/upper80, low 95/high 95).
// Pure (no DOM, no Office).
import { auditLog, AuditLog, AuditRow, isEngineError, POOLED } from "../engine";
import { calibrationChartSvg, coveragePoints, hitStripSvg } from "../chart";
import type { PaneData } from "./view-model";

/** The controls of the audit view (column indexes; group "" for none, "c:J" a column, "l:K" a label column). */
export interface AuditControls {
  actual: number;
  lower: number;
  upper: number;
  level: number;
  group: string;
  /** The group to show (a name, or POOLED); the first group when absent or unknown. */
  show?: string;
}

/** What the audit view shows. */
export type AuditLogView =
  | {
    ok: true;
    log: AuditLog;
    /** Groups to choose from (with POOLED last when there are several); empty without a group column. */
    choices: string[];
    shown: string;
    row: AuditRow;
    lines: [string, string][];
    verdict: string;
    colour: string;
    strip: string;
    calibration: string;
    notes: string[];
  }
  | { ok: false; message: string };

const LEVEL_IN_NAME = /(\d{2}(?:\.\d+)?)\s*%?\s*$/;

/**
 * Other levels in the data: a column named like the chosen lower end with another number
 * ("lower95" beside "lower80") and its upper twin, so the calibration chart shows every level.
 * @example otherLevels(["actual", "lower80", "upper80", "lower95", "upper95"], 1, 2) // [{ level: 95, lower: 3, upper: 4 }]
 */
export function otherLevels(names: readonly string[], lower: number, upper: number): { level: number; lower: number; upper: number }[] {
  const stem = (s: string): string => s.replace(LEVEL_IN_NAME, "").trim().toLowerCase();
  const lo = names[lower] ?? "", hi = names[upper] ?? "";
  if (!LEVEL_IN_NAME.test(lo) || !LEVEL_IN_NAME.test(hi)) return [];
  const out: { level: number; lower: number; upper: number }[] = [];
  names.forEach((n, j) => {
    if (j === lower || stem(n) !== stem(lo)) return;
    const m = LEVEL_IN_NAME.exec(n);
    if (!m) return;
    const k = names.findIndex((u) => stem(u) === stem(hi) && LEVEL_IN_NAME.exec(u)?.[1] === m[1]);
    const level = Number(m[1]);
    if (k >= 0 && k !== upper && level >= 50 && level < 100) out.push({ level, lower: j, upper: k });
  });
  return out;
}

const p = (x: number | null): string => (x === null ? "n/a" : x < 0.001 ? x.toExponential(1) : x.toFixed(3));

/**
 * The choices of the series (group) column: none, every column of labels, then every column.
 * A column named like series/shop/group/item is picked first.
 * @example groupChoices({ source: "", names: ["actual"], columns: [[]], labelColumns: [{ name: "series", values: [] }], headerRows: 1 }).pick // "l:0"
 */
export function groupChoices(data: PaneData): { options: [string, string][]; pick: string } {
  const options: [string, string][] = [["", "(none: one series)"], ...(data.labelColumns ?? []).map((l, k): [string, string] => [`l:${k}`, l.name]), ...data.names.map((n, j): [string, string] => [`c:${j}`, n])];
  const named = options.find(([v, n]) => v !== "" && /^(series|shop|store|group|item|sku|product)$/i.test(n.trim()));
  return { options, pick: named ? named[0] : "" };
}

/**
 * Audits the chosen columns, by group when a group column is chosen, and shapes the chosen
 * group's result for the pane (readout lines, verdict, zone colour, strip with dates, calibration
 * chart over the levels found by name).
 * @example auditLogView(data, { actual: 5, lower: 1, upper: 2, level: 80, group: "l:0" }).ok
 */
export function auditLogView(data: PaneData, c: AuditControls): AuditLogView {
  try {
    const col = (j: number) => data.columns[j] ?? [];
    const more = otherLevels(data.names, c.lower, c.upper).filter((o) => o.level !== c.level);
    const intervals = [{ level: c.level, lower: col(c.lower), upper: col(c.upper) }, ...more.map((o) => ({ level: o.level, lower: col(o.lower), upper: col(o.upper) }))];
    const gm = /^([cl]):(\d+)$/.exec(c.group);
    const groups = !gm ? null : gm[1] === "c" ? col(Number(gm[2])) : data.labelColumns?.[Number(gm[2])]?.values ?? null;
    let log: AuditLog;
    try {
      log = auditLog({ actual: col(c.actual), intervals, groups, firstRow: 1 + data.headerRows });
    } catch (e) {
      // The extra levels are a convenience: if they are the problem, audit the chosen pair alone.
      if (!more.length) throw e;
      log = auditLog({ actual: col(c.actual), intervals: intervals.slice(0, 1), groups, firstRow: 1 + data.headerRows });
    }
    const choices = log.groups.length > 1 ? [...log.groups, POOLED] : log.groups.slice();
    const shown = c.show && choices.includes(c.show) ? c.show : choices[0] ?? "";
    const rowsOf = (g: string) => log.rows.filter((r) => (choices.length ? r.group === g : true));
    const row = rowsOf(shown).find((r) => r.level === c.level) as AuditRow;
    const lines: [string, string][] = [
      ["observed coverage", `${(100 * row.coverage).toFixed(1)}% of ${row.n} (nominal ${(100 * row.nominal).toFixed(0)}%; 95% interval ${(100 * row.coverageInterval[0]).toFixed(1)}–${(100 * row.coverageInterval[1]).toFixed(1)}%)`],
      ["misses", `${row.misses} (${row.above} above, ${row.below} below)${log.skipped ? `; ${log.skipped} rows skipped for blanks` : ""}`],
      ["Kupiec (miss rate)", `p = ${p(row.kupiec.p)}`],
      ["independence (clustering)", `p = ${p(row.independence.note ? null : row.independence.p)}`],
      ["conditional coverage", `p = ${p(row.conditional.p)}`],
      ["zone", row.verdict.colour],
      ["mean interval score", row.intervalScore.toPrecision(5)],
    ];
    const labels = row.rows.map((i) => data.rowLabels?.[i] ?? `row ${i + 1 + data.headerRows}`);
    const strip = row.pooled ? "" : hitStripSvg({ sides: row.sides, labels, width: 300 });
    const calRows = log.levels.map((lv) => rowsOf(shown).find((r) => r.level === lv)).filter((r): r is AuditRow => r !== undefined);
    const calibration = calibrationChartSvg({ points: coveragePoints(calRows), title: `Calibration${shown ? ` (${shown})` : ""}`, width: 300 });
    return { ok: true, log, choices, shown, row, lines, verdict: `${row.verdict.headline}. ${row.verdict.text}`, colour: row.verdict.colour, strip, calibration, notes: log.notes };
  } catch (e) {
    if (isEngineError(e)) return { ok: false, message: e.message };
    return { ok: false, message: `Fanwise could not audit this (${e instanceof Error ? e.message : String(e)}).` };
  }
}
