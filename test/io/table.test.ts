// Reading whole tables: delimiter, which column is the period, number formats decided per column
// from the whole column, rows that are not observations, and the messages for bad input. Rules are
// common practice (how spreadsheet importers read exports); the expectation for each is stated.
import { CsvRecordReader, detectDelimiter, likelyDelimiter, parseCsv, readCsvText } from "../../src/io";

describe("delimiters", () => {
  test("comma, semicolon and tab are detected from the first lines", () => {
    expect(detectDelimiter("month,sales\n2024-01,5\n").delimiter).toBe(",");
    expect(detectDelimiter("Monat;Umsatz\n01.1995;66190,00\n").delimiter).toBe(";");
    expect(detectDelimiter("month\tsales\n2024-01\t1,234.5\n").delimiter).toBe("\t");
    expect(detectDelimiter('Monat;Umsatz\n01.1995;"66.190,00"\n').delimiter).toBe(";");
  });
  test("a sep=; first line is honoured and skipped (lines keep their numbers)", () => {
    const c = detectDelimiter("sep=;\nJahr;Wert\n");
    expect(c).toMatchObject({ delimiter: ";", from: "sep-line", firstLine: 2 });
    expect(() => readCsvText("sep=;\nJahr;Wert\n2001;1\n2001;2\n2003;3\n").column(0)).toThrow(/line 3 and line 4/);
  });
  test("a forced delimiter wins", () => {
    expect(detectDelimiter("a;b\n1;2\n", ",")).toMatchObject({ delimiter: ",", from: "option" });
  });
  test("a one-column read whose lines hold semicolons or tabs names the likely delimiter", () => {
    expect(likelyDelimiter(["month;sales", "2024-01;5"], ",")).toBe(";");
    expect(() => readCsvText("month;sales\n2024-01;5\n2024-02;6\n", { delimiter: "," })).toThrow(/semicolons.*--delimiter ;/);
    expect(() => readCsvText("month\tsales\n2024-01\t5\n2024-02\t6\n", { delimiter: "," })).toThrow(/tabs.*--delimiter tab/);
    expect(() => readCsvText("Monat;Umsatz\n01.1995;66190,50\n02.1995;1,5\n", { delimiter: "," })).toThrow(/semicolon-separated.*--delimiter ;/);
  });
});

describe("number formats are decided per column from the whole column, and reported", () => {
  test("a column's one unambiguous value decides the rest (1.850 is 1850 beside 66.190,00)", () => {
    const t = readCsvText('Monat;Umsatz\n01.1995;"1.850"\n02.1995;"66.190,00"\n03.1995;"2.000"\n04.1995;"3.100"\n');
    expect(t.column(0)).toEqual([1850, 66190, 2000, 3100]);
    expect(t.reading.columns.Umsatz).toMatchObject({ decimal: ",", decimalFrom: "values", thousands: ["."] });
  });
  test("an ambiguous column follows the file's other columns", () => {
    const t = readCsvText("month;a;b\n2024-01;1.234;5,5\n2024-02;1.300;6,25\n");
    expect(t.column(0)).toEqual([1234, 1300]);
    expect(t.reading.columns.a.decimalFrom).toBe("file");
  });
  test("with nothing else, the delimiter decides: semicolon → decimal comma, comma → decimal point", () => {
    expect(readCsvText("month;a\n2024-01;1,234\n2024-02;1,300\n").column(0)).toEqual([1.234, 1.3]);
    expect(readCsvText('month,a\n2024-01,"1,234"\n2024-02,"1,300"\n').column(0)).toEqual([1234, 1300]);
    expect(readCsvText('month,a\n2024-01,"1,234"\n2024-02,"1,300"\n').reading.columns.a.decimalFrom).toBe("delimiter");
  });
  test("with a tab and nothing to decide it, the reader asks for --decimal; forcing it reads it", () => {
    expect(() => readCsvText("month\ta\n2024-01\t1.234\n2024-02\t1.300\n").column(0)).toThrow(/"1\.234".*--decimal \. or --decimal ,/);
    expect(readCsvText("month\ta\n2024-01\t1.234\n2024-02\t1.300\n", { decimal: "," }).column(0)).toEqual([1234, 1300]);
    expect(readCsvText("month\ta\n2024-01\t1.234\n2024-02\t1.300\n", { decimal: "." }).column(0)).toEqual([1.234, 1.3]);
  });
  test("a value that looks numeric but cannot be read is named with its column and line, never dropped", () => {
    expect(() => readCsvText("month;Umsatz\n2024-01;66.190,00\n2024-02;1.2.3,4\n2024-03;70.000,00\n").column(0)).toThrow(/Column "Umsatz" has a value that cannot be read as a number with the decimal mark "," \(line 3: "1\.2\.3,4"\)/);
    expect(() => readCsvText("month,sales\n2024-01,12.5\n2024-02,13.5\n", { decimal: "," }).column(0)).toThrow(/line 2: "12\.5"/);
  });
  test("a column mixing points and commas in equal numbers is refused naming both", () => {
    expect(() => readCsvText("month;x\n2024-01;1,5\n2024-02;2.25\n").column(0)).toThrow(/mixes decimal points and decimal commas.*line 3: "2\.25".*line 2: "1,5"/);
  });
  test("currency, percent and negatives are reported", () => {
    const t = readCsvText('month,a\n2024-01,"($1,850.00)"\n2024-02,"$2,000.50"\n2024-03,"1,000.00-"\n');
    expect(t.column(0)).toEqual([-1850, 2000.5, -1000]);
    expect(t.reading.columns.a).toMatchObject({ currency: ["$"], negatives: ["accounting", "trailing-minus"] });
  });
  test("text that is not a number stays text (the series check names it)", () => {
    expect(readCsvText("month,a\n2024-01,5\n2024-02,closed\n2024-03,7\n").column(0)).toEqual([5, "closed", 7]);
  });
});

