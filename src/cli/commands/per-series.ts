// The per-series function of each command that works series by series, for the worker threads of
// --jobs (series-worker.ts): the same function the command runs serially.
import { ParsedArgs } from "../options";
import { SeriesData } from "../table";
import { backtestOne } from "./backtest";
import { fanOne } from "./fan";
import { lambdaOne } from "./lambda";
import { totalOne } from "./total";

/** A command's result for series j of `data`; `at` is the series' place in the whole file. */
export type PerSeries = (p: ParsedArgs, data: SeriesData, j: number, at: number) => unknown;

/** The per-series function of each command that spreads its series over worker threads. */
export const PER_SERIES: Record<string, PerSeries> = {
  fan: fanOne,
  lambda: lambdaOne,
  backtest: backtestOne,
  total: (p, data, j, at) => totalOne(p, data, j, at),
};
