// The audit of a forecast log: several series (groups), several steps ahead (horizons) and several
// levels at once, one row per group plus a pooled row, each with its tests and one verdict.
import { EngineError } from "../errors";
import { fmt, requireLevelPercent } from "../_lib/check";
import { isBlank } from "../_lib/cells";
import type { RawCell } from "../series/screen";
import { binomialTail, LrTest, Transitions, trafficLight, Zone } from "./coverage-tests";
import { clopperPearson } from "./calibration";
import { overlapTests } from "./overlap";
import { intervalScore } from "./scores";
import { Verdict, verdictOf } from "./verdict";

/** One level's interval ends, one cell per row of the log. */
export interface IntervalColumns {
  /** Promised coverage in percent, e.g. 80. */
  level: number;
  lower: readonly RawCell[];
  upper: readonly RawCell[];
}

/** What {@link auditLog} reads. */
export interface AuditLogInput {
  actual: readonly RawCell[];
  /** One pair of columns per level (any order; they are checked to nest). */
  intervals: readonly IntervalColumns[];
  /** Series name of each row (optional): one result row per group plus a pooled row. */
  groups?: readonly RawCell[] | null;
  /** Steps ahead of each row (optional): results per step, overlap-adjusted for h > 1. */
  horizons?: readonly RawCell[] | null;
  /** Number of the first row, for messages (e.g. 2 below a header). */
  firstRow?: number;
  /** Significance level of the verdict's tests (default 0.05). */
  alpha?: number;
}

/** The audit of one group (or of all groups pooled) at one level and one step ahead. */
export interface AuditRow {
  /** The group's name; "" when the log has no groups; {@link POOLED} for the pooled row. */
  group: string;
  pooled: boolean;
  /** Steps ahead, or null when the log has no horizon column. */
  h: number | null;
  level: number;
  n: number;
  misses: number;
  /** Misses above the upper end and below the lower end. */
  above: number;
  below: number;
  coverage: number;
  /** Clopper–Pearson 95% interval of the observed coverage (for error bars). */
  coverageInterval: [number, number];
  nominal: number;
  kupiec: LrTest;
  independence: LrTest & Transitions;
  conditional: LrTest;
  /** P(X ≥ misses) at the nominal miss rate, over all rows. */
  binomialTail: number;
  /** The zone by miss count alone (see verdict.colour for the one to show). */
  zone: Zone;
  zoneCumulative: number;
  intervalScore: number;
  /** How the tests were adjusted for overlapping forecasts (empty for one step ahead). */
  adjustment: string;
  verdict: Verdict;
  /** Input rows (0-based) in this row's audit, in order, and the side of each: 0 inside, 1 above, −1 below. */
  rows: number[];
  sides: (-1 | 0 | 1)[];
}

/** The whole audit. */
export interface AuditLog {
  rows: AuditRow[];
  groups: string[];
  horizons: number[];
  levels: number[];
  /** Rows used (with an actual and at least one complete interval) and rows skipped for blanks. */
  used: number;
  skipped: number;
  /** How the log was read and what to keep in mind. */
  notes: string[];
}

/** The name of the pooled row. */
export const POOLED = "all groups";

interface Obs { row: number; hit: number; side: -1 | 0 | 1; y: number; l: number; u: number }

function num(v: RawCell, name: string, row: number): number {
  if (typeof v !== "number" || !Number.isFinite(v)) throw new EngineError("input", `Row ${row}: the ${name} value is not a number (${JSON.stringify(v).slice(0, 20)}). Fix it or leave the row blank.`);
  return v;
}

function readHorizon(v: RawCell, row: number): number {
  const x = typeof v === "string" && /^\s*\d+\s*$/.test(v) ? Number(v) : v;
  if (typeof x !== "number" || !Number.isInteger(x) || x < 1) {
    throw new EngineError("input", `Row ${row}: the horizon ${JSON.stringify(v).slice(0, 20)} is not a whole number of steps ahead. The horizons column must hold 1, 2, 3, … (steps after the forecast origin).`);
  }
  return x;
}

function readGroup(v: RawCell): string {
  return typeof v === "string" ? v.trim() : typeof v === "number" ? String(v) : String(v);
}

