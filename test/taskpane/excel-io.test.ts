// excel-io.ts against office-addin-mock: reading a selection with blanks, text and a header row,
// and writing the FW.FAN formula and the native chart (with the ExcelApi 1.7 check).
import { OfficeMockObject } from "office-addin-mock";
import { columnAddress, readSelection, selectionData, writeFan } from "../../src/taskpane/excel-io";
import { selectionProblem } from "../../src/taskpane/view-model";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Any = any;
const g = globalThis as Any;

function enums(): void {
  g.Excel.ChartType = { areaStacked: "AreaStacked", line: "Line", lineMarkers: "LineMarkers" };
  g.Excel.ChartSeriesBy = { columns: "Columns" };
  g.Excel.ChartMarkerStyle = { diamond: "Diamond" };
}

test("reads a selection with a header row, blanks, text and an error cell as named columns", async () => {
  const mock = new OfficeMockObject({
    context: {
      workbook: {
        range: {
          address: "Sheet1!B2:C6",
          rowCount: 5,
          columnCount: 2,
          values: [["Harbour Street", "Millbrook"], [100, ""], [110, "closed"], ["", 130], [121, "#N/A"]],
          valueTypes: [["String", "String"], ["Double", "Empty"], ["Double", "String"], ["Empty", "Double"], ["Double", "Error"]],
          numberFormat: [["General", "General"], ["#,##0", "General"], ["#,##0", "General"], ["General", "#,##0"], ["#,##0", "General"]],
        },
        getSelectedRange: function () {
          return this.range;
        },
      },
    },
    run: async function (callback: (c: unknown) => Promise<unknown>) {
      return callback(this.context);
    },
  }) as Any;
  g.Excel = mock;
  const sel = await readSelection();
  expect(sel.address).toBe("Sheet1!B2:C6");
  expect(sel.source).toBe("Selection Sheet1!B2:C6");
  expect(sel.headerRows).toBe(1);
  expect(sel.names).toEqual(["Harbour Street", "Millbrook"]);
  expect(sel.columns[0]).toEqual([100, 110, null, 121]);
  expect(sel.columns[1]).toEqual([null, "closed", 130, "#N/A"]);
});

test("a selection without a header gets column names", async () => {
  const mock = new OfficeMockObject({
    context: { workbook: { range: { address: "A1:A3", rowCount: 3, columnCount: 1, values: [[1], [2], [3]], valueTypes: [["Double"], ["Double"], ["Double"]], numberFormat: [["General"], ["General"], ["General"]] }, getSelectedRange: function () { return this.range; } } },
    run: async function (callback: (c: unknown) => Promise<unknown>) { return callback(this.context); },
  }) as Any;
  g.Excel = mock;
  const sel = await readSelection();
  expect(sel.names).toEqual(["column 1"]);
  expect(sel.headerRows).toBe(0);
});

function sheetMock(supports17: boolean): { excel: Any; written: Any } {
  const written: Any = { formulas: null, helper: null, chart: null, added: [] as Any[] };
  const makeRange = (address: string, rowOff = 0, colOff = 0): Any => ({
    address,
    rowOff,
    colOff,
    set formulas(v: unknown) { written.formulas = { address, v }; },
    set formulasR1C1(v: unknown) { written.helper = { rowOff, colOff, v }; },
    load() { return this; },
    getOffsetRange(r: number, c: number) { return makeRange(`${address}+${r},${c}`, rowOff + r, colOff + c); },
    getResizedRange(r: number, c: number) { return { ...makeRange(`${address}~${r},${c}`, rowOff, colOff), rows: r + 1, cols: c + 1, set formulasR1C1(v: unknown) { written.helper = { rowOff, colOff, rows: r + 1, cols: c + 1, v }; } }; },
  });
  const series = (name: string): Any => ({ name, format: { fill: { cleared: false, color: "", clear() { this.cleared = true; }, setSolidColor(c: string) { this.color = c; } } as Any, line: {} }, setValues(r: Any) { this.values = r; } });
  const excel = {
    context: {
      workbook: {
        worksheets: {
          getActiveWorksheet() {
            return {
              getRange: (a: string) => makeRange(a),
              charts: {
                add(type: string, range: Any, by: string) {
                  const items = Array.from({ length: range.cols }, (_, i) => series(`band ${i}`));
                  written.chart = { type, range, by, items, title: {} };
                  return { title: written.chart.title, series: { items, load() { return this; }, add(n: string) { const s = series(n); written.added.push(s); return s; } } };
                },
              },
            };
          },
        },
      },
      sync: async () => undefined,
    },
    run: async function (callback: (c: unknown) => Promise<unknown>) { return callback(this.context); },
  };
  g.Office = { context: { requirements: { isSetSupported: (name: string, v: string) => supports17 && name === "ExcelApi" && Number(v) <= 1.7 } } };
  return { excel, written };
}

