// Hostile arguments for the cell functions, as fast-check arbitraries, and the one rule every
// outcome must obey. Used by the fuzz tests in test/functions/fuzz-*.test.ts.
//
// What Excel can hand a custom function: numbers, text, booleans, empty cells (null or ""), error
// values, 2-D arrays for ranges. We add what it should not (NaN, ±Infinity, undefined, ragged or
// empty arrays, objects) so the guard itself is tested too.
import fc from "fast-check";
import { ShimError } from "./custom-functions-shim";

/** The error codes a Fanwise cell may show. */
const CODES = new Set(["#VALUE!", "#NUM!", "#N/A"]);

/** Runs per function: 10,000, or FANWISE_FUZZ_RUNS for a quick local run; never fewer than 10,000 in CI. */
export const FUZZ_RUNS = Math.max(Number(process.env.FANWISE_FUZZ_RUNS ?? 10000) || 10000, process.env.CI ? 10000 : 1);
/** The base seed; each function adds its own offset so a failure names one reproducible case. */
export const FUZZ_SEED = Number(process.env.FANWISE_FUZZ_SEED ?? 20261202);

const edgeNumbers = fc.constantFrom(0, -0, 5e-324, -5e-324, 2.2250738585072014e-308, 1e-300, 1e-12, 1, -1, 0.5, 2, 100, 1e15, 1e300, 1e308, -1e308, Number.MAX_VALUE, -Number.MAX_VALUE, Number.MAX_SAFE_INTEGER);
const businessNumbers = fc.double({ min: 0.01, max: 1e6, noNaN: true });
/** Any finite number, with the edges (±0, subnormals, 1e308) over-represented. */
export const anyNumber = fc.oneof(
  { weight: 3, arbitrary: edgeNumbers },
  { weight: 3, arbitrary: businessNumbers },
  { weight: 2, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
  { weight: 2, arbitrary: fc.integer({ min: -5, max: 120 }) },
);
const notFinite = fc.constantFrom(NaN, Infinity, -Infinity);
const blank = fc.constantFrom<unknown>(null, "", undefined);
const text = fc.oneof(
  fc.constantFrom("abc", "12", " 3 ", "1e3", "#N/A", "NaN", "Infinity", "-", "auto", "none", "mle", "80,95", "0.5", "naive", "TRUE", "   ", "12,500", "\u0000", "€"),
  fc.string({ maxLength: 6 }),
);
const errorValue = fc.oneof(
  fc.constantFrom("#N/A", "#DIV/0!", "#VALUE!", "#REF!", "#NUM!", "#NAME?", "#NULL!").map((c) => new ShimError(c, "")),
  fc.constant({ code: "#DIV/0!" }),
);

/** One cell: mostly numbers, then blanks, text, booleans, error values, rarely NaN/±Infinity or an object. */
export const anyCell: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 10, arbitrary: anyNumber },
  { weight: 3, arbitrary: blank },
  { weight: 2, arbitrary: text },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: errorValue },
  { weight: 1, arbitrary: notFinite },
  { weight: 1, arbitrary: fc.constantFrom<unknown>({}, [], Symbol.for("x")) },
);

/** A rectangular range of random cells (1–6 rows × 1–3 columns). */
const randomRange = fc.integer({ min: 1, max: 3 }).chain((w) => fc.array(fc.array(anyCell, { minLength: w, maxLength: w }), { minLength: 1, maxLength: 6 }));
/** A ragged or empty "range". */
const raggedRange = fc.oneof(
  fc.array(fc.array(anyCell, { maxLength: 4 }), { maxLength: 5 }),
  fc.constantFrom<unknown>([], [[]], [[], []], [null], "not a range", 42, null, undefined, {}),
);

/**
 * A plausible business series (positive, with level, trend and a seasonal swing) of 0–36 rows and
 * 1–3 columns, sometimes under a header row, then lightly corrupted: a cell now and then becomes
 * hostile. This reaches the deep paths (λ, fitting, simulation) that random cells rarely do.
 */