/**
 * Audits a forecast log by group, by step ahead and by level. Per level and step: one row per group
 * (its own Kupiec 1995 and Christoffersen 1998 tests, zone and verdict) and, with more than one
 * group, a pooled row whose Kupiec test counts every row and whose independence test sums the
 * transition counts of the groups, so clustering is only looked for within a series. For h > 1 the
 * tests use every h-th origin with a Bonferroni bound (Diebold, Gunther & Tay 1998; see
 * {@link overlapTests}). Rows of a group and step are taken as consecutive origins in row order.
 * Blank cells skip the row (for that level); a blank group or horizon beside an actual, a horizon
 * that is not a whole number, and levels whose intervals do not nest are refused, naming the row.
 * @example auditLog({ actual, intervals: [{ level: 80, lower, upper }], groups }).rows.at(-1).group // "all groups"
 */
export function auditLog(input: AuditLogInput): AuditLog {
  const first = input.firstRow ?? 1;
  const { actual } = input;
  const ivs = input.intervals;
  if (ivs.length === 0) throw new EngineError("input", "Give at least one pair of interval columns (lower and upper) with its level.");
  const levels = ivs.map((iv) => {
    requireLevelPercent(iv.level);
    return iv.level;
  });
  if (new Set(levels).size !== levels.length) throw new EngineError("input", `Each level may appear once; got ${levels.join(", ")}.`);
  for (const [name, col] of [["groups", input.groups], ["horizons", input.horizons]] as const) {
    if (col && col.length !== actual.length) throw new EngineError("input", `${name} must have one cell per row of actuals; it has ${col.length}, actuals have ${actual.length}.`);
  }
  ivs.forEach((iv) => {
    if (iv.lower.length !== actual.length || iv.upper.length !== actual.length) {
      throw new EngineError("input", `actual, lower and upper must have the same number of rows; at ${fmt(iv.level)}% they have ${actual.length}, ${iv.lower.length} and ${iv.upper.length}.`);
    }
  });
  const order = levels.map((_, k) => k).sort((a, b) => levels[a] - levels[b]);
  const strands = new Map<string, Obs[]>();
  const groupNames: string[] = [];
  const hs = new Set<number>();
  let used = 0;
  let skipped = 0;
  for (let i = 0; i < actual.length; i++) {
    const rowNo = first + i;
    if (isBlank(actual[i])) { skipped++; continue; }
    const y = num(actual[i], "actual", rowNo);
    const ends: ({ l: number; u: number } | null)[] = ivs.map((iv) => {
      if (isBlank(iv.lower[i]) || isBlank(iv.upper[i])) return null;
      const l = num(iv.lower[i], `lower (${fmt(iv.level)}%)`, rowNo);
      const u = num(iv.upper[i], `upper (${fmt(iv.level)}%)`, rowNo);
      if (l > u) throw new EngineError("input", `Row ${rowNo}: the lower end (${fmt(l)}) is above the upper end (${fmt(u)}) at ${fmt(iv.level)}%. Check that the columns are in the order actual, lower, upper.`);
      return { l, u };
    });
    if (ends.every((e) => e === null)) { skipped++; continue; }
    // A higher level must give an interval at least as wide, containing the lower level's.
    for (let a = 0; a + 1 < order.length; a++) {
      const lo = ends[order[a]];
      for (let b = a + 1; b < order.length; b++) {
        const hi = ends[order[b]];
        if (!lo || !hi) continue;
        const tol = 1e-9 * Math.max(1, Math.abs(lo.l), Math.abs(lo.u));
        if (hi.l > lo.l + tol || hi.u < lo.u - tol) {
          throw new EngineError("input", `Row ${rowNo}: the ${fmt(levels[order[b]])}% interval (${fmt(hi.l)} to ${fmt(hi.u)}) does not contain the ${fmt(levels[order[a]])}% interval (${fmt(lo.l)} to ${fmt(lo.u)}), so the levels disagree with the widths. Check which columns belong to which level: a higher level needs a wider interval.`);
        }
      }
    }
    let g = "";
    if (input.groups) {
      if (isBlank(input.groups[i])) throw new EngineError("input", `Row ${rowNo}: the group (series name) is blank beside an actual. Fill it in, or clear the row, so every row belongs to one series.`);
      g = readGroup(input.groups[i]);
      if (g === POOLED) throw new EngineError("input", `Row ${rowNo}: "${POOLED}" is the name of the pooled row; rename that group.`);
    }
    let h: number | null = null;
    if (input.horizons) {
      if (isBlank(input.horizons[i])) throw new EngineError("input", `Row ${rowNo}: the horizon is blank beside an actual. Fill in the steps ahead (1, 2, 3, …) or clear the row.`);
      h = readHorizon(input.horizons[i], rowNo);
      hs.add(h);
    }
    if (!groupNames.includes(g)) groupNames.push(g);
    used++;
    ends.forEach((e, k) => {
      if (!e) return;
      const key = `${k}\u0000${h ?? 0}\u0000${g}`;
      let s = strands.get(key);
      if (!s) strands.set(key, (s = []));
      const side: -1 | 0 | 1 = y < e.l ? -1 : y > e.u ? 1 : 0;
      s.push({ row: i, hit: side === 0 ? 0 : 1, side, y, l: e.l, u: e.u });
    });
  }
  if (used < 2) {
    throw new EngineError("input", `At least 2 rows with an actual and both interval ends are needed to check coverage; there ${used === 1 ? "is 1" : `are ${used}`}${skipped ? ` (${skipped} skipped for blanks)` : ""}.`);
  }
  const horizons = input.horizons ? [...hs].sort((a, b) => a - b) : [];
  const notes: string[] = [];
  if (skipped) notes.push(`${skipped} row${skipped === 1 ? " was" : "s were"} skipped for a blank actual or blank interval ends.`);
  if (input.horizons && horizons.some((h) => h > 1)) notes.push("Rows of one series and one step ahead are taken as forecasts from consecutive origins, in row order; for h > 1 the tests use every h-th origin with a Bonferroni bound (Diebold, Gunther & Tay 1998), because overlapping forecasts share shocks.");
  if (input.groups && groupNames.length > 1) notes.push(`The pooled row ("${POOLED}") counts every row for the miss rate; clustering is tested within each series only (transition counts summed over the series). When the series' miss rates differ, that difference alone can make the pooled clustering test reject: read the per-series rows.`);
  const rows: AuditRow[] = [];
  for (const k of order) {
    const level = levels[k];
    for (const h of input.horizons ? horizons : [null]) {
      const members: { g: string; obs: Obs[] }[] = [];
      for (const g of groupNames) {
        const s = strands.get(`${k}\u0000${h ?? 0}\u0000${g}`);
        if (s && s.length) members.push({ g, obs: s });
        else if (input.groups) notes.push(`${g} has no complete row at ${fmt(level)}%${h !== null ? ` ${h} step${h === 1 ? "" : "s"} ahead` : ""}.`);
      }
      if (members.length === 0) continue;
      for (const m of members) rows.push(auditRow(m.g, false, h, level, [m.obs], input.alpha));
      if (members.length > 1) rows.push(auditRow(POOLED, true, h, level, members.map((m) => m.obs), input.alpha));
    }
  }
  const small = rows.filter((r) => !r.pooled && r.n < 2);
  if (small.length) notes.push(`${small.map((r) => `${r.group || "the log"}${r.h !== null ? ` (h = ${r.h})` : ""} at ${fmt(r.level)}%`).join(", ")}: only one row, too few to test; it still counts in the pooled row.`);
  return { rows, groups: input.groups ? groupNames : [], horizons, levels: order.map((k) => levels[k]), used, skipped, notes };
}

