// A block of spreadsheet cells (the pane's Excel selection): which column holds the dates, told by
// the cells' number formats (a date is a number shown with a date format) or by period labels in
// text, and whether the rows are in the order the cell functions will read them.
import { EngineError, RawCell } from "../engine";
import { calendarFor, Calendar, LabelledRow } from "./calendar";
import { LabelParts, parsePeriodLabel } from "./period-labels";

/**
 * Whether a spreadsheet number format shows a date: it has a day or year code (d, y), or a month
 * code (m) without hours or seconds (h:mm is a time), outside quoted text, brackets ([$-409],
 * colours) and escaped characters. Common practice (the number-format codes of the common
 * spreadsheet programs; from memory of ECMA-376 Part 1, §18.8.31).
 * @example isDateFormat("dd/mm/yyyy") // true
 */
export function isDateFormat(format: string | null | undefined): boolean {
  if (!format) return false;
  const f = format.replace(/"[^"]*"/g, "").replace(/\[[^\]]*\]/g, "").replace(/\\./g, "").replace(/_./g, "");
  if (/general/i.test(f)) return false;
  return /[dy]/i.test(f) || (/m/i.test(f) && !/[hs]/i.test(f));
}

/** The date column of a block of cells and its calendar, or why the block cannot be read as it stands. */
export interface CellDates {
  /** The column (0-based) holding the dates. */
  column: number;
  calendar: Calendar | null;
  /** What is wrong with the order of the rows and how to fix it (the cell functions read the cells as they stand). */
  problem: string | null;
}

/**
 * Finds the date column of a block of cells (the rows below any header; `formats` are the cells'
 * number formats when known) and reads its calendar. The block is read as it stands, as the cell
 * functions will: rows out of time order, a skipped period or a row that is not a period (a Total)
 * make a `problem` saying what to change in the sheet, so the preview never differs from what the
 * cells compute. Null when no column holds dates.
 * @example findDateColumn([[45292, 5], [45323, 6], [45352, 7]], [["yyyy-mm-dd", "0"], ["yyyy-mm-dd", "0"], ["yyyy-mm-dd", "0"]], 2, "Date")?.calendar?.frequency // "monthly"
 */
export function findDateColumn(body: RawCell[][], formats: (string | null)[][] | null, firstRow: number, name: (j: number) => string): CellDates | null {
  const width = body[0]?.length ?? 0;
  for (let j = 0; j < width; j++) {
    const parts: (LabelParts | null)[] = [];
    let nonBlank = 0;
    let dates = 0;
    for (let i = 0; i < body.length; i++) {
      const c = body[i][j];
      let p: LabelParts | null = null;
      if (c !== null && c !== undefined && c !== "") nonBlank++;
      if (typeof c === "number" && Number.isFinite(c) && isDateFormat(formats?.[i]?.[j])) p = { family: "serial", y: c, a: 0, b: 0, format: "date cells" };
      else if (typeof c === "string") p = parsePeriodLabel(c);
      parts.push(p);
      if (p) dates++;
    }
    if (dates < 2 || dates * 2 <= nonBlank) continue;
    const family = parts.find((p) => p)?.family;
    const rows: LabelledRow[] = [];
    const where = (r: number): string => `row ${firstRow + r}`;
    for (let i = 0; i < parts.length; i++) {
      const p = parts[i];
      const c = body[i][j];
      if (p && p.family === family) { rows.push({ row: i, parts: p }); continue; }
      if (body[i].every((x) => x === null || x === undefined || x === "")) continue;
      const label = c === null || c === undefined || c === "" ? "no date" : `"${String(c)}"`;
      return { column: j, calendar: null, problem: `${cap(where(i))} (${label}) is not a period of "${name(j)}". Select the rows of the periods only (without totals), so the FW functions read the same series.` };
    }
    let calendar: Calendar;
    try {
      calendar = calendarFor(rows, name(j), where);
    } catch (e) {
      if (e instanceof EngineError) return { column: j, calendar: null, problem: e.message };
      throw e;
    }
    let problem: string | null = null;
    if (calendar.reversed || calendar.sorted) problem = `The dates in "${name(j)}" are ${calendar.reversed ? "newest first" : "not in time order"}; the FW functions read a column from the top as oldest first. Sort the rows by "${name(j)}", oldest first.`;
    else if (calendar.skipped.length) problem = `"${name(j)}" has no row for ${calendar.skipped.slice(0, 4).join(", ")}${calendar.skipped.length > 4 ? " and more" : ""}: insert a row for each missing period with its date and a blank value, so the seasons stay in place.`;
    return { column: j, calendar, problem };
  }
  return null;
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
