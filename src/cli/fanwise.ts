// The `fanwise` command line: CSV in → CSV (default) or JSON out; errors to stderr, exit 1.
import * as fs from "fs";
import * as path from "path";
import { EngineError, RawCell, fitLambda, isEngineError, cleanSeries, screenSeries, LambdaMethod, fitForecast, fanTable, totalForecast, Forecaster, Maybe, auditCoverage, backtest } from "../engine";
import { buildDemoWorkbook, demoForecastLogCsv, demoMonthlyCsv } from "../demo/quillmere";
import { fanChartSvg } from "../taskpane/chart/fan-chart";
import { csvSeries, toCsv, CsvSeries } from "./csv";
import { readCsvFile } from "./csv-file";

const USAGE = `fanwise — Box-Cox forecasts with honest means, medians and intervals (CSV in, CSV or JSON out)

Usage:
  fanwise screen FILE [--period N] [--json]
  fanwise lambda FILE [--method guerrero|mle] [--period N] [--bounds -1,2] [--json]
  fanwise fan    FILE --horizon H [--method M] [--lambda L] [--levels 80,95] [--period N] [--mean taylor|exact] [--json]
  fanwise total  FILE --horizon H [--method M] [--lambda L] [--level 95] [--period N] [--seed S] [--paths P] [--json]
  fanwise audit    FILE --actual COL --lower COL --upper COL --level P [--json]
  fanwise backtest FILE --horizon H [--method M] [--lambda L] [--level 95] [--period N] [--first N] [--json]
  fanwise demo   [--out DIR]

Methods: mean, naive, seasonal-naive, drift, ses, holt, damped, seasonal-ses, holt-winters,
damped-holt-winters, auto (default: lowest AICc among the smoothing models).
Lambda: a number, auto (default), guerrero, mle, or none (no transform).

FILE is a CSV whose first row names the columns; lines starting with # are comments; a column of
labels (dates, periods) is skipped; every other column is a series; blank cells are gaps.
Forecasts are estimates from past patterns; check results before committing money, and follow
your organisation's forecasting and audit policies.
`;

/** Output streams, replaceable in tests. */
export interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
}

const defaultIo: Io = {
  out: (s) => void process.stdout.write(s),
  err: (s) => void process.stderr.write(s),
};

interface Parsed {
  positional: string[];
  flags: Map<string, string | true>;
}

function parseArgs(argv: string[], allowed: Record<string, "value" | "switch">): Parsed {
  const positional: string[] = [];
  const flags = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a.startsWith("--")) {
      const eq = a.indexOf("=");
      const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
      const kind = allowed[name];
      if (!kind) throw new EngineError("input", `Unknown option --${name}. Options here: ${Object.keys(allowed).map((k) => `--${k}`).join(", ") || "none"}.`);
      if (kind === "switch") {
        if (eq >= 0) throw new EngineError("input", `--${name} takes no value.`);
        flags.set(name, true);
      } else {
        const v = eq >= 0 ? a.slice(eq + 1) : argv[++i];
        if (v === undefined || (eq < 0 && v.startsWith("--"))) throw new EngineError("input", `--${name} needs a value.`);
        flags.set(name, v);
      }
    } else if (a.startsWith("-") && a !== "-" && !/^-\d/.test(a)) {
      throw new EngineError("input", `Unknown option ${a}. Options start with two dashes, e.g. --horizon 12.`);
    } else positional.push(a);
  }
  return { positional, flags };
}

function intFlag(p: Parsed, name: string, dflt: number, min: number): number {
  const v = p.flags.get(name);
  if (v === undefined) return dflt;
  const x = Number(v);
  if (typeof v !== "string" || v.trim() === "" || !Number.isInteger(x) || x < min) {
    throw new EngineError("input", `--${name} must be a whole number of at least ${min}; got "${String(v)}".`);
  }
  return x;
}