function auditRow(group: string, pooled: boolean, h: number | null, level: number, parts: Obs[][], alpha?: number): AuditRow {
  const c = level / 100;
  const p = 1 - c;
  const all = parts.flat();
  const n = all.length;
  const misses = all.reduce((s, o) => s + o.hit, 0);
  const tests = overlapTests(parts.map((s) => s.map((o) => o.hit)), p, h ?? 1);
  const tl = trafficLight(misses, n, p);
  let is = 0;
  for (const o of all) is += intervalScore(o.l, o.u, o.y, p);
  const coverage = 1 - misses / n;
  const verdict = verdictOf({ n, misses, coverage, nominal: c, kupiec: tests.kupiec, independence: tests.independence, conditional: tests.conditional, zone: tl.zone, alpha });
  if (tests.adjustment) verdict.text += ` ${tests.adjustment}`;
  return {
    group, pooled, h, level, n, misses,
    above: all.filter((o) => o.side === 1).length,
    below: all.filter((o) => o.side === -1).length,
    coverage, coverageInterval: clopperPearson(n - misses, n), nominal: c, kupiec: tests.kupiec, independence: tests.independence, conditional: tests.conditional,
    binomialTail: binomialTail(misses, n, p), zone: tl.zone, zoneCumulative: tl.cumulative, intervalScore: is / n,
    adjustment: tests.adjustment, verdict,
    rows: pooled ? [] : all.map((o) => o.row), sides: pooled ? [] : all.map((o) => o.side),
  };
}
