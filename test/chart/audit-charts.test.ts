// The audit pictures: geometry checked by arithmetic (common practice: a chart's layout is checked
// by its coordinates), SVG checked for what an auditor needs (legend words, dates on the axis,
// error bars) and for safety (no scripts, no outside references, user text escaped).
import { calibrationChartSvg, calibrationGeometry, coveragePoints, hitStripGeometry, hitStripSvg } from "../../src/chart";
import { clopperPearson } from "../../src/engine";

const months = Array.from({ length: 36 }, (_, i) => `${2023 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, "0")}`);

function safe(svg: string): void {
  expect(svg).not.toMatch(/<script|javascript:|on\w+=|xlink:href|<image|<foreignObject/i);
  expect(svg.replace('xmlns="http://www.w3.org/2000/svg"', "")).not.toMatch(/https?:|url\(/);
}

describe("hit strip", () => {
  const sides = months.map((_, i): -1 | 0 | 1 => (i === 4 ? 1 : i === 20 ? -1 : 0));
  test("one cell per row, in order, filling at most the plot width; first and last dates on the axis", () => {
    const g = hitStripGeometry({ sides, labels: months, width: 320 });
    expect(g.cells).toHaveLength(36);
    expect(g.cells[1].x - g.cells[0].x).toBeCloseTo(g.cells[0].w, 12);
    expect(g.cells[35].x + g.cells[35].w).toBeLessThanOrEqual(g.plot.right + 1e-9);
    expect(g.ticks.map((t) => t.label)).toEqual(["2023-01", "2023-10", "2024-07", "2025-03", "2025-12"]); // rows 0, 9, 18, 26, 35 of 36 (round(j·35/4))
    expect(g.ticks.length).toBe(5);
    expect(g.legend.map((l) => l.label)).toEqual(["hit (inside)", "miss above", "miss below"]);
  });
  test("1,000 rows still fit the width (cells shrink, never the axis)", () => {
    const g = hitStripGeometry({ sides: new Array(1000).fill(0), width: 300 });
    expect(g.plot.right).toBeLessThanOrEqual(300);
    expect(g.ticks[0].label).toBe("row 1");
    expect(g.ticks[g.ticks.length - 1].label).toBe("row 1000");
  });
  test("the SVG has the legend words, the dates, misses by side, and escapes labels", () => {
    const svg = hitStripSvg({ sides, labels: months.map((m, i) => (i === 0 ? "<b>&\"x\"" : m)), title: "Harbour Street at 80%" });
    expect(svg).toContain("miss above");
    expect(svg).toContain("miss below");
    expect(svg).toContain("hit (inside)");
    expect(svg).toContain("2025-12");
    expect(svg).toContain("&lt;b&gt;&amp;&quot;x&quot;");
    expect((svg.match(/class="miss miss-above"/g) ?? []).length).toBe(1);
    expect((svg.match(/class="miss miss-below"/g) ?? []).length).toBe(1);
    expect(svg).toMatch(/aria-label="Hits and misses over time, oldest first: 34 inside, 1 above, 1 below"/);
    safe(svg);
  });
});

describe("calibration chart", () => {
  const pts = coveragePoints([
    { level: 80, coverage: 0.7, coverageInterval: clopperPearson(84, 120), n: 120 },
    { level: 95, coverage: 0.94, coverageInterval: clopperPearson(113, 120), n: 120 },
  ]);
  test("equal axes, so the diagonal is at 45°: x(s) and y(s) move by the same amount", () => {
    const g = calibrationGeometry({ points: pts });
    expect(g.x(g.range[1]) - g.x(g.range[0])).toBeCloseTo(g.y(g.range[0]) - g.y(g.range[1]), 9);
    expect(g.range[0]).toBeLessThanOrEqual(pts[0].low);
    expect(g.range[1]).toBeGreaterThanOrEqual(0.95);
  });
  test("a point whose Clopper–Pearson bar misses the promise is flagged; one that covers it is not", () => {
    const g = calibrationGeometry({ points: pts });
    expect(g.points.map((p) => p.inside)).toEqual([false, true]);
    expect(g.points[0].y1).toBeLessThan(g.points[0].cy);
    expect(g.points[0].y2).toBeGreaterThan(g.points[0].cy);
  });
  test("the SVG: error bars, labels, the diagonal, the legend; safe", () => {
    const svg = calibrationChartSvg({ points: pts, title: "All shops" });
    expect((svg.match(/class="error-bar"/g) ?? []).length).toBe(2);
    expect(svg).toContain("80%");
    expect(svg).toContain('class="diagonal"');
    expect(svg).toContain("Clopper–Pearson");
    expect(svg).toContain('class="point off"');
    safe(svg);
  });
});
