// fanwise fan: per-step means, medians and intervals for each series.
import { FanTable, Maybe, fanTable, isEngineError } from "../../engine";
import { Command, COMMON } from "../command";
import { seriesError, writeOutput } from "../output";
import { atLines, errorMessage, fitAll, periodOf, readSeriesFile, reportReading } from "../series-input";

/** fan's own options, shared with the commands that draw or write a fan. */
export const FAN_OPTIONS = {
  horizon: COMMON.horizon,
  method: COMMON.method,
  lambda: COMMON.lambda,
  levels: { type: { kind: "text" as const }, value: "80,95", help: "interval levels in percent", example: "80,95", default: "80,95" },
  period: COMMON.period,
  mean: COMMON.mean,
  zeros: COMMON.zeros,
  delimiter: COMMON.delimiter,
  decimal: COMMON.decimal,
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

export const fanCommand: Command = {
  name: "fan",
  summary: "forecast each series: mean, median and intervals for every step ahead",
  args: "FILE",
  options: { ...FAN_OPTIONS, json: COMMON.json },
  examples: ["fanwise fan sales.csv --horizon 12 --period 12", "fanwise fan sales.csv --horizon 6 --method drift --lambda 0 --levels 50,80,95 --json"],
  run(p, io) {
    const H = p.int("horizon") as number;
    const mean = (p.choice("mean") ?? "taylor") as "taylor" | "exact";
    const levels = p.text("levels");
    const data = readSeriesFile(p);
    const { period, periodFrom } = periodOf(p, data);
    const label = (h: number): string => (data.next ? data.next(h) : "");
    const tables: { name: string; table?: FanTable; missing?: number; error?: string }[] = fitAll(p, data).map((x) => {
      if (!x.f) return { name: x.name, error: x.error as string };
      try {
        const table = fanTable(x.f, H, { levels, mean });
        return { name: x.name, table: { ...table, notes: table.notes.map((n) => atLines(n, data)) }, missing: x.f.missing };
      } catch (e) {
        if (isEngineError(e) && e.code === "input" && /horizon|level/.test(e.message)) throw e; // the same for every series
        return { name: x.name, error: errorMessage(e) };
      }
    });
    const lv = tables.find((t) => t.table)?.table?.levels ?? [80, 95];
    writeOutput(io, p.has("json"), {
      json: () => {
        const series: Record<string, unknown> = {};
        for (const t of tables) {
          if (!t.table) { series[t.name] = { error: t.error }; continue; }
          const tb = t.table;
          series[t.name] = {
            method: tb.method,
            lambda: tb.lambda,
            sigma: tb.sigma,
            missing: t.missing,
            meanMethod: tb.meanMethod,
            period,
            periodFrom,
            steps: tb.rows.map((r) => ({
              h: r.h,
              ...(data.next ? { period: label(r.h) } : {}),
              mean: val(r.mean),
              median: val(r.median),
              intervals: Object.fromEntries(Object.entries(r.intervals).map(([k, v]) => [k, [val(v[0]), val(v[1])]])),
              ...(cellNotes(r).length ? { notes: cellNotes(r) } : {}),
            })),
            notes: tb.notes,
          };
        }
        return { reading: data.reading, series };
      },
      header: ["series", "h", "period", "method", "lambda", "mean", "median", ...lv.flatMap((l) => [`low${l}`, `high${l}`]), "note"],
      rows: () => {
        const rows: unknown[][] = [];
        for (const t of tables) {
          if (!t.table) { rows.push([t.name, "", "", "", "", "", "", ...lv.flatMap(() => ["", ""]), t.error]); continue; }
          const tb = t.table;
          tb.rows.forEach((r, i) => rows.push([
            t.name, r.h, label(r.h), tb.method, tb.lambda === null ? "none" : tb.lambda, val(r.mean), val(r.median),
            ...lv.flatMap((l) => [val(r.intervals[String(l)][0]), val(r.intervals[String(l)][1])]),
            [i === 0 ? tb.notes.join(" ") : "", ...cellNotes(r)].filter(Boolean).join(" "),
          ]));
        }
        return rows;
      },
    });
    for (const t of tables) if (!t.table) seriesError(io, t.name, t.error);
    reportReading(io, p.has("json"), data);
    return 0;
  },
};
