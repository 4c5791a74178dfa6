// EngineError → CustomFunctions.Error. The only place that decides which Excel error a problem shows.
import { isEngineError } from "../engine";

/** The error codes Fanwise uses, as the strings Excel shows. */
export const ExcelErrorCode = { value: "#VALUE!", num: "#NUM!", na: "#N/A" } as const;

function makeError(code: "#VALUE!" | "#NUM!" | "#N/A", message: string): CustomFunctions.Error {
  const codes = CustomFunctions.ErrorCode;
  const c = code === "#VALUE!" ? codes.invalidValue : code === "#NUM!" ? codes.invalidNumber : codes.notAvailable;
  return new CustomFunctions.Error(c, message);
}

/**
 * Maps anything thrown while computing a cell to a CustomFunctions.Error:
 * `input` → #VALUE! with the engine's message; `domain` → #NUM!; `unavailable` → #N/A with the
 * message. Anything else (a bug) becomes #VALUE! with a short note, never an uncaught exception.
 * @example toExcelError(new EngineError("input", "λ must be a number")).code // "#VALUE!"
 */
export function toExcelError(e: unknown): CustomFunctions.Error {
  if (e instanceof CustomFunctions.Error) return e;
  if (isEngineError(e)) {
    if (e.code === "domain") return makeError("#NUM!", e.message);
    if (e.code === "unavailable") return makeError("#N/A", e.message);
    return makeError("#VALUE!", e.message);
  }
  const msg = e instanceof Error ? e.message : String(e);
  return makeError("#VALUE!", `Fanwise could not compute this (${msg.slice(0, 120)}). Please report it with the inputs.`);
}

/** A cell-level #NUM! for a value that is not finite (so NaN/Infinity never reach a cell). */
export function notFiniteError(what: string): CustomFunctions.Error {
  return makeError("#NUM!", `${what} is not a finite number.`);
}
