// A file read as a table of cells, whatever its format (CSV or .xlsx), and its series: the label
// column, the series columns, and where each data row is in the file (for messages).
import { EngineError, RawCell } from "../engine";
import { CsvColumns } from "./csv";

/** A file's cells by column, with the header's names. */
export interface CellTable {
  header: string[];
  rows: number;
  cells: (j: number) => RawCell[];
  /** Column j's cells as label text (dates as YYYY-MM-DD). */
  labels: (j: number) => string[];
  /** Whether column j holds labels (dates, periods, text) rather than a series. */
  isLabel: (j: number) => boolean;
  /** Where data row i (0-based) is in the file, e.g. "line 14" or "row 14 of Sales". */
  where: (i: number) => string;
  /** How the file was read, for the user (merged cells, formulas without results, …). */
  notes: string[];
}

/**
 * A CSV file's columns as a CellTable (rows named by their line).
 * @example csvTable(parseCsv("m,a\n1,2\n")).where(0) // "line 2"
 */
export function csvTable(cols: CsvColumns): CellTable {
  return {
    header: cols.header,
    rows: cols.rows,
    cells: (j) => cols.cells(j),
    labels: (j) => cols.labels(j),
    isLabel: (j) => cols.isLabel(j),
    where: (i) => `line ${cols.line(i)}`,
    notes: [],
  };
}

/** The series of a table. */
export interface SeriesData {
  names: string[];
  /** The cells of series j. */
  column: (j: number) => RawCell[];
  /** The label column's name and values, when there is one. */
  labelColumn: { name: string; values: string[] } | null;
  where: (i: number) => string;
  rows: number;
  notes: string[];
}

/**
 * Splits a table into its label column (the first column that holds labels) and its series; with
 * `only` (the text of --series), keeps just those series, in the order given. Throws when there is no series, or when a
 * name in `only` is not a series (listing the series there are).
 * @example tableSeries(csvTable(parseCsv("month,a,b\n2024-01,1,2\n")), "b").names // ["b"]
 */
export function tableSeries(t: CellTable, only?: string): SeriesData {
  const names: string[] = [];
  const index: number[] = [];
  let labelIndex = -1;
  t.header.forEach((h, j) => {
    if (t.isLabel(j)) {
      if (labelIndex < 0) labelIndex = j;
      return;
    }
    names.push(h || `column ${j + 1}`);
    index.push(j);
  });
  if (names.length === 0) throw new EngineError("input", "No column of numbers was found. Each series needs a column of numbers under its name.");
  let pick = names.map((_, k) => k);
  if (only) {
    pick = parseSeriesList(only, names).map((n) => {
      const k = names.indexOf(n);
      if (k < 0) {
        const hint = names.find((x) => x.toLowerCase() === n.toLowerCase());
        throw new EngineError("input", `--series: no series named "${n}"${hint ? ` (did you mean "${hint}"? names are matched exactly)` : ""}. Series in this file: ${names.join(", ")}.`);
      }
      return k;
    });
  }
  let labels: string[] | null = null;
  return {
    names: pick.map((k) => names[k]),
    column: (j) => t.cells(index[pick[j]]),
    get labelColumn() {
      if (labelIndex < 0) return null;
      labels ??= t.labels(labelIndex);
      return { name: t.header[labelIndex] || `column ${labelIndex + 1}`, values: labels };
    },
    where: t.where,
    rows: t.rows,
    notes: t.notes,
  };
}

/**
 * Reads --series: names separated by commas; a name that itself holds a comma is matched whole
 * first ("Sales, net").
 * @example parseSeriesList("a,b", ["a", "b", "c"]) // ["a", "b"]
 */
export function parseSeriesList(v: string, known: string[]): string[] {
  if (known.includes(v.trim())) return [v.trim()];
  const parts = v.split(",").map((x) => x.trim()).filter((x) => x !== "");
  if (parts.length === 0) throw new EngineError("input", `--series needs one or more series names separated by commas, e.g. --series "${known[0] ?? "sales"}"; got "${v}".`);
  return parts;
}
