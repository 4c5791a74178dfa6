// Period labels as spreadsheets export them: ISO (2024-01, 2024-01-31), dd.mm.yyyy, mm/dd/yyyy or
// dd/mm/yyyy (decided for the whole column in calendar.ts), English month names (Jan-24, Jan 2024,
// January 2024), quarters (2024Q1, 2024 Q1, Q1 2024), years, and spreadsheet serial dates.

/** The written form of a label; "slash" is a/b/yyyy, day-first or month-first (decided per column). */
export type LabelFamily = "ym" | "my" | "ymd" | "dmy" | "slash" | "mon" | "q" | "year" | "serial";

/**
 * One parsed label: the year, and `a`, `b` by family — ym/my/mon: a = month; ymd/dmy: a = month,
 * b = day; slash: a, b the first and second numbers; q: a = quarter; serial: `y` is the serial day.
 */
export interface LabelParts {
  family: LabelFamily;
  y: number;
  a: number;
  b: number;
  /** How it was written, in words for the report ("yyyy-mm", "dd.mm.yyyy", "Mon yyyy", …). */
  format: string;
}

const MONTHS = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"];
const FULL = ["january", "february", "march", "april", "may", "june", "july", "august", "september", "october", "november", "december"];

function monthOf(word: string): number {
  const w = word.toLowerCase();
  if (w === "sept") return 9;
  const i = MONTHS.indexOf(w);
  if (i >= 0) return i + 1;
  const j = FULL.indexOf(w);
  return j >= 0 ? j + 1 : 0;
}

/**
 * A two-digit year as spreadsheet programs read it by default: 00–29 → 2000–2029, 30–99 →
 * 1930–1999 (common practice: the default two-digit-year window of the common spreadsheet programs).
 * @example fullYear("49") // 1949
 */
export function fullYear(y: string): number {
  const n = Number(y);
  if (y.length !== 2) return n;
  return n < 30 ? 2000 + n : 1900 + n;
}

