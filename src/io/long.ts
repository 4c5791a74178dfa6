// Reading a long ("tidy") table — one row per series and period, as databases and reporting tools
// export many series — by turning it, record by record, into the wide table the rest of the reader
// knows (a period column, then one column per series in order of first appearance). Each series
// cell keeps the line it came from, so every message names the line of the long file; only the
// wide table (series × periods) is held, never the long file's text.
import { EngineError } from "../engine";
import { Column, CsvColumns, LABEL_NAMES } from "./columns";
import { delimiterName, DelimiterFrom, likelyDelimiter } from "./delimiter";
import { parsePeriodLabel } from "./period-labels";
import type { Delimiter } from "./records";
import { readTable, ReadOptions, SeriesTable } from "./table";

/** The three columns of a long table, by header name. */
export interface LongSpec {
  series: string;
  period: string;
  value: string;
}

/**
 * Reads the text of --long: three header names separated by commas (series, period, value); an
 * `input` EngineError that shows the form otherwise.
 * @example parseLongSpec("store,month,sales") // { series: "store", period: "month", value: "sales" }
 */
export function parseLongSpec(text: string, option = "--long"): LongSpec {
  const parts = text.split(",").map((x) => x.trim());
  if (parts.length !== 3 || parts.some((x) => x === "")) {
    throw new EngineError("input", `${option} needs three column names separated by commas — the series, the period and the value column — e.g. ${option} store,month,sales; got "${text}".`);
  }
  const [series, period, value] = parts;
  if (new Set(parts).size !== 3) throw new EngineError("input", `${option} names the same column twice ("${text}"); give three different columns: series, period, value, e.g. ${option} store,month,sales.`);
  return { series, period, value };
}

/** Series names that usually mean a total of the others. */
const TOTAL_NAMES = /^(total|totals|grand total|sum|all|overall|gesamt|summe|insgesamt|total général|totale)$/i;

/** A cell of a long record: text as written, a number a workbook stored as a number, or blank. */
type LongCell = string | number | null;

/**
 * A long table's records collected as a wide table: column 0 holds the periods (one row per
 * distinct period, in order of first appearance; a period written two ways is one row), then one
 * column per series in order of first appearance. Read it with {@link readLongTable}.
 */
export class LongColumns extends CsvColumns {
  /** The long file's own header. */
  longHeader: string[] = [];
  /** Long columns not read (neither series, period nor value). */
  unused: string[] = [];
  /** Lines whose series name is blank while the row has a value or a period (left out). */
  unnamed: number[] = [];
  private at: [number, number, number] = [-1, -1, -1];
  private seriesOf = new Map<string, number>();
  private rowOf = new Map<string, number>();
  /** For each series, the long file's line of its cell in each wide row (0: no row). */
  private cellLines: Int32Array[] = [];
  private capacity = 16;

  constructor(readonly spec: LongSpec, private readonly keepText = false, delimiter: Delimiter = ",", delimiterFrom: DelimiterFrom = "default", place: (line: number) => string = (l) => `line ${l}`, readonly option = "--long") {
    super(false, delimiter, delimiterFrom, place);
    this.lineNos = new Int32Array(this.capacity);
  }

  /**
   * A long table from columns already read (an .xlsx sheet): its header names the columns, each row
   * is one record (numbers stay numbers).
   * @example LongColumns.fromColumns(sheet, { series: "store", period: "month", value: "sales" }).header // ["month", "Harbour Street", …]
   */
  static fromColumns(source: CsvColumns, spec: LongSpec, option = "--long"): LongColumns {
    const long = new LongColumns(spec, false, source.delimiter, source.delimiterFrom, source.place, option);
    long.setHeader(source.header, source.sample);
    const cell = (j: number, i: number): LongCell => {
      const c = source.cols[j];
      if (c.kinds[i] === 0) return null;
      return c.kinds[i] === 5 ? c.nums[i] : c.text(i);
    };
    const [s, p, v] = long.at;
    for (let i = 0; i < source.rows; i++) long.record(cell(s, i), cell(p, i), cell(v, i), source.line(i));
    return long.finish();
  }

  /** Adds one CSV record: the first is the long file's header, the rest its rows. */
  override add(fields: string[], line: number): void {
    if (this.sample.length < 5) this.sample.push(fields.join(this.delimiter));
    if (this.longHeader.length === 0) {
      this.setHeader(fields.map((h) => h.trim()), this.sample);
      return;
    }
    this.checkWidth(fields.length, this.longHeader.length, line);
    const [s, p, v] = this.at;
    this.record(fields[s], fields[p], fields[v], line);
  }

  /** A workbook row; read through {@link fromColumns} instead. */
  override addCells(): void {
    throw new Error("LongColumns.addCells: use LongColumns.fromColumns for a workbook");
  }

  /** The wide table's size is known only as periods arrive: nothing to reserve ahead. */
  override reserve(): void {
    // (the series columns grow with the number of periods, see `record`)
  }

