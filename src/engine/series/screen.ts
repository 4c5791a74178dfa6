import { EngineError, isEngineError } from "../errors";
import { fmt } from "../_lib/check";
import type { LambdaChoice } from "../transform/fit-lambda";
import { fitLambdaForModel, LAMBDA_CHOICE_MAX } from "../models/lambda-choice";
import { autoShift } from "../transform/shift";
import { MLE_MIN_LENGTH } from "../transform/lambda-mle";
import { isBlank, cap } from "../_lib/cells";
import { MAX_MISSING_SHARE, ZEROS_OPTION_ALL_FACES, ZerosRule } from "./clean";

/** A raw cell as the faces hand it over: a number, text, a boolean, or blank (null/undefined/""). */
export type RawCell = number | string | boolean | null | undefined;

/** What to do about a series before Box-Cox. */
export type SuggestedFix = "none" | "shift" | "yeo-johnson" | "too-short" | "fill-gaps" | "constant" | "no-numbers" | "zeros-missing";

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
  /**
   * Missing observations the forecast will see: interior blanks, plus interior zeros when zeros
   * are read as missing. More than MAX_MISSING_SHARE of the periods is refused by the forecast.
   */
  missing: number;
  /** True when every zero sits alone between positive values (a closed period), so reading zeros as missing fits. */
  zerosIsolated: boolean;
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
 * read isolated zeros as missing observations — naming the face's option, `zerosOption` —, or
 * "too short"). Interior blanks are missing observations (λ is chosen with them in place); more
 * than MAX_MISSING_SHARE of them gets the fix "fill-gaps". With `zeros: "missing"` zeros are
 * read as missing too.
 * @example screenSeries([3, 0, 5, 6], { label: "Old Quay" }).fix // "shift"
 */
