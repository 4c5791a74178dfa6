// fanwise total: the total over the next H periods — its mean (the sum of the means), median and
// interval from seeded simulated paths.
import { isEngineError, totalForecast } from "../../engine";
import { Command, COMMON } from "../command";
import { seriesError, writeOutput } from "../output";
import { errorMessage, fitAll, readSeriesFile } from "../series-input";

export const totalCommand: Command = {
  name: "total",
  summary: "forecast each series' total over the next H periods, with its interval",
  args: "FILE",
  options: {
    horizon: COMMON.horizon,
    method: COMMON.method,
    lambda: COMMON.lambda,
    level: COMMON.level,
    period: COMMON.period,
    seed: { type: { kind: "int", min: 0 }, value: "S", help: "seed of the simulated paths (same seed, same result)", example: "7", default: "1" },
    paths: { type: { kind: "int", min: 100 }, value: "P", help: "number of simulated paths", example: "20000", default: "10000" },
    mean: COMMON.mean,
    transform: COMMON.transform,
    shift: COMMON.shift,
    json: COMMON.json,
  },
  examples: ["fanwise total sales.csv --horizon 12 --period 12", "fanwise total sales.csv --horizon 12 --level 80 --seed 7 --json"],
  run(p, io) {
    const H = p.int("horizon") as number;
    const level = p.num("level") ?? 95;
    const seed = p.int("seed") ?? 1;
    const paths = p.int("paths") ?? 10000;
    const mean = p.choice("mean") ?? "auto";
    const data = readSeriesFile(p);
    const results = fitAll(p, data).map((x) => {
      if (!x.f) return { name: x.name, error: x.error as string };
      try {
        return { name: x.name, method: x.f.method, lambda: x.f.lambda, transform: x.f.transform, t: totalForecast(x.f, H, { level, seed, paths, mean }) };
      } catch (e) {
        if (isEngineError(e) && e.code === "input" && /horizon|level|paths|seed/.test(e.message)) throw e;
        return { name: x.name, error: errorMessage(e) };
      }
    });
    writeOutput(io, p.has("json"), {
      json: () => {
        const series: Record<string, unknown> = {};
        for (const r of results) {
          if (!("t" in r) || !r.t) { series[r.name] = { error: r.error }; continue; }
          series[r.name] = {
            method: r.method, lambda: r.lambda, horizon: r.t.horizon,
            transform: { kind: r.transform.kind, lambda: r.transform.lambda, shift: r.transform.shift },
            mean: r.t.mean.value, meanUsed: r.t.meanUsed, median: r.t.median, interval: r.t.interval, level: r.t.level,
            paths: r.t.paths, seed: r.t.seed, simulatedMean: r.t.simulatedMean, monteCarloError: r.t.monteCarloError,
            notes: [...(r.t.mean.note ? [r.t.mean.note] : []), ...r.t.notes],
          };
        }
        return { series };
      },
      header: ["series", "horizon", "method", "lambda", "mean", "median", "low", "high", "level", "paths", "mc_std_error", "note"],
      rows: () => results.map((r) => (!("t" in r) || !r.t)
        ? [r.name, H, "", "", "", "", "", "", level, "", "", r.error]
        : [r.name, H, r.method, r.lambda === null ? "none" : r.lambda, r.t.mean.value, r.t.median, r.t.interval[0], r.t.interval[1], r.t.level, r.t.paths, r.t.monteCarloError, [r.t.mean.note, ...r.t.notes].filter(Boolean).join(" ")]),
    });
    for (const r of results) if (!("t" in r) || !r.t) seriesError(io, r.name, r.error);
    return 0;
  },
};
