// fanwise backtest: rolling-origin forecasts over the series' own past — coverage, interval score
// and the errors of the mean and the median per step ahead, with Kupiec's p and a verdict per step.
import { backtest, isEngineError } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { emit, exitCode, seriesError } from "../output";
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
    first: { type: { kind: "int", min: 2 }, value: "N", help: "length of the first fitting window", example: "24" },
    transform: COMMON.transform,
    shift: COMMON.shift,
    mean: COMMON.mean,
    zeros: COMMON.zeros,
    ...SERIES_IO_OPTIONS,
  },
  examples: ["fanwise backtest sales.csv --horizon 3 --period 12"],
  async run(p, io) {
    const H = p.int("horizon") as number;
    const level = p.num("level") ?? 95;
    const first = p.int("first");
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const results = data.names.map((_, j) => {
      try {
        return { name: data.names[j], b: backtest(data.column(j), H, { method: p.value<string>("method") ?? "auto", lambda: p.value<string>("lambda") ?? "auto", transform: p.choice("transform"), shift: p.text("shift"), mean: p.choice("mean") ?? "auto", level, period, first, label: data.names[j], zeros: zerosOf(p) }) };
      } catch (e) {
        if (isEngineError(e) && /^horizon|must be a percentage|is in percent/.test(e.message)) throw e;
        return { name: data.names[j], error: errorMessage(e) };
      }
    });
    await emit(io, p, {
      command: "backtest",
      json: () => {
        const series: Record<string, unknown> = {};
        for (const r of results) {
          series[r.name] = r.b
            ? {
              horizon: r.b.horizon, period, periodFrom, level: r.b.level, first: r.b.first, failures: r.b.failures, gapOrigins: r.b.gapOrigins, origins: r.b.origins, originNote: r.b.originNote,
              steps: r.b.rows.map((s) => ({ ...s, verdict: s.verdict ? `${s.verdict.headline}. ${s.verdict.text}` : null, headline: s.verdict?.headline ?? null, zone: s.verdict?.colour ?? null })),
            }
            : { error: r.error };
        }
        return { reading: data.reading, series };
      },
      header: ["series", "h", "origins", "coverage", "interval_score", "mean_error_of_mean", "mean_error_of_median", "kupiec_p", "independence_p", "zone", "verdict", "note"],
      rows: () => {
        const rows: unknown[][] = [];
        for (const r of results) {
          if (!r.b) { rows.push([r.name, "", "", "", "", "", "", "", "", "", "", r.error]); continue; }
          for (const s of r.b.rows) {
            const note = s.h === 1 ? [r.b.originNote, r.b.failureNote ?? ""].filter((x) => x).join(" ") : "";
            rows.push([r.name, s.h, s.origins, s.coverage, s.intervalScore, s.meanErrorOfMean, s.meanErrorOfMedian, s.kupiecP ?? "", s.independenceP ?? "", s.verdict?.colour ?? "", s.verdict?.headline ?? "", note]);
          }
        }
        return rows;
      },
      formats: { coverage: "0.0%" },
      cautions: [...data.notes, ...results.flatMap((r) => (r.b ? [] : [`${r.name}: ${r.error}`]))],
    });
    for (const r of results) if (!r.b) seriesError(io, r.name, r.error);
    reportReading(io, p.has("json"), data);
    const ok = results.filter((r) => r.b).length;
    return exitCode(ok, results.length - ok);
  },
};
