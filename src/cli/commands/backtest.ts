// fanwise backtest: rolling-origin forecasts over the series' own past — coverage, interval score
// and the errors of the mean and the median per step ahead.
import { backtest, isEngineError } from "../../engine";
import { Command, COMMON } from "../command";
import { seriesError, writeOutput } from "../output";
import { errorMessage, periodOf, readSeriesFile, reportReading, zerosOf } from "../series-input";

export const backtestCommand: Command = {
  name: "backtest",
  summary: "re-forecast the past from rolling origins: coverage and errors per step ahead",
  args: "FILE",
  options: {
    horizon: COMMON.horizon,
    method: COMMON.method,
    lambda: COMMON.lambda,
    level: COMMON.level,
    period: COMMON.period,
    delimiter: COMMON.delimiter,
    decimal: COMMON.decimal,
    first: { type: { kind: "int", min: 2 }, value: "N", help: "length of the first fitting window", example: "24" },
    zeros: COMMON.zeros,
    json: COMMON.json,
  },
  examples: ["fanwise backtest sales.csv --horizon 3 --period 12"],
  run(p, io) {
    const H = p.int("horizon") as number;
    const level = p.num("level") ?? 95;
    const first = p.int("first");
    const data = readSeriesFile(p);
    const { period, periodFrom } = periodOf(p, data);
    const results = data.names.map((_, j) => {
      try {
        return { name: data.names[j], b: backtest(data.column(j), H, { method: p.text("method") ?? "auto", lambda: p.text("lambda") ?? "auto", level, period, first, label: data.names[j], zeros: zerosOf(p) }) };
      } catch (e) {
        if (isEngineError(e) && /^horizon|must be a percentage|is in percent/.test(e.message)) throw e;
        return { name: data.names[j], error: errorMessage(e) };
      }
    });
    writeOutput(io, p.has("json"), {
      json: () => {
        const series: Record<string, unknown> = {};
        for (const r of results) series[r.name] = r.b ? { horizon: r.b.horizon, period, periodFrom, level: r.b.level, first: r.b.first, failures: r.b.failures, gapOrigins: r.b.gapOrigins, steps: r.b.rows } : { error: r.error };
        return { reading: data.reading, series };
      },
      header: ["series", "h", "origins", "coverage", "interval_score", "mean_error_of_mean", "mean_error_of_median", "note"],
      rows: () => {
        const rows: unknown[][] = [];
        for (const r of results) {
          if (!r.b) { rows.push([r.name, "", "", "", "", "", "", r.error]); continue; }
          for (const s of r.b.rows) rows.push([r.name, s.h, s.origins, s.coverage, s.intervalScore, s.meanErrorOfMean, s.meanErrorOfMedian, s.h === 1 ? r.b.failureNote ?? "" : ""]);
        }
        return rows;
      },
    });
    for (const r of results) if (!r.b) seriesError(io, r.name, r.error);
    reportReading(io, p.has("json"), data);
    return 0;
  },
};
