// Help text, generated from the commands' declarations (their options, summaries and examples).
import { Command } from "./command";
import { optionUsage } from "./options";

const METHODS = `Methods: mean, naive, seasonal-naive, drift, ses, holt, damped, seasonal-ses, holt-winters,
damped-holt-winters, auto (default: lowest AICc among the smoothing models), arima (automatic
seasonal ARIMA) or an ARIMA order: arima:p,d,q or arima:p,d,q/P,D,Q, +c for a constant (arima:0,1,0+c
is the random walk with drift).
Lambda: a number, auto (default), guerrero, mle, or none (no transform).`;

const FILES = `FILE is a CSV whose first row names the columns (comma, semicolon or tab, detected; a sep= first
line is honoured; lines starting with # are comments), or an .xlsx workbook (--sheet NAME, --range
B2:H74; numbers and dates as the workbook stores them, formulas by their saved results). The column
of dates or periods (2024-01, 31.01.2024, 01/31/2024, Jan-24, 2024 Q1, years, serial dates under a
date header) sets the time order, the period (monthly 12, quarterly 4, yearly 1, weekly 52, daily 7)
and the labels of the forecast; a skipped period is a blank (missing) at its place; a Total row is
left out (with a note). Every other column of numbers is a series, its number format (1,234.5 /
1.234,5 / 1'234.5, currency, percent, (1,850), 1.850-) decided from the whole column; blank cells
are missing observations. --json adds a "reading" object.`;

const EXIT = `Exit codes: 0 every series computed; 1 nothing computed, or a usage or file error; 3 some series
failed (their messages are in the output and on stderr).`;

/**
 * The package's version (package.json beside build/ and src/).
 * @example version() // "0.1.0"
 */
export function version(): string {
  try {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    return String(require("../../package.json").version);
  } catch {
    return "(version unknown)";
  }
}

const CAUTION = `Forecasts are estimates from past patterns; check results before committing money, and follow
your organisation's forecasting and audit policies.`;

/**
 * A command's usage line, e.g. "fanwise fan FILE --horizon H [--method M] …".
 * @example usageLine(screenCommand) // "fanwise screen FILE [--period N] [--json]"
 */
export function usageLine(c: Command, pad = 0): string {
  return ["fanwise", c.name.padEnd(pad), c.args, ...Object.entries(c.options).map(([n, s]) => optionUsage(n, s))].filter(Boolean).join(" ");
}

/**
 * The overview printed by `fanwise help` (and by `fanwise` alone).
 * @example generalHelp(COMMANDS).startsWith("fanwise —") // true
 */
export function generalHelp(commands: readonly Command[]): string {
  const pad = Math.max(...commands.map((c) => c.name.length));
  return `fanwise — Box-Cox forecasts with honest means, medians and intervals (CSV or .xlsx in; CSV, JSON or .xlsx out)

Usage:
${commands.map((c) => `  ${usageLine(c, pad)}`).join("\n")}
  fanwise help COMMAND     (or fanwise COMMAND --help): one command's options and examples
  fanwise --version

${METHODS}

${FILES}

${EXIT}

${CAUTION}
`;
}

/**
 * The help of one command: usage, its options (from its declaration), details and examples.
 * @example commandHelp(fanCommand).includes("--horizon H") // true
 */
export function commandHelp(c: Command): string {
  const opts = Object.entries(c.options);
  const width = Math.max(0, ...opts.map(([n, s]) => (s.type.kind === "switch" ? `--${n}` : `--${n} ${s.value ?? "VALUE"}`).length));
  const optionLines = opts.map(([n, s]) => {
    const flag = s.type.kind === "switch" ? `--${n}` : `--${n} ${s.value ?? "VALUE"}`;
    const extra = s.required ? " (required)" : s.default !== undefined ? ` (default ${s.default})` : "";
    return `  ${flag.padEnd(width)}  ${s.help}${extra}`;
  });
  const parts = [`fanwise ${c.name} — ${c.summary}`, "", `Usage: ${usageLine(c)}`];
  if (optionLines.length) parts.push("", "Options:", ...optionLines, `  ${"--help".padEnd(width)}  this help`);
  if (c.details?.length) parts.push("", ...c.details);
  if (c.args.includes("FILE")) parts.push("", FILES);
  if (Object.prototype.hasOwnProperty.call(c.options, "method")) parts.push("", METHODS);
  if (Object.prototype.hasOwnProperty.call(c.options, "series")) parts.push("", EXIT);
  parts.push("", "Examples:", ...c.examples.map((e) => `  ${e}`), "", CAUTION);
  return parts.join("\n") + "\n";
}
