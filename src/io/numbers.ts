// Number formats as spreadsheets write them: thousands separators (, . ' ’ space, no-break space),
// a decimal point or comma, currency symbols or codes before or after, percent, accounting
// negatives (1,850), a trailing minus 1.850-, the Unicode minus. Which decimal mark a column uses
// is decided from the whole column (numberFormat.ts); this file reads one value with a known mark.

/** The decimal mark of a column. */
export type DecimalMark = "." | ",";

/** How a negative number was written. */
export type NegativeStyle = "minus" | "unicode-minus" | "accounting" | "trailing-minus";

/** One value read from text, with how it was written. */
export interface ParsedNumber {
  value: number;
  /** The thousands separator used, if any. */
  thousands: string | null;
  /** The currency symbol or code, if any. */
  currency: string | null;
  /** Written with a percent sign (the value is divided by 100, as a spreadsheet stores it). */
  percent: boolean;
  negative: NegativeStyle | null;
}

const CODES = "US\\$|\\$US|C\\$|A\\$|R\\$|CHF|EUR|USD|GBP|JPY|SEK|NOK|DKK|PLN|CAD|AUD|BRL|Fr\\.|kr|zł|[$€£¥]";
const CURRENCY_PREFIX = new RegExp(`^(${CODES})\\s*`);
const CURRENCY_SUFFIX = new RegExp(`\\s*(${CODES})$`);
const SPACES = /[\u00a0\u202f\u2009\u2007]/g;

/**
 * Reads one number as a spreadsheet shows it, with the column's decimal mark; null when the text
 * is not a number in that mark (a bad thousands grouping such as "1,23,4", two decimal marks, two
 * currencies, two minus signs). Thousands groups must be of three digits after a first group of one
 * to three (common practice: the grouping of every spreadsheet locale Fanwise reads; the Indian
 * lakh grouping is not read). A percent value is divided by 100, as a spreadsheet stores "12.5%".
 * @example parseNumberText("(1.850,00 €)", ",")?.value // -1850
 */
export function parseNumberText(text: string, mark: DecimalMark): ParsedNumber | null {
  let s = text.replace(SPACES, " ").trim();
  if (s === "") return null;
  let negative: NegativeStyle | null = null;
  let signSeen = false;
  let currency: string | null = null;
  let percent = false;
  for (let guard = 0; guard < 8; guard++) {
    const before = s;
    s = s.trim();
    if (s.length > 2 && s[0] === "(" && s[s.length - 1] === ")") {
      if (signSeen) return null;
      negative = "accounting";
      signSeen = true;
      s = s.slice(1, -1);
      continue;
    }
    let m = /^([-+\u2212])\s*/.exec(s);
    if (m) {
      if (signSeen) return null;
      signSeen = true;
      if (m[1] !== "+") negative = m[1] === "-" ? "minus" : "unicode-minus";
      s = s.slice(m[0].length);
      continue;
    }
    m = /\s*([-\u2212])$/.exec(s);
    if (m && s.length > m[0].length) {
      if (signSeen) return null;
      signSeen = true;
      negative = "trailing-minus";
      s = s.slice(0, s.length - m[0].length);
      continue;
    }
    m = CURRENCY_PREFIX.exec(s) ?? CURRENCY_SUFFIX.exec(s);
    if (m && s.length > m[0].length) {
      if (currency !== null) return null;
      currency = m[1];
      s = m.index === 0 ? s.slice(m[0].length) : s.slice(0, m.index);
      continue;
    }
    m = /\s*%$/.exec(s);
    if (m && s.length > m[0].length) {
      if (percent) return null;
      percent = true;
      s = s.slice(0, m.index);
      continue;
    }
    if (s === before) break;
  }
  const core = readDigits(s, mark);
  if (!core) return null;
  let value = core.value;
  if (percent) value /= 100;
  if (negative) value = -value;
  if (!Number.isFinite(value)) return null;
  return { value, thousands: core.thousands, currency, percent, negative };
}

/** Digits with at most one thousands separator kind and one decimal mark; null if malformed. */
function readDigits(s: string, mark: DecimalMark): { value: number; thousands: string | null } | null {
  if (mark === "." && /^(\d+\.?\d*|\.\d+)[eE][-+]?\d+$/.test(s)) return { value: Number(s), thousands: null };
  if (!/^[\d.,'’ ]+$/.test(s) || !/\d/.test(s)) return null;
  const parts = s.split(mark);
  if (parts.length > 2) return null;
  const [intPart, frac = null] = parts;
  if (frac !== null && !/^\d+$/.test(frac)) return null;
  let digits = intPart;
  let thousands: string | null = null;
  const seps = intPart.match(/[^\d]/g);
  if (seps) {
    const sep = seps[0];
    if (sep === mark || seps.some((c) => c !== sep)) return null;
    if (sep !== "," && sep !== "." && sep !== "'" && sep !== "’" && sep !== " ") return null;
    const groups = intPart.split(sep);
    if (!/^[1-9]\d{0,2}$/.test(groups[0]) || groups.slice(1).some((g) => !/^\d{3}$/.test(g))) return null;
    digits = groups.join("");
    thousands = sep;
  }
  if (digits === "" && frac === null) return null;
  const value = Number(`${digits === "" ? "0" : digits}${frac !== null ? `.${frac}` : ""}`);
  return Number.isFinite(value) ? { value, thousands } : null;
}

/**
 * Whether a text looks like a number someone meant (digits with only separators, signs, currency
 * and percent around them), so a value that cannot be read is reported rather than taken as text.
 * @example looksNumeric("1.2.3,4") // true
 */
export function looksNumeric(text: string): boolean {
  const s = text.replace(SPACES, " ").trim();
  if (!/\d/.test(s)) return false;
  const stripped = s.replace(new RegExp(CODES, "g"), "");
  return /^[\d.,'’ ()+\-\u2212%$€£¥]+$/.test(stripped);
}

/** What a value says about a column's decimal mark. */
export type MarkEvidence = "." | "," | "same" | "ambiguous" | "none";

/**
 * Which decimal marks read a text, and whether they agree: "." or "," when only one reads it,
 * "same" when both read it as the same number (1234, $5), "ambiguous" when they give different
 * numbers (1,234 is 1234 or 1.234), "none" when neither reads it.
 * @example markEvidence("66.190,00") // ","
 */
export function markEvidence(text: string): MarkEvidence {
  const a = parseNumberText(text, ".");
  const b = parseNumberText(text, ",");
  if (a && b) return a.value === b.value ? "same" : "ambiguous";
  return a ? "." : b ? "," : "none";
}
