// Writing CSV (the command line's output).

/**
 * Quotes a field for CSV output when needed (RFC 4180).
 * @example csvCell('say "hi"') // '"say ""hi"""'
 */
export function csvCell(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "";
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * Formats rows as CSV text (comma-separated, a header row first).
 * @example toCsv(["a"], [[1]]) // "a\n1\n"
 */
export function toCsv(header: string[], rows: unknown[][]): string {
  return [header.map(csvCell).join(","), ...rows.map((r) => r.map(csvCell).join(","))].join("\n") + "\n";
}
