// Reading the audit functions' arguments (actuals, interval ends for one or more levels, groups,
// horizons) into the engine's forecast-log input, and shaping its rows for a spill.
import { AuditLog, AuditLogInput, AuditRow, EngineError, RawCell } from "../engine";
import { describeValue, readMatrix } from "./coerce";

/** A single column (or a single row, read as a column). */
export function column(v: unknown, name: string): RawCell[] {
  const m = readMatrix(v, name);
  if (m.length > 1 && m[0].length > 1) throw new EngineError("input", `${name} must be a single column or a single row; it is ${m.length}×${m[0].length}.`);
  return m.length === 1 ? m[0] : m.map((r) => r[0]);
}

/** The columns of a range with `k` columns (k = 1: a single row also reads as one column). */
function columns(v: unknown, name: string, k: number): RawCell[][] {
  if (k === 1) return [column(v, name)];
  const m = readMatrix(v, name);
  if (m[0].length !== k) throw new EngineError("input", `${name} needs one column per level: ${k} levels were given, but ${name} has ${m[0].length} column${m[0].length === 1 ? "" : "s"}. Select the ${name} ends of every level side by side, in the order of the levels.`);
  return Array.from({ length: k }, (_, j) => m.map((r) => r[j]));
}

/** Levels in the order given: one number, a range of numbers, or text like "80,95". */
export function levelList(v: unknown): number[] {
  const fail = (what: string): never => { throw new EngineError("input", `level must be a percentage like 80, or several like "80,95" (one per pair of lower and upper columns); ${what}.`); };
  if (v === null || v === undefined || v === "") fail("it is blank");
  let items: unknown[];
  if (typeof v === "number") items = [v];
  else if (typeof v === "string") items = v.split(/[,;\s]+/).filter((s) => s !== "").map((s) => (Number.isFinite(Number(s)) ? Number(s) : s));
  else if (Array.isArray(v)) items = (v as unknown[][]).flat().filter((c) => c !== null && c !== "" && c !== undefined);
  else items = [v];
  if (items.length === 0) fail("it is blank");
  return items.map((c) => (typeof c === "number" && Number.isFinite(c) ? c : fail(`got ${describeValue(c)}`)));
}

/** The engine's input from the cell arguments of FW.COVERAGE / FW.INTERVALSCORE. */
export function auditInput(actuals: unknown, lower: unknown, upper: unknown, level: unknown, groups: unknown, horizons: unknown): AuditLogInput {
  const levels = levelList(level);
  const lo = columns(lower, "lower", levels.length);
  const hi = columns(upper, "upper", levels.length);
  const optionalColumn = (v: unknown, name: string): RawCell[] | null => (v === null || v === undefined || v === "" ? null : column(v, name));
  return {
    actual: column(actuals, "actuals"),
    intervals: levels.map((l, k) => ({ level: l, lower: lo[k], upper: hi[k] })),
    groups: optionalColumn(groups, "groups"),
    horizons: optionalColumn(horizons, "horizons"),
  };
}

/** The identifying cells of a row: group (with groups), step (with horizons), level (with several levels). */
export function rowKey(a: AuditLog, r: AuditRow): (string | number)[] {
  const key: (string | number)[] = [];
  if (a.groups.length) key.push(r.group);
  if (a.horizons.length) key.push(r.h as number);
  if (a.levels.length > 1) key.push(r.level);
  return key;
}
