// fanwise total: the total over the next H periods (or steps from..to) — its mean (the sum of the
// means), median and interval from seeded simulated paths; with --across, one more row for the
// total over all series, simulated jointly.
import { alignSeries, checkWindowStart, EngineError, fitForecast, Forecaster, isEngineError, totalAcross, totalForecast, AcrossTotal, MeanMethod, TotalForecast } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { emit, exitCode, seriesError } from "../output";
import { inOrder, jobsFor, JOBS_OPTION } from "../parallel";
import { atLines, calendarLabel, errorMessage, fitAll, fitOne, labelsAfter, lastObserved, periodOf, readAllColumns, readSeriesFile, reportReading, SeriesFit, stepLabels, zerosOf } from "../series-input";
import { emitSeries } from "../stream-output";
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
    jobs: { ...JOBS_OPTION, help: `${JOBS_OPTION.help} (one thread with --across or a window of periods)` },
  },
  details: [
    "--from F --to T adds up steps F..T only (steps count from each series' last value), or the periods F..T when the file has a column of dates (--from 2026-01 --to 2026-12: each series' own steps to those months). --across adds a row for the total over all series, simulated jointly with their one-step errors correlated as in their history (the Pearson correlation of the transformed-scale residuals over the periods every series has), beside the interval if they were independent.",
  ],
  examples: ["fanwise total sales.csv --horizon 12 --period 12", "fanwise total sales.csv --from 8 --to 19 --period 12", "fanwise total sales.csv --horizon 12 --period 12 --across", "fanwise total sales.csv --horizon 12 --level 80 --seed 7 --json"],
  async run(p, io) {
    const w = windowOptions(p);
    const level = p.num("level") ?? 95;
    const seed = p.int("seed") ?? 1;
    const paths = p.int("paths") ?? 10000;
    const mean = (p.choice("mean") ?? "auto") as MeanMethod;
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const windowOf = (last: number, who: string): { from: number; H: number } => (w.byPeriod ? periodWindow(data, last, who, w.fromOpt, w.toOpt, w.hFlag) : { from: w.from, H: w.H });
    const entry = (r: TotalRow): [string, unknown] => {
      if (!r.t) return [r.name, { error: r.error }];
      return [r.name, {
        method: r.method, lambda: r.lambda, missing: r.missing, from: r.t.from, horizon: r.t.horizon, period, periodFrom,
        ...windowPeriods(data, r.j, r.t.from, r.t.horizon),
        transform: r.transform,
        mean: r.t.mean.value, meanUsed: r.t.meanUsed, median: r.t.median, interval: r.t.interval, level: r.t.level,
        paths: r.t.paths, seed: r.t.seed, simulatedMean: r.t.simulatedMean, monteCarloError: r.t.monteCarloError,
        notes: [...(r.t.mean.note ? [r.t.mean.note] : []), ...r.t.notes],
      }];
    };
    const row = (r: TotalRow): unknown[] => (!r.t
      ? [r.name, w.fromOpt ?? 1, w.toOpt ?? w.hFlag ?? "", "", "", "", "", "", level, "", "", r.error]
      : [r.name, r.t.from, r.t.horizon, r.method, r.lambda === null ? "none" : r.lambda, r.t.mean.value, r.t.median, r.t.interval[0], r.t.interval[1], r.t.level, r.t.paths, r.t.monteCarloError, [r.t.mean.note, ...r.t.notes].filter(Boolean).join(" ")]);
    const header = ["series", "from", "horizon", "method", "lambda", "mean", "median", "low", "high", "level", "paths", "mc_std_error", "note"];
    if (!p.has("across")) {
      // Series by series, written as they are done; over worker threads unless the window is
      // given by periods (each series' steps come from the file's calendar, read here).
      const failed: TotalRow[] = [];
      let ok = 0;
      await emitSeries<TotalRow>(io, p, {
        command: "total",
        header,
        head: () => {
          readAllColumns(data);
          return { reading: data.reading };
        },
        entry,
        rows: (r) => [row(r)],
        workbook: (all) => ({ formats: { lambda: "0.000" }, cautions: [...data.notes, ...all.flatMap((r) => (r.t ? [] : [`${r.name}: ${r.error}`]))] }),
      }, inOrder(p, "total", data, w.byPeriod ? 1 : jobsFor(p, data.names.length), (j) => totalOne(p, data, j, j, windowOf)), (r) => {
        if (r.t) ok++;
        else failed.push(r);
      });
      for (const r of failed) seriesError(io, r.name, r.error);
      reportReading(io, p.has("json"), data);
      return exitCode(ok, failed.length);
    }
    // --across: every series' fit is needed for the joint total, so all are computed here first.
    const fits = fitAll(p, data);
    const results = fits.map((x, j) => totalOfFit(x, j, data, windowOf, { level, seed, paths, mean }));
    const across = acrossRow(p, data, fits, windowOf, level, seed, paths, mean);
    if (!across.t && across.error && /needs at least two series/.test(across.error) && data.names.length < 2) throw new EngineError("input", `--across adds up several series; ${data.names.length === 1 ? `the file has one (${data.names[0]})` : "the file has none"}. Leave --across out for one series.`);
    await emit(io, p, {
      command: "total",
      json: () => {
        const a = across.t;
        return {
          reading: data.reading,
          series: Object.fromEntries(results.map(entry)),
          across: a ? {
            name: across.name, from: a.from, horizon: a.horizon, mean: a.mean, median: a.median, interval: a.interval, level: a.level,
            independent: a.independent.interval, correlation: a.correlation, series: a.series.map((x) => x.label), commonPeriods: a.commonPeriods, estimator: a.estimator,
            paths: a.paths, seed: a.seed, simulatedMean: a.simulatedMean, monteCarloError: a.monteCarloError, notes: [...(a.meanNote ? [a.meanNote] : []), ...across.notes],
          } : { name: across.name, error: across.error, notes: across.notes },
        };
      },
      header,
      rows: () => [
        ...results.map(row),
        across.t
          ? [across.name, across.t.from, across.t.horizon, "joint", "per series", across.t.mean ?? "", across.t.median, across.t.interval[0], across.t.interval[1], across.t.level, across.t.paths, across.t.monteCarloError ?? "",
            [`If the series were independent: ${fmtRange(across.t.independent.interval)}.`, across.t.meanNote, ...across.notes].filter(Boolean).join(" ")]
          : [across.name, w.fromOpt ?? 1, w.toOpt ?? w.hFlag ?? "", "", "", "", "", "", level, "", "", [across.error, ...across.notes].join(" ")],
      ],
      formats: { lambda: "0.000" },
      cautions: [...data.notes, ...results.flatMap((r) => (r.t ? [] : [`${r.name}: ${r.error}`])), ...(!across.t ? [`${across.name}: ${across.error}`] : [])],
    });
    for (const r of results) if (!r.t) seriesError(io, r.name, r.error);
    if (!across.t) seriesError(io, across.name, across.error);
    reportReading(io, p.has("json"), data);
    const ok = results.filter((r) => r.t).length;
    return exitCode(ok + (across.t ? 1 : 0), results.length - ok + (!across.t ? 1 : 0));
  },
};

