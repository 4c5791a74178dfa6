// excel-io.ts against office-addin-mock: reading a selection with blanks, text and a header row,
// and writing the FW.FAN formula and the native chart (with the ExcelApi 1.7 check).
import { OfficeMockObject } from "office-addin-mock";
import { columnAddress, READ_PIECE_CELLS, readPieces, readSelection, selectionData, writeFan } from "../../src/taskpane/excel-io";
import { blockAddress, parseCell } from "../../src/taskpane/write-plan";
import { selectionProblem } from "../../src/taskpane/view-model";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Any = any;
const g = globalThis as Any;

function enums(): void {
  g.Excel.ChartType = { areaStacked: "AreaStacked", line: "Line", lineMarkers: "LineMarkers" };
  g.Excel.ChartSeriesBy = { columns: "Columns" };
  g.Excel.ChartMarkerStyle = { diamond: "Diamond" };
  g.Excel.ClearApplyTo = { contents: "Contents" };
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

/** Rows × columns of an A1 block address ("J2:P13" → 12 × 7). */
function sizeOf(address: string): [number, number] {
  const [a, b] = address.split(":");
  const p = parseCell(a);
  const q = b ? parseCell(b) : p;
  return [q.row - p.row + 1, q.col - p.col + 1];
}

/**
 * A stand-in sheet for the write path: `cells` maps A1 addresses to what they hold (a formula or a
 * value); getRange(...).load("formulas") reads them (empty cells as ""), as Excel's Range.formulas does.
 * Records every write and every context.sync(), and the options Excel.run was given.
 */
function sheetMock(supports17: boolean, cells: Record<string, unknown> = {}, options: { editing?: boolean } = {}): { excel: Any; written: Any } {
  const written: Any = { formulas: null, helper: null, chart: null, added: [] as Any[], cleared: [] as string[], syncs: 0, runOptions: null };
  const blockFormulas = (address: string): unknown[][] => {
    if (!/^[A-Z]+\d+(:[A-Z]+\d+)?$/.test(address)) return []; // a derived range (offset/resized): never read
    const [rows, cols] = sizeOf(address);
    const tl = parseCell(address.split(":")[0]);
    return Array.from({ length: rows }, (_, i) => Array.from({ length: cols }, (_, j) => cells[blockAddress(tl.row + i, tl.col + j, 1, 1)] ?? ""));
  };
  const makeRange = (address: string, rowOff = 0, colOff = 0): Any => ({
    address,
    rowOff,
    colOff,
    get formulas() { return blockFormulas(address); },
    set formulas(v: unknown) { written.formulas = { address, v }; },
    set formulasR1C1(v: unknown) { written.helper = { rowOff, colOff, v }; },
    load() { return this; },
    clear(what: string) { written.cleared.push(`${address} ${what}`); },
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
                  return { title: written.chart.title, series: { getItemAt: (i: number) => items[i], add(n: string) { const s = series(n); written.added.push(s); return s; } } };
                },
              },
            };
          },
        },
      },
      sync: async () => {
        written.syncs++;
      },
    },
    run: async function (a: unknown, b?: (c: unknown) => Promise<unknown>) {
      const cb = (typeof a === "function" ? a : b) as (c: unknown) => Promise<unknown>;
      written.runOptions = typeof a === "function" ? null : a;
      // Excel without delayForCellEdit refuses a batch while the user edits a cell.
      if (options.editing) throw Object.assign(new Error("The operation failed because the cell is in edit mode."), { code: "InvalidOperationInCellEditMode" });
      return cb(this.context);
    },
  };
  g.Office = { context: { requirements: { isSetSupported: (name: string, v: string) => supports17 && name === "ExcelApi" && Number(v) <= 1.7 } } };
  return { excel, written };
}