function fileArgument(p: Parsed, example: string): string {
  if (p.positional.length !== 1) throw new EngineError("input", p.positional.length === 0 ? `Give the CSV file to read, e.g. ${example}` : `Give exactly one CSV file; got ${p.positional.length} (${p.positional.slice(0, 3).join(", ")}).`);
  return p.positional[0];
}

function readSeriesFile(p: Parsed): CsvSeries {
  return csvSeries(readCsvFile(fileArgument(p, "fanwise screen sales.csv")));
}

/** Names a data row by its line in the file. */
function lineOf(data: CsvSeries): (i: number) => string {
  return (i) => `line ${data.line(i)}`;
}

/** Replaces "row N" (1-based data rows, as the engine names them) by the file's line. */
function atLines(message: string, data: CsvSeries): string {
  return message.replace(/row (\d+)/, (_m, r) => `line ${data.line(Number(r) - 1)}`);
}

function errorMessage(e: unknown): string {
  if (isEngineError(e)) return e.message;
  throw e;
}

function screenCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { period: "value", json: "switch" });
  const period = intFlag(p, "period", 1, 1);
  const data = readSeriesFile(p);
  const results = data.names.map((name, j) => screenSeries(data.column(j), { period, label: name, where: lineOf(data) }));
  if (p.flags.has("json")) {
    const series: Record<string, unknown> = {};
    results.forEach((r, j) => {
      series[data.names[j]] = {
        n: r.n, blanks: r.blanks, leadingBlanks: r.leadingBlanks, trailingBlanks: r.trailingBlanks, interiorGaps: r.interiorGaps,
        textCells: r.textCells, min: r.min, max: r.max, zeros: r.zeros, negatives: r.negatives, nonPositive: r.nonPositive,
        boxCoxUsable: r.boxCoxUsable, suggestedLambda: r.suggestedLambda, lambdaEstimate: r.lambda ? r.lambda.lambda : null,
        lambdaMethod: r.lambda ? r.lambda.method : null, fix: r.fix, shift: r.shift, message: r.message,
      };
    });
    io.out(JSON.stringify({ series }, null, 2) + "\n");
  } else {
    io.out(toCsv(
      ["series", "n", "blanks", "text_cells", "min", "nonpositive", "boxcox_usable", "suggested_lambda", "fix", "message"],
      results.map((r, j) => [data.names[j], r.n, r.blanks, r.textCells, r.min, r.nonPositive, r.boxCoxUsable ? "yes" : "no", r.suggestedLambda === null ? "" : round(r.suggestedLambda), r.fix, r.message]),
    ));
  }
  return 0;
}

function lambdaCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { method: "value", period: "value", bounds: "value", json: "switch" });
  const period = intFlag(p, "period", 1, 1);
  const methodFlag = p.flags.get("method");
  const method = (methodFlag === undefined ? "guerrero" : String(methodFlag).toLowerCase()) as LambdaMethod;
  if (method !== "guerrero" && method !== "mle") throw new EngineError("input", `--method must be guerrero or mle; got "${String(methodFlag)}".`);
  let lower: number | undefined;
  let upper: number | undefined;
  const b = p.flags.get("bounds");
  if (b !== undefined) {
    const parts = String(b).split(",").map((x) => x.trim());
    const nums = parts.map(Number);
    if (parts.length !== 2 || parts.some((x) => x === "") || nums.some((x) => !Number.isFinite(x))) {
      throw new EngineError("input", `--bounds must be two numbers separated by a comma, e.g. --bounds -1,2; got "${String(b)}".`);
    }
    [lower, upper] = nums;
  }
  const data = readSeriesFile(p);
  const results = data.names.map((_, j) => {
    try {
      const cells = data.column(j);
      const screen = screenSeries(cells, { period, label: data.names[j], where: lineOf(data) });
      if (!screen.boxCoxUsable) throw new EngineError("input", screen.message);
      const clean = cleanSeriesAtLines(cells, data, j);
      return { ok: true as const, r: fitLambda(clean.values, { method, period, lower, upper, label: data.names[j] }) };
    } catch (e) {
      return { ok: false as const, message: errorMessage(e) };
    }
  });
  if (p.flags.has("json")) {
    const series: Record<string, unknown> = {};
    results.forEach((x, j) => {
      series[data.names[j]] = x.ok
        ? { lambda: x.r.lambda, method: x.r.method, interval: x.r.interval, loglik: x.r.loglik, readable: x.r.readable, onBound: x.r.onBound, window: x.r.window, n: x.r.n, note: x.r.note }
        : { error: x.message };
    });
    io.out(JSON.stringify({ series }, null, 2) + "\n");
  } else {
    io.out(toCsv(
      ["series", "lambda", "method", "interval_low", "interval_high", "readable_lambda", "loglik", "on_bound", "note"],
      results.map((x, j) => x.ok
        ? [data.names[j], x.r.lambda, x.r.method, x.r.interval[0], x.r.interval[1], x.r.readable, x.r.loglik, x.r.onBound ?? "", x.r.note]
        : [data.names[j], "", method, "", "", "", "", "", x.message]),
    ));
  }
  for (const [j, x] of results.entries()) if (!x.ok) seriesError(io, data.names[j], x.message);
  return 0;
}

