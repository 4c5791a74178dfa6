// Period labels and the calendar. Calendar facts (month lengths, leap years, weekdays) are checked
// against JavaScript's Date (proleptic Gregorian calendar, ECMA-262); the spreadsheet serial-date
// epoch (serial 1 = 1900-01-01, serial 60 the fictitious 1900-02-29) is from memory of the Office
// Open XML specification (ECMA-376, date system 1900); the rest is common practice.
import { buildCalendar, calendarFor, dayNumber, fullYear, LabelledRow, parsePeriodLabel, serialDay, isoDate } from "../../src/io";

describe("period labels, one written form each", () => {
  const cases: [string, string, number, number, number][] = [
    ["2024-01", "ym", 2024, 1, 0], ["2024/11", "ym", 2024, 11, 0], ["2024-01-31", "ymd", 2024, 1, 31],
    ["2024-01-31T00:00:00", "ymd", 2024, 1, 31], ["2024-01-31 00:00:00", "ymd", 2024, 1, 31],
    ["31.01.2024", "dmy", 2024, 1, 31], ["01.1995", "my", 1995, 1, 0], ["1/1995", "my", 1995, 1, 0],
    ["01/02/2024", "slash", 2024, 1, 2], ["Jan-24", "mon", 2024, 1, 0], ["Jan 2024", "mon", 2024, 1, 0],
    ["January 2024", "mon", 2024, 1, 0], ["Sept 2024", "mon", 2024, 9, 0], ["Mar-49", "mon", 1949, 3, 0],
    ["2024Q1", "q", 2024, 1, 0], ["2024 Q3", "q", 2024, 3, 0], ["Q1 2024", "q", 2024, 1, 0], ["1960-Q4", "q", 1960, 4, 0],
    ["2024", "year", 2024, 0, 0],
  ];
  for (const [text, family, y, a, b] of cases) {
    test(`"${text}" is ${family}`, () => expect(parsePeriodLabel(text)).toMatchObject({ family, y, a, b }));
  }
  test("not periods: Total, Summe, Average, a 13th month, a fifth quarter, a number", () => {
    for (const t of ["Total", "Summe", "Gesamt", "Average", "Sum", "2024-13", "2024Q5", "13.2024", "123", "66190,00", "Jan 2024 total"]) expect([t, parsePeriodLabel(t)]).toEqual([t, null]);
  });
  test("two-digit years follow the spreadsheet window 1930–2029", () => {
    expect([fullYear("29"), fullYear("30"), fullYear("49"), fullYear("2024")]).toEqual([2029, 1930, 1949, 2024]);
  });
  test("dayNumber refuses dates that do not exist (JavaScript Date, ECMA-262)", () => {
    expect(dayNumber(2024, 2, 29)).toBe(Date.UTC(2024, 1, 29) / 86400000);
    expect(dayNumber(2023, 2, 29)).toBeNull();
    expect(dayNumber(2024, 4, 31)).toBeNull();
  });
  test("spreadsheet serial dates (1900 system, ECMA-376, from memory): 61 = 1900-03-01, 45292 = 2024-01-01", () => {
    expect(isoDate(serialDay(61) as number)).toBe("1900-03-01");
    expect(isoDate(serialDay(45292) as number)).toBe("2024-01-01");
    expect(isoDate(serialDay(45292.75) as number)).toBe("2024-01-01");
    expect(serialDay(60)).toBeNull();
  });
});

const rowsOf = (labels: string[]): LabelledRow[] => labels.map((l, row) => ({ row, parts: parsePeriodLabel(l) as NonNullable<ReturnType<typeof parsePeriodLabel>> }));
const lineOf = (r: number): string => `line ${r + 2}`;
const months = (from: number, n: number, year = 2023): string[] => Array.from({ length: n }, (_, i) => `${year + Math.floor((from + i - 1) / 12)}-${String(((from + i - 1) % 12) + 1).padStart(2, "0")}`);

