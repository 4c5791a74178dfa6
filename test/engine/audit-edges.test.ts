// Edges of the audit and the backtest that the mutation run (MUTATION.md §2) found unguarded.
import { auditLog, backtest } from "../../src/engine";

describe("a log's unreadable interval end is named by its column and level (common practice: say what to fix)", () => {
  test("text in the upper column at 95% names 'upper (95%)' and the row", () => {
    const input = {
      actual: [100, 102, 98],
      intervals: [{ level: 95, lower: [90, 91, 89], upper: [110, "n/a", 108] }],
      firstRow: 2,
    };
    expect(() => auditLog(input)).toThrow(/upper \(95%\)/);
    expect(() => auditLog(input)).toThrow(/[Rr]ow 3/);
  });
});

describe("a backtest step that no origin reaches has no statistics rather than made-up ones", () => {
  test("the only origin that reaches step 5 follows a missing month: step 5 has no coverage, no test and no verdict", () => {
    // INVENTED series (a shop's monthly sales with a gentle trend); month 25 missing.
    const y: Array<number | null> = Array.from({ length: 30 }, (_, i) => 200 + 2 * i + 5 * Math.sin(i));
    y[24] = null;
    const bt = backtest(y, 5, { method: "naive", lambda: "none", first: 25, level: 80 });
    expect(bt.rows.map((r) => r.origins)).toEqual([4, 3, 2, 1, 0]);
    expect(bt.rows[3].kupiecP).not.toBeNull();
    for (const r of bt.rows.slice(4)) {
      expect(r.coverage).toBeNull();
      expect(r.kupiecP).toBeNull();
      expect(r.verdict).toBeNull();
    }
  });
});
