// Reading a CSV file for the command line: in 256 KiB pieces, parsed as they arrive (src/io), so the
// file's text is never held whole.
import * as fs from "fs";
import { EngineError } from "../engine";
import { CsvColumns, CsvRecordReader, Delimiter, detectDelimiter, LongColumns, LongSpec, notText } from "../io";

/**
 * Reads a CSV file in 256 KiB pieces straight into columns; the text is never held whole. UTF-8 (with
 * or without a BOM) is expected; a file that is not valid UTF-8 is read again as Windows-1252 (what
 * older spreadsheet programs export). The delimiter is `delimiter` when given, else detected from the
 * first piece (a `sep=` first line, or the first lines). `keepLabels` keeps the text of a first
 * column named like a period even past the reader's cap (labels for a chart's axis or an audit's
 * hit strip). Throws `input` EngineErrors that say what to fix.
 * @example readCsvFile("sales.csv").header // ["month", "Harbour Street", …]
 */
export function readCsvFile(file: string, options: { delimiter?: Delimiter; keepLabels?: boolean; long?: LongSpec } = {}): CsvColumns {
  let fd: number;
  try {
    fd = fs.openSync(file, "r");
    if (fs.fstatSync(fd).isDirectory()) {
      fs.closeSync(fd);
      throw Object.assign(new Error("dir"), { code: "EISDIR" });
    }
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new EngineError("input", code === "ENOENT" ? `File not found: ${file}` : code === "EISDIR" ? `${file} is a folder, not a CSV file.` : code === "EACCES" ? `No permission to read ${file}.` : `Cannot read ${file} (${code ?? "error"}).`);
  }
  try {
    const first = readWith(fd, "utf-8", options.delimiter, options.keepLabels ?? false, options.long);
    if (first !== "not-utf8") return first;
    return readWith(fd, "windows-1252", options.delimiter, options.keepLabels ?? false, options.long) as CsvColumns;
  } finally {
    fs.closeSync(fd);
  }
}

function readWith(fd: number, encoding: "utf-8" | "windows-1252", delimiter: Delimiter | undefined, keepLabels: boolean, long: LongSpec | undefined): CsvColumns | "not-utf8" {
  // The first piece decides the delimiter (the command line names rows by their line, so label text
  // that is not a period is not kept unless asked).
  let state: { cols: CsvColumns; reader: CsvRecordReader } | null = null;
  const feed = (text: string): CsvColumns => {
    if (!state) {
      const choice = detectDelimiter(text, delimiter);
      // A long file (--long) is collected straight into its wide table, record by record.
      const cols = long ? new LongColumns(long, keepLabels, choice.delimiter, choice.from) : new CsvColumns(keepLabels, choice.delimiter, choice.from);
      state = { cols, reader: new CsvRecordReader((fields, line) => cols.add(fields, line), choice.delimiter, choice.firstLine) };
      text = text.slice(choice.skip);
    }
    state.reader.push(text);
    return state.cols;
  };
  const buf = Buffer.allocUnsafe(1 << 18);
  // fatal: a malformed UTF-8 sequence throws (sequences cut between pieces are joined by stream).
  const decoder = new TextDecoder(encoding, { fatal: encoding === "utf-8" });
  const size = fs.fstatSync(fd).size;
  let pos = 0;
  let cols: CsvColumns | null = null;
  try {
    for (;;) {
      const got = fs.readSync(fd, buf, 0, buf.length, pos);
      if (got === 0) break;
      pos += got;
      const bytes = buf.subarray(0, got);
      if (bytes.indexOf(0) >= 0) throw notText();
      cols = feed(decoder.decode(bytes, { stream: true }));
      // After the first piece, size the columns for the whole file (rows per byte so far × size,
      // plus 5%), so they are allocated about once instead of grown and copied.
      if (pos === got && got < size) cols.reserve(Math.ceil((cols.rows * size * 1.05) / got));
    }
    cols = feed(decoder.decode());
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ERR_ENCODING_INVALID_ENCODED_DATA") return "not-utf8";
    throw e;
  }
  (state as unknown as { reader: CsvRecordReader }).reader.end();
  return cols.finish();
}
