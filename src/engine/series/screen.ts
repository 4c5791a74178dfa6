import { EngineError, isEngineError } from "../errors";
import { fmt } from "../_lib/check";
import type { LambdaChoice } from "../transform/fit-lambda";
import { fitLambdaForModel, LAMBDA_CHOICE_MAX } from "../models/lambda-choice";
import { autoShift } from "../transform/shift";
import { MLE_MIN_LENGTH } from "../transform/lambda-mle";
import { isBlank, cap } from "../_lib/cells";

/** A raw cell as the faces hand it over: a number, text, a boolean, or blank (null/undefined/""). */
export type RawCell = number | string | boolean | null | undefined;

/** What to do about a series before Box-Cox. */
export type SuggestedFix = "none" | "shift" | "yeo-johnson" | "too-short" | "fill-gaps" | "constant" | "no-numbers";

/** Screening of one series. */
export interface ScreenResult {
  label: string;
  /** Numeric values. */
  n: number;
  blanks: number;
  leadingBlanks: number;
  trailingBlanks: number;
  /** 1-based positions of blanks between the first and last number. */
  interiorGaps: number[];
  /** Text and boolean cells (not counted as numbers). */
  textCells: number;
  min: number | null;
  max: number | null;
  zeros: number;
  negatives: number;
  nonPositive: number;
  boxCoxUsable: boolean;
  /** Suggested λ: exactly the λ a forecast with lambda "auto" (method "auto") uses, when Box-Cox is usable. */
  suggestedLambda: number | null;
  lambda: LambdaChoice | null;
  fix: SuggestedFix;
  /** The shift "auto" would add for a shifted Box-Cox (value + c > 0), when the fix is "shift" or "yeo-johnson". */
  shift: number | null;
  /** A sentence a user understands. */
  message: string;
}


/**
 * Screens a raw series for Box-Cox: counts numbers, blanks (leading, trailing, interior) and text;
 * finds the minimum and values ≤ 0; says whether Box-Cox is usable, suggests the λ a forecast with
 * lambda "auto" uses (readable λ and form together by original-scale AICc; Box & Cox 1964 for the
 * likelihood) with the chosen form's likelihood interval and, when Box-Cox is not usable, the fix
 * naming the argument that works (shift "auto", transform "yeo-johnson" — Yeo & Johnson 2000 —,
 * fill the gaps, or "too short").
 * @example screenSeries([3, 0, 5, 6], { label: "Old Quay" }).fix // "shift"
 */
