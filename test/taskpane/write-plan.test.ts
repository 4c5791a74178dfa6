// What "Write to sheet" will occupy (src/taskpane/write-plan.ts), worked out before writing.
// Expectations: A1 arithmetic (common practice) and the fan's layout (step, mean, median, low/high per level).
import { blockAddress, colLetters, describeInTheWay, fanWritePlan, occupiedCells, parseCell } from "../../src/taskpane/write-plan";

test("A1 columns: A, Z, AA, XFD (the last column) both ways (common practice)", () => {
  expect([0, 25, 26, 16383].map(colLetters)).toEqual(["A", "Z", "AA", "XFD"]);
  expect(parseCell("$xfd$1048576")).toEqual({ row: 1048575, col: 16383 });
  expect(blockAddress(1, 9, 12, 7)).toBe("J2:P13");
});

test("the spill area is horizon rows × (3 + 2·levels) columns from the target; the helper block starts one column after it", () => {
  const p = fanWritePlan("J2", 12, [50, 80, 95], true);
  expect(p.areas.map((a) => [a.role, a.address])).toEqual([["the fan's spill area", "J2:R13"], ["the chart's helper columns", "T2:Y13"]]);
  expect(fanWritePlan("a1", 1, [80], false).areas.map((a) => a.address)).toEqual(["A1:E1"]);
});

test("occupied cells are listed with what they hold; the message names at most three and counts the rest", () => {
  const p = fanWritePlan("A1", 2, [80], false);
  const cells = occupiedCells(p.areas, [[["", "x", "", "", "=SUM(Z1:Z9)"], [3, "", "", "", "a very long piece of text that goes on and on"]]]);
  expect(cells.map((c) => c.address)).toEqual(["B1", "E1", "A2", "E2"]);
  expect(cells[3].holds).toBe("a very long piece of text tha…");
  expect(describeInTheWay(cells)).toBe('B1 (in the fan\'s spill area) holds x; E1 (in the fan\'s spill area) holds =SUM(Z1:Z9); A2 (in the fan\'s spill area) holds 3, and 1 more cell. Writing would overwrite them: choose another cell, or press "Overwrite" to replace them.');
  expect(describeInTheWay([])).toBe("");
});

test("bad targets and horizons are refused with what to do", () => {
  expect(() => fanWritePlan("J2:K4", 12, [80], false)).toThrow(/not a cell address: type one cell of the active sheet, such as J2/);
  expect(() => fanWritePlan("Sheet1!J2", 12, [80], false)).toThrow(/not a cell address/);
  expect(() => fanWritePlan("J1048570", 12, [80], false)).toThrow(/run off the sheet; choose a cell further up or left/);
  expect(() => fanWritePlan("J2", 0, [80], false)).toThrow(/whole number of periods/);
});