export function screenSeries(cells: readonly RawCell[], options: { period?: number; label?: string; where?: (index: number) => string; zeros?: ZerosRule; zerosOption?: string } = {}): ScreenResult {
  const label = options.label ?? "the series";
  const zerosMissing = options.zeros === "missing";
  const zerosOption = options.zerosOption ?? ZEROS_OPTION_ALL_FACES;
  const where = options.where ?? ((i: number) => `position ${i + 1}`);
  const period = options.period ?? 1;
  if (!Number.isInteger(period) || period < 1) {
    throw new EngineError("input", `period must be a whole number of at least 1 (12 for monthly data, 4 for quarterly, 1 for none); got ${period}.`);
  }
  const numbers: number[] = [];
  const positions: number[] = [];
  let blanks = 0;
  let textCells = 0;
  let zerosRead = 0;
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (isBlank(c)) blanks++;
    else if (typeof c === "number" && Number.isFinite(c)) {
      if (zerosMissing && c === 0) {
        zerosRead++;
        continue;
      }
      numbers.push(c);
      positions.push(i);
    } else textCells++;
  }
  const first = positions.length ? positions[0] : cells.length;
  const last = positions.length ? positions[positions.length - 1] : -1;
  const interiorGaps: number[] = [];
  let missing = 0;
  for (let i = first + 1; i < last; i++) {
    if (isBlank(cells[i])) interiorGaps.push(i + 1);
    if (isBlank(cells[i]) || (zerosMissing && cells[i] === 0)) missing++;
  }
  const span = last - first + 1;
  // the series as the forecast reads it: NaN at each missing observation, for λ's windows
  const positioned: number[] = [];
  for (let i = first, k = 0; i <= last; i++) {
    if (k < positions.length && positions[k] === i) positioned.push(numbers[k++]);
    else if (isBlank(cells[i]) || (zerosMissing && cells[i] === 0)) positioned.push(NaN);
  }
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
  const zerosIsolated = isolatedZeros(numbers, missing, span);
  const base = { label, n: numbers.length, blanks, leadingBlanks, trailingBlanks, interiorGaps, missing, zerosIsolated, textCells, min, max, zeros: zeros + zerosRead, negatives, nonPositive };
  const textNote = textCells ? ` ${textCells} text cell${textCells > 1 ? "s are" : " is"} ignored.` : "";

  if (numbers.length === 0) {
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix: "no-numbers", shift: null, message: `${cap(label)} has no numbers.${textNote}` };
  }
  if (nonPositive > 0) {
    const shift = autoShift(numbers);
    const what = [zeros ? `${zeros} zero${zeros > 1 ? "s" : ""}` : "", negatives ? `${negatives} negative value${negatives > 1 ? "s" : ""}` : ""].filter(Boolean).join(" and ");
    const fix: SuggestedFix = negatives > 0 ? "yeo-johnson" : zerosIsolated ? "zeros-missing" : "shift";
    const yj = `transform "yeo-johnson" (command line: --transform yeo-johnson)`;
    const sh = `shift "auto", which adds ${fmt(shift)} (command line: --shift auto)`;
    const advice = negatives > 0
      ? `Use ${yj}, or ${sh}`
      : zerosIsolated
        ? `If ${zeros > 1 ? "those periods were" : "that period was"} closed, read zeros as missing observations: ${zerosOption}. Otherwise use ${sh}, or ${yj}`
        : `Use ${sh}, or ${yj}`;
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix, shift, message: `Not Box-Cox ready: ${label} has ${what} (minimum ${fmt(min as number)}, first at ${where(firstBad)}); Box-Cox needs values > 0. ${advice}.${textNote}` };
  }
  if (numbers.length < MLE_MIN_LENGTH) {
    return { ...base, boxCoxUsable: false, suggestedLambda: null, lambda: null, fix: "too-short", shift: null, message: `${cap(label)} is too short: ${numbers.length} value${numbers.length > 1 ? "s" : ""}; at least ${MLE_MIN_LENGTH} are needed to choose λ. Give λ yourself (0 for the log).${textNote}` };
  }
  if (numbers.every((v) => v === numbers[0])) {
    return { ...base, boxCoxUsable: true, suggestedLambda: 1, lambda: null, fix: "constant", shift: null, message: `${cap(label)} is constant; no transform is needed (λ = 1).${textNote}` };
  }
  const missingAt: string[] = [];
  for (let i = first + 1; i < last; i++) if (isBlank(cells[i]) || (zerosMissing && cells[i] === 0)) missingAt.push(where(i));
  const tooMany = missing > MAX_MISSING_SHARE * span;
  const what = zerosMissing ? "missing value" : "blank";
  const gaps = missing
    ? tooMany
      ? ` ${missing} ${what}${missing > 1 ? "s" : ""} inside the series (${Math.round((100 * missing) / span)}% of ${span} periods, at ${listPositions(missingAt)}): at most ${Math.round(100 * MAX_MISSING_SHARE)}% may be missing for a forecast; fill some of them.`
      : ` ${missing} ${what}${missing > 1 ? "s" : ""} inside the series (at ${listPositions(missingAt)}) ${missing > 1 ? "are missing observations" : "is a missing observation"}: the forecast allows for ${missing > 1 ? "them" : "it"}.`
    : "";
  let lambda: LambdaChoice;
  try {
    lambda = fitLambdaForModel(positioned, { period, label });
  } catch (e) {
    if (!isEngineError(e)) throw e;
    return { ...base, boxCoxUsable: true, suggestedLambda: null, lambda: null, fix: tooMany ? "fill-gaps" : "too-short", shift: null, message: `${e.message}${gaps}${textNote}` };
  }
  const how = `the rule lambda "auto" uses: readable λ and smoothing form chosen together by AICc on the original scale${numbers.length > LAMBDA_CHOICE_MAX ? `, on the latest ${LAMBDA_CHOICE_MAX.toLocaleString("en-US")} values` : ""}`;
  const lead = leadingBlanks ? ` ${leadingBlanks} leading blank${leadingBlanks > 1 ? "s" : ""} skipped.` : "";
  return {
    ...base,
    boxCoxUsable: true,
    suggestedLambda: lambda.lambda,
    lambda,
    fix: tooMany ? "fill-gaps" : "none",
    shift: null,
    message: `Box-Cox ready. Suggested λ = ${fmt(lambda.lambda)} (${how}).${lead}${gaps}${textNote}`,
  };
}

/**
 * Zeros that look like closed periods: each sits alone between positive values (never first or
 * last, never two together), there are no negatives, and with the other gaps they stay within
 * MAX_MISSING_SHARE of the periods — so reading them as missing observations is a working fix.
 */
function isolatedZeros(numbers: readonly number[], missing: number, span: number): boolean {
  let zeros = 0;
  for (let k = 0; k < numbers.length; k++) {
    const v = numbers[k];
    if (v < 0) return false;
    if (v !== 0) continue;
    zeros++;
    if (k === 0 || k === numbers.length - 1 || !(numbers[k - 1] > 0) || !(numbers[k + 1] > 0)) return false;
  }
  return zeros > 0 && zeros + missing <= MAX_MISSING_SHARE * span;
}

function listPositions(p: string[]): string {
  return p.length <= 5 ? p.join(", ") : `${p.slice(0, 5).join(", ")}, …`;
}

