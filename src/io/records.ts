// The record reader: RFC 4180 quoting over any of the three delimiters (comma, semicolon, tab),
// CRLF, LF or CR line ends, an optional UTF-8 BOM, and lines starting with "#" as comments.
// Pure: text arrives in pieces of any size (a file read in 256 KiB pieces, or a pasted table).
import { EngineError } from "../engine";

/** Receives each record (its fields, and the 1-based line it starts on). */
export type RecordSink = (fields: string[], line: number) => void;

/** The delimiters Fanwise reads. */
export type Delimiter = "," | ";" | "\t";

const SPECIAL: Record<Delimiter, RegExp> = { ",": /[,\r\n"]/g, ";": /[;\r\n"]/g, "\t": /[\t\r\n"]/g };

/**
 * An incremental RFC 4180 reader (the format of RFC 4180, with the delimiter as a parameter):
 * `push` text in pieces of any size (a record may span pieces), then `end`. Empty lines are
 * skipped; a line starting with "#" is a comment. Throws an `input` EngineError for an
 * unterminated quote.
 * @example const r = new CsvRecordReader((f) => out.push(f)); r.push("a,\"b,"); r.push("c\"\n"); r.end(); // out: [["a", "b,c"]]
 */
export class CsvRecordReader {
  private field = "";
  private fields: string[] = [];
  private inQuotes = false;
  private quoteSeen = false;
  private inComment = false;
  private afterCR = false;
  private atLineStart = true;
  private started = false;
  private line = 1;
  private recordLine = 1;
  private readonly special: RegExp;

  /**
   * @param sink receives each record
   * @param delimiter the field delimiter (comma by default)
   * @param firstLine the line number of the first text pushed (2 when a `sep=` line was taken off)
   */
  constructor(private readonly sink: RecordSink, private readonly delimiter: Delimiter = ",", firstLine = 1) {
    this.special = new RegExp(SPECIAL[delimiter].source, "g");
    this.line = firstLine;
    this.recordLine = firstLine;
  }

  /** Feeds the next piece of text. */
  push(s: string): void {
    let i = 0;
    const n = s.length;
    const delim = this.delimiter;
    if (!this.started && n > 0) {
      this.started = true;
      if (s.charCodeAt(0) === 0xfeff) i = 1; // UTF-8 byte order mark
    }
    while (i < n) {
      const ch = s[i];
      if (this.afterCR) {
        this.afterCR = false;
        if (ch === "\n") { i++; continue; }
      }
      if (this.inComment) {
        if (ch === "\n" || ch === "\r") this.newLine(ch);
        i++;
        continue;
      }
      if (this.inQuotes) {
        if (this.quoteSeen) {
          this.quoteSeen = false;
          if (ch === '"') { this.field += '"'; i++; continue; }
          this.inQuotes = false; // the closing quote; ch is read as unquoted text below
        } else {
          const q = s.indexOf('"', i);
          const end = q < 0 ? n : q;
          const chunk = s.slice(i, end);
          for (let k = chunk.indexOf("\n"); k >= 0; k = chunk.indexOf("\n", k + 1)) this.line++;
          this.field += chunk;
          if (q >= 0) this.quoteSeen = true;
          i = end + (q >= 0 ? 1 : 0);
          continue;
        }
      }
      if (this.atLineStart && ch === "#") { this.inComment = true; i++; continue; }
      this.atLineStart = false;
      if (ch === '"' && this.field.trim() === "") { this.field = ""; this.inQuotes = true; i++; continue; }
      if (ch === delim) { this.fields.push(this.field); this.field = ""; i++; continue; }
      if (ch === "\n" || ch === "\r") { this.endRecord(); this.newLine(ch); i++; continue; }
      // Plain text: take everything up to the next delimiter, quote or line break at once.
      const special = this.special;
      special.lastIndex = i + 1;
      const m = special.exec(s);
      const end = m ? m.index : n;
      this.field += s.slice(i, end);
      i = end;
    }
  }

  /** Ends the input: flushes the last record; throws if a quoted field was never closed. */
  end(): void {
    if (this.inQuotes && !this.quoteSeen) throw new EngineError("input", `A quoted field starting on line ${this.recordLine} is never closed. Check the quotes in the file.`);
    if (this.field !== "" || this.fields.length > 0) this.endRecord();
  }

  private newLine(ch: string): void {
    this.inComment = false;
    this.line++;
    this.recordLine = this.line;
    this.atLineStart = true;
    if (ch === "\r") this.afterCR = true;
  }

  private endRecord(): void {
    this.fields.push(this.field);
    const blank = this.fields.length === 1 && this.fields[0].trim() === "";
    if (!blank) this.sink(this.fields, this.recordLine);
    this.fields = [];
    this.field = "";
  }
}

/** The error for a file that is not text. */
export function notText(): EngineError {
  return new EngineError("input", "The file is not text (it contains NUL bytes). Export the sheet as CSV first.");
}