describe("the calendar (common practice)", () => {
  test("frequency → default period: monthly 12, quarterly 4, yearly 1, weekly 52, daily 7", () => {
    expect(buildCalendar(rowsOf(months(1, 6)), "m", lineOf)).toMatchObject({ frequency: "monthly", period: 12 });
    expect(buildCalendar(rowsOf(["2024Q1", "2024Q2", "2024Q3"]), "q", lineOf)).toMatchObject({ frequency: "quarterly", period: 4 });
    expect(buildCalendar(rowsOf(["2020", "2021", "2022"]), "y", lineOf)).toMatchObject({ frequency: "yearly", period: 1 });
    expect(buildCalendar(rowsOf(["2024-01-01", "2024-01-08", "2024-01-15", "2024-01-22", "2024-01-29", "2024-02-05"]), "w", lineOf)).toMatchObject({ frequency: "weekly", period: 52 });
    expect(buildCalendar(rowsOf(["2024-01-01", "2024-01-02", "2024-01-03", "2024-01-04"]), "d", lineOf)).toMatchObject({ frequency: "daily", period: 7 });
  });
  test("month-end dates are monthly; quarter-end dates quarterly; year-end dates yearly", () => {
    expect(buildCalendar(rowsOf(["2024-01-31", "2024-02-29", "2024-03-31", "2024-04-30"]), "d", lineOf)).toMatchObject({ frequency: "monthly", labels: ["2024-01", "2024-02", "2024-03", "2024-04"] });
    expect(buildCalendar(rowsOf(["2024-03-31", "2024-06-30", "2024-09-30"]), "d", lineOf)).toMatchObject({ frequency: "quarterly", labels: ["2024-Q1", "2024-Q2", "2024-Q3"] });
    expect(buildCalendar(rowsOf(["2021-12-31", "2022-12-31", "2023-12-31"]), "d", lineOf)).toMatchObject({ frequency: "yearly", labels: ["2021", "2022", "2023"] });
  });
  test("a skipped month is a blank at its place, named", () => {
    const labels = months(1, 8).filter((m) => m !== "2023-04");
    const c = buildCalendar(rowsOf(labels), "m", lineOf);
    expect(c.skipped).toEqual(["2023-04"]);
    expect(Array.from(c.order)).toEqual([0, 1, 2, -1, 3, 4, 5, 6]);
  });
  test("newest first is put in time order", () => {
    const c = buildCalendar(rowsOf(months(1, 5).reverse()), "m", lineOf);
    expect(c.reversed).toBe(true);
    expect(Array.from(c.order)).toEqual([4, 3, 2, 1, 0]);
    expect(c.labels[0]).toBe("2023-01");
  });
  test("a duplicate period is refused naming both lines", () => {
    expect(() => buildCalendar(rowsOf(["2023-01", "2023-02", "2023-02", "2023-03"]), "month", lineOf)).toThrow(/2023-02 appears twice in "month" \(line 3 and line 4\)/);
  });
  test("irregular dates are refused", () => {
    expect(() => buildCalendar(rowsOf(["2024-01-03", "2024-01-17", "2024-02-02", "2024-02-25", "2024-03-04"]), "d", lineOf)).toThrow(/not equally spaced/);
    expect(() => buildCalendar(rowsOf(["2020-01", "2020-02", "2020-07", "2020-12", "2021-06"]), "m", lineOf)).toThrow(/not equally spaced.*absent/);
  });
  test("business days (weekends left out) are refused with what to do", () => {
    const days = ["2024-01-04", "2024-01-05", "2024-01-08", "2024-01-09", "2024-01-10", "2024-01-11", "2024-01-12", "2024-01-15"];
    expect(() => buildCalendar(rowsOf(days), "d", lineOf)).toThrow(/business days/);
  });
  test("the next labels continue the calendar", () => {
    const c = buildCalendar(rowsOf(months(1, 12, 2025)), "m", lineOf);
    expect([c.next(1), c.next(12)]).toEqual(["2026-01", "2026-12"]);
    expect(buildCalendar(rowsOf(["2025 Q3", "2025 Q4"]), "q", lineOf).next(1)).toBe("2026-Q1");
  });
  test("dd/mm vs mm/dd: decided by a number above 12, else by which reading is regular, else refused", () => {
    expect(calendarFor(rowsOf(["13/01/2024", "13/02/2024", "13/03/2024"]), "d", lineOf).format).toBe("dd/mm/yyyy");
    expect(calendarFor(rowsOf(["01/13/2024", "02/13/2024", "03/13/2024"]), "d", lineOf).format).toBe("mm/dd/yyyy");
    const firsts = Array.from({ length: 14 }, (_, i) => `01/${String((i % 12) + 1).padStart(2, "0")}/${2023 + Math.floor(i / 12)}`);
    expect(calendarFor(rowsOf(firsts), "d", lineOf)).toMatchObject({ format: "dd/mm/yyyy", frequency: "monthly" });
    expect(() => calendarFor(rowsOf(["01/02/2024", "01/03/2024", "01/04/2024"]), "date", lineOf)).toThrow(/Cannot tell whether the dates in "date" are day-first or month-first.*yyyy-mm-dd/);
  });
});

test("a long daily calendar (300,000 days) is read without overflowing the call stack (common practice)", () => {
  const start = Date.UTC(1200, 0, 1) / 86400000;
  const labels = Array.from({ length: 300000 }, (_, i) => isoDate(start + i));
  const c = buildCalendar(rowsOf(labels), "day", lineOf);
  expect([c.frequency, c.labels.length, c.next(1)]).toEqual(["daily", 300000, isoDate(start + 300000)]);
});
