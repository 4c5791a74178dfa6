// fanwise backtest: rolling-origin forecasts over the series' own past — coverage, interval score
// and the errors of the mean and the median per step ahead, with Kupiec's p and a verdict per step.
import { backtest, Backtest, isEngineError } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { ParsedArgs } from "../options";
import { exitCode, seriesError } from "../output";
import { inOrder, jobsFor, JOBS_OPTION } from "../parallel";
import { errorMessage, periodOf, readAllColumns, readSeriesFile, reportReading, zerosOf } from "../series-input";
import { emitSeries } from "../stream-output";
import { SeriesData } from "../table";

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
    jobs: JOBS_OPTION,
  },
  examples: ["fanwise backtest sales.csv --horizon 3 --period 12"],
  async run(p, io) {
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const failed: SeriesBacktest[] = [];
    let ok = 0;
    await emitSeries<SeriesBacktest>(io, p, {
      command: "backtest",
      header: ["series", "h", "origins", "coverage", "interval_score", "mean_error_of_mean", "mean_error_of_median", "kupiec_p", "independence_p", "zone", "verdict", "note"],
      head: () => {
        readAllColumns(data);
        return { reading: data.reading };
      },
      entry: (r) => [r.name, r.b
        ? {
          horizon: r.b.horizon, period, periodFrom, level: r.b.level, first: r.b.first, failures: r.b.failures, gapOrigins: r.b.gapOrigins, origins: r.b.origins, originNote: r.b.originNote,
          steps: r.b.rows.map((s) => ({ ...s, verdict: s.verdict ? `${s.verdict.headline}. ${s.verdict.text}` : null, headline: s.verdict?.headline ?? null, zone: s.verdict?.colour ?? null })),
        }
        : { error: r.error }],
      rows: (r) => {
        if (!r.b) return [[r.name, "", "", "", "", "", "", "", "", "", "", r.error]];
        const b = r.b;
        return b.rows.map((s) => {
          const note = s.h === 1 ? [b.originNote, b.failureNote ?? ""].filter((x) => x).join(" ") : "";
          return [r.name, s.h, s.origins, s.coverage, s.intervalScore, s.meanErrorOfMean, s.meanErrorOfMedian, s.kupiecP ?? "", s.independenceP ?? "", s.verdict?.colour ?? "", s.verdict?.headline ?? "", note];
        });
      },
      workbook: (all) => ({
        formats: { coverage: "0.0%" },
        cautions: [...data.notes, ...all.flatMap((r) => (r.b ? [] : [`${r.name}: ${r.error}`]))],
      }),
    }, inOrder(p, "backtest", data, jobsFor(p, data.names.length), (j) => backtestOne(p, data, j)), (r) => {
      if (r.b) ok++;
      else failed.push(r);
    });
    for (const r of failed) seriesError(io, r.name, r.error);
    reportReading(io, p.has("json"), data);
    return exitCode(ok, failed.length);
  },
};

/** One series' backtest, or its message. */
export interface SeriesBacktest { name: string; b?: Backtest; error?: string }

/**
 * The backtest of series j of the file with backtest's options, or its message; a message that is
 * the same for every series (a bad horizon or level) is thrown.
 * @example backtestOne(parsed, data, 0).b?.rows.length // 3
 */
export function backtestOne(p: ParsedArgs, data: SeriesData, j: number): SeriesBacktest {
  const H = p.int("horizon") as number;
  const level = p.num("level") ?? 95;
  const first = p.int("first");
  const { period } = periodOf(p, data);
  try {
    return { name: data.names[j], b: backtest(data.column(j), H, { method: p.value<string>("method") ?? "auto", lambda: p.value<string>("lambda") ?? "auto", transform: p.choice("transform"), shift: p.text("shift"), mean: p.choice("mean") ?? "auto", level, period, first, label: data.names[j], zeros: zerosOf(p) }) };
  } catch (e) {
    if (isEngineError(e) && /^horizon|must be a percentage|is in percent/.test(e.message)) throw e;
    return { name: data.names[j], error: errorMessage(e) };
  }
}
