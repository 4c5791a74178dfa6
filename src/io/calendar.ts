// The calendar of a label column: frequency (and from it the default period), time order, skipped
// periods (kept as blanks at their place), duplicates and irregular spacing (refused).
import { EngineError } from "../engine";
import { dayNumber, isoDate, LabelFamily, LabelParts, serialDay } from "./period-labels";

/** How often a series is observed. */
export type Frequency = "monthly" | "quarterly" | "yearly" | "weekly" | "daily";

/**
 * The default seasonal period of each frequency: monthly 12, quarterly 4, yearly 1, weekly 52,
 * daily 7 (common practice: the number of observations in a year, or a week for daily data).
 * @example DEFAULT_PERIOD.quarterly // 4
 */
export const DEFAULT_PERIOD: Readonly<Record<Frequency, number>> = { monthly: 12, quarterly: 4, yearly: 1, weekly: 52, daily: 7 };

/** A label column read as a calendar. */
export interface Calendar {
  frequency: Frequency;
  /** The default period of the frequency. */
  period: number;
  /** How the labels were written ("yyyy-mm", "dd.mm.yyyy", "mm/dd/yyyy", …). */
  format: string;
  /** For each position in time order, the data row it comes from, or -1 for a skipped period. */
  order: Int32Array;
  /** The label of each position ("2024-01", "2024-Q1", "2024", or an ISO date). */
  labels: string[];
  /** The labels of the skipped periods (blank at their place). */
  skipped: string[];
  /** The file was newest first (put in time order). */
  reversed: boolean;
  /** The rows were in no time order (sorted). */
  sorted: boolean;
  /** The label h periods after the last one (h ≥ 1). */
  next: (h: number) => string;
}

/** One observation row's label. */
export interface LabelledRow {
  /** The data row (0-based). */
  row: number;
  parts: LabelParts;
}

/** What a calendar may skip before the dates count as irregular: 20% of the rows, at least 2. */
const MAX_SKIPPED_SHARE = 0.2;

// Loops, not Math.min(...x): a spread of a million dates overflows the call stack.
function minOf(x: number[]): number {
  let m = Infinity;
  for (const v of x) if (v < m) m = v;
  return m;
}
function maxOf(x: number[]): number {
  let m = -Infinity;
  for (const v of x) if (v > m) m = v;
  return m;
}

const MONTH_LEVEL: LabelFamily[] = ["ym", "my", "mon"];

function monthLabel(k: number): string {
  return `${Math.floor(k / 12)}-${String((k % 12) + 1).padStart(2, "0")}`;
}

interface Keyed {
  frequency: Frequency;
  /** Ordinal of each row on its frequency's scale (consecutive periods differ by 1). */
  keys: number[];
  label: (k: number) => string;
}

/** Months of a day-level date column, when it is monthly/quarterly/yearly; else null. */
function monthsFromDays(days: number[]): { step: number; base: number; keys: number[] } | null {
  const dates = days.map((d) => new Date(d * 86400000));
  const months = dates.map((d) => d.getUTCFullYear() * 12 + d.getUTCMonth());
  if (new Set(months).size !== months.length) return null;
  const sorted = months.slice().sort((a, b) => a - b);
  let step = Infinity;
  for (let i = 1; i < sorted.length; i++) step = Math.min(step, sorted[i] - sorted[i - 1]);
  if (step !== 1 && step !== 3 && step !== 12) return null;
  if (sorted.some((m) => (m - sorted[0]) % step !== 0)) return null;
  // The same place in each month: the same day, or the same distance from the month's end, within
  // 3 days (first or last business day).
  const dom = dates.map((d) => d.getUTCDate());
  const fromEnd = dates.map((d) => new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 0)).getUTCDate() - d.getUTCDate());
  const spread = (x: number[]): number => maxOf(x) - minOf(x);
  if (spread(dom) > 3 && spread(fromEnd) > 3) return null;
  return { step, base: sorted[0], keys: months.map((m) => (m - sorted[0]) / step) };
}

function irregular(column: string, detail: string): EngineError {
  return new EngineError("input", `The dates in "${column}" are not equally spaced (${detail}). Fanwise forecasts periods of one length (days, weeks, months, quarters or years): aggregate the data to one row per period, or use --period with a column of plain labels.`);
}

