// Output of the command line: the streams (replaceable in tests), one-line messages, printed
// numbers (--digits), exit codes, and where a command's table goes (stdout as CSV or JSON, or a
// file with --out: .xlsx, .csv or .json).
import * as fs from "fs";
import * as path from "path";
import { EngineError } from "../engine";
import { toCsv } from "../io";
import { ParsedArgs } from "./options";

/** Output streams, replaceable in tests. */
export interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
}

/** The process's stdout and stderr. */
export const defaultIo: Io = {
  out: (s) => void process.stdout.write(s),
  err: (s) => void process.stderr.write(s),
};

/**
 * A message on one line (a quoted CSV field may carry line breaks into it).
 * @example oneLine("a\r\n  b") // "a b"
 */
export function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, " ");
}

/**
 * A series that could not be used: its message on stderr, on one line, as "fanwise: name: …".
 * @example seriesError(io, "Old Quay", "Not Box-Cox ready") // stderr: "fanwise: Old Quay: Not Box-Cox ready"
 */
export function seriesError(io: Io, name: string, message: string | undefined): void {
  io.err(`fanwise: ${oneLine(`${name}: ${message ?? ""}`)}\n`);
}

/**
 * The exit code of a per-series command: 0 when every series was computed, 3 when some failed
 * (their messages are in the output and on stderr), 1 when none was computed.
 * @example exitCode(5, 1) // 3
 */
export function exitCode(computed: number, failed: number): number {
  if (computed === 0) return 1;
  return failed === 0 ? 0 : 3;
}

/** Significant digits printed by default: enough for any money amount, short of float noise. */
export const DEFAULT_DIGITS = 10;

/**
 * A number as printed: rounded to `digits` significant digits and written in its shortest form
 * (so 111144.05996502224 → "111144.06" and 25099.89999999999 → "25099.9" at 10 digits).
 * Common practice (shortest round-trip text of the rounded double).
 * @example formatNumber(25099.89999999999) // "25099.9"
 */
export function formatNumber(x: number, digits = DEFAULT_DIGITS): string {
  if (!Number.isFinite(x)) return "";
  return String(Number(x.toPrecision(digits)));
}

/** Column names that hold counts or codes: printed as they are, never rounded. */
const COUNT_COLUMNS = new Set(["h", "n", "blanks", "text_cells", "nonpositive", "horizon", "paths", "origins", "misses", "level", "nominal", "period"]);

/** A picture of a result (a fan chart), drawn as SVG. */
export interface ChartPicture {
  title: string;
  svg: string;
  width: number;
  height: number;
}

/** A command's result in every form it can be written in. */
export interface TableResult {
  /** The command's name (the workbook sheet is named after it). */
  command: string;
  json: () => unknown;
  header: string[];
  rows: () => unknown[][];
  /** Columns beyond the usual counts that are never rounded. */
  exact?: string[];
  /** Excel number formats by column name, for --out FILE.xlsx (default "#,##0.00" for numbers). */
  formats?: Record<string, string>;
  /** Messages a reader of the workbook must see (series that failed, notes). */
  cautions?: string[];
  /** The charts to place beside the table in a workbook. */
  charts?: () => ChartPicture[];
}

/** The table's rows with numbers rounded for print (--digits), counts left as they are. */
export function printedRows(r: TableResult, digits: number): unknown[][] {
  return r.rows().map(rowPrinter(r.header, r.exact, digits));
}

/**
 * Rounds one row's numbers for print (--digits), leaving counts and the `exact` columns as they are.
 * @example rowPrinter(["series", "h", "mean"], undefined, 3)(["a", 1, 12.345]) // ["a", 1, "12.3"]
 */
export function rowPrinter(header: string[], exactColumns: string[] | undefined, digits: number): (row: unknown[]) => unknown[] {
  const exact = header.map((h) => COUNT_COLUMNS.has(h) || (exactColumns ?? []).includes(h));
  return (row) => row.map((v, j) => (typeof v === "number" && !exact[j] ? formatNumber(v, digits) : v));
}

/**
 * The message for a file --out cannot write (its system error code in words).
 * @example writeError("x/y.csv", "ENOENT") // "Cannot write x/y.csv (no such folder)."
 */
export function writeError(out: string, code: string): string {
  return `Cannot write ${out} (${code === "ENOENT" ? "no such folder" : code === "EACCES" ? "no permission" : code === "EBUSY" ? "the file is open in another program" : code}).`;
}

/** Writes a workbook; loaded only when --out names an .xlsx file (it pulls in the xlsx library). */
type WorkbookWriter = (file: string, r: TableResult, p: ParsedArgs) => Promise<void>;

/**
 * Writes a command's result: with --out FILE to that file (.xlsx, .csv or .json, saying so on
 * stdout), else to stdout — JSON (full precision) with --json, CSV with numbers to --digits
 * significant digits otherwise.
 * @example await emit(io, parsed, { command: "screen", json: () => ({}), header: ["a"], rows: () => [[1]] }) // stdout: "a\n1\n"
 */
export async function emit(io: Io, p: ParsedArgs, r: TableResult, writeWorkbook?: WorkbookWriter): Promise<void> {
  const digits = p.value<number>("digits") ?? DEFAULT_DIGITS;
  const json = (): string => JSON.stringify(r.json(), null, 2) + "\n";
  const csv = (): string => toCsv(r.header, printedRows(r, digits));
  const out = p.has("out") ? p.text("out") : undefined;
  if (out === undefined) {
    io.out(p.has("json") ? json() : csv());
    return;
  }
  const ext = path.extname(out).toLowerCase();
  try {
    if (ext === ".xlsx") {
      const writer = writeWorkbook ?? (await import("./xlsx-write")).writeResultWorkbook;
      await writer(out, r, p);
    } else if (ext === ".json") fs.writeFileSync(out, json());
    else if (ext === ".csv") fs.writeFileSync(out, csv());
    else throw new EngineError("input", `--out must name a .xlsx, .csv or .json file, e.g. --out results.xlsx; got "${out}".`);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (typeof code === "string" && /^E[A-Z]+$/.test(code)) throw new EngineError("input", writeError(out, code));
    throw e;
  }
  io.out(`Wrote ${out}\n`);
}