function numberFlag(p: Parsed, name: string): number | undefined {
  const v = p.flags.get(name);
  if (v === undefined) return undefined;
  const x = Number(v);
  if (typeof v !== "string" || v.trim() === "" || !Number.isFinite(x)) throw new EngineError("input", `--${name} must be a number; got "${String(v)}".`);
  return x;
}

function requireHorizon(p: Parsed): number {
  if (!p.flags.has("horizon")) throw new EngineError("input", "--horizon is required: how many periods ahead to forecast, e.g. --horizon 12.");
  return intFlag(p, "horizon", 1, 1);
}

/** Fits every series of the file; a series that cannot be fitted keeps its message. */
function fitAll(p: Parsed, data: CsvSeries): { name: string; f?: Forecaster; error?: string }[] {
  const period = intFlag(p, "period", 1, 1);
  const method = p.flags.get("method");
  const lambdaFlag = p.flags.get("lambda");
  return data.names.map((name, j) => {
    try {
      const cells = data.column(j);
      const lambda = lambdaFlag === undefined ? "auto" : String(lambdaFlag);
      if (lambda.toLowerCase() !== "none") {
        const screen = screenSeries(cells, { period, label: name, where: lineOf(data) });
        if (screen.nonPositive > 0) throw new EngineError("input", screen.message);
      }
      const f = fitForecast(cells, { method: method === undefined ? "auto" : String(method), lambda, period, label: name });
      return { name, f };
    } catch (e) {
      return { name, error: atLines(errorMessage(e), data) };
    }
  });
}

function val(m: Maybe): number | null {
  return m.value;
}

function fanCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { horizon: "value", method: "value", lambda: "value", levels: "value", period: "value", mean: "value", json: "switch" });
  const H = requireHorizon(p);
  const mean = String(p.flags.get("mean") ?? "taylor").toLowerCase();
  if (mean !== "taylor" && mean !== "exact") throw new EngineError("input", `--mean must be taylor or exact; got "${String(p.flags.get("mean"))}".`);
  const levels = p.flags.has("levels") ? String(p.flags.get("levels")) : undefined;
  const data = readSeriesFile(p);
  const fits = fitAll(p, data);
  const tables = fits.map((x) => {
    if (!x.f) return { name: x.name, error: x.error as string };
    try {
      return { name: x.name, table: fanTable(x.f, H, { levels, mean: mean as "taylor" | "exact" }), f: x.f };
    } catch (e) {
      if (isEngineError(e) && e.code === "input" && /horizon|level/.test(e.message)) throw e; // the same for every series
      return { name: x.name, error: errorMessage(e) };
    }
  });
  const levelList = tables.find((t) => "table" in t && t.table)?.["table" as never] as unknown as { levels: number[] } | undefined;
  if (p.flags.has("json")) {
    const series: Record<string, unknown> = {};
    for (const t of tables) {
      if (!("table" in t) || !t.table) { series[t.name] = { error: t.error }; continue; }
      const tb = t.table;
      series[t.name] = {
        method: tb.method,
        lambda: tb.lambda,
        sigma: tb.sigma,
        meanMethod: tb.meanMethod,
        steps: tb.rows.map((r) => ({
          h: r.h,
          mean: val(r.mean),
          median: val(r.median),
          intervals: Object.fromEntries(Object.entries(r.intervals).map(([k, v]) => [k, [val(v[0]), val(v[1])]])),
          ...(cellNotes(r).length ? { notes: cellNotes(r) } : {}),
        })),
        notes: tb.notes,
      };
    }
    io.out(JSON.stringify({ series }, null, 2) + "\n");
  } else {
    const lv = levelList ? levelList.levels : [80, 95];
    const header = ["series", "h", "method", "lambda", "mean", "median", ...lv.flatMap((l) => [`low${l}`, `high${l}`]), "note"];
    const rows: unknown[][] = [];
    for (const t of tables) {
      if (!("table" in t) || !t.table) { rows.push([t.name, "", "", "", "", "", ...lv.flatMap(() => ["", ""]), t.error]); continue; }
      const tb = t.table;
      tb.rows.forEach((r, i) => rows.push([
        t.name, r.h, tb.method, tb.lambda === null ? "none" : tb.lambda, val(r.mean), val(r.median),
        ...lv.flatMap((l) => [val(r.intervals[String(l)][0]), val(r.intervals[String(l)][1])]),
        [i === 0 ? tb.notes.join(" ") : "", ...cellNotes(r)].filter(Boolean).join(" "),
      ]));
    }
    io.out(toCsv(header, rows));
  }
  for (const t of tables) if (!("table" in t) || !t.table) seriesError(io, t.name, t.error);
  return 0;
}

function cellNotes(r: { mean: Maybe; median: Maybe; intervals: Record<string, [Maybe, Maybe]> }): string[] {
  const notes = [r.mean.note, r.median.note, ...Object.values(r.intervals).flatMap((v) => [v[0].note, v[1].note])].filter((x): x is string => !!x);
  return Array.from(new Set(notes));
}

function totalCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { horizon: "value", method: "value", lambda: "value", level: "value", period: "value", seed: "value", paths: "value", mean: "value", json: "switch" });
  const H = requireHorizon(p);
  const level = numberFlag(p, "level") ?? 95;
  const seed = p.flags.has("seed") ? intFlag(p, "seed", 1, 0) : 1;
  const paths = p.flags.has("paths") ? intFlag(p, "paths", 10000, 100) : 10000;
  const mean = String(p.flags.get("mean") ?? "taylor").toLowerCase();
  if (mean !== "taylor" && mean !== "exact") throw new EngineError("input", `--mean must be taylor or exact; got "${String(p.flags.get("mean"))}".`);
  const data = readSeriesFile(p);
  const results = fitAll(p, data).map((x) => {
    if (!x.f) return { name: x.name, error: x.error as string };
    try {
      return { name: x.name, method: x.f.method, lambda: x.f.lambda, t: totalForecast(x.f, H, { level, seed, paths, mean: mean as "taylor" | "exact" }) };
    } catch (e) {
      if (isEngineError(e) && e.code === "input" && /horizon|level|paths|seed/.test(e.message)) throw e;
      return { name: x.name, error: errorMessage(e) };
    }
  });
  if (p.flags.has("json")) {
    const series: Record<string, unknown> = {};
    for (const r of results) {
      if (!("t" in r) || !r.t) { series[r.name] = { error: r.error }; continue; }
      series[r.name] = {
        method: r.method, lambda: r.lambda, horizon: r.t.horizon,
        mean: r.t.mean.value, median: r.t.median, interval: r.t.interval, level: r.t.level,
        paths: r.t.paths, seed: r.t.seed, simulatedMean: r.t.simulatedMean, monteCarloError: r.t.monteCarloError,
        notes: [...(r.t.mean.note ? [r.t.mean.note] : []), ...r.t.notes],
      };
    }
    io.out(JSON.stringify({ series }, null, 2) + "\n");
  } else {
    io.out(toCsv(
      ["series", "horizon", "method", "lambda", "mean", "median", "low", "high", "level", "paths", "mc_std_error", "note"],
      results.map((r) => (!("t" in r) || !r.t)
        ? [r.name, H, "", "", "", "", "", "", level, "", "", r.error]
        : [r.name, H, r.method, r.lambda === null ? "none" : r.lambda, r.t.mean.value, r.t.median, r.t.interval[0], r.t.interval[1], r.t.level, r.t.paths, r.t.monteCarloError, [r.t.mean.note, ...r.t.notes].filter(Boolean).join(" ")]),
    ));
  }
  for (const r of results) if (!("t" in r) || !r.t) seriesError(io, r.name, r.error);
  return 0;
}

function auditCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { actual: "value", lower: "value", upper: "value", level: "value", json: "switch" });
  for (const k of ["actual", "lower", "upper", "level"]) if (!p.flags.has(k)) throw new EngineError("input", `--${k} is required (fanwise audit FILE --actual COL --lower COL --upper COL --level P).`);
  const level = numberFlag(p, "level") as number;
  const t = readCsvFile(fileArgument(p, "fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80"));
  const col = (flag: string) => {
    const name = String(p.flags.get(flag));
    const j = t.header.indexOf(name);
    if (j < 0) throw new EngineError("input", `No column named "${name}" (for --${flag}). Columns: ${t.header.join(", ")}.`);
    return t.cells(j);
  };
  const a = auditCoverage(col("actual"), col("lower"), col("upper"), level, 2);
  if (p.flags.has("json")) {
    io.out(JSON.stringify({
      n: a.n, misses: a.misses, coverage: a.coverage,
      kupiec: { lr: a.kupiec.lr, p: a.kupiec.p }, independence: { lr: a.independence.lr, p: a.independence.p }, conditional: { lr: a.conditional.lr, p: a.conditional.p },
      binomialTail: a.binomialTail, intervalScore: a.intervalScore,
      level, skipped: a.skipped, zone: a.zone, verdict: a.verdict,
    }, null, 2) + "\n");
  } else {
    io.out(toCsv(["n", "misses", "coverage", "nominal", "kupiec_lr", "kupiec_p", "independence_lr", "independence_p", "conditional_lr", "conditional_p", "binomial_tail", "interval_score", "zone", "verdict"],
      [[a.n, a.misses, a.coverage, a.nominal, a.kupiec.lr, a.kupiec.p, a.independence.lr, a.independence.p, a.conditional.lr, a.conditional.p, a.binomialTail, a.intervalScore, a.zone, a.verdict]]));
  }
  return 0;
}

function backtestCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { horizon: "value", method: "value", lambda: "value", level: "value", period: "value", first: "value", json: "switch" });
  const H = requireHorizon(p);
  const level = numberFlag(p, "level") ?? 95;
  const period = intFlag(p, "period", 1, 1);
  const first = p.flags.has("first") ? intFlag(p, "first", 2, 2) : undefined;
  const data = readSeriesFile(p);
  const results = data.names.map((_, j) => {
    try {
      return { name: data.names[j], b: backtest(data.column(j), H, { method: String(p.flags.get("method") ?? "auto"), lambda: String(p.flags.get("lambda") ?? "auto"), level, period, first, label: data.names[j] }) };
    } catch (e) {
      if (isEngineError(e) && /^horizon|must be a percentage|is in percent/.test(e.message)) throw e;
      return { name: data.names[j], error: errorMessage(e) };
    }
  });
  if (p.flags.has("json")) {
    const series: Record<string, unknown> = {};
    for (const r of results) series[r.name] = r.b ? { horizon: r.b.horizon, level: r.b.level, first: r.b.first, failures: r.b.failures, steps: r.b.rows } : { error: r.error };
    io.out(JSON.stringify({ series }, null, 2) + "\n");
  } else {
    const rows: unknown[][] = [];
    for (const r of results) {
      if (!r.b) { rows.push([r.name, "", "", "", "", "", "", r.error]); continue; }
      for (const s of r.b.rows) rows.push([r.name, s.h, s.origins, s.coverage, s.intervalScore, s.meanErrorOfMean, s.meanErrorOfMedian, s.h === 1 ? r.b.failureNote ?? "" : ""]);
    }
    io.out(toCsv(["series", "h", "origins", "coverage", "interval_score", "mean_error_of_mean", "mean_error_of_median", "note"], rows));
  }
  for (const r of results) if (!r.b) seriesError(io, r.name, r.error);
  return 0;
}

function demoCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { out: "value" });
  if (p.positional.length) throw new EngineError("input", `fanwise demo takes no file; got "${p.positional[0]}". Use --out DIR to choose where it writes.`);
  const dir = String(p.flags.get("out") ?? "fanwise-demo");
  const wb = buildDemoWorkbook();
  fs.mkdirSync(dir, { recursive: true });
  const monthly = path.join(dir, "quillmere-monthly.csv");
  const log = path.join(dir, "quillmere-forecast-log.csv");
  fs.writeFileSync(monthly, demoMonthlyCsv(wb));
  fs.writeFileSync(log, demoForecastLogCsv(wb));
  const lines: string[] = [wb.title, wb.notice, ""];
  lines.push("Series check (Box-Cox needs values > 0; suggested λ by Guerrero's method, windows of 12 months):");
  for (const c of wb.columns) {
    const r = screenSeries(c.values, { period: 12, label: c.name, where: (i) => wb.months[i] ?? `row ${i + 1}` });
    lines.push(`  ${c.name.padEnd(18)} n=${String(r.n).padStart(2)}  min=${String(r.min).padStart(6)}  ${r.boxCoxUsable ? "ready    " : "NOT READY"}  ${r.message}`);
  }
  // The main job: next year's budget per shop, the mean (which adds up) against the median.
  lines.push("");
  lines.push("Next 12 months (Jan–Dec 2026), method auto, λ auto, period 12 — totals by shop:");
  lines.push(`  ${"series".padEnd(18)} ${"method".padEnd(20)} ${"λ".padStart(6)} ${"mean total".padStart(11)} ${"Σ medians".padStart(11)} ${"gap".padStart(7)}  95% interval of the total`);
  let chart: string | null = null;
  for (const c of wb.columns) {
    try {
      const screen = screenSeries(c.values, { period: 12, label: c.name, where: (i) => wb.months[i] ?? `row ${i + 1}` });
      if (!screen.boxCoxUsable) {
        lines.push(`  ${c.name.padEnd(18)} skipped: ${screen.message}`);
        continue;
      }
      const f = fitForecast(c.values, { period: 12, label: c.name });
      const fan = fanTable(f, 12, { levels: [50, 80, 95] });
      const t = totalForecast(f, 12, { level: 95, seed: 1 });
      const sumMedian = fan.rows.reduce((s2, r) => s2 + (r.median.value ?? NaN), 0);
      const mean = t.mean.value;
      const gap = mean === null ? "" : `${(100 * (mean - sumMedian) / sumMedian).toFixed(1)}%`;
      lines.push(`  ${c.name.padEnd(18)} ${f.method.padEnd(20)} ${(f.lambda === null ? "none" : f.lambda.toFixed(2)).padStart(6)} ${money(mean).padStart(11)} ${money(sumMedian).padStart(11)} ${gap.padStart(7)}  ${money(t.interval[0])} to ${money(t.interval[1])}`);
      if (!chart) {
        const history = (c.values.filter((v) => v !== null) as number[]).slice(-36);
        const future = Array.from({ length: 12 }, (_, i) => `2026-${String(i + 1).padStart(2, "0")}`);
        chart = fanChartSvg({ title: `${c.name}: monthly revenue and 12-month fan (invented data)`, history, labels: [...wb.months.slice(-36), ...future], fan, width: 640, height: 320 });
      }
    } catch (e) {
      lines.push(`  ${c.name.padEnd(18)} ${errorMessage(e)}`);
    }
  }
  lines.push("  (mean total = sum of the monthly bias-adjusted means; Σ medians = what back-transformed point forecasts add up to.)");
  let miss80 = 0;
  let miss95 = 0;
  for (const r of wb.forecastLog) {
    if (r.actual < r.lower80 || r.actual > r.upper80) miss80++;
    if (r.actual < r.lower95 || r.actual > r.upper95) miss95++;
  }
  const n = wb.forecastLog.length;
  lines.push("");
  lines.push(`Forecast log: ${n} past one-month-ahead forecasts for Harbour Street; the 80% intervals missed ${miss80} times (${Math.round((100 * miss80) / n)}%), the 95% intervals ${miss95} times (${Math.round((100 * miss95) / n)}%).`);
  lines.push("");
  if (chart) {
    fs.writeFileSync(path.join(dir, "quillmere-fan.svg"), chart);
    lines.push(`Wrote ${path.join(dir, "quillmere-fan.svg")}`);
  }
  lines.push(`Wrote ${monthly}`);
  lines.push(`Wrote ${log}`);
  lines.push(`Next: fanwise fan ${monthly} --horizon 12 --period 12    (or screen, lambda, total, backtest)`);
  lines.push(`      fanwise audit ${log} --actual actual --lower lower80 --upper upper80 --level 80`);
  lines.push("");
  lines.push("Forecasts are estimates from past patterns; intervals assume the model holds. Check results before committing money, and follow your organisation's forecasting and audit policies.");
  const summary = lines.join("\n") + "\n";
  fs.writeFileSync(path.join(dir, "summary.txt"), summary);
  io.out(summary);
  return 0;
}