/** One series' total, or its message. */
export interface TotalRow {
  name: string;
  j: number;
  method?: string;
  lambda?: number | null;
  transform?: { kind: string; lambda: number | null; shift: number };
  missing?: number;
  t?: TotalForecast;
  error?: string;
}

/** The window options (--horizon, --from, --to), checked: steps the same for every series, or periods. */
function windowOptions(p: ParsedArgs): { hFlag?: number; fromOpt?: WindowEnd; toOpt?: WindowEnd; byPeriod: boolean; H: number; from: number } {
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
  return { hFlag, fromOpt, toOpt, byPeriod, H, from };
}

/** A fitted series' total over its window; messages that are the same for every series are thrown. */
function totalOfFit(x: SeriesFit, j: number, data: SeriesData, windowOf: (last: number, who: string) => { from: number; H: number }, o: { level: number; seed: number; paths: number; mean: MeanMethod }, at = j): TotalRow {
  if (!x.f) return { name: x.name, j: at, error: x.error as string };
  try {
    const w = windowOf(lastObserved(data, j), x.name);
    const t = totalForecast(x.f, w.H, { level: o.level, seed: o.seed, paths: o.paths, mean: o.mean, from: w.from });
    return { name: x.name, j: at, method: x.f.method, lambda: x.f.lambda, transform: { kind: x.f.transform.kind, lambda: x.f.transform.lambda, shift: x.f.transform.shift }, missing: x.f.missing, t: { ...t, notes: t.notes.map((n) => atLines(n, data, j)) } };
  } catch (e) {
    if (isEngineError(e) && e.code === "input" && /horizon|level|paths|seed|^from|^--from|^--to/.test(e.message)) throw e;
    return { name: x.name, j: at, error: errorMessage(e) };
  }
}

/**
 * The total of series j of the file over its window (--horizon, or --from/--to as steps; `windowOf`
 * for periods, which needs the file's calendar), with total's options; or its message. `at` is the
 * series' place in the whole file (a worker gets one series).
 * @example totalOne(parsed, data, 0).t?.mean.value // 14250.3
 */
export function totalOne(p: ParsedArgs, data: SeriesData, j: number, at = j, windowOf?: (last: number, who: string) => { from: number; H: number }): TotalRow {
  const w = windowOptions(p);
  const win = windowOf ?? ((): { from: number; H: number } => ({ from: w.from, H: w.H }));
  return totalOfFit(fitOne(p, data, j), j, data, win, { level: p.num("level") ?? 95, seed: p.int("seed") ?? 1, paths: p.int("paths") ?? 10000, mean: (p.choice("mean") ?? "auto") as MeanMethod }, at);
}

function switchAcross(): typeof COMMON.json {
  return { ...COMMON.json, help: "add a row for the total over all series, simulated jointly" };
}

function fmtRange(r: [number, number | null]): string {
  return `${r[0].toFixed(1)} to ${r[1] === null ? "unbounded" : r[1].toFixed(1)}`;
}
