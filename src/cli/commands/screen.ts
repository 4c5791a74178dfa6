// fanwise screen: is each series ready for a Box-Cox transform, and if not, what to do.
import { screenSeries } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { emit } from "../output";
import { lineOf, periodOf, readSeriesFile, reportReading, ZEROS_OPTION_CLI, zerosOf } from "../series-input";

export const screenCommand: Command = {
  name: "screen",
  summary: "check each series: blanks, text cells, values ≤ 0, a suggested λ",
  args: "FILE",
  options: { period: COMMON.period, zeros: COMMON.zeros, ...SERIES_IO_OPTIONS },
  examples: ["fanwise screen sales.csv --period 12", "fanwise screen book.xlsx --sheet Sales --series \"Harbour Street\""],
  async run(p, io) {
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const results = data.names.map((name, j) => screenSeries(data.column(j), { period, label: name, where: lineOf(data, j), zeros: zerosOf(p), zerosOption: ZEROS_OPTION_CLI }));
    await emit(io, p, {
      command: "screen",
      json: () => {
        const series: Record<string, unknown> = {};
        results.forEach((r, j) => {
          series[data.names[j]] = {
            n: r.n, blanks: r.blanks, leadingBlanks: r.leadingBlanks, trailingBlanks: r.trailingBlanks, interiorGaps: r.interiorGaps, missing: r.missing, zerosIsolated: r.zerosIsolated,
            textCells: r.textCells, min: r.min, max: r.max, zeros: r.zeros, negatives: r.negatives, nonPositive: r.nonPositive,
            boxCoxUsable: r.boxCoxUsable, suggestedLambda: r.suggestedLambda, lambdaEstimate: r.lambda ? r.lambda.lambda : null,
            lambdaMethod: r.lambda ? r.lambda.method : null, fix: r.fix, shift: r.shift, message: r.message, period, periodFrom,
          };
        });
        return { reading: data.reading, series };
      },
      header: ["series", "n", "blanks", "text_cells", "min", "nonpositive", "boxcox_usable", "suggested_lambda", "fix", "message"],
      rows: () => results.map((r, j) => [data.names[j], r.n, r.blanks, r.textCells, r.min, r.nonPositive, r.boxCoxUsable ? "yes" : "no", r.suggestedLambda === null ? "" : round(r.suggestedLambda), r.fix, r.message]),
      exact: ["min"],
      cautions: data.notes,
    });
    reportReading(io, p.has("json"), data);
    return 0; // a check, not a computation: every series gets its verdict
  },
};

function round(x: number): number {
  return Number(x.toPrecision(6));
}
