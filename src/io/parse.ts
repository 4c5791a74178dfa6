// Text held in memory (the pane's paste box, tests) → columns → a table read for forecasting.
import { CsvColumns } from "./columns";
import { detectDelimiter } from "./delimiter";
import { CsvRecordReader, Delimiter, notText } from "./records";
import { readTable, ReadOptions, SeriesTable } from "./table";

/** Options for reading text. */
export interface ParseOptions {
  /** Force the delimiter (else detected: a `sep=` first line, or the first lines). */
  delimiter?: Delimiter;
  /** Keep the text of a label column named as such (for row labels); default true. */
  keepLabels?: boolean;
}

/**
 * Parses CSV text held in memory into compact columns, with the delimiter forced or detected
 * ({@link detectDelimiter}). Throws an `input` EngineError naming the line for unequal rows or an
 * unterminated quote.
 * @example parseCsv("a;b\n1;2\n").delimiter // ";"
 */
export function parseCsv(text: string, options: ParseOptions = {}): CsvColumns {
  if (text.indexOf("\u0000") >= 0) throw notText();
  const choice = detectDelimiter(text, options.delimiter);
  const cols = new CsvColumns(options.keepLabels ?? true, choice.delimiter, choice.from);
  const reader = new CsvRecordReader((fields, line) => cols.add(fields, line), choice.delimiter, choice.firstLine);
  reader.push(text.slice(choice.skip));
  reader.end();
  return cols.finish();
}

/**
 * Reads CSV text for forecasting: {@link parseCsv}, then {@link readTable}.
 * @example readCsvText("month,sales\n2024-01,5\n2024-02,6\n").names // ["sales"]
 */
export function readCsvText(text: string, options: ParseOptions & ReadOptions = {}): SeriesTable {
  return readTable(parseCsv(text, options), options);
}
