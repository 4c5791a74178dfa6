// fanwise lambda: the Box-Cox λ of each series by Guerrero's method or profile likelihood.
import { EngineError, LambdaMethod, fitLambda, screenSeries } from "../../engine";
import { Command, COMMON } from "../command";
import { seriesError, writeOutput } from "../output";
import { cleanSeriesAtLines, errorMessage, lineOf, periodOf, readSeriesFile, reportReading, ZEROS_OPTION_CLI, zerosOf } from "../series-input";

export const lambdaCommand: Command = {
  name: "lambda",
  summary: "estimate the Box-Cox λ of each series, with its interval",
  args: "FILE",
  options: {
    method: { type: { kind: "choice", values: ["guerrero", "mle"] }, value: "guerrero|mle", help: "Guerrero's method or the profile likelihood", example: "mle", default: "guerrero" },
    period: COMMON.period,
    delimiter: COMMON.delimiter,
    decimal: COMMON.decimal,
    bounds: { type: { kind: "pair" }, value: "LO,HI", help: "search λ between these two numbers", example: "-1,2", default: "-1,2" },
    zeros: COMMON.zeros,
    json: COMMON.json,
  },
  examples: ["fanwise lambda sales.csv --period 12", "fanwise lambda sales.csv --method mle --json"],
  run(p, io) {
    const method = (p.choice("method") ?? "guerrero") as LambdaMethod;
    const [lower, upper] = p.pair("bounds") ?? [undefined, undefined];
    const data = readSeriesFile(p);
    const { period, periodFrom } = periodOf(p, data);
    const results = data.names.map((_, j) => {
      try {
        const cells = data.column(j);
        const screen = screenSeries(cells, { period, label: data.names[j], where: lineOf(data), zeros: zerosOf(p), zerosOption: ZEROS_OPTION_CLI });
        if (!screen.boxCoxUsable) throw new EngineError("input", screen.message);
        const clean = cleanSeriesAtLines(cells, data, j, zerosOf(p));
        return { ok: true as const, r: fitLambda(clean.values, { method, period, lower, upper, label: data.names[j] }) };
      } catch (e) {
        return { ok: false as const, message: errorMessage(e) };
      }
    });
    writeOutput(io, p.has("json"), {
      json: () => {
        const series: Record<string, unknown> = {};
        results.forEach((x, j) => {
          series[data.names[j]] = x.ok
            ? { lambda: x.r.lambda, method: x.r.method, interval: x.r.interval, loglik: x.r.loglik, readable: x.r.readable, onBound: x.r.onBound, window: x.r.window, n: x.r.n, missing: x.r.missing, note: x.r.note, period, periodFrom }
            : { error: x.message };
        });
        return { reading: data.reading, series };
      },
      header: ["series", "lambda", "method", "interval_low", "interval_high", "readable_lambda", "loglik", "on_bound", "note"],
      rows: () => results.map((x, j) => x.ok
        ? [data.names[j], x.r.lambda, x.r.method, x.r.interval[0], x.r.interval[1], x.r.readable, x.r.loglik, x.r.onBound ?? "", x.r.note]
        : [data.names[j], "", method, "", "", "", "", "", x.message]),
    });
    for (const [j, x] of results.entries()) if (!x.ok) seriesError(io, data.names[j], x.message);
    reportReading(io, p.has("json"), data);
    return 0;
  },
};
