// fanwise total: the total over the next H periods (or steps from..to) — its mean (the sum of the
// means), median and interval from seeded simulated paths; with --across, one more row for the
// total over all series, simulated jointly.
import { alignSeries, checkWindowStart, EngineError, fitForecast, Forecaster, isEngineError, totalAcross, totalForecast, AcrossTotal, MeanMethod } from "../../engine";
import { Command, COMMON, IO_OPTIONS } from "../command";
import { emit, exitCode, seriesError } from "../output";
import { atLines, errorMessage, fitAll, periodOf, readSeriesFile, reportReading, SeriesFit, stepLabels, zerosOf } from "../series-input";
import type { SeriesData } from "../table";
import type { ParsedArgs } from "../options";

/** The periods of a total's first and last step (the series' calendar labels after its last observed value), when the file has dates. */
function windowPeriods(data: SeriesData, j: number, from: number, horizon: number): { firstPeriod?: string; lastPeriod?: string } {
  const labels = stepLabels(data, j, horizon);
  return labels ? { firstPeriod: labels[from - 1], lastPeriod: labels[horizon - 1] } : {};
}

interface AcrossRow { name: string; t?: AcrossTotal; error?: string; notes: string[] }

/** The total over every series that could be fitted, aligned on their latest common period. */
function acrossRow(p: ParsedArgs, data: SeriesData, fits: SeriesFit[], H: number, from: number, level: number, seed: number, paths: number, mean: MeanMethod): AcrossRow {
  const ok = fits.map((x, j) => ({ x, j })).filter(({ x }) => x.f);
  const left = fits.filter((x) => !x.f).map((x) => x.name);
  const name = left.length ? `all series except ${left.join(", ")}` : "all series";
  const notes = left.length ? [`Left out (cannot be fitted): ${left.join(", ")}.`] : [];
  try {
    const aligned = alignSeries(ok.map(({ j }) => data.column(j)), ok.map(({ x }) => x.name), 1);
    if (aligned.note) notes.push(atLines(aligned.note, data));
    const { period } = periodOf(p, data);
    const fs: Forecaster[] = ok.map(({ x }, k) => (aligned.cut.includes(x.name)
      ? fitForecast(aligned.columns[k], { method: p.value<string>("method") ?? "auto", lambda: p.value<string>("lambda") ?? "auto", transform: p.choice("transform"), shift: p.text("shift"), period, label: x.name, zeros: zerosOf(p) })
      : (x.f as Forecaster)));
    const t = totalAcross(fs, H, { from, level, seed, paths, mean });
    return { name, t, notes: [...notes, ...t.notes] };
  } catch (e) {
    return { name, error: errorMessage(e), notes };
  }
}

