// The `fanwise` command line: CSV in → CSV (default) or JSON out; errors to stderr, exit 1.
import * as fs from "fs";
import * as path from "path";
import { EngineError, fitLambda, isEngineError, cleanSeries, screenSeries, LambdaMethod } from "../engine";
import { buildDemoWorkbook, demoForecastLogCsv, demoMonthlyCsv } from "../demo/quillmere";
import { csvSeries, parseCsv, toCsv, CsvSeries } from "./csv";

const USAGE = `fanwise — Box-Cox checks and λ choice for positive business series (CSV in, CSV or JSON out)

Usage:
  fanwise screen FILE [--period N] [--json]
  fanwise lambda FILE [--method guerrero|mle] [--period N] [--bounds -1,2] [--json]
  fanwise demo   [--out DIR]

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

function readSeriesFile(p: Parsed): CsvSeries {
  if (p.positional.length !== 1) throw new EngineError("input", p.positional.length === 0 ? "Give the CSV file to read, e.g. fanwise screen sales.csv" : `Give exactly one CSV file; got ${p.positional.length}.`);
  const file = p.positional[0];
  let text: string;
  try {
    text = fs.readFileSync(file, "utf8");
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new EngineError("input", code === "ENOENT" ? `File not found: ${file}` : code === "EISDIR" ? `${file} is a folder, not a CSV file.` : `Cannot read ${file} (${code ?? "error"}).`);
  }
  return csvSeries(parseCsv(text));
}

/** Names a data row by its line in the file. */
function lineOf(data: CsvSeries): (i: number) => string {
  return (i) => `line ${data.lines[i] ?? i + 2}`;
}

function errorMessage(e: unknown): string {
  if (isEngineError(e)) return e.message;
  throw e;
}

function screenCommand(argv: string[], io: Io): number {
  const p = parseArgs(argv, { period: "value", json: "switch" });
  const period = intFlag(p, "period", 1, 1);
  const data = readSeriesFile(p);
  const results = data.series.map((cells, j) => screenSeries(cells, { period, label: data.names[j], where: lineOf(data) }));
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
  const results = data.series.map((cells, j) => {
    try {
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
  for (const [j, x] of results.entries()) if (!x.ok) io.err(`fanwise: ${data.names[j]}: ${x.message}\n`);
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
    const r = screenSeries(c.values, { period: 12, label: c.name });
    lines.push(`  ${c.name.padEnd(18)} n=${String(r.n).padStart(2)}  min=${String(r.min).padStart(6)}  ${r.boxCoxUsable ? "ready    " : "NOT READY"}  ${r.message}`);
  }
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
  lines.push(`Wrote ${monthly}`);
  lines.push(`Wrote ${log}`);
  lines.push(`Next: fanwise screen ${monthly} --period 12    or    fanwise lambda ${monthly} --period 12`);
  lines.push("");
  lines.push("Forecasts are estimates from past patterns; intervals assume the model holds. Check results before committing money, and follow your organisation's forecasting and audit policies.");
  const summary = lines.join("\n") + "\n";
  fs.writeFileSync(path.join(dir, "summary.txt"), summary);
  io.out(summary);
  return 0;
}

function cleanSeriesAtLines(cells: CsvSeries["series"][number], data: CsvSeries, j: number): ReturnType<typeof cleanSeries> {
  try {
    return cleanSeries(cells, data.names[j], 1);
  } catch (e) {
    // cleanSeries names rows from 1; say which line of the file instead.
    if (isEngineError(e)) throw new EngineError(e.code, e.message.replace(/row (\d+)/, (_m, r) => `line ${data.lines[Number(r) - 1] ?? r}`));
    throw e;
  }
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
      case undefined:
      case "help":
      case "--help":
      case "-h":
        io.out(USAGE);
        return command === undefined ? 1 : 0;
      default:
        io.err(`fanwise: unknown command "${command}". Commands: screen, lambda, demo (fanwise help for more).\n`);
        return 1;
    }
  } catch (e) {
    if (isEngineError(e)) {
      io.err(`fanwise: ${e.message}\n`);
      return 1;
    }
    io.err(`fanwise: unexpected problem: ${e instanceof Error ? e.message : String(e)}. Please report it.\n`);
    return 1;
  }
}