test("writes the formula, and with ExcelApi 1.7 a stacked-area chart over helper columns plus mean and median lines, in one batch", async () => {
  const { excel, written } = sheetMock(true);
  g.Excel = excel;
  enums();
  const r = await writeFan("J2", '=FW.FAN(Sheet1!B2:B74,12,"auto","auto","80,95",12)', 12, [80, 95], true);
  expect(written.formulas).toEqual({ address: "J2", v: [['=FW.FAN(Sheet1!B2:B74,12,"auto","auto","80,95",12)']] });
  expect(r.chart).toBe(true);
  expect(r.written).toBe(true);
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
  // one sync to read what is there, one for all the writes (one undo record); it waits while a cell is edited
  expect(written.syncs).toBe(2);
  expect(written.runOptions).toMatchObject({ delayForCellEdit: true });
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

describe("writing never destroys a user's cells unasked (stand-in sheet; the project's own rule, README 'Write to sheet')", () => {
  test("a value inside the spill area: nothing is written, and the note says what and where and asks", async () => {
    const { excel, written } = sheetMock(true, { K5: 1200, A1: "Sales" });
    g.Excel = excel;
    enums();
    const r = await writeFan("J2", "=FW.FAN(A1:A10,12)", 12, [80, 95], true);
    expect(r.written).toBe(false);
    expect(r.inTheWay).toEqual([{ address: "K5", role: "the fan's spill area", holds: "1200" }]);
    expect(r.note).toBe('K5 (in the fan\'s spill area) holds 1200. Writing would overwrite it: choose another cell, or press "Overwrite" to replace it.');
    expect(written.formulas).toBeNull();
    expect(written.helper).toBeNull();
    expect(written.chart).toBeNull();
    expect(written.syncs).toBe(1); // the read only
  });
  test("a formula in the chart's helper columns and one in the target cell are both reported", async () => {
    const { excel } = sheetMock(true, { J2: "=SUM(A1:A3)", S13: "=B2*2", Z99: "far away" });
    g.Excel = excel;
    enums();
    const r = await writeFan("J2", "=FW.FAN(A1:A10,12)", 12, [80, 95], true);
    expect(r.written).toBe(false);
    expect(r.inTheWay.map((c: Any) => [c.address, c.role])).toEqual([["J2", "the fan's spill area"], ["S13", "the chart's helper columns"]]);
  });
  test("without a chart the helper columns are not checked (nothing will be written there)", async () => {
    const { excel, written } = sheetMock(true, { S13: "=B2*2" });
    g.Excel = excel;
    enums();
    const r = await writeFan("J2", "=FW.FAN(A1:A10,12)", 12, [80, 95], false);
    expect(r.written).toBe(true);
    expect(written.formulas.address).toBe("J2");
  });
  test("with Overwrite it clears the spill area's old contents, then writes everything in one batch", async () => {
    const { excel, written } = sheetMock(true, { K5: 1200 });
    g.Excel = excel;
    enums();
    const r = await writeFan("J2", "=FW.FAN(A1:A10,12)", 12, [80, 95], true, { overwrite: true });
    expect(r.written).toBe(true);
    expect(written.cleared).toEqual(["J2:P13 Contents"]);
    expect(written.formulas.address).toBe("J2");
    expect(written.syncs).toBe(2);
  });
  test("an Excel that refuses while a cell is being edited gets a message saying to finish the edit", async () => {
    const { excel } = sheetMock(true, {}, { editing: true });
    g.Excel = excel;
    enums();
    await expect(writeFan("J2", "=FW.FAN(A1:A10,12)", 12, [80, 95], true)).rejects.toThrow(/editing a cell\. Finish the edit \(Enter or Esc\)/);
  });
  test("a target that is not one cell, or a fan that would run off the sheet, is refused before anything is read", async () => {
    const { excel, written } = sheetMock(true);
    g.Excel = excel;
    enums();
    await expect(writeFan("J2:K3", "=FW.FAN(A1:A10,12)", 12, [80, 95], true)).rejects.toThrow(/not a cell address: type one cell/);
    await expect(writeFan("XFC2", "=FW.FAN(A1:A10,12)", 12, [80, 95], true)).rejects.toThrow(/run off the sheet/);
    expect(written.syncs).toBe(0);
  });
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

describe("large selections are read in pieces under Excel on the web's 5 MB limit per response (platform documentation)", () => {
  const LIMIT = 5 * 1024 * 1024;
  test("a piece of the widest numbers with their types is far below 5 MB (under 1 MB)", () => {
    // The longest JSON a number can take, and its value type, for every cell of one piece.
    const cols = 50;
    const rows = Math.floor(READ_PIECE_CELLS / cols);
    const piece = { values: Array.from({ length: rows }, () => new Array(cols).fill(-1.2345678901234567e-308)), valueTypes: Array.from({ length: rows }, () => new Array(cols).fill("Double")) };
    const bytes = Buffer.byteLength(JSON.stringify(piece), "utf8");
    expect(bytes).toBeLessThan(1024 * 1024);
    // so text can average this many characters a cell before a piece reaches the limit
    expect(Math.floor((LIMIT - bytes) / READ_PIECE_CELLS)).toBeGreaterThan(200);
  });
  test("pieces cover every row once, each at most READ_PIECE_CELLS cells, at least one row", () => {
    for (const [r, c] of [[200000, 1], [4000, 50], [50001, 4], [13, 16384], [1, 1]]) {
      const pieces = readPieces(r, c);
      expect(pieces.reduce((n, [, k]) => n + k, 0)).toBe(r);
      pieces.forEach(([start, k], i) => {
        expect(start).toBe(i === 0 ? 0 : pieces[i - 1][0] + pieces[i - 1][1]);
        expect(k * c <= READ_PIECE_CELLS || k === 1).toBe(true);
      });
    }
    expect(readPieces(200000, 1)).toHaveLength(10);
  });
  test("readSelection reads 60,000 × 3 cells in pieces of whole rows and puts them back together in order", async () => {
    const rows = 60000;
    const values = [["North", "South", "East"], ...Array.from({ length: rows }, (_, i) => [i, 2 * i, 3 * i])];
    const types = values.map((r, i) => r.map(() => (i === 0 ? "String" : "Double")));
    const requested: [number, number][] = [];
    const pieceOf = (start: number, n: number): Any => ({ values: values.slice(start, start + n), valueTypes: types.slice(start, start + n), load() { return this; } });
    const range: Any = {
      address: "Sheet1!A1:C60001", rowCount: rows + 1, columnCount: 3,
      load() { return this; },
      get values() { throw new Error("the whole range must not be read in one request"); },
      getCell: (i: number) => ({ getResizedRange: (dr: number) => { requested.push([i, dr + 1]); return pieceOf(i, dr + 1); } }),
    };
    g.Office = { context: { requirements: { isSetSupported: () => true } } };
    g.Excel = { run: async (cb: (c: unknown) => Promise<unknown>) => cb({ workbook: { getSelectedRange: () => range }, sync: async () => undefined }) };
    const sel = await readSelection();
    expect(requested.length).toBe(Math.ceil((rows + 1) / Math.floor(READ_PIECE_CELLS / 3)));
    for (const [, n] of requested) expect(n * 3).toBeLessThanOrEqual(READ_PIECE_CELLS);
    expect(sel.names).toEqual(["North", "South", "East"]);
    expect(sel.columns[2].length).toBe(rows);
    expect(sel.columns[2][rows - 1]).toBe(3 * (rows - 1));
    expect(sel.columns[0].slice(0, 3)).toEqual([0, 1, 2]);
  });
});