export const totalCommand: Command = {
  name: "total",
  summary: "forecast each series' total over the next H periods (or steps from..to), with its interval",
  args: "FILE",
  options: {
    horizon: { ...COMMON.horizon, help: "the last step to add up (how many periods ahead)", required: undefined },
    from: { type: { kind: "int", min: 1 }, value: "F", help: "the first step to add up (e.g. 8 for next January after a May history end)", example: "8", default: "1" },
    to: { type: { kind: "int", min: 1 }, value: "T", help: "the last step to add up (the same as --horizon)", example: "19" },
    across: switchAcross(),
    method: COMMON.method,
    lambda: COMMON.lambda,
    level: COMMON.level,
    period: COMMON.period,
    seed: { type: { kind: "int", min: 0 }, value: "S", help: "seed of the simulated paths (same seed, same result)", example: "7", default: "1" },
    paths: { type: { kind: "int", min: 100 }, value: "P", help: "number of simulated paths", example: "20000", default: "10000" },
    mean: COMMON.mean,
    transform: COMMON.transform,
    shift: COMMON.shift,
    zeros: COMMON.zeros,
    ...IO_OPTIONS,
  },
  details: [
    "--from F --to T adds up steps F..T only (steps count from the period after the last row). --across adds a row for the total over all series, simulated jointly with their one-step errors correlated as in their history (the Pearson correlation of the transformed-scale residuals over the periods every series has), beside the interval if they were independent.",
  ],
  examples: ["fanwise total sales.csv --horizon 12 --period 12", "fanwise total sales.csv --from 8 --to 19 --period 12", "fanwise total sales.csv --horizon 12 --period 12 --across", "fanwise total sales.csv --horizon 12 --level 80 --seed 7 --json"],
  async run(p, io) {
    const hFlag = p.int("horizon");
    const toFlag = p.int("to");
    if (hFlag === undefined && toFlag === undefined) throw new EngineError("input", "--horizon is required: how many periods ahead to add up, e.g. --horizon 12 (or --from 8 --to 19).");
    if (hFlag !== undefined && toFlag !== undefined && hFlag !== toFlag) throw new EngineError("input", `--horizon ${hFlag} and --to ${toFlag} disagree; give one of them (both name the last step).`);
    const H = (toFlag ?? hFlag) as number;
    const from = checkWindowStart(p.int("from") ?? 1, H);
    const level = p.num("level") ?? 95;
    const seed = p.int("seed") ?? 1;
    const paths = p.int("paths") ?? 10000;
    const mean = (p.choice("mean") ?? "auto") as MeanMethod;
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const fits = fitAll(p, data);
    const results = fits.map((x, j) => {
      if (!x.f) return { name: x.name, error: x.error as string };
      try {
        const t = totalForecast(x.f, H, { level, seed, paths, mean, from });
        return { name: x.name, j, method: x.f.method, lambda: x.f.lambda, transform: x.f.transform, missing: x.f.missing, t: { ...t, notes: t.notes.map((n) => atLines(n, data)) } };
      } catch (e) {
        if (isEngineError(e) && e.code === "input" && /horizon|level|paths|seed|^from/.test(e.message)) throw e;
        return { name: x.name, error: errorMessage(e) };
      }
    });
    const across = p.has("across") ? acrossRow(p, data, fits, H, from, level, seed, paths, mean) : null;
    if (across && !across.t && across.error && /needs at least two series/.test(across.error) && data.names.length < 2) throw new EngineError("input", `--across adds up several series; ${data.names.length === 1 ? `the file has one (${data.names[0]})` : "the file has none"}. Leave --across out for one series.`);
    await emit(io, p, {
      command: "total",
      json: () => {
        const series: Record<string, unknown> = {};
        for (const r of results) {
          if (!("t" in r) || !r.t) { series[r.name] = { error: r.error }; continue; }
          series[r.name] = {
            method: r.method, lambda: r.lambda, missing: r.missing, from: r.t.from, horizon: r.t.horizon, period, periodFrom,
            ...windowPeriods(data, r.j, r.t.from, r.t.horizon),
            transform: { kind: r.transform.kind, lambda: r.transform.lambda, shift: r.transform.shift },
            mean: r.t.mean.value, meanUsed: r.t.meanUsed, median: r.t.median, interval: r.t.interval, level: r.t.level,
            paths: r.t.paths, seed: r.t.seed, simulatedMean: r.t.simulatedMean, monteCarloError: r.t.monteCarloError,
            notes: [...(r.t.mean.note ? [r.t.mean.note] : []), ...r.t.notes],
          };
        }
        if (!across) return { reading: data.reading, series };
        const a = across.t;
        return {
          reading: data.reading,
          series,
          across: a ? {
            name: across.name, from: a.from, horizon: a.horizon, mean: a.mean, median: a.median, interval: a.interval, level: a.level,
            independent: a.independent.interval, correlation: a.correlation, series: a.series.map((s) => s.label), commonPeriods: a.commonPeriods, estimator: a.estimator,
            paths: a.paths, seed: a.seed, simulatedMean: a.simulatedMean, monteCarloError: a.monteCarloError, notes: [...(a.meanNote ? [a.meanNote] : []), ...across.notes],
          } : { name: across.name, error: across.error, notes: across.notes },
        };
      },
      header: ["series", "from", "horizon", "method", "lambda", "mean", "median", "low", "high", "level", "paths", "mc_std_error", "note"],
      rows: () => [
        ...results.map((r) => (!("t" in r) || !r.t)
          ? [r.name, from, H, "", "", "", "", "", "", level, "", "", r.error]
          : [r.name, from, H, r.method, r.lambda === null ? "none" : r.lambda, r.t.mean.value, r.t.median, r.t.interval[0], r.t.interval[1], r.t.level, r.t.paths, r.t.monteCarloError, [r.t.mean.note, ...r.t.notes].filter(Boolean).join(" ")]),
        ...(across ? [across.t
          ? [across.name, from, H, "joint", "per series", across.t.mean ?? "", across.t.median, across.t.interval[0], across.t.interval[1], across.t.level, across.t.paths, across.t.monteCarloError ?? "",
            [`If the series were independent: ${fmtRange(across.t.independent.interval)}.`, across.t.meanNote, ...across.notes].filter(Boolean).join(" ")]
          : [across.name, from, H, "", "", "", "", "", "", level, "", "", [across.error, ...across.notes].join(" ")]] : []),
      ],
      formats: { lambda: "0.000" },
      cautions: [...data.notes, ...results.flatMap((r) => ("t" in r && r.t ? [] : [`${r.name}: ${r.error}`])), ...(across && !across.t ? [`${across.name}: ${across.error}`] : [])],
    });
    for (const r of results) if (!("t" in r) || !r.t) seriesError(io, r.name, r.error);
    if (across && !across.t) seriesError(io, across.name, across.error);
    reportReading(io, p.has("json"), data);
    const ok = results.filter((r) => "t" in r && r.t).length;
    return exitCode(ok + (across?.t ? 1 : 0), results.length - ok + (across && !across.t ? 1 : 0));
  },
};

function switchAcross(): typeof COMMON.json {
  return { ...COMMON.json, help: "add a row for the total over all series, simulated jointly" };
}

function fmtRange(r: [number, number | null]): string {
  return `${r[0].toFixed(1)} to ${r[1] === null ? "unbounded" : r[1].toFixed(1)}`;
}