const plausibleSeries = (maxWidth: number) => fc.record({
  n: fc.integer({ min: 0, max: 36 }),
  w: fc.integer({ min: 1, max: maxWidth }),
  level: fc.oneof(fc.double({ min: 1, max: 1e5, noNaN: true }), fc.constantFrom(1e-300, 1e300, 0.001)),
  trend: fc.double({ min: -0.05, max: 0.05, noNaN: true }),
  season: fc.double({ min: 0, max: 0.5, noNaN: true }),
  noise: fc.double({ min: 0.001, max: 0.3, noNaN: true }),
  header: fc.boolean(),
  seed: fc.integer({ min: 1, max: 1e6 }),
  corrupt: fc.array(fc.tuple(fc.nat(), fc.nat(), anyCell), { maxLength: 2 }),
}).map((p) => {
  let s = p.seed;
  const rnd = (): number => ((s = (s * 16807) % 2147483647) / 2147483647);
  const rows: unknown[][] = [];
  for (let i = 0; i < p.n; i++) {
    rows.push(Array.from({ length: p.w }, (_, j) => {
      const v = p.level * (1 + j) * Math.exp(p.trend * i) * (1 + p.season * Math.sin((2 * Math.PI * i) / 12)) * (1 + p.noise * (rnd() - 0.5));
      return Number.isFinite(v) ? v : 1;
    }));
  }
  for (const [r, c, v] of p.corrupt) if (rows.length) rows[r % rows.length][c % p.w] = v;
  if (p.header) rows.unshift(Array.from({ length: p.w }, (_, j) => `Shop ${j + 1}`));
  return rows.length ? rows : [[null]];
});

/** A "values" argument: often a plausible series, otherwise random, ragged or not a range at all. */
export const anyRange: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 7, arbitrary: plausibleSeries(3) },
  { weight: 3, arbitrary: randomRange },
  { weight: 1, arbitrary: raggedRange },
  { weight: 1, arbitrary: anyCell },
);

/**
 * Like anyRange, with plausible series drawn less often (about one call in six): for functions whose
 * every plausible series costs dozens of model fits (λ chosen with the form, METHODS §7), so 10,000
 * calls stay within CI's budget while the deep path is still reached well over a thousand times.
 */
export const costlyRange: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 2, arbitrary: plausibleSeries(3) },
  { weight: 6, arbitrary: randomRange },
  { weight: 2, arbitrary: raggedRange },
  { weight: 2, arbitrary: anyCell },
);

/**
 * Like anyRange, with plausible series a little less often (three in eight): for the forecasting
 * functions, whose every plausible series is a model fitted with λ chosen alongside it, so 10,000
 * calls stay within CI's budget with well over 500 of them reaching the forecast.
 */
export const modelRange: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: plausibleSeries(3) },
  { weight: 3, arbitrary: randomRange },
  { weight: 1, arbitrary: raggedRange },
  { weight: 1, arbitrary: anyCell },
);

/** Like costlyRange, with single-column plausible series (for costly functions that take one series). */
export const costlyColumn: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 5, arbitrary: plausibleSeries(1) },
  { weight: 6, arbitrary: randomRange },
  { weight: 2, arbitrary: raggedRange },
  { weight: 2, arbitrary: anyCell },
);

/** Like anyRange, but its plausible series are single columns (for functions that take one series). */
export const anyColumn: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 7, arbitrary: plausibleSeries(1) },
  { weight: 2, arbitrary: randomRange },
  { weight: 1, arbitrary: raggedRange },
);

/** An optional argument: omitted (null), a good value, or something hostile. */
export function optional(good: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 12, arbitrary: fc.constant(null) },
    { weight: 28, arbitrary: good },
    { weight: 2, arbitrary: anyCell },
    { weight: 1, arbitrary: randomRange },
  );
}

