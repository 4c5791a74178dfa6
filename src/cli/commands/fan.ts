// fanwise fan: per-step means, medians and intervals for each series.
import { FanTable, Maybe, fanTable, isEngineError, parseLevels } from "../../engine";
import { Command, COMMON } from "../command";
import { seriesChart } from "../fan-charts";
import { ParsedArgs } from "../options";
import { Io, exitCode, seriesError } from "../output";
import { inOrder, jobsFor, JOBS_OPTION } from "../parallel";
import { atLines, errorMessage, fitOne, periodOf, readAllColumns, readSeriesFile, reportReading, stepLabels } from "../series-input";
import { emitSeries } from "../stream-output";
import { SeriesData } from "../table";

/** fan's own options, shared with the commands that draw or write a fan. */
export const FAN_OPTIONS = {
  horizon: COMMON.horizon,
  method: COMMON.method,
  lambda: COMMON.lambda,
  levels: { type: { kind: "text" as const }, value: "80,95", help: "interval levels in percent", example: "80,95", default: "80,95" },
  period: COMMON.period,
  mean: COMMON.mean,
  transform: COMMON.transform,
  shift: COMMON.shift,
  zeros: COMMON.zeros,
  delimiter: COMMON.delimiter,
  decimal: COMMON.decimal,
  series: COMMON.series,
  sheet: COMMON.sheet,
  range: COMMON.range,
  long: COMMON.long,
};

/**
 * A per-step value's number (null where the engine could not give one; its note says why).
 * @example val({ value: 3, note: null }) // 3
 */
export function val(m: Maybe): number | null {
  return m.value;
}

/**
 * The distinct notes of one step's cells.
 * @example cellNotes(table.rows[0]) // []
 */
export function cellNotes(r: { mean: Maybe; median: Maybe; intervals: Record<string, [Maybe, Maybe]> }): string[] {
  const notes = [r.mean.note, r.median.note, ...Object.values(r.intervals).flatMap((v) => [v[0].note, v[1].note])].filter((x): x is string => !!x);
  return Array.from(new Set(notes));
}

/** One series' fan table, or its message. */
export interface SeriesFan {
  name: string;
  j: number;
  table?: FanTable;
  /** Missing observations inside the series. */
  missing?: number;
  /** The transform the series was forecast on. */
  transform?: { kind: string; lambda: number | null; shift: number };
  error?: string;
}

/**
 * The fan of series j of the file with fan's options (--horizon, --levels, --mean and the fit's
 * options), or its message; `at` is the series' place in the whole file (a worker gets one series).
 * Messages that are the same for every series (a bad horizon or level) are thrown.
 * @example fanOne(parsed, data, 0).table?.rows.length // 12
 */
export function fanOne(p: ParsedArgs, data: SeriesData, j: number, at = j): SeriesFan {
  const H = p.int("horizon") as number;
  const mean = p.choice("mean") ?? "auto";
  const levels = p.text("levels");
  const x = fitOne(p, data, j);
  if (!x.f) return { name: x.name, j: at, error: x.error as string };
  try {
    const table = fanTable(x.f, H, { levels, mean });
    return { name: x.name, j: at, table: { ...table, notes: table.notes.map((n) => atLines(n, data, j)) }, missing: x.f.missing, transform: { kind: x.f.transform.kind, lambda: x.f.transform.lambda, shift: x.f.transform.shift } };
  } catch (e) {
    if (isEngineError(e) && e.code === "input" && /horizon|level/.test(e.message)) throw e; // the same for every series
    return { name: x.name, j: at, error: errorMessage(e) };
  }
}

/**
 * Reads the file and computes the fan of every chosen series with fan's options; messages that
 * are the same for every series (a bad horizon or level) are usage errors. With `first`, only the
 * first that many series are kept and fitted; `names` lists every series of the file.
 * @example (await computeFans(parsed, io)).fans[0].table?.rows.length // 12
 */
export async function computeFans(p: ParsedArgs, io: Io, first?: number): Promise<{ data: SeriesData; fans: SeriesFan[]; H: number; names: string[] }> {
  const H = p.int("horizon") as number;
  const all = await readSeriesFile(p, io);
  const data = first === undefined ? all : { ...all, names: all.names.slice(0, first), labelColumn: all.labelColumn };
  const fans = data.names.map((_, j) => fanOne(p, data, j));
  return { data, fans, H, names: all.names };
}

