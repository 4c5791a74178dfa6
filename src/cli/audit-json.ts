// The audit's results as plain objects: one place that both `--json` and the HTML report read, so
// the report's numbers are the JSON's numbers.
import type { AuditLog, AuditRow, Calibration } from "../engine";

/** One audited row as JSON (stable keys). */
export interface AuditRowJson {
  group: string | null;
  h: number | null;
  level: number;
  n: number;
  misses: number;
  above: number;
  below: number;
  coverage: number;
  coverageInterval: [number, number];
  kupiec: { lr: number; p: number };
  independence: { lr: number; p: number | null };
  conditional: { lr: number; p: number };
  binomialTail: number;
  intervalScore: number;
  /** The zone to show: by miss count, raised when a test rejects (never green beside a rejection). */
  zone: string;
  verdictCode: string;
  headline: string;
  verdict: string;
  adjustment: string;
  notes: string[];
}

/**
 * One audit row as JSON: group (null without groups), step (null without horizons), the counts,
 * the tests (independence p is null when there is nothing to test, with the reason in notes), the
 * zone to show and the verdict.
 * @example rowJson(log.rows[0]).headline // "Consistent with the promised coverage"
 */
export function rowJson(r: AuditRow, withGroups: boolean): AuditRowJson {
  return {
    group: withGroups ? r.group : null, h: r.h, level: r.level, n: r.n, misses: r.misses, above: r.above, below: r.below,
    coverage: r.coverage, coverageInterval: r.coverageInterval,
    kupiec: { lr: r.kupiec.lr, p: r.kupiec.p },
    independence: { lr: r.independence.lr, p: r.independence.note ? null : r.independence.p },
    conditional: { lr: r.conditional.lr, p: r.conditional.p },
    binomialTail: r.binomialTail, intervalScore: r.intervalScore,
    zone: r.verdict.colour, verdictCode: r.verdict.code, headline: r.verdict.headline, verdict: `${r.verdict.headline}. ${r.verdict.text}`,
    adjustment: r.adjustment,
    notes: [r.kupiec.note, r.independence.note].filter((s) => s),
  };
}

/** The calibration table as JSON. */
export function calibrationJson(c: Calibration): unknown {
  return {
    used: c.used, skipped: c.skipped,
    quantiles: c.rows.map((r) => ({ p: r.p, n: r.n, atOrBelow: r.atOrBelow, hitRate: r.hitRate, interval: r.interval, kupiec: { lr: r.test.lr, p: r.test.p }, pinball: r.pinball })),
    intervals: c.intervals.map((i) => ({ level: i.level, n: i.n, inside: i.inside, coverage: i.coverage, interval: i.interval, kupiec: { lr: i.test.lr, p: i.test.p } })),
  };
}

/**
 * The whole audit as JSON: `rows` (one per group, step and level, pooled rows last in each block),
 * `notes` (how the log was read), and `calibration` when quantile columns were given.
 * @example auditJson(log, null).rows.length
 */
export function auditJson(log: AuditLog | null, cal: Calibration | null): { rows: AuditRowJson[]; levels: number[]; groups: string[]; horizons: number[]; used: number; skipped: number; notes: string[]; calibration?: unknown } {
  const out: { rows: AuditRowJson[]; levels: number[]; groups: string[]; horizons: number[]; used: number; skipped: number; notes: string[]; calibration?: unknown } = {
    rows: log ? log.rows.map((r) => rowJson(r, log.groups.length > 0)) : [],
    levels: log?.levels ?? [], groups: log?.groups ?? [], horizons: log?.horizons ?? [],
    used: log?.used ?? cal?.used ?? 0, skipped: log?.skipped ?? cal?.skipped ?? 0,
    notes: log?.notes ?? [],
  };
  if (cal) out.calibration = calibrationJson(cal);
  return out;
}