/** A required scalar argument: a good value or something hostile. */
export function required(good: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> {
  return fc.oneof({ weight: 20, arbitrary: good }, { weight: 1, arbitrary: anyCell }, { weight: 1, arbitrary: randomRange });
}

export const goodLambda = fc.oneof(fc.double({ min: -6, max: 6, noNaN: true }), fc.constantFrom(0, 0.5, 1, -1, -5, 5));
export const lambdaKeyword = fc.oneof(goodLambda, fc.constantFrom("auto", "guerrero", "mle", "none", "AUTO", " None ", "1/2", "log"));
/**
 * λ for functions that refit many times per call (a backtest refits at every origin, a total across
 * series fits every column): mostly a number, sometimes a keyword or blank (then "auto", which fits
 * every readable λ with the form), sometimes hostile — so 10,000 calls stay within CI's budget.
 */
export const lambdaMostlyNumber: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(0, 0.5, 1, -0.5, 0.33) },
  { weight: 1, arbitrary: fc.constant(null) },
  { weight: 1, arbitrary: lambdaKeyword },
  { weight: 1, arbitrary: anyCell },
);
export const goodLevel = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(50, 80, 90, 95, 99) },
  { weight: 2, arbitrary: fc.double({ min: 1, max: 99.999, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(0, 100, -5, 150, 0.8, 99.99999, 1e-9) },
);
export const goodProb = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(0.1, 0.5, 0.9, 0.025, 0.975) },
  { weight: 2, arbitrary: fc.double({ min: 1e-9, max: 1 - 1e-9, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(0, 1, 1e-12, 1 - 1e-12, -0.5, 50) },
);
export const goodPeriod = fc.oneof({ weight: 5, arbitrary: fc.constantFrom(1, 2, 4, 12) }, { weight: 1, arbitrary: fc.constantFrom(0, -3, 2.5, 13, 1e9) });
export const goodHorizon = fc.oneof(
  { weight: 6, arbitrary: fc.integer({ min: 1, max: 24 }) },
  { weight: 1, arbitrary: fc.constantFrom(0, -1, 1.5, 400, 1e6, 1e9, 1e308, 5e-324) },
);
export const goodLevels = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom<unknown>("80,95", "50, 80 ,95", "95", [[80, 95]], [[80], [95]], [[50, 80, 95]], 90) },
  { weight: 2, arbitrary: fc.array(goodLevel, { minLength: 1, maxLength: 3 }).map((r) => [r]) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>("80;95", "0,100", "abc", [[80, "x"]], [[120]], "80,,95", [[]], "") },
);

/** Throws (with what was wrong) unless v is a cell a function may return. */
function checkCell(v: unknown, where: string, echo: string[]): void {
  if (typeof v === "number") {
    if (!Number.isFinite(v)) throw new Error(`${where}: not a finite number (${v})`);
    return;
  }
  if (typeof v === "string" || typeof v === "boolean") return;
  if (v instanceof ShimError) {
    checkError(v, where, echo);
    return;
  }
  throw new Error(`${where}: a cell may not be ${v === null ? "null" : typeof v} (${String(v)})`);
}

