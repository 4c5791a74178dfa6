// The fan chart's axis labels (common practice: labels under an axis must not overlap): the first
// period, the last observed one at the divider and the last forecast one. Invented monthly data.
import { fanChartSvg } from "../../src/chart/fan-chart";
import { fanTable, fitForecast } from "../../src/engine";

const history = Array.from({ length: 24 }, (_, i) => 100 * Math.exp(0.01 * i + 0.1 * Math.sin(i / 2)));
const month = (k: number): string => `${2024 + Math.floor(k / 12)}-${String((k % 12) + 1).padStart(2, "0")}`;

function axisLabels(horizon: number, width: number): { text: string; x: number; anchor: string }[] {
  const f = fitForecast(history, { method: "naive", lambda: 0 });
  const svg = fanChartSvg({ title: "t", history, labels: Array.from({ length: 24 + horizon }, (_, k) => month(k)), fan: fanTable(f, horizon, { levels: [80] }), width, height: 220 });
  return [...svg.matchAll(/<text x="([\d.]+)" y="[\d.]+" font-size="9"(?: text-anchor="(\w+)")? fill="[^"]+">(\d{4}-\d{2})<\/text>/g)].map((m) => ({ x: Number(m[1]), anchor: m[2] ?? "start", text: m[3] }));
}

test("a short forecast in a narrow pane: the divider's label ends at the divider instead of running into the last label", () => {
  const l = axisLabels(6, 300);
  expect(l.map((x) => x.text)).toEqual(["2024-01", "2025-12", "2026-06"]);
  expect(l[1].anchor).toBe("end");
  expect(l[1].x).toBeLessThan(l[2].x - 5.5 * 7); // the last label ends at the right edge and is 7 characters wide
});

test("a long forecast: the divider's label is centred on the divider", () => {
  const l = axisLabels(24, 600);
  expect(l.map((x) => x.text)).toEqual(["2024-01", "2025-12", "2027-12"]);
  expect(l[1].anchor).toBe("middle");
});

test("no room at all: the divider's label is left out rather than drawn over another", () => {
  const l = axisLabels(1, 120);
  expect(l.map((x) => x.text)).toEqual(["2024-01", "2026-01"]);
});