function keyed(rows: LabelledRow[], family: LabelFamily, column: string, lineOf: (row: number) => string): Keyed {
  if (family === "q") return { frequency: "quarterly", keys: rows.map((r) => r.parts.y * 4 + r.parts.a - 1), label: (k) => `${Math.floor(k / 4)}-Q${(k % 4) + 1}` };
  if (family === "year") return { frequency: "yearly", keys: rows.map((r) => r.parts.y), label: (k) => String(k) };
  if (MONTH_LEVEL.includes(family)) {
    const months = rows.map((r) => r.parts.y * 12 + r.parts.a - 1);
    const sorted = Array.from(new Set(months)).sort((a, b) => a - b);
    let step = 1;
    if (sorted.length > 1) {
      step = Infinity;
      for (let i = 1; i < sorted.length; i++) step = Math.min(step, sorted[i] - sorted[i - 1]);
    }
    if (step === 3 || step === 12) {
      if (sorted.some((m) => (m - sorted[0]) % step !== 0)) throw irregular(column, "months mix steps of " + step + " and less");
      return { frequency: step === 3 ? "quarterly" : "yearly", keys: months.map((m) => (m - sorted[0]) / step), label: (k) => (step === 3 ? quarterLabel(sorted[0] + k * 3) : String(Math.floor((sorted[0] + k * 12) / 12))) };
    }
    return { frequency: "monthly", keys: months, label: monthLabel };
  }
  // Day-level: ymd, dmy, serial, and slash after it was decided (a = month, b = day).
  const days = rows.map((r) => {
    const d = family === "serial" ? serialDay(r.parts.y) : dayNumber(r.parts.y, r.parts.a, r.parts.b);
    if (d === null) throw new EngineError("input", `${lineOf(r.row)}: the date in "${column}" does not exist (${r.parts.y}-${String(r.parts.a).padStart(2, "0")}-${String(r.parts.b).padStart(2, "0")}). Correct it.`);
    return d;
  });
  const monthly = monthsFromDays(days);
  if (monthly) {
    const { step, base, keys } = monthly;
    const freq: Frequency = step === 1 ? "monthly" : step === 3 ? "quarterly" : "yearly";
    return { frequency: freq, keys, label: (k) => (step === 1 ? monthLabel(base + k) : step === 3 ? quarterLabel(base + 3 * k) : String(Math.floor((base + 12 * k) / 12))) };
  }
  const sorted = Array.from(new Set(days)).sort((a, b) => a - b);
  if (sorted.length < days.length) return { frequency: "daily", keys: days, label: isoDate }; // duplicates: reported below
  let step = Infinity;
  for (let i = 1; i < sorted.length; i++) step = Math.min(step, sorted[i] - sorted[i - 1]);
  if (step % 7 === 0 && sorted.every((d) => (d - sorted[0]) % 7 === 0)) {
    const base = sorted[0];
    return { frequency: "weekly", keys: days.map((d) => (d - base) / 7), label: (k) => isoDate(base + 7 * k) };
  }
  if (step === 1) {
    const weekday = (d: number): number => (d + 4) % 7; // 0 = Sunday (1970-01-01 was a Thursday)
    const set = new Set(days);
    let weekendOnly = true;
    let gaps = 0;
    for (let d = sorted[0]; d <= sorted[sorted.length - 1]; d++) {
      if (set.has(d)) continue;
      gaps++;
      if (weekday(d) !== 0 && weekday(d) !== 6) weekendOnly = false;
    }
    if (gaps > 0 && weekendOnly && days.every((d) => weekday(d) !== 0 && weekday(d) !== 6)) {
      throw new EngineError("input", `The dates in "${column}" are business days (weekends left out). Fanwise forecasts equally spaced periods: aggregate to weeks or months, or give a column of plain labels (1, 2, 3, …) and --period 5.`);
    }
    return { frequency: "daily", keys: days, label: isoDate };
  }
  throw irregular(column, `steps of ${step} days and more`);
}

function quarterLabel(month: number): string {
  return `${Math.floor(month / 12)}-Q${Math.floor((month % 12) / 3) + 1}`;
}

/**
 * Puts a label column's observation rows on a calendar (the labels of one family, a slash family
 * already decided). Infers the frequency, puts newest-first or unordered rows in time order (with
 * a note), keeps a skipped period as a blank at its place (named), and refuses duplicates (naming
 * both lines) and irregular spacing (more skipped periods than a fifth of the rows, or steps that
 * are not multiples of one period). Common practice (the calendar checks of any time-series tool).
 * @example buildCalendar([{ row: 0, parts: { family: "ym", y: 2024, a: 1, b: 0, format: "yyyy-mm" } }, { row: 1, parts: { family: "ym", y: 2024, a: 3, b: 0, format: "yyyy-mm" } }], "month", (r) => `line ${r + 2}`).skipped // ["2024-02"]
 */