function checkError(e: ShimError, where: string, echo: string[]): void {
  if (!CODES.has(e.code)) throw new Error(`${where}: unexpected error code ${e.code}`);
  if (typeof e.message !== "string" || e.message.trim() === "") throw new Error(`${where}: ${e.code} without a message`);
  // Excel shows the message only with #VALUE! and #N/A ("Handle and return errors from your custom
  // function"); a Fanwise #NUM! is bare in Excel, so it may only mean the one documented cause, an
  // overflow (README, How Fanwise reads cells; src/functions/excel-errors.ts).
  if (e.code === "#NUM!" && !/too large to represent|\boverflows on\b|not a finite number/.test(e.message)) throw new Error(`${where}: #NUM! (shown without its message) for something other than an overflow: ${e.message}`);
  // The user's own text echoed back (a header named "NaN", got the text "undefined") is not a leak.
  let own = e.message.replace(/"[^"]*"/g, '""');
  for (const t of echo) if (t.trim()) own = own.split(t.trim()).join("");
  if (/\bNaN\b|undefined|\[object /.test(own)) throw new Error(`${where}: message leaks internals: ${e.message}`);
  // The catch-all in excel-errors.ts: an exception the code did not expect (a bug), not a message.
  if (/Please report it/.test(e.message)) throw new Error(`${where}: an unexpected exception reached the cell: ${e.message}`);
}

/**
 * The rule for every call: either it threw a CustomFunctions.Error with a message, or it returned a
 * finite number, or a non-empty rectangular 2-D array whose cells are finite numbers, text,
 * booleans or CustomFunctions.Errors with messages. Anything else is a failure.
 */
export function checkOutcome(outcome: { threw: boolean; value: unknown }, args: unknown = []): void {
  const v = outcome.value;
  const echo = textsIn(args);
  if (outcome.threw) {
    if (!(v instanceof ShimError)) throw new Error(`an uncaught ${v instanceof Error ? `${v.name}: ${v.message}\n${v.stack}` : String(v)} escaped`);
    checkError(v, "thrown", echo);
    return;
  }
  if (!Array.isArray(v)) {
    checkCell(v, "result", echo);
    return;
  }
  if (v.length === 0) throw new Error("an empty result array");
  const width = Array.isArray(v[0]) ? v[0].length : -1;
  if (width <= 0) throw new Error("a result that is not a 2-D array");
  v.forEach((row, i) => {
    if (!Array.isArray(row) || row.length !== width) throw new Error(`result row ${i + 1} is ragged (${Array.isArray(row) ? row.length : typeof row} vs ${width})`);
    row.forEach((c, j) => checkCell(c, `result[${i}][${j}]`, echo));
  });
}

function textsIn(x: unknown): string[] {
  if (typeof x === "string") return [x];
  if (Array.isArray(x)) return x.flatMap(textsIn);
  return [];
}

/** Calls f and records whether it threw (sync or async) and what came back. */
export async function outcomeOf(f: () => unknown): Promise<{ threw: boolean; value: unknown }> {
  try {
    return { threw: false, value: await f() };
  } catch (e) {
    return { threw: true, value: e };
  }
}

/**
 * Three ranges of the same shape, as a published forecast gives them: median, lower and upper ends
 * of an interval (lower < median < upper, sometimes skewed, sometimes out of order), 1–4 cells,
 * lightly corrupted, or now and then three unrelated hostile ranges.
 */
export const intervalTriple: fc.Arbitrary<[unknown, unknown, unknown]> = fc.oneof(
  { weight: 8, arbitrary: fc.record({
    rows: fc.array(fc.tuple(fc.oneof(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), fc.constantFrom(1e-300, 1e300, 5e-324)), fc.double({ min: 0.01, max: 0.95, noNaN: true }), fc.double({ min: 0.01, max: 5, noNaN: true })), { minLength: 1, maxLength: 4 }),
    corrupt: fc.array(fc.tuple(fc.nat(), fc.nat({ max: 2 }), anyCell), { maxLength: 1 }),
  }).map(({ rows, corrupt }) => {
    const cols: unknown[][][] = [rows.map(([m]) => [m]), rows.map(([m, a]) => [m * (1 - a)]), rows.map(([m, , b]) => [m * (1 + b)])];
    for (const [r, c, v] of corrupt) cols[c][r % rows.length][0] = v;
    return cols as [unknown, unknown, unknown];
  }) },
  { weight: 1, arbitrary: fc.tuple(anyRange, anyRange, anyRange) },
);

/** Builds a plausible audit log (actual inside or outside [lower, upper]) of 0–40 rows, lightly corrupted. */
export const auditColumns = fc.record({
  n: fc.integer({ min: 0, max: 40 }),
  seed: fc.integer({ min: 1, max: 1e6 }),
  width: fc.double({ min: 0, max: 0.5, noNaN: true }),
  row: fc.boolean(),
  corrupt: fc.array(fc.tuple(fc.nat(), fc.nat({ max: 2 }), anyCell), { maxLength: 2 }),
}).map((p) => {
  let s = p.seed;
  const rnd = (): number => ((s = (s * 16807) % 2147483647) / 2147483647);
  const cols: unknown[][] = [[], [], []];
  for (let i = 0; i < p.n; i++) {
    const m = 100 * (1 + rnd());
    cols[0].push(m * (1 + (rnd() - 0.5)));
    cols[1].push(m * (1 - p.width));
    cols[2].push(m * (1 + p.width));
  }
  for (const [r, c, v] of p.corrupt) if (p.n) cols[c][r % p.n] = v;
  const shape = (c: unknown[]): unknown[][] => (c.length === 0 ? [[null]] : p.row ? [c] : c.map((v) => [v]));
  return cols.map(shape) as [unknown[][], unknown[][], unknown[][]];
});

