// Face options shared by the readers.
import { EngineError } from "../engine";
import type { DecimalMark } from "./numbers";

/**
 * Reads a `--decimal` value: `,` or `.` (also the words comma, point, dot). Throws an `input`
 * EngineError naming the values that work.
 * @example parseDecimalOption("comma") // ","
 */
export function parseDecimalOption(v: string, option = "--decimal"): DecimalMark {
  const t = v.trim().toLowerCase();
  if (t === "," || t === "comma") return ",";
  if (t === "." || t === "point" || t === "dot") return ".";
  throw new EngineError("input", `${option} must be , (decimal comma) or . (decimal point); got "${v}".`);
}