export function buildCalendar(rows: LabelledRow[], column: string, lineOf: (row: number) => string): Calendar {
  const family = rows[0].parts.family;
  const k = keyed(rows, family, column, lineOf);
  const byKey = new Map<number, number>();
  k.keys.forEach((key, i) => {
    const prev = byKey.get(key);
    if (prev !== undefined) {
      throw new EngineError("input", `The period ${k.label(key)} appears twice in "${column}" (${lineOf(rows[prev].row)} and ${lineOf(rows[i].row)}). Keep one row per period: remove or add up the duplicate.`);
    }
    byKey.set(key, i);
  });
  let ascending = true;
  let descending = true;
  for (let i = 1; i < k.keys.length; i++) {
    if (k.keys[i] < k.keys[i - 1]) ascending = false;
    if (k.keys[i] > k.keys[i - 1]) descending = false;
  }
  const first = minOf(k.keys);
  const last = maxOf(k.keys);
  const length = last - first + 1;
  const skippedCount = length - rows.length;
  if (skippedCount > Math.max(2, MAX_SKIPPED_SHARE * rows.length)) {
    const missing: string[] = [];
    for (let key = first; key <= last && missing.length < 3; key++) if (!byKey.has(key)) missing.push(k.label(key));
    throw irregular(column, `${k.frequency} labels with ${skippedCount} of ${length} periods absent, e.g. ${missing.join(", ")}; if those periods are truly missing, add a row for each with its label and blank values`);
  }
  const order = new Int32Array(length);
  const labels: string[] = [];
  const skipped: string[] = [];
  for (let key = first; key <= last; key++) {
    const i = byKey.get(key);
    order[key - first] = i === undefined ? -1 : rows[i].row;
    labels.push(k.label(key));
    if (i === undefined) skipped.push(k.label(key));
  }
  const frequency = k.frequency;
  return {
    frequency,
    period: DEFAULT_PERIOD[frequency],
    format: rows[0].parts.format,
    order,
    labels,
    skipped,
    reversed: !ascending && descending && rows.length > 1,
    sorted: !ascending && !descending,
    next: (h) => k.label(last + h),
  };
}

function decideSlash(rows: LabelledRow[], column: string, lineOf: (r: number) => string): Calendar {
  const dayFirst = rows.some((r) => r.parts.a > 12);
  const monthFirst = rows.some((r) => r.parts.b > 12);
  const sep = rows[0].parts.format;
  const as = (df: boolean): LabelledRow[] => rows.map((r) => ({ row: r.row, parts: { family: "ymd", y: r.parts.y, a: df ? r.parts.b : r.parts.a, b: df ? r.parts.a : r.parts.b, format: df ? `dd${sep}mm${sep}yyyy` : `mm${sep}dd${sep}yyyy` } }));
  if (dayFirst && monthFirst) {
    const a = rows.find((r) => r.parts.a > 12) as LabelledRow;
    const b = rows.find((r) => r.parts.b > 12) as LabelledRow;
    throw new EngineError("input", `The dates in "${column}" mix day-first and month-first: ${lineOf(a.row)} has day ${a.parts.a} first, ${lineOf(b.row)} has day ${b.parts.b} second. Write every date one way, best as yyyy-mm-dd.`);
  }
  if (dayFirst || monthFirst) return buildCalendar(as(dayFirst), column, lineOf);
  const tries = [true, false].map((df) => {
    try { return buildCalendar(as(df), column, lineOf); } catch { return null; }
  });
  const [d, m] = tries;
  if (d && !m) return d;
  if (m && !d) return m;
  const ex = rows[0].parts;
  const two = (n: number): string => String(n).padStart(2, "0");
  if (!d || !m) throw new EngineError("input", `The dates in "${column}" (such as ${two(ex.a)}${sep}${two(ex.b)}${sep}${ex.y}) make no regular calendar read day-first or month-first. Write them as yyyy-mm-dd, one row per period.`);
  throw new EngineError("input", `Cannot tell whether the dates in "${column}" are day-first or month-first: ${two(ex.a)}${sep}${two(ex.b)}${sep}${ex.y} could be ${two(ex.b)}-${two(ex.a)} or ${two(ex.a)}-${two(ex.b)} of ${ex.y}, and both readings give a regular calendar. Write the dates as yyyy-mm-dd (e.g. ${ex.y}-${two(ex.b)}-${two(ex.a)} for day-first).`);
}


/**
 * The calendar of a label column's observation rows, deciding day-first or month-first first for
 * a/b/yyyy dates: a number above 12 in first place means day-first, in second place month-first;
 * with neither, the reading that gives a regular calendar is taken, and when both do, the column
 * is refused (it cannot be decided). Then {@link buildCalendar}.
 * @example calendarFor(rows, "date", (r) => `line ${r + 2}`).frequency // "monthly"
 */
export function calendarFor(rows: LabelledRow[], column: string, lineOf: (row: number) => string): Calendar {
  return rows[0].parts.family === "slash" ? decideSlash(rows, column, lineOf) : buildCalendar(rows, column, lineOf);
}

/**
 * The period label `h` steps after position `last` of a table's rows: the row's own label while
 * that is still inside the table (a series whose last rows are blank is forecast from its last
 * value, so its first steps fall on rows of the table), then the calendar's labels after its last
 * row (`next(k)`: the label k periods after it). Common practice (a forecast starts after the last
 * observation). One rule for every face.
 * @example labelAfter(["2026-01", "2026-02", "2026-03"], (k) => `2026-0${3 + k}`, 1, 2) // "2026-04"
 */
export function labelAfter(labels: readonly string[], next: (k: number) => string, last: number, h: number): string {
  const at = last + h;
  return at < labels.length && labels[at] ? labels[at] : next(at - (labels.length - 1));
}