/** How the calls of one fuzz run ended. */
export interface FuzzTally { runs: number; thrown: number; numbers: number; reasons: Map<string, number> }

/** A computed number in the result: in a table, outside its first column (FW.FAN's step numbers). */
function hasNumber(v: unknown): boolean {
  if (typeof v === "number") return true;
  if (!Array.isArray(v)) return false;
  return v.some((row) => Array.isArray(row) && row.some((c, j) => typeof c === "number" && (j > 0 || row.length === 1)));
}

/**
 * Asserts the outcome rule over FUZZ_RUNS seeded calls of `call` with arguments from `args`, and
 * returns the tally (how many calls threw, how many returned at least one number). A failure
 * prints fast-check's seed and path, so `FANWISE_FUZZ_SEED` reproduces it.
 */
export async function fuzz<T>(args: fc.Arbitrary<T>, call: (a: T) => unknown, seedOffset: number): Promise<FuzzTally> {
  const tally: FuzzTally = { runs: 0, thrown: 0, numbers: 0, reasons: new Map() };
  await fc.assert(
    fc.asyncProperty(args, async (a) => {
      const o = await outcomeOf(() => call(a));
      checkOutcome(o, a);
      tally.runs++;
      if (o.threw) {
        tally.thrown++;
        const k = (o.value as Error).message.replace(/-?[\d.]+(e[-+]?\d+)?/g, "#").slice(0, 80);
        tally.reasons.set(k, (tally.reasons.get(k) ?? 0) + 1);
      }
      else if (hasNumber(o.value)) tally.numbers++;
      else if (Array.isArray(o.value)) {
        const e = (o.value as unknown[][]).flat().find((c) => c instanceof ShimError) as ShimError | undefined;
        if (e) {
          const k = `(in cells) ${e.message.replace(/-?[\d.]+(e[-+]?\d+)?/g, "#").slice(0, 80)}`;
          tally.reasons.set(k, (tally.reasons.get(k) ?? 0) + 1);
        }
      }
    }),
    { numRuns: FUZZ_RUNS, seed: FUZZ_SEED + seedOffset, endOnFailure: true },
  );
  return tally;
}

/**
 * A runner for one test file: `run(name, args, f, offset, minShare)` fuzzes f and also requires
 * that at least minShare (default 5%) of its calls returned computed numbers, so a generator that
 * only makes junk (and so never reaches the computing paths) fails instead of passing quietly. The
 * tallies are printed after the file.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function fuzzRunner(): (name: string, args: fc.Arbitrary<unknown[]>, f: (...a: any[]) => unknown, seedOffset: number, minShare?: number) => Promise<void> {
  const tallies: Record<string, FuzzTally> = {};
  afterAll(() => {
    console.log(Object.entries(tallies).map(([k, t]) => `${k}: ${t.runs} calls, ${t.thrown} refused whole, ${t.numbers} returned numbers`
      + (process.env.FANWISE_FUZZ_VERBOSE ? `\n  ${[...t.reasons].sort((a, b) => b[1] - a[1]).slice(0, Number(process.env.FANWISE_FUZZ_VERBOSE) || 8).map(([r, c]) => `${c} × ${r}`).join("\n  ")}` : "")).join("\n"));
  });
  return async (name, args, f, seedOffset, minShare = 0.05) => {
    const t = await fuzz(args, (a) => f(...a), seedOffset);
    tallies[name] = t;
    expect(t.numbers).toBeGreaterThanOrEqual(minShare * t.runs);
  };
}

/** Per-test time limit for a fuzz test: a guard against a hang, not a speed target. */
export const FUZZ_TIMEOUT = 20 * 60 * 1000;