export function screenSeries(cells: readonly RawCell[], options: { period?: number; label?: string; where?: (index: number) => string } = {}): ScreenResult {
  const label = options.label ?? "the series";
  const where = options.where ?? ((i: number) => `position ${i + 1}`);
  const period = options.period ?? 1;
  if (!Number.isInteger(period) || period < 1) {
    throw new EngineError("input", `period must be a whole number of at least 1 (12 for monthly data, 4 for quarterly, 1 for none); got ${period}.`);
  }
  const numbers: number[] = [];
  const positions: number[] = [];
  let blanks = 0;
  let textCells = 0;
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (isBlank(c)) blanks++;
    else if (typeof c === "number" && Number.isFinite(c)) {
      numbers.push(c);
      positions.push(i);
    } else textCells++;
  }
  const first = positions.length ? positions[0] : cells.length;
  const last = positions.length ? positions[positions.length - 1] : -1;
  const interiorGaps: number[] = [];
  for (let i = first + 1; i < last; i++) if (isBlank(cells[i])) interiorGaps.push(i + 1);
  let trailingBlanks = 0;
  for (let i = cells.length - 1; i > last && isBlank(cells[i]); i--) trailingBlanks++;
  let leadingBlanks = 0;
  for (let i = 0; i < first && isBlank(cells[i]); i++) leadingBlanks++;

  let min: number | null = null;
  let max: number | null = null;
  let zeros = 0;
  let negatives = 0;
  let firstBad = -1;
  for (let k = 0; k < numbers.length; k++) {
    const v = numbers[k];
    if (min === null || v < min) min = v;
    if (max === null || v > max) max = v;
    if (v === 0) zeros++;
    else if (v < 0) negatives++;
    if (v <= 0 && firstBad < 0) firstBad = positions[k];
  }
  const nonPositive = zeros + negatives;
  const base = { label, n: numbers.length, blanks, leadingBlanks, trailingBlanks, interiorGaps, textCells, min, max, zeros, negatives, nonPositive };
  const textNote = textCells ? ` ${textCells} text cell${textCells > 1 ? "s are" : " is"} ignored.` : "";

  if (numbers.length === 0) {
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix: "no-numbers", shift: null, message: `${cap(label)} has no numbers.${textNote}` };
  }
  if (nonPositive > 0) {
    const shift = autoShift(numbers);
    const what = [zeros ? `${zeros} zero${zeros > 1 ? "s" : ""}` : "", negatives ? `${negatives} negative value${negatives > 1 ? "s" : ""}` : ""].filter(Boolean).join(" and ");
    const fix: SuggestedFix = negatives > 0 ? "yeo-johnson" : "shift";
    const yj = `transform "yeo-johnson" (command line: --transform yeo-johnson)`;
    const sh = `shift "auto", which adds ${fmt(shift)} (command line: --shift auto)`;
    const advice = negatives > 0 ? `Use ${yj}, or ${sh}` : `Use ${sh}, or ${yj}`;
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix, shift, message: `Not Box-Cox ready: ${label} has ${what} (minimum ${fmt(min as number)}, first at ${where(firstBad)}); Box-Cox needs values > 0. ${advice}.${textNote}` };
  }
  if (numbers.length < MLE_MIN_LENGTH) {
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix: "too-short", shift: null, message: `${cap(label)} is too short: ${numbers.length} value${numbers.length > 1 ? "s" : ""}; at least ${MLE_MIN_LENGTH} are needed to choose λ. Give λ yourself (0 for the log).${textNote}` };
  }
  if (numbers.every((v) => v === numbers[0])) {
    return { ...base, boxCoxUsable: true, suggestedLambda: 1, lambda: null, fix: "constant", shift: null, message: `${cap(label)} is constant; no transform is needed (λ = 1).${textNote}` };
  }
  const gaps = interiorGaps.length
    ? ` ${interiorGaps.length} blank${interiorGaps.length > 1 ? "s" : ""} inside the series (at ${listPositions(interiorGaps.map((p) => where(p - 1)))}): fill ${interiorGaps.length > 1 ? "them" : "it"} before forecasting.`
    : "";
  let lambda: LambdaChoice;
  try {
    lambda = fitLambdaForModel(numbers, { period, label });
  } catch (e) {
    if (!isEngineError(e)) throw e;
    return { ...base, boxCoxUsable: true, suggestedLambda: null, lambda: null, fix: interiorGaps.length ? "fill-gaps" : "too-short", shift: null, message: `${e.message}${gaps}${textNote}` };
  }
  const how = `the rule lambda "auto" uses: readable λ and smoothing form chosen together by AICc on the original scale${numbers.length > LAMBDA_CHOICE_MAX ? `, on the latest ${LAMBDA_CHOICE_MAX.toLocaleString("en-US")} values` : ""}`;
  const lead = leadingBlanks ? ` ${leadingBlanks} leading blank${leadingBlanks > 1 ? "s" : ""} skipped.` : "";
  return {
    ...base,
    boxCoxUsable: true,
    suggestedLambda: lambda.lambda,
    lambda,
    fix: interiorGaps.length ? "fill-gaps" : "none",
    shift: null,
    message: `Box-Cox ready. Suggested λ = ${fmt(lambda.lambda)} (${how}).${lead}${gaps}${textNote}`,
  };
}

function listPositions(p: string[]): string {
  return p.length <= 5 ? p.join(", ") : `${p.slice(0, 5).join(", ")}, …`;
}

