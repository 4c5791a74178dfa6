// The fan chart of one series for the command line (the chart command and the pictures in a
// results workbook), drawn by the shared chart module.
import { FanTable } from "../engine";
import { fanChartSvg } from "../chart/fan-chart";
import { ChartPicture } from "./output";
import { chartHistory, stepLabels } from "./series-input";
import { SeriesData } from "./table";

/** The chart's size in pixels: wide enough for dates under the axis and the legend in one row. */
export const CHART_SIZE = { width: 720, height: 360 };

/**
 * The fan chart of series j: its last few years of history (at least 36 points, or 3 × the
 * horizon), the bands, the mean and the median, dated where the file has period labels.
 * @example seriesChart(data, 0, table).svg.startsWith("<svg") // true
 */
export function seriesChart(data: SeriesData, j: number, table: FanTable, size = CHART_SIZE): ChartPicture {
  const h = chartHistory(data, j, Math.max(36, 3 * table.rows.length));
  const labelled = h.labels.some((l) => l !== "");
  const H = table.rows.length;
  const labels = labelled ? [...h.labels, ...(stepLabels(data, j, H) ?? Array.from({ length: H }, (_, k) => `+${k + 1}`))] : undefined;
  const title = `${data.names[j]}: ${table.method}, λ ${table.lambda === null ? "none" : Number(table.lambda.toPrecision(3))}, ${table.rows.length} step${table.rows.length === 1 ? "" : "s"} ahead`;
  return { title, svg: fanChartSvg({ title, history: h.values, labels, fan: table, ...size }), ...size };
}
