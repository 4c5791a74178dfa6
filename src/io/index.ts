// The shared reader of user tables (CSV files, the pane's paste box, the pane's selection): pure,
// no Node I/O, no DOM. Faces read text or cells and hand them here.
export { CsvRecordReader, notText } from "./records";
export type { Delimiter, RecordSink } from "./records";
export { detectDelimiter, delimiterName, likelyDelimiter, parseDelimiterOption } from "./delimiter";
export type { DelimiterChoice, DelimiterFrom } from "./delimiter";
export { parseNumberText, looksNumeric, markEvidence } from "./numbers";
export type { DecimalMark, NegativeStyle, ParsedNumber, MarkEvidence } from "./numbers";
export { parsePeriodLabel, fullYear, dayNumber, serialDay, isoDate } from "./period-labels";
export type { LabelFamily, LabelParts } from "./period-labels";
export { buildCalendar, calendarFor, DEFAULT_PERIOD, labelAfter } from "./calendar";
export type { Calendar, Frequency, LabelledRow } from "./calendar";
export { CsvColumns, LABEL_NAMES } from "./columns";
export { readTable } from "./table";
export type { ColumnReading, DatesReading, Reading, ReadOptions, SeriesTable } from "./table";
export { parseCsv, readCsvText } from "./parse";
export type { ParseOptions } from "./parse";
export { parseDecimalOption } from "./options";
export { csvCell, toCsv } from "./csv-out";
export { findDateColumn, isDateFormat } from "./cells";
export type { CellDates } from "./cells";
export { LongColumns, parseLongSpec, readLongTable } from "./long";
export type { LongSpec } from "./long";