test("writes the formula, and with ExcelApi 1.7 a stacked-area chart over helper columns plus mean and median lines", async () => {
  const { excel, written } = sheetMock(true);
  g.Excel = excel;
  enums();
  const r = await writeFan("J2", '=FW.FAN(Sheet1!B2:B74,12,"auto","auto","80,95",12)', 12, [80, 95], true);
  expect(written.formulas).toEqual({ address: "J2", v: [['=FW.FAN(Sheet1!B2:B74,12,"auto","auto","80,95",12)']] });
  expect(r.chart).toBe(true);
  // The fan is 1 + 2 + 2×2 = 7 columns wide; the helper block starts one column after it.
  expect(written.helper.colOff).toBe(8);
  expect(written.helper.rows).toBe(12);
  expect(written.helper.cols).toBe(4);
  // helper h refers to fan column k as RC[k − (7 + 1 + h)]: base = low95 (fan col 5), then low80 − low95, high80 − low80, high95 − high80
  expect(written.helper.v[0]).toEqual(["=RC[-3]", "=RC[-6]-RC[-4]", "=RC[-6]-RC[-7]", "=RC[-5]-RC[-7]"]);
  expect(written.chart.type).toBe("AreaStacked");
  expect(written.chart.items[0].format.fill.cleared).toBe(true);
  expect(written.chart.items.slice(1).map((s: Any) => s.format.fill.color)).toEqual(["#f4e3bf", "#e9c27a", "#f4e3bf"]);
  expect(written.added.map((s: Any) => [s.name, s.chartType])).toEqual([["mean", "Line"], ["median", "LineMarkers"]]);
  expect(written.added[0].format.line.color).toBe("#5a2d82");
});

test("without ExcelApi 1.7 it writes the formula only and says why", async () => {
  const { excel, written } = sheetMock(false);
  g.Excel = excel;
  enums();
  const r = await writeFan("J2", "=FW.FAN(A1:A10,3)", 3, [80, 95], true);
  expect(written.formulas.v).toEqual([["=FW.FAN(A1:A10,3)"]]);
  expect(r.chart).toBe(false);
  expect(r.note).toMatch(/ExcelApi 1.7/);
  expect(written.chart).toBeNull();
});

test("columnAddress picks one column of the selection", () => {
  expect(columnAddress("Sheet1!B2:H74", 0)).toBe("Sheet1!B2:B74");
  expect(columnAddress("Sheet1!B2:H74", 2)).toBe("Sheet1!D2:D74");
  expect(columnAddress("'My sheet'!$Y$1:$AB$10", 3)).toBe("'My sheet'!AB1:AB10");
});

describe("selectionProblem says what a selection with nothing to forecast needs (project's own wording)", () => {
  test("one text cell, one empty cell, one number, a block of text, and real data", () => {
    expect(selectionProblem(selectionData("C3", [["Revenue"]], [["String"]]))).toMatch(/^The selection is one cell holding text \("Revenue"\)\. Select the data/);
    expect(selectionProblem(selectionData("C3", [[""]], [["Empty"]]))).toMatch(/^The selection is one empty cell\./);
    expect(selectionProblem(selectionData("C3", [[42]], [["Double"]]))).toMatch(/^The selection is one cell \(42\); a forecast needs a series of at least 4 values/);
    expect(selectionProblem(selectionData("A1:B2", [["a", "b"], ["c", ""]], [["String", "String"], ["String", "Empty"]]))).toMatch(/holds no numbers, only text or empty cells/);
    expect(selectionProblem(selectionData("A1:A3", [["Sales"], [1], [2]], [["String"], ["Double"], ["Double"]]))).toBeNull();
  });
});