  override where(i: number, j?: number): string {
    if (j !== undefined && j >= 1) {
      const l = this.cellLines[j - 1]?.[i] ?? 0;
      if (l > 0) return this.place(l);
      return `${this.cols[0].text(i)} (no row for ${this.cols[j].name})`;
    }
    return super.where(i);
  }

  override finish(): this {
    if (this.longHeader.length === 0) throw new EngineError("input", "The file has no rows. It needs a header row naming the columns, then one row per series and period.");
    if (this.rows === 0 && this.unnamed.length === 0) throw new EngineError("input", "The file has a header row but no data rows.");
    if (this.cols.length <= 1) {
      throw new EngineError("input", `No row of the file has a series name in "${this.spec.series}" (the series column of ${this.option}). Check the column names: ${this.option} SERIES_COL,PERIOD_COL,VALUE_COL.`);
    }
    return this;
  }

  private setHeader(header: string[], sample: string[]): void {
    this.longHeader = header.map((h, j) => h || `column ${j + 1}`);
    const names: [keyof LongSpec, string][] = [["series", this.spec.series], ["period", this.spec.period], ["value", this.spec.value]];
    names.forEach(([role, name], k) => {
      const j = this.longHeader.indexOf(name);
      if (j >= 0) { this.at[k] = j; return; }
      const hint = this.longHeader.find((h) => h.toLowerCase() === name.toLowerCase());
      const one = this.longHeader.length === 1 ? likelyDelimiter(sample, this.delimiter) : null;
      const delim = one ? ` The file reads as one column with ${delimiterName(this.delimiter)}s as the delimiter, but its lines hold ${delimiterName(one)}s: add --delimiter ${one === "\t" ? "tab" : one}.` : "";
      throw new EngineError("input", `${this.option}: no column named "${name}" (the ${role} column)${hint ? ` — did you mean "${hint}"? names are matched exactly` : ""}. The file's columns: ${this.longHeader.join(", ")}.${delim} Give ${this.option} SERIES_COL,PERIOD_COL,VALUE_COL with three of them.`);
    });
    this.unused = this.longHeader.filter((_, j) => !this.at.includes(j));
    const period = this.longHeader[this.at[1]];
    this.header = [period];
    this.cols = [new Column(period, LABEL_NAMES.test(period), this.keepText)];
  }

  /** One long record: its series cell, period cell and value cell. */
  private record(seriesCell: LongCell, periodCell: LongCell, valueCell: LongCell, line: number): void {
    const name = seriesCell === null ? "" : String(seriesCell).trim();
    const blank = (c: LongCell): boolean => c === null || (typeof c === "string" && c.trim() === "");
    if (name === "") {
      if (!blank(periodCell) || !blank(valueCell)) this.unnamed.push(line);
      return;
    }
    let s = this.seriesOf.get(name);
    if (s === undefined) {
      s = this.cols.length - 1;
      this.seriesOf.set(name, s);
      this.header.push(name);
      const col = new Column(name, false, true, `series "${name}" (column "${this.spec.value}")`);
      col.reserve(this.capacity);
      this.cols.push(col);
      this.cellLines.push(new Int32Array(this.capacity));
    }
    const r = this.periodRow(periodCell, line);
    const lines = this.cellLines[s];
    if (lines[r] > 0) {
      throw new EngineError("input", `Series "${name}" has two rows for the period ${this.cols[0].text(r) || "(blank)"} (${this.place(lines[r])} and ${this.place(line)}). Keep one row per series and period: remove or add up the duplicate.`);
    }
    lines[r] = line;
    const col = this.cols[s + 1];
    if (typeof valueCell === "number") col.addValue(r, valueCell);
    else col.add(r, valueCell ?? "");
  }

  /** The wide row of a period cell (a new row for a period not seen before). */
  private periodRow(cell: LongCell, line: number): number {
    let key: string;
    if (typeof cell === "number") key = `n:${cell}`;
    else {
      const t = (cell ?? "").trim();
      const p = parsePeriodLabel(t);
      key = p ? `p:${p.family}:${p.y}:${p.a}:${p.b}` : `t:${t}`;
    }
    const known = this.rowOf.get(key);
    if (known !== undefined) return known;
    const r = this.rows++;
    if (r >= this.capacity) this.grow(this.capacity * 2);
    this.lineNos[r] = line;
    this.rowOf.set(key, r);
    if (typeof cell === "number") this.cols[0].addValue(r, cell);
    else this.cols[0].add(r, cell ?? "");
    return r;
  }

  private grow(n: number): void {
    this.capacity = n;
    const l = new Int32Array(n);
    l.set(this.lineNos.subarray(0, Math.min(this.lineNos.length, n)));
    this.lineNos = l;
    for (const c of this.cols) c.reserve(n);
    this.cellLines = this.cellLines.map((a) => {
      const b = new Int32Array(n);
      b.set(a);
      return b;
    });
  }

  /** For series column j (≥ 1), whether its long file has a row for wide row i. */
  hasRow(j: number, i: number): boolean {
    return (this.cellLines[j - 1]?.[i] ?? 0) > 0;
  }
}

