// Writing a per-series command's table as its series are computed (in order), so a run over many
// series never holds every result: CSV rows or the JSON object's entries are written one series at
// a time, byte for byte what the whole table written at once would be. A workbook (--out FILE.xlsx)
// needs the whole table and collects it first.
import * as fs from "fs";
import * as path from "path";
import { EngineError } from "../engine";
import { csvCell } from "../io";
import { ParsedArgs } from "./options";
import { DEFAULT_DIGITS, emit, Io, rowPrinter, TableResult, writeError } from "./output";

/** How a command writes each series' result. */
export interface SeriesOutput<R> {
  command: string;
  header: string[];
  /** Columns beyond the usual counts that are never rounded. */
  exact?: string[];
  /** The JSON object's keys before "series" (the reading), asked for once every series' cells were read. */
  head: () => Record<string, unknown>;
  /** One series' JSON entry: its name and its object. */
  entry: (r: R) => [string, unknown];
  /** One series' CSV rows. */
  rows: (r: R) => unknown[][];
  /** For a workbook: number formats, cautions and charts of the whole table. */
  workbook: (all: R[]) => Pick<TableResult, "formats" | "cautions" | "charts">;
}

/** Output is written in pieces of about this size (a usage error found by the first series leaves stdout empty). */
const PIECE = 1 << 20;

function indent(json: string, pad: string): string {
  return json.replace(/\n/g, `\n${pad}`);
}

/**
 * Writes the results as they come: to stdout (CSV, or JSON with --json) or to --out FILE (.csv,
 * .json: the same text; .xlsx: the whole table as a workbook). `each` sees every result after it
 * is written (to count failures). The bytes are those JSON.stringify(…, null, 2) and the CSV writer
 * give for the whole table.
 * @example await emitSeries(io, parsed, output, inOrder(parsed, "fan", data, 2, one), (r) => count(r))
 */
export async function emitSeries<R>(io: Io, p: ParsedArgs, o: SeriesOutput<R>, results: AsyncIterable<R>, each: (r: R) => void): Promise<void> {
  const out = p.has("out") ? p.text("out") : undefined;
  const ext = out === undefined ? "" : path.extname(out).toLowerCase();
  if (out !== undefined && ext !== ".xlsx" && ext !== ".csv" && ext !== ".json") throw new EngineError("input", `--out must name a .xlsx, .csv or .json file, e.g. --out results.xlsx; got "${out}".`);
  if (ext === ".xlsx") {
    const all: R[] = [];
    for await (const r of results) { all.push(r); each(r); }
    const table: TableResult = {
      command: o.command,
      header: o.header,
      exact: o.exact,
      json: () => ({ ...o.head(), series: Object.fromEntries(all.map(o.entry)) }),
      rows: () => all.flatMap(o.rows),
      ...o.workbook(all),
    };
    await emit(io, p, table);
    return;
  }
  let fd: number | null = null;
  let buffer = "";
  const flush = (): void => {
    if (buffer === "") return;
    if (fd === null) io.out(buffer);
    else fs.writeSync(fd, buffer);
    buffer = "";
  };
  const write = (s: string): void => {
    buffer += s;
    if (buffer.length >= PIECE) flush();
  };
  try {
    if (out !== undefined) fd = fs.openSync(out, "w");
  } catch (e) {
    throw new EngineError("input", writeError(out as string, String((e as NodeJS.ErrnoException).code ?? "error")));
  }
  try {
    if (p.has("json") || ext === ".json") {
      let first = true;
      write("{\n");
      for (const [k, v] of Object.entries(o.head())) {
        if (v === undefined) continue;
        write(`${first ? "" : ",\n"}  ${JSON.stringify(k)}: ${indent(JSON.stringify(v, null, 2), "  ")}`);
        first = false;
      }
      write(`${first ? "" : ",\n"}  "series": {`);
      let any = false;
      for await (const r of results) {
        const [name, v] = o.entry(r);
        if (v !== undefined) {
          write(`${any ? "," : ""}\n    ${JSON.stringify(name)}: ${indent(JSON.stringify(v, null, 2), "    ")}`);
          any = true;
        }
        each(r);
      }
      write(any ? "\n  }\n}\n" : "}\n}\n");
    } else {
      const print = rowPrinter(o.header, o.exact, p.value<number>("digits") ?? DEFAULT_DIGITS);
      write(o.header.map(csvCell).join(",") + "\n");
      for await (const r of results) {
        for (const row of o.rows(r)) write(print(row).map(csvCell).join(",") + "\n");
        each(r);
      }
    }
    flush();
  } finally {
    if (fd !== null) fs.closeSync(fd);
  }
  if (out !== undefined) io.out(`Wrote ${out}\n`);
}
