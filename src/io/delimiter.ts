// Which character separates the fields: comma, semicolon or tab, decided from the first lines (or a
// `sep=;` first line, as spreadsheet programs write it in exports for other locales).
import { EngineError } from "../engine";
import type { Delimiter } from "./records";

/** How the delimiter was decided. */
/** How the delimiter was decided; "workbook": the table came as cells (an .xlsx sheet), no delimiter. */
export type DelimiterFrom = "option" | "sep-line" | "detected" | "default" | "workbook";

/** The delimiter of a text, and how much of its start to skip (a `sep=` line). */
export interface DelimiterChoice {
  delimiter: Delimiter;
  from: DelimiterFrom;
  /** Characters to skip at the start (the `sep=` line and its line break; a BOM before it too). */
  skip: number;
  /** 2 when a `sep=` line was skipped (the next text starts on line 2), else 1. */
  firstLine: number;
}

const NAMES: Record<Delimiter, string> = { ",": "comma", ";": "semicolon", "\t": "tab" };

/**
 * The delimiter's name in words ("comma", "semicolon", "tab").
 * @example delimiterName(";") // "semicolon"
 */
export function delimiterName(d: Delimiter): string {
  return NAMES[d];
}

/**
 * Reads a `--delimiter` value: `,` `;` `tab` (or a tab character), also the words comma and
 * semicolon. Throws an `input` EngineError naming the values that work.
 * @example parseDelimiterOption("semicolon") // ";"
 */
export function parseDelimiterOption(v: string, option = "--delimiter"): Delimiter {
  const t = v.trim().toLowerCase();
  if (t === "," || t === "comma") return ",";
  if (t === ";" || t === "semicolon") return ";";
  if (v === "\t" || t === "tab" || t === "\\t") return "\t";
  throw new EngineError("input", `${option} must be , or ; or tab; got "${v}".`);
}

/** Field counts per record of the first lines, outside quotes, for one candidate delimiter. */
function fieldCounts(sample: string, d: string): number[] {
  const counts: number[] = [];
  let inQuotes = false;
  let n = 1;
  let atStart = true;
  let comment = false;
  let content = false;
  for (let i = 0; i < sample.length && counts.length < 50; i++) {
    const ch = sample[i];
    if (comment) {
      if (ch === "\n" || ch === "\r") { comment = false; atStart = true; }
      continue;
    }
    if (atStart && ch === "#") { comment = true; continue; }
    if (inQuotes) {
      if (ch === '"') inQuotes = false;
      continue;
    }
    if (ch === "\n" || ch === "\r") {
      if (content) counts.push(n);
      n = 1;
      atStart = true;
      content = false;
      continue;
    }
    atStart = false;
    if (ch === '"') { inQuotes = true; content = true; continue; }
    if (ch === d) n++;
    if (ch.trim() !== "") content = true;
  }
  // The last line counts only when the sample ends there (a cut-off line would mislead).
  if (content && !inQuotes && sample.length < 1 << 16) counts.push(n);
  return counts;
}

/**
 * Decides the delimiter from the start of a text: a first line `sep=X` (as spreadsheet programs
 * write it) is honoured and skipped; otherwise the candidate (tab, semicolon, comma) that splits
 * the first lines (up to 50, outside quotes and comments) into the same number of fields, more than
 * one, wins; among several, the one giving the most fields (ties: tab, then semicolon, then comma).
 * With none, comma. Common practice (how spreadsheet importers guess).
 * @example detectDelimiter("Monat;Umsatz\n01.1995;66190,00\n").delimiter // ";"
 */
export function detectDelimiter(text: string, forced?: Delimiter): DelimiterChoice {
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const sep = /^"?sep=(.)"?[ \t]*(\r\n|\n|\r|$)/i.exec(text.slice(start, start + 20));
  if (sep) {
    const d = sep[1] === "\t" ? "\t" : sep[1] === ";" ? ";" : sep[1] === "," ? "," : null;
    if (d === null) throw new EngineError("input", `The first line "sep=${sep[1]}" names a delimiter Fanwise does not read. Export with commas, semicolons or tabs.`);
    start += sep[0].length;
    return { delimiter: forced ?? d, from: forced ? "option" : "sep-line", skip: start, firstLine: 2 };
  }
  if (forced) return { delimiter: forced, from: "option", skip: 0, firstLine: 1 };
  const sample = text.slice(start, start + (1 << 16));
  let best: { d: Delimiter; fields: number } | null = null;
  for (const d of ["\t", ";", ","] as Delimiter[]) {
    const counts = fieldCounts(sample, d);
    if (counts.length === 0 || counts[0] < 2) continue;
    const consistent = counts.every((c) => c === counts[0]);
    if (!consistent) continue;
    if (!best || counts[0] > best.fields) best = { d, fields: counts[0] };
  }
  return best ? { delimiter: best.d, from: "detected", skip: 0, firstLine: 1 } : { delimiter: ",", from: "default", skip: 0, firstLine: 1 };
}

/**
 * When a table read with one delimiter has come out as one column but its lines hold semicolons or
 * tabs, the delimiter that was probably meant (else null).
 * @example likelyDelimiter(["month;sales", "2024-01;5"], ",") // ";"
 */
export function likelyDelimiter(lines: readonly string[], used: Delimiter): Delimiter | null {
  for (const d of ["\t", ";", ","] as Delimiter[]) {
    if (d === used) continue;
    if (lines.length > 0 && lines.every((l) => l.includes(d))) return d;
  }
  return null;
}
