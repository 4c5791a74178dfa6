// A file's series as the shared reader (src/io) reads them, from a CSV file or an .xlsx sheet alike:
// narrowed to --series, with the notes of how the file was read; and the same table as cells by
// column, for an audit's forecast log.
import { EngineError, RawCell } from "../engine";
import { SeriesTable } from "../io";

/** The series of a file (the shared reader's table, narrowed to --series). */
export interface SeriesData extends SeriesTable {
  /** How the file was read, for the user: the source's notes (a workbook's merged cells, …) and the reading's (rows left out, skipped periods). */
  notes: string[];
}

/**
 * Narrows a table read by the shared reader to the series named by `only` (the text of --series),
 * in the order given; without it keeps every series. Throws when a name in `only` is not a series
 * (listing the series there are).
 * @example tableSeries(readCsvText("month,a,b\n2024-01,1,2\n2024-02,3,4\n"), [], "b").names // ["b"]
 */
export function tableSeries(t: SeriesTable, sourceNotes: string[], only?: string): SeriesData {
  const notes = [...sourceNotes, ...t.reading.notes];
  if (!only) return { ...t, notes };
  const pick = parseSeriesList(only, t.names).map((n) => {
    const k = t.names.indexOf(n);
    if (k < 0) {
      const hint = t.names.find((x) => x.toLowerCase() === n.toLowerCase());
      throw new EngineError("input", `--series: no series named "${n}"${hint ? ` (did you mean "${hint}"? names are matched exactly)` : ""}. Series in this file: ${t.names.join(", ")}.`);
    }
    return k;
  });
  return { ...t, names: pick.map((k) => t.names[k]), column: (j) => t.column(pick[j]), where: (i, j) => t.where(i, j === undefined ? undefined : pick[j]), notes };
}

/** A file's cells by column, with the header's names (an audit's forecast log). */
export interface CellTable {
  header: string[];
  rows: number;
  /** Column j's cells: a column of numbers read with its number format, any other column as text. */
  cells: (j: number) => RawCell[];
  /** Column j's cells as label text (periods as the reader writes them, e.g. 2024-01). */
  labels: (j: number) => string[];
  /** Whether column j holds labels (dates, periods, text) rather than numbers. */
  isLabel: (j: number) => boolean;
  /** Where data row i (0-based) is in the file, e.g. "line 14" or "row 14 of sheet "Sales"". */
  where: (i: number) => string;
  /** How the file was read, for the user. */
  notes: string[];
}

/**
 * A table read by the shared reader as cells by column (rows in the file's order when it was read
 * without a calendar).
 * @example cellTable(readCsvText("m,a\n1,2\n", { calendar: false }), []).cells(1) // [2]
 */
export function cellTable(t: SeriesTable, sourceNotes: string[]): CellTable {
  const cells = (j: number): RawCell[] => t.columnNamed(t.header[j]) ?? [];
  return {
    header: t.header,
    rows: t.rows,
    cells,
    labels: (j) => cells(j).map((x) => (x === null || x === undefined ? "" : String(x))),
    isLabel: (j) => !t.names.includes(t.header[j]),
    where: t.where,
    notes: [...sourceNotes, ...t.reading.notes],
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