describe("the period column", () => {
  test("the month column of a European file is the period, not a series", () => {
    const t = readCsvText("Monat;Umsatz\n01.1995;66190,00\n02.1995;67005,50\n03.1995;70000,00\n");
    expect(t.names).toEqual(["Umsatz"]);
    expect(t.labelColumn).toEqual({ name: "Monat", values: ["1995-01", "1995-02", "1995-03"] });
    expect([t.period, t.periodFrom, t.next?.(1)]).toEqual([12, "dates", "1995-04"]);
  });
  test("without dates the period is 1 by default", () => {
    const t = readCsvText("t,v\n1,5\n2,6\n3,7\n");
    expect([t.names, t.period, t.periodFrom, t.calendar]).toEqual([["v"], 1, "default", null]);
  });
  test("Total, Sum, Average, Gesamt and Summe rows are left out with a note naming the line", () => {
    for (const word of ["Total", "Sum", "Average", "Gesamt", "Summe"]) {
      const t = readCsvText(`month,sales\n2024-01,5\n2024-02,6\n2024-03,7\n2024-04,8\n${word},26\n`);
      expect(t.column(0)).toEqual([5, 6, 7, 8]);
      expect(t.reading.notes[0]).toBe(`Line 6 ("${word}") is not a period; left out.`);
    }
  });
  test("a row with no label but numbers is left out with a note; an empty row is skipped", () => {
    const t = readCsvText("month;a\n2024-01;5\n2024-02;6\n;;\n2024-03;7\n;18\n".replace(/;;/g, ";"));
    expect(t.column(0)).toEqual([5, 6, 7]);
    expect(t.reading.leftOut).toEqual([{ line: 6, label: "" }]);
  });
  test("a period written another way than the others is refused naming its line", () => {
    expect(() => readCsvText("month,a\n2024-01,5\n2024-02,6\nMar 2024,7\n2024-04,8\n2024-05,9\n")).toThrow(/line 4: the period "2024-03" .* is written another way/);
  });
  test("years are a period column only under a period name or in the first column", () => {
    expect(readCsvText("year,sales\n2001,5\n2002,6\n2003,7\n").names).toEqual(["sales"]);
    expect(readCsvText("sales,units\n2001,5\n2002,6\n2003,7\n").names).toEqual(["units"]);
    expect(readCsvText("shop,sales\nA,2001\nB,2002\nC,2003\n").names).toEqual(["sales"]);
  });
  test("serial numbers are dates only under a header naming a date", () => {
    expect(readCsvText("Date,sales\n45292,5\n45323,6\n45352,7\n").reading.dates).toMatchObject({ frequency: "monthly", first: "2024-01", format: "spreadsheet serial date" });
    expect(readCsvText("units,sales\n45292,5\n45323,6\n45352,7\n").names).toEqual(["units", "sales"]);
  });
  test("the first lines are kept for the delimiter message only (five)", () => {
    expect(parseCsv("a;b\n1;2\n3;4\n").sample).toEqual(["a;b", "1;2", "3;4"]);
  });
});

describe("quoted fields (RFC 4180 §2.5–2.7)", () => {
  test("a doubled quote inside a quoted field is one quote; delimiters and line breaks inside quotes are text", () => {
    const t = readCsvText('month,"Harbour ""North"" shop","Mill Lane, east"\n2024-01,5,7\n2024-02,6,8\n');
    expect(t.names).toEqual(['Harbour "North" shop', "Mill Lane, east"]);
    expect(t.column(0)).toEqual([5, 6]);
    expect(t.column(1)).toEqual([7, 8]);
    // The same file split into pieces at every place (the reader is incremental: a quote pair may
    // straddle two pieces).
    const text = 'month;"a ""b""\nc"\n2024-01;"1,5"\n';
    for (let cut = 1; cut < text.length; cut++) {
      const got: string[][] = [];
      const r = new CsvRecordReader((f) => got.push(f), ";", 1);
      r.push(text.slice(0, cut));
      r.push(text.slice(cut));
      r.end();
      expect(got).toEqual([["month", 'a "b"\nc'], ["2024-01", "1,5"]]);
    }
  });
});