/**
 * Reads a long table (collected by {@link LongColumns}) like a wide one with {@link readTable}: the
 * same period labels, calendar, number formats and Total-row handling, one series per name in order
 * of first appearance. The row order of a long file means nothing, so no note says the rows were
 * out of time order. Notes say what else was decided: rows without a series name left out, periods
 * with no row inside a series (a missing observation at its place), a series named like a total,
 * and the long file's columns that were not read (`reading.ignored`).
 * @example readLongTable(long).names // ["Harbour Street", "Old Quay"]
 */
export function readLongTable(cols: LongColumns, options: ReadOptions = {}): SeriesTable {
  const read = readTable(cols, { ...options, rowsInAnyOrder: true });
  // The wide rows in time order (−1: a skipped period), and each series' column in the wide table.
  const order = read.calendar ? read.calendar.order : Int32Array.from({ length: cols.rows }, (_, i) => i);
  const columnOf = new Map(cols.header.map((h, j) => [h, j]));
  const t = withoutEmptySeries(read, cols, order, columnOf);
  const notes = t.reading.notes;
  if (cols.unnamed.length) {
    const n = cols.unnamed.length;
    const shown = cols.unnamed.slice(0, 5).map((l) => cols.place(l).replace(/^line /, ""));
    const places = /^line /.test(cols.place(cols.unnamed[0])) ? `${n === 1 ? "Line" : "Lines"} ${shown.join(", ")}${n > 5 ? ` and ${n - 5} more` : ""}` : `${shown.join(", ")}${n > 5 ? ` and ${n - 5} more` : ""}`;
    notes.push(`${places} ${n === 1 ? "has" : "have"} no series name in "${cols.spec.series}"; left out (a total row has none; give ${n === 1 ? "it" : "each"} a series name to forecast ${n === 1 ? "it" : "them"}).`);
  }
  // Periods with no row inside a series (not those no series has: the calendar names them).
  const gaps: string[] = [];
  let gapSeries = 0;
  t.names.forEach((name) => {
    const j = columnOf.get(name) as number;
    let first = -1;
    let last = -1;
    order.forEach((r, i) => {
      if (r >= 0 && cols.hasRow(j, r)) { if (first < 0) first = i; last = i; }
    });
    const absent: string[] = [];
    for (let i = first + 1; i < last; i++) if (order[i] >= 0 && !cols.hasRow(j, order[i])) absent.push(t.labelColumn?.values[i] ?? `row ${i + 1}`);
    if (absent.length === 0) return;
    gapSeries++;
    if (gaps.length < 5) gaps.push(`${name} (${absent.length <= 3 ? absent.join(", ") : `${absent.slice(0, 3).join(", ")} and ${absent.length - 3} more`})`);
  });
  if (gapSeries) notes.push(`No row for some periods inside ${gapSeries === 1 ? "a series" : `${gapSeries} series`}: ${gaps.join("; ")}${gapSeries > 5 ? `; and ${gapSeries - 5} more series` : ""}. Each is a missing observation (blank) at its place.`);
  const totals = t.names.filter((n) => TOTAL_NAMES.test(n));
  for (const n of totals) notes.push(`Series "${n}" looks like a total of the others; it is read as a series of its own (leave it out with --series if it is one).`);
  t.reading.ignored.push(...cols.unused);
  return t;
}

/**
 * The table without the series none of whose rows was kept: a long file's total row with a series
 * name but no period (`Summe;;99.999,00`) makes a series whose only row is left out as "not a
 * period"; it is dropped with a note naming its lines rather than read as a series with no values.
 * Throws when no series is left. Common practice (a total row is not a series).
 * @example withoutEmptySeries(readTable(cols), cols, order, columnOf).names // ["Hafen", "Mühlweg"] (without "Summe")
 */
function withoutEmptySeries(t: SeriesTable, cols: LongColumns, order: Int32Array, columnOf: Map<string, number>): SeriesTable {
  const keptRow = (j: number): boolean => {
    for (const r of order) if (r >= 0 && cols.hasRow(j, r)) return true;
    return false;
  };
  const kept: number[] = [];
  const dropped: string[] = [];
  t.names.forEach((name, s) => {
    if (keptRow(columnOf.get(name) as number)) kept.push(s);
    else dropped.push(name);
  });
  if (dropped.length === 0) return t;
  if (kept.length === 0) {
    throw new EngineError("input", `No series has a row with a period: every row was left out (${t.reading.notes.join(" ")}). Check the period column "${cols.spec.period}" of ${cols.option}.`);
  }
  for (const name of dropped) {
    const j = columnOf.get(name) as number;
    const lines: string[] = [];
    for (let r = 0; r < cols.rows && lines.length < 3; r++) if (cols.hasRow(j, r)) lines.push(cols.where(r, j));
    t.reading.notes.push(`Series "${name}" has no row with a period (${lines.join(", ")}: left out above), so it is not read (a total row is not a series).`);
  }
  return {
    ...t,
    names: kept.map((s) => t.names[s]),
    column: (s) => t.column(kept[s]),
    where: (i, s) => t.where(i, s === undefined ? undefined : kept[s]),
  };
}
