// fanwise total: the total over the next H periods (or steps from..to) — its mean (the sum of the
// means), median and interval from seeded simulated paths; with --across, one more row for the
// total over all series, simulated jointly.
import { alignSeries, checkWindowStart, EngineError, fitForecast, Forecaster, isEngineError, totalAcross, totalForecast, AcrossTotal, MeanMethod } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { emit, exitCode, seriesError } from "../output";
import { atLines, calendarLabel, errorMessage, fitAll, labelsAfter, lastObserved, periodOf, readSeriesFile, reportReading, SeriesFit, stepLabels, zerosOf } from "../series-input";
import type { SeriesData } from "../table";
import type { ParsedArgs } from "../options";

/** The periods of a total's first and last step (the series' calendar labels after its last observed value), when the file has dates. */
function windowPeriods(data: SeriesData, j: number, from: number, horizon: number): { firstPeriod?: string; lastPeriod?: string } {
  const labels = stepLabels(data, j, horizon);
  return labels ? { firstPeriod: labels[from - 1], lastPeriod: labels[horizon - 1] } : {};
}

interface AcrossRow { name: string; t?: AcrossTotal; error?: string; notes: string[] }

/** --from / --to: a step number (1, 2, …) or a period of the file's dates (2026-01, "Jan 2026", 2026-Q1). */
type WindowEnd = number | string;

function windowEnd(v: string, name: string): WindowEnd {
  const t = v.trim();
  if (/^\d+$/.test(t)) {
    const k = Number(t);
    if (k < 1) throw new EngineError("input", `--${name} must be a step of at least 1 or a period such as 2026-01; got "${v}".`);
    return k;
  }
  if (t === "" || /^[-+]?\d*\.\d+$|^-\d+$/.test(t)) throw new EngineError("input", `--${name} must be a whole number of at least 1 or a period such as 2026-01; got "${v}".`);
  return t;
}

/**
 * The steps of a window given by periods (--from 2026-01 --to 2026-12) for a series whose last
 * observed value is at calendar position `last`: each period is found among the periods after it.
 */
function periodWindow(data: SeriesData, last: number, who: string, fromOpt: WindowEnd | undefined, toOpt: WindowEnd | undefined, hFlag: number | undefined): { from: number; H: number } {
  const cal = data.calendar;
  const given = typeof fromOpt === "string" ? `--from ${fromOpt}` : `--to ${String(toOpt)}`;
  if (!cal) throw new EngineError("input", `${given} names a period, but the file has no column of dates to count periods from; give steps instead (--from 8 --to 19 counts from the period after the last row).`);
  const reach = Math.max(10 * (last + 1), 24);
  const labels = labelsAfter(data, last, reach) as string[];
  const lastLabel = last >= 0 ? cal.labels[last] : "the start";
  const stepOf = (v: WindowEnd, opt: string): number => {
    if (typeof v === "number") return v;
    const label = calendarLabel(v, cal.frequency);
    if (label === null) throw new EngineError("input", `--${opt} "${v}" is not a ${cal.frequency} period; write it like the file's dates, e.g. ${labels[0]}.`);
    const k = labels.indexOf(label);
    if (k >= 0) return k + 1;
    if (label <= lastLabel) throw new EngineError("input", `--${opt} ${v} is not after ${who}'s last value (${lastLabel}); a window starts at ${labels[0]} at the earliest.`);
    throw new EngineError("input", `--${opt} ${v} is more than ${reach} periods after ${who}'s last value (${lastLabel}); forecasts that far out say nothing.`);
  };
  const H = toOpt !== undefined ? stepOf(toOpt, "to") : (hFlag as number);
  const from = stepOf(fromOpt ?? 1, "from");
  if (from > H) throw new EngineError("input", `--from ${String(fromOpt)} comes after --to ${String(toOpt ?? `step ${H}`)}: the window is empty. Give the earlier period first.`);
  return { from, H };
}