function cleanSeriesAtLines(cells: RawCell[], data: CsvSeries, j: number): ReturnType<typeof cleanSeries> {
  try {
    return cleanSeries(cells, data.names[j], 1);
  } catch (e) {
    // cleanSeries names rows from 1; say which line of the file instead.
    if (isEngineError(e)) throw new EngineError(e.code, atLines(e.message, data));
    throw e;
  }
}

function money(x: number | null): string {
  return x === null || !Number.isFinite(x) ? "n/a" : Math.round(x).toLocaleString("en-GB");
}

function round(x: number): number {
  return Number(x.toPrecision(6));
}

/**
 * Runs the command line with the given arguments; resolves to the exit code (0 ok, 1 error).
 * Every expected problem becomes a one-line message on stderr, never a stack trace.
 * @example await main(["lambda", "sales.csv", "--json"]) // 0, JSON on stdout
 */
export async function main(argv: string[], io: Io = defaultIo): Promise<number> {
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case "screen": return screenCommand(rest, io);
      case "lambda": return lambdaCommand(rest, io);
      case "demo": return demoCommand(rest, io);
      case "fan": return fanCommand(rest, io);
      case "total": return totalCommand(rest, io);
      case "audit": return auditCommand(rest, io);
      case "backtest": return backtestCommand(rest, io);
      case undefined:
      case "help":
      case "--help":
      case "-h":
        io.out(USAGE);
        return command === undefined ? 1 : 0;
      default:
        io.err(`fanwise: unknown command "${oneLine(command)}". Commands: screen, lambda, fan, total, audit, backtest, demo (fanwise help for more).\n`);
        return 1;
    }
  } catch (e) {
    if (isEngineError(e)) {
      io.err(`fanwise: ${oneLine(e.message)}\n`);
      return 1;
    }
    io.err(`fanwise: unexpected problem: ${oneLine(e instanceof Error ? e.message : String(e))}. Please report it.\n`);
    return 1;
  }
}

/** A series that could not be used: its message on stderr, on one line, as "fanwise: name: …". */
function seriesError(io: Io, name: string, message: string | undefined): void {
  io.err(`fanwise: ${oneLine(`${name}: ${message ?? ""}`)}\n`);
}

/** A message on one line (a quoted CSV field may carry line breaks into it). */
function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, " ");
}