export const fanCommand: Command = {
  name: "fan",
  summary: "forecast each series: mean, median and intervals for every step ahead",
  args: "FILE",
  options: { ...FAN_OPTIONS, json: COMMON.json, digits: COMMON.digits, out: COMMON.out, jobs: JOBS_OPTION },
  details: ["Rows carry the period of each step (after the series' last observed value) when the file has a column of dates or periods.", "Series are computed on every core when there are many (--jobs); the output is the same, written as each series is done."],
  examples: ["fanwise fan sales.csv --horizon 12 --period 12", "fanwise fan book.xlsx --sheet Sales --horizon 12 --period 12 --out results.xlsx", "fanwise fan sales.csv --horizon 6 --method drift --lambda 0 --levels 50,80,95 --json", "fanwise fan shops-long.csv --long store,month,sales --horizon 12 --jobs 2"],
  async run(p, io) {
    const H = p.int("horizon") as number;
    const lv = parseLevels(p.text("levels"));
    const data = await readSeriesFile(p, io);
    // The periods of each series' steps (the calendar's labels after its last observed value);
    // without a column of dates rows keep only h.
    const { period, periodFrom } = periodOf(p, data);
    const periods = data.calendar !== null;
    const periodsOf = (t: SeriesFan): string[] | null => (t.table ? stepLabels(data, t.j, H) : null);
    const failed: SeriesFan[] = [];
    let ok = 0;
    await emitSeries<SeriesFan>(io, p, {
      command: "fan",
      header: ["series", "h", ...(periods ? ["period"] : []), "method", "lambda", "mean", "median", ...lv.flatMap((l) => [`low${l}`, `high${l}`]), "note"],
      head: () => {
        readAllColumns(data);
        return { reading: data.reading };
      },
      entry: (t) => {
        if (!t.table) return [t.name, { error: t.error }];
        const tb = t.table;
        const future = periodsOf(t);
        return [t.name, {
          method: tb.method,
          lambda: tb.lambda,
          transform: t.transform,
          sigma: tb.sigma,
          missing: t.missing,
          meanMethod: tb.meanMethod,
          period,
          periodFrom,
          steps: tb.rows.map((r, i) => ({
            h: r.h,
            ...(future ? { period: future[i] } : {}),
            mean: val(r.mean),
            meanUsed: r.meanDetail.used,
            median: val(r.median),
            intervals: Object.fromEntries(Object.entries(r.intervals).map(([k, v]) => [k, [val(v[0]), val(v[1])]])),
            ...(cellNotes(r).length ? { notes: cellNotes(r) } : {}),
          })),
          notes: tb.notes,
        }];
      },
      rows: (t) => {
        if (!t.table) return [[t.name, "", ...(periods ? [""] : []), "", "", "", "", ...lv.flatMap(() => ["", ""]), t.error]];
        const tb = t.table;
        const future = periodsOf(t);
        return tb.rows.map((r, i) => [
          t.name, r.h, ...(periods ? [future?.[i] ?? ""] : []), tb.method, tb.lambda === null ? "none" : tb.lambda, val(r.mean), val(r.median),
          ...lv.flatMap((l) => [val(r.intervals[String(l)][0]), val(r.intervals[String(l)][1])]),
          [i === 0 ? tb.notes.join(" ") : "", ...cellNotes(r)].filter(Boolean).join(" "),
        ]);
      },
      workbook: (fans) => ({
        formats: { lambda: "0.000" },
        cautions: [...data.notes, ...fans.flatMap((t) => (t.table ? [] : [`${t.name}: ${t.error}`]))],
        charts: () => fans.filter((t) => t.table).map((t) => seriesChart(data, t.j, t.table as FanTable)),
      }),
    }, inOrder(p, "fan", data, jobsFor(p, data.names.length), (j) => fanOne(p, data, j)), (t) => {
      if (t.table) ok++;
      else failed.push({ name: t.name, j: t.j, error: t.error });
    });
    for (const t of failed) seriesError(io, t.name, t.error);
    reportReading(io, p.has("json"), data);
    return exitCode(ok, failed.length);
  },
};
