// Access to the external reference values (scipy 1.10.1 / statsmodels 0.13.5 / mpmath 1.2.1,
// see test/fixtures/README.md) and the one place tolerances are applied.
import * as fs from "fs";
import * as path from "path";

const FIXTURES = path.join(__dirname, "..", "fixtures");

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;

let cache: Json | null = null;

/** The whole reference.json. */
export function reference(): Json {
  if (!cache) cache = JSON.parse(fs.readFileSync(path.join(FIXTURES, "reference.json"), "utf8"));
  return cache;
}

/** One check by id; throws if it is missing so a renamed fixture cannot silently skip a test. */
export function check(id: string): Json {
  const c = reference().checks.find((x: Json) => x.id === id);
  if (!c) throw new Error(`fixture check ${id} not found`);
  return c;
}

/** All checks whose id starts with a prefix. */
export function checks(prefix: string): Json[] {
  const list = reference().checks.filter((x: Json) => x.id.startsWith(prefix));
  if (list.length === 0) throw new Error(`no fixture checks start with ${prefix}`);
  return list;
}

/** A dataset's values (the `value` column), read from its CSV (comment line skipped). */
export function dataset(name: string): number[] {
  const text = fs.readFileSync(path.join(FIXTURES, "datasets", `${name}.csv`), "utf8");
  const lines = text.split(/\r?\n/).filter((l) => l && !l.startsWith("#"));
  const header = lines[0].split(",");
  const col = header.indexOf("value");
  return lines.slice(1).map((l) => Number(l.split(",")[col]));
}

/** Path of a dataset CSV (for CLI tests). */
export function datasetPath(name: string): string {
  return path.join(FIXTURES, "datasets", `${name}.csv`);
}

/** Parses the fixtures' float format ('nan', 'inf', '-inf' are strings). */
export function num(x: number | string): number {
  if (typeof x === "number") return x;
  if (x === "nan") return NaN;
  if (x === "inf") return Infinity;
  if (x === "-inf") return -Infinity;
  throw new Error(`not a fixture number: ${x}`);
}

/** |a − e| ≤ rtol·|e| (+ atol); a clear message naming the quantity on failure. */
export function expectClose(actual: number, expected: number, opts: { rtol?: number; atol?: number }, what = "value"): void {
  const rtol = opts.rtol ?? 0;
  const atol = opts.atol ?? 0;
  const ok = Number.isFinite(actual) && Math.abs(actual - expected) <= rtol * Math.abs(expected) + atol;
  if (!ok) {
    throw new Error(`${what}: got ${actual}, expected ${expected} (|Δ| = ${Math.abs(actual - expected)}, rtol ${rtol}, atol ${atol})`);
  }
}