/** The total over every series that could be fitted, aligned on their latest common period. */
function acrossRow(p: ParsedArgs, data: SeriesData, fits: SeriesFit[], windowOf: (last: number, who: string) => { from: number; H: number }, level: number, seed: number, paths: number, mean: MeanMethod): AcrossRow {
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
    // the series are aligned on their latest common period: the window counts from there
    const { from, H } = windowOf(Math.min(...ok.map(({ j }) => lastObserved(data, j))), name);
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
    from: { type: { kind: "custom", check: windowEnd }, value: "F", help: "the first step to add up (e.g. 8 for next January after a May history end), or a period of the file's dates (e.g. 2026-01)", example: "8", default: "1" },
    to: { type: { kind: "custom", check: windowEnd }, value: "T", help: "the last step to add up (the same as --horizon), or a period of the file's dates (e.g. 2026-12)", example: "19" },
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
    ...SERIES_IO_OPTIONS,
  },
  details: [
    "--from F --to T adds up steps F..T only (steps count from each series' last value), or the periods F..T when the file has a column of dates (--from 2026-01 --to 2026-12: each series' own steps to those months). --across adds a row for the total over all series, simulated jointly with their one-step errors correlated as in their history (the Pearson correlation of the transformed-scale residuals over the periods every series has), beside the interval if they were independent.",
  ],
  examples: ["fanwise total sales.csv --horizon 12 --period 12", "fanwise total sales.csv --from 8 --to 19 --period 12", "fanwise total sales.csv --horizon 12 --period 12 --across", "fanwise total sales.csv --horizon 12 --level 80 --seed 7 --json"],
  async run(p, io) {
    const hFlag = p.int("horizon");
    const fromOpt = p.value<WindowEnd>("from");
    const toOpt = p.value<WindowEnd>("to");
    const byPeriod = typeof fromOpt === "string" || typeof toOpt === "string";
    if (hFlag === undefined && toOpt === undefined) throw new EngineError("input", "--horizon is required: how many periods ahead to add up, e.g. --horizon 12 (or --from 8 --to 19, or --from 2026-01 --to 2026-12 with a column of dates).");
    if (hFlag !== undefined && typeof toOpt === "number" && hFlag !== toOpt) throw new EngineError("input", `--horizon ${hFlag} and --to ${toOpt} disagree; give one of them (both name the last step).`);
    if (hFlag !== undefined && typeof toOpt === "string") throw new EngineError("input", `--horizon ${hFlag} and --to ${toOpt} both name the last step; give one of them.`);
    // Steps: the same for every series; with periods (--from 2026-01), each series' own steps.
    const H = byPeriod ? 0 : ((toOpt as number | undefined) ?? hFlag) as number;
    const from = byPeriod ? 0 : checkWindowStart((fromOpt as number | undefined) ?? 1, H);
    const level = p.num("level") ?? 95;
    const seed = p.int("seed") ?? 1;
    const paths = p.int("paths") ?? 10000;
    const mean = (p.choice("mean") ?? "auto") as MeanMethod;
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const windowOf = (last: number, who: string): { from: number; H: number } => (byPeriod ? periodWindow(data, last, who, fromOpt, toOpt, hFlag) : { from, H });
    const fits = fitAll(p, data);
    const results = fits.map((x, j) => {
      if (!x.f) return { name: x.name, error: x.error as string };
      try {
        const w = windowOf(lastObserved(data, j), x.name);
        const t = totalForecast(x.f, w.H, { level, seed, paths, mean, from: w.from });
        return { name: x.name, j, method: x.f.method, lambda: x.f.lambda, transform: x.f.transform, missing: x.f.missing, t: { ...t, notes: t.notes.map((n) => atLines(n, data, j)) } };
      } catch (e) {
        if (isEngineError(e) && e.code === "input" && /horizon|level|paths|seed|^from|^--from|^--to/.test(e.message)) throw e;
        return { name: x.name, error: errorMessage(e) };
      }
    });
    const across = p.has("across") ? acrossRow(p, data, fits, windowOf, level, seed, paths, mean) : null;
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
          ? [r.name, fromOpt ?? 1, toOpt ?? hFlag ?? "", "", "", "", "", "", level, "", "", r.error]
          : [r.name, r.t.from, r.t.horizon, r.method, r.lambda === null ? "none" : r.lambda, r.t.mean.value, r.t.median, r.t.interval[0], r.t.interval[1], r.t.level, r.t.paths, r.t.monteCarloError, [r.t.mean.note, ...r.t.notes].filter(Boolean).join(" ")]),
        ...(across ? [across.t
          ? [across.name, across.t.from, across.t.horizon, "joint", "per series", across.t.mean ?? "", across.t.median, across.t.interval[0], across.t.interval[1], across.t.level, across.t.paths, across.t.monteCarloError ?? "",
            [`If the series were independent: ${fmtRange(across.t.independent.interval)}.`, across.t.meanNote, ...across.notes].filter(Boolean).join(" ")]
          : [across.name, fromOpt ?? 1, toOpt ?? hFlag ?? "", "", "", "", "", "", level, "", "", [across.error, ...across.notes].join(" ")]] : []),
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