const TIME = "(?:[T ]0?0:00(?::00(?:\\.0+)?)?Z?)?";
const ISO_DATE = new RegExp(`^(\\d{4})([-/])(\\d{1,2})\\2(\\d{1,2})${TIME}$`);
const ISO_MONTH = /^(\d{4})[-/](\d{1,2})$/;
const MONTH_YEAR = /^(\d{1,2})[./-](\d{4})$/;
const DOT_DATE = new RegExp(`^(\\d{1,2})\\.(\\d{1,2})\\.(\\d{4}|\\d{2})${TIME}$`);
const SLASH_DATE = new RegExp(`^(\\d{1,2})([/-])(\\d{1,2})\\2(\\d{4}|\\d{2})${TIME}$`);
const NAME_YEAR = /^([A-Za-z]{3,9})\.?[\s\-/',]*('?\d{2}|\d{4})$/;
const YEAR_NAME = /^(\d{4})[\s\-/]*([A-Za-z]{3,9})\.?$/;
const YEAR_Q = /^(\d{4})\s*[-/ ]?\s*[Qq]([1-4])$/;
const Q_YEAR = /^[Qq]([1-4])\s*[-/ ]?\s*(\d{4}|'?\d{2})$/;
const YEAR = /^(\d{4})$/;

/**
 * Parses one period label, or null when it is not one (such as "Total"). Years are read from 1000
 * to 9999; months and quarters are checked; a day is checked against its month in calendar.ts.
 * @example parsePeriodLabel("Q1 2024") // { family: "q", y: 2024, a: 1, b: 0, format: "Qn yyyy" }
 */
export function parsePeriodLabel(text: string): LabelParts | null {
  const t = text.trim();
  if (t.length < 4 || t.length > 32) return null;
  let m: RegExpExecArray | null;
  const ok = (p: LabelParts): LabelParts | null => (p.y >= 1000 && p.y <= 9999 ? p : null);
  if ((m = ISO_DATE.exec(t))) {
    const mo = Number(m[3]);
    const d = Number(m[4]);
    return mo >= 1 && mo <= 12 && d >= 1 && d <= 31 ? ok({ family: "ymd", y: Number(m[1]), a: mo, b: d, format: `yyyy${m[2]}mm${m[2]}dd` }) : null;
  }
  if ((m = ISO_MONTH.exec(t))) {
    const mo = Number(m[2]);
    return mo >= 1 && mo <= 12 ? ok({ family: "ym", y: Number(m[1]), a: mo, b: 0, format: `yyyy${t[4]}mm` }) : null;
  }
  if ((m = MONTH_YEAR.exec(t))) {
    const mo = Number(m[1]);
    return mo >= 1 && mo <= 12 ? ok({ family: "my", y: Number(m[2]), a: mo, b: 0, format: `mm${t[m[1].length]}yyyy` }) : null;
  }
  if ((m = DOT_DATE.exec(t))) {
    const d = Number(m[1]);
    const mo = Number(m[2]);
    return mo >= 1 && mo <= 12 && d >= 1 && d <= 31 ? ok({ family: "dmy", y: fullYear(m[3]), a: mo, b: d, format: m[3].length === 2 ? "dd.mm.yy" : "dd.mm.yyyy" }) : null;
  }
  if ((m = SLASH_DATE.exec(t))) {
    const a = Number(m[1]);
    const b = Number(m[3]);
    if (a < 1 || b < 1 || a > 31 || b > 31 || (a > 12 && b > 12)) return null;
    return ok({ family: "slash", y: fullYear(m[4]), a, b, format: m[2] });
  }
  if ((m = NAME_YEAR.exec(t))) {
    const mo = monthOf(m[1]);
    const y = m[2].replace("'", "");
    return mo ? ok({ family: "mon", y: fullYear(y), a: mo, b: 0, format: `${m[1].length > 4 ? "Month" : "Mon"} ${y.length === 2 ? "yy" : "yyyy"}` }) : null;
  }
  if ((m = YEAR_NAME.exec(t))) {
    const mo = monthOf(m[2]);
    return mo ? ok({ family: "mon", y: Number(m[1]), a: mo, b: 0, format: "yyyy Mon" }) : null;
  }
  if ((m = YEAR_Q.exec(t))) return ok({ family: "q", y: Number(m[1]), a: Number(m[2]), b: 0, format: t.includes("-") ? "yyyy-Qn" : /\s/.test(t) ? "yyyy Qn" : "yyyyQn" });
  if ((m = Q_YEAR.exec(t))) return ok({ family: "q", y: fullYear(m[2].replace("'", "")), a: Number(m[1]), b: 0, format: "Qn yyyy" });
  if ((m = YEAR.exec(t))) return ok({ family: "year", y: Number(m[1]), a: 0, b: 0, format: "yyyy" });
  return null;
}

/**
 * The day number (days since 1970-01-01) of a calendar date, or null when the date does not exist
 * (31 April, 29 February 2023).
 * @example dayNumber(2024, 2, 29) // 19782
 */
export function dayNumber(y: number, m: number, d: number): number | null {
  const t = Date.UTC(y, m - 1, d);
  const back = new Date(t);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== m - 1 || back.getUTCDate() !== d) return null;
  return Math.round(t / 86400000);
}

/** Day number of spreadsheet serial day 0 in the 1900 date system: 1899-12-30 (valid from serial 61). */
const SERIAL_EPOCH = -25569;

/**
 * The day number of a spreadsheet serial date (1900 date system, as spreadsheet programs store
 * dates: serial 1 is 1900-01-01 and serial 60 the non-existent 1900-02-29, so serials from 61 on
 * count from 1899-12-30; common practice, from memory of the published file-format specification).
 * A time of day (the fraction) is dropped. Null before serial 61 or past 9999-12-31.
 * @example serialDay(45292) // 19723 (2024-01-01)
 */
export function serialDay(serial: number): number | null {
  if (!Number.isFinite(serial) || serial < 61 || serial >= 2958466) return null;
  return Math.floor(serial) + SERIAL_EPOCH;
}

/**
 * A day number as an ISO date.
 * @example isoDate(19723) // "2024-01-01"
 */
export function isoDate(day: number): string {
  return new Date(day * 86400000).toISOString().slice(0, 10);
}
