// The pane reads selections and pasted tables through the shared reader (src/io): the number
// formats of a selection tell a date column from a series, the dates give the period and the
// forecast's dates on the axis, and rows the cell functions would read differently are refused
// with what to change. Number-format codes: common practice (ECMA-376 Part 1 §18.8.31, from memory).
import { findDateColumn, isDateFormat } from "../../src/io";
import { selectionData } from "../../src/taskpane/excel-io";
import { pastedData } from "../../src/taskpane/paste";
import { fanView, selectionProblem } from "../../src/taskpane/view-model";

const serial = (y: number, m: number): number => Math.round((Date.UTC(y, m - 1, 1) - Date.UTC(1899, 11, 30)) / 86400000);

test("date number formats are told from number, currency and time formats", () => {
  for (const f of ["dd/mm/yyyy", "m/d/yy", "mmm-yy", "yyyy-mm-dd", "[$-409]mmmm yyyy", "d-mmm", "mmmm"]) expect([f, isDateFormat(f)]).toEqual([f, true]);
  for (const f of ["General", "0.00", "#,##0", '#,##0 "€"', "[Red]0.00", "h:mm", "hh:mm:ss", "0%", "_-* #,##0.00 €_-", null]) expect([f, isDateFormat(f)]).toEqual([f, false]);
});

describe("an Excel selection with a date column (AirPassengers 1949, R datasets)", () => {
  const air = [112, 118, 132, 129, 121, 135, 148, 148, 136, 119, 104, 118];
  const values = [["Month", "Passengers"], ...air.map((v, i) => [serial(1949, i + 1), v])];
  const types = values.map((r, i) => r.map(() => (i === 0 ? "String" : "Double")));
  const formats = values.map((_, i) => (i === 0 ? ["General", "General"] : ["mmm-yy", "#,##0"]));

  test("the date column is not a series; it labels the rows and gives period 12", () => {
    const d = selectionData("Sheet1!A1:B13", values, types, formats);
    expect(d.names).toEqual(["Passengers"]);
    expect(d.columns[0]).toEqual(air);
    expect(d.rangeColumns).toEqual([1]);
    expect(d.period).toBe(12);
    expect(d.rowLabels?.[0]).toBe("1949-01");
    expect(d.nextLabel?.(1)).toBe("1950-01");
  });
  test("without number formats the same selection is two series (as before)", () => {
    expect(selectionData("Sheet1!A1:B13", values, types).names).toEqual(["Month", "Passengers"]);
  });
  test("the fan's axis ends on a date, not +12", () => {
    const d = selectionData("Sheet1!A1:B13", values, types, formats);
    const v = fanView(d, { series: 0, method: "naive", lambda: "none", horizon: 3, period: 12, levels: "80" });
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.svg).toContain("1950-03");
      expect(v.svg).not.toContain("+3");
    }
  });
  test("newest-first rows are refused, saying to sort (the cells read top to bottom)", () => {
    const rev = [values[0], ...values.slice(1).reverse()];
    const d = selectionData("Sheet1!A1:B13", rev, types, formats);
    expect(selectionProblem(d)).toMatch(/newest first.*Sort the rows by "Month", oldest first/);
  });
  test("a Total row in the selection is refused naming its row", () => {
    const withTotal = [...values, ["Total", air.reduce((a, b) => a + b, 0)]];
    const t = [...types, ["String", "Double"]];
    const f = [...formats, ["General", "#,##0"]];
    expect(selectionProblem(selectionData("Sheet1!A1:B14", withTotal, t, f))).toMatch(/Row 14 \("Total"\) is not a period of "Month"/);
  });
  test("a skipped month is refused, saying to insert a row with a blank value", () => {
    const drop = <T>(xs: T[]): T[] => xs.filter((_, i) => i !== 4);
    expect(selectionProblem(selectionData("Sheet1!A1:B12", drop(values), drop(types), drop(formats)))).toMatch(/no row for 1949-04: insert a row/);
  });
});

test("findDateColumn reads text period labels too", () => {
  expect(findDateColumn([["2024 Q1", 5], ["2024 Q2", 6], ["2024 Q3", 7]], null, 2, () => "q")?.calendar?.frequency).toBe("quarterly");
});

describe("the paste box (AirPassengers 1949, R datasets, exported the European way)", () => {
  const text = "Monat;Umsatz\n" + [112, 118, 132, 129, 121, 135].map((v, i) => `0${i + 1}.1949;"${v}.000,00"`).join("\n") + "\nSumme;\"747.000,00\"\n";
  test("reads the semicolon table with decimal commas, leaves out the Summe row, and gives period 12", () => {
    const d = pastedData(text);
    expect(d.names).toEqual(["Umsatz"]);
    expect(d.columns[0]).toEqual([112000, 118000, 132000, 129000, 121000, 135000]);
    expect(d.period).toBe(12);
    expect(d.notes?.[0]).toMatch(/Line 8 \("Summe"\) is not a period; left out/);
  });
  test("an undecidable tab table asks for the Decimal mark box; choosing it reads it", () => {
    const tab = "year\tlynx\n1821\t269\n1822\t3.409\n1823\t2.285\n";
    expect(() => pastedData(tab)).toThrow(/Decimal mark: point or Decimal mark: comma/);
    expect(pastedData(tab, ",").columns[0]).toEqual([269, 3409, 2285]);
  });  test("a pasted forecast log (periods repeat, one row per series) is read in the order pasted for the audit, and not forecast as one series", () => {
    // invented log (Quillmere shops are fictional): two shops, the same two months each
    const log = "month\tseries\tactual\tlower80\tupper80\n2024-01\tHarbour\t100\t90\t110\n2024-02\tHarbour\t104\t92\t112\n2024-01\tQuay\t50\t45\t58\n2024-02\tQuay\t61\t46\t59\n";
    const d = pastedData(log);
    expect(d.problem).toMatch(/The period 2024-01 appears twice in "month" \(line 2 and line 4\).*Read in the order pasted, for an audit/);
    expect(d.names).toEqual(["actual", "lower80", "upper80"]);
    expect(d.columns[0]).toEqual([100, 104, 50, 61]);
    expect(d.labelColumns?.map((l) => l.name)).toEqual(["month", "series"]);
    expect(d.labelColumns?.[1].values).toEqual(["Harbour", "Harbour", "Quay", "Quay"]);
    expect(selectionProblem(d)).toBe(d.problem);
  });
});
