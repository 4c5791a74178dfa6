// EngineError → CustomFunctions.Error. The only place that decides which Excel error a problem shows.
//
// Excel shows a custom message only with #VALUE! and #N/A; with #NUM!, #DIV/0! and #NULL! it drops
// it ("Handle and return errors from your custom function":
// https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-errors; ErrorCode:
// https://learn.microsoft.com/javascript/api/custom-functions-runtime/customfunctions.errorcode).
// So, per case:
//   - something to fix in the inputs (`input`)                      → #VALUE! with the message;
//   - a value that does not exist (`unavailable`, and the `domain`
//     cases "past the floor / pole / bound: no original value")      → #N/A with the message;
//   - a number too large to represent (overflow past ~1e308)         → #NUM!, bare in Excel. This is
//     the only cause of a Fanwise #NUM!; the README (How Fanwise reads cells) and the support page
//     say so, and what to do (rescale, smaller λ). The message is kept for other hosts and tests.
// test/functions/error-messages.test.ts holds every path to this rule.
import { isEngineError } from "../engine";
import { CallCancelled } from "./cancel";

/** The error codes Fanwise uses, as the strings Excel shows. */
export const ExcelErrorCode = { value: "#VALUE!", num: "#NUM!", na: "#N/A" } as const;

/** The codes whose custom message Excel shows (the others show the bare code). */
export const CODES_WITH_MESSAGE: readonly string[] = ["#VALUE!", "#N/A"];

function makeError(code: "#VALUE!" | "#NUM!" | "#N/A", message: string): CustomFunctions.Error {
  const codes = CustomFunctions.ErrorCode;
  const c = code === "#VALUE!" ? codes.invalidValue : code === "#NUM!" ? codes.invalidNumber : codes.notAvailable;
  return new CustomFunctions.Error(c, message);
}

/** A `domain` problem that is an overflow (a number too large to represent), not a missing value. */
function isOverflow(message: string): boolean {
  // "…is too large to represent…", "Box-Cox with λ = 3 overflows on Sales's values…"; not "unbounded
  // … (or overflows)", which is a pole: no value exists, so #N/A with the reason.
  return /too large to represent|\boverflows on\b/.test(message);
}

/**
 * Maps anything thrown while computing a cell to a CustomFunctions.Error:
 * `input` → #VALUE! with the engine's message; `unavailable` → #N/A with the message; `domain` →
 * #NUM! when it is an overflow (Excel shows #NUM! bare; the README lists it as the one cause), else
 * #N/A with the message (no such value exists). A call Excel cancelled → #N/A (Excel discards it).
 * Anything else (a bug) becomes #VALUE! with a short note, never an uncaught exception.
 * @example toExcelError(new EngineError("input", "λ must be a number")).code // "#VALUE!"
 */
export function toExcelError(e: unknown): CustomFunctions.Error {
  if (e instanceof CustomFunctions.Error) return e;
  if (e instanceof CallCancelled) return makeError("#N/A", e.message);
  if (isEngineError(e)) {
    if (e.code === "domain") return makeError(isOverflow(e.message) ? "#NUM!" : "#N/A", e.message);
    if (e.code === "unavailable") return makeError("#N/A", e.message);
    return makeError("#VALUE!", e.message);
  }
  const msg = e instanceof Error ? e.message : String(e);
  return makeError("#VALUE!", `Fanwise could not compute this (${msg.slice(0, 120)}). Please report it with the inputs.`);
}

/** A cell-level #NUM! for a value that is not finite (so NaN/Infinity never reach a cell): an overflow. */
export function notFiniteError(what: string): CustomFunctions.Error {
  return makeError("#NUM!", `${what} is not a finite number (too large to represent).`);
}
