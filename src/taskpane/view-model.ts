// The pane's view model: raw columns and control values in, everything the pane shows out.
// Pure (no DOM, no Office), so it is tested in Node and timed in the browser.
import { describeForecaster, fanTable, FanTable, fitForecast, isEngineError, RawCell, screenSeries, Forecaster, ZerosRule } from "../engine";
import { fanChartSvg } from "../chart/fan-chart";
import { labelAfter } from "../io";
import { FW_NAMESPACE } from "./namespace";
import { formatWhole } from "./locale";

/** The data the pane works on: named columns of raw cells. */
export interface PaneData {
  /** Where the data came from, in words ("Selection Sheet1!B2:H74", "Demo workbook"). */
  source: string;
  names: string[];
  columns: RawCell[][];
  /** Labels of the rows (periods), when known. */
  rowLabels?: string[];
  /** Every column of labels (text such as series names or dates), by name, when known. */
  labelColumns?: { name: string; values: string[] }[];
  /** The range address (in Excel), for the formula the pane writes. */
  address?: string;
  /** 1 when the first row of the range was a header. */
  headerRows: number;
  /** The period the row labels' dates imply (monthly 12, quarterly 4, …), when they are dates. */
  period?: number;
  /** The label h periods after the last row ("2026-01"), when the row labels are dates. */
  nextLabel?: (h: number) => string;
  /** How the data was read (rows left out, order, skipped periods), in sentences. */
  notes?: string[];
  /** The range column of each series (a date column in the selection is not a series). */
  rangeColumns?: number[];
  /** Why this data cannot be forecast as selected, with the fix (a selection whose dates are out of order, say). */
  problem?: string;
}

/** One row of the series-check table. */
export interface CheckRow {
  name: string;
  n: number;
  min: string;
  blanks: number;
  lambda: string;
  lambdaInterval: [number, number] | null;
  ready: boolean;
  /** Missing observations inside the series (blanks, and zeros when they are read as missing). */
  missing: number;
  /** "not Box-Cox ready" (minimum ≤ 0), "too short", "gaps" (more missing than a forecast accepts), or null. */
  badge: string | null;
  reason: string;
}

function fmt(x: number | null): string {
  if (x === null || !Number.isFinite(x)) return "–";
  return Math.abs(x) >= 1000 ? formatWhole(x) : String(Number(x.toPrecision(4)));
}

/**
 * Screens each column and shapes the result for the table. A series whose minimum is ≤ 0 gets the
 * "not Box-Cox ready" badge with the reason and the fix; too-short series and series with more
 * missing observations than a forecast accepts are flagged too. With `zeros` "missing" (the
 * "Treat zeros as missing" box) zeros are missing observations.
 * @example checkRows({ source: "x", names: ["A"], columns: [[1, 0, 2, 3]], headerRows: 0 }, 1)[0].badge // "not Box-Cox ready"
 */
export function checkRows(data: PaneData, period: number, zeros: ZerosRule = "keep"): CheckRow[] {
  return data.columns.map((_, j) => checkRow(data, j, period, zeros));
}

/** How the pane names its zeros option in the check's advice. */
export const ZEROS_OPTION_PANE = 'tick "Treat zeros as missing" in the fan controls';

/**
 * The series-check row of column j (what {@link checkRows} does for each column), so a caller can
 * check a wide selection a few columns at a time.
 * @example checkRow({ source: "x", names: ["A"], columns: [[1, 2, 3, 4]], headerRows: 0 }, 0, 1).ready // true
 */
export function checkRow(data: PaneData, j: number, period: number, zeros: ZerosRule = "keep"): CheckRow {
  const where = (i: number): string => data.rowLabels?.[i] ?? `row ${i + 1 + data.headerRows}`;
  const cells = data.columns[j];
  const name = data.names[j];
  const r = screenSeries(cells, { period, label: name, where, zeros, zerosOption: ZEROS_OPTION_PANE });
  const iv = r.lambda ? r.lambda.interval : null;
  const interval: [number, number] | null = iv && iv[0] !== null && iv[1] !== null ? [iv[0], iv[1]] : null;
  const lambda = r.suggestedLambda === null ? "–" : interval ? `${fmt(r.suggestedLambda)} (${interval[0].toFixed(2)} to ${interval[1].toFixed(2)})` : fmt(r.suggestedLambda);
  let badge: string | null = null;
  if (r.nonPositive > 0) badge = "not Box-Cox ready";
  else if (r.fix === "too-short" || r.fix === "no-numbers") badge = "too short";
  else if (r.fix === "fill-gaps") badge = "gaps";
  return { name, n: r.n, min: fmt(r.min), blanks: r.blanks, missing: r.missing, lambda, lambdaInterval: interval, ready: r.boxCoxUsable && r.fix === "none", badge, reason: r.message };
}

const WHAT_TO_SELECT = "Select the data: one column per series, oldest first, its name in the top cell (e.g. B1:B37 or B1:H74).";

/**
 * What is wrong with a selection that holds nothing to forecast, in words a user can act on, or
 * null when there is at least one number to work with.
 * @example selectionProblem({ source: "x", names: ["column 1"], columns: [["Revenue"]], headerRows: 0 }) // 'The selection is one cell holding text ("Revenue"). Select the data: …'
 */
export function selectionProblem(data: PaneData): string | null {
  if (data.problem) return data.problem;
  const cells = data.columns.flat();
  if (data.columns.length === 0 || cells.length === 0) return `Nothing is selected. ${WHAT_TO_SELECT}`;
  if (cells.some((c) => typeof c === "number")) {
    if (cells.length === 1) return `The selection is one cell (${fmt(cells[0] as number)}); a forecast needs a series of at least 4 values. ${WHAT_TO_SELECT}`;
    return null;
  }
  if (cells.length === 1) {
    const c = cells[0];
    if (c === null || c === "") return `The selection is one empty cell. ${WHAT_TO_SELECT}`;
    const text = String(c);
    return `The selection is one cell holding ${typeof c === "boolean" ? "TRUE/FALSE" : `text ("${text.length > 24 ? `${text.slice(0, 24)}…` : text}")`}. ${WHAT_TO_SELECT}`;
  }
  const blanks = cells.filter((c) => c === null || c === "").length;
  return `The selection (${data.columns.length} column${data.columns.length === 1 ? "" : "s"}, ${cells.length} cells) holds no numbers${blanks === cells.length ? ", only empty cells" : ", only text or empty cells"}. ${WHAT_TO_SELECT}`;
}

/** The fan preview's controls. */
export interface FanControls {
  series: number;
  method: string;
  /** "auto", "guerrero", "mle", "none", or a number as text. */
  lambda: string;
  horizon: number;
  period: number;
  /** Levels in percent, as text ("50,80,95"). */
  levels: string;
  /** "box-cox" (default), "yeo-johnson" or "none". */
  transform?: string;
  /** "" or "0" (none), "auto", or a number as text. */
  shift?: string;
  /** "missing": zeros are missing observations (the "Treat zeros as missing" box). Default "keep". */
  zeros?: ZerosRule;
}

/** What the fan preview shows. */
export type FanView =
  | {
      ok: true;
      svg: string;
      fan: FanTable;
      /** Readout: method, λ, σ, AICc (original scale), and which mean is shown at the last step. */
      readout: { method: string; lambda: string; sigma: string; aicc: string; mean: string };
      /** The mean-vs-median gap at the last step, in plain words. */
      gap: string;
      notes: string[];
      /** Likelihood interval of λ for the slider (null when the series is not transformed or has none). */
      lambdaRange: [number, number] | null;
      forecaster: Forecaster;
      /** The period of forecast step h, counted from this series' own last value (undefined without dates). */
      stepLabel?: (h: number) => string;
    }
  | { ok: false; message: string };

function lambdaOption(text: string): string | number {
  const t = text.trim().toLowerCase();
  if (t === "" || t === "auto") return "auto";
  if (t === "guerrero" || t === "mle" || t === "model" || t === "none") return t;
  const v = Number(t);
  return Number.isFinite(v) ? v : text;
}

/**
 * The mean-vs-median gap at the last step in words a budget owner reads.
 * @example gapSentence(fan) // "At step 12 the mean is 1.3% (2,310) above the median: …"
 */
export function gapSentence(fan: FanTable): string {
  const last = fan.rows[fan.rows.length - 1];
  const mean = last.mean.value;
  const median = last.median.value;
  if (mean === null || median === null || median === 0) return last.mean.note ?? "The mean is not available at the last step.";
  if (last.meanDetail && last.meanDetail.accuracy) return last.meanDetail.accuracy;
  const d = mean - median;
  const pct = (100 * d) / median;
  if (Math.abs(pct) < 0.05) return `At step ${last.h} the mean and the median agree to within 0.05%: the transform barely bends this forecast.`;
  const side = d > 0 ? "above" : "below";
  const lesson = d > 0
    ? "budgeting on the back-transformed point forecast (the median) would understate it."
    : "budgeting on the median would overstate it.";
  return `At step ${last.h} the mean is ${Math.abs(pct).toFixed(1)}% (${fmt(Math.abs(d))}) ${side} the median: ${lesson}`;
}

/**
 * Fits the chosen series with the controls and lays out the fan (chart SVG, readout, gap), or says
 * why it cannot.
 * @example fanView(data, { series: 0, method: "auto", lambda: "auto", horizon: 12, period: 12, levels: "50,80,95" }).ok
 */
export function fanView(data: PaneData, c: FanControls): FanView {
  try {
    const cells = data.columns[c.series];
    if (!cells) return { ok: false, message: "Choose a series." };
    const f = fitForecast(cells, { method: c.method, lambda: lambdaOption(c.lambda), transform: c.transform || undefined, shift: c.shift || undefined, period: c.period, label: data.names[c.series], firstRow: 1 + data.headerRows, zeros: c.zeros });
    const fan = fanTable(f, c.horizon, { levels: c.levels });
    const history: number[] = [];
    const labels: string[] = [];
    cells.forEach((v, i) => {
      if (typeof v === "number" && !(c.zeros === "missing" && v === 0)) {
        history.push(v);
        labels.push(data.rowLabels?.[i] ?? String(i + 1));
      }
    });
    const shown = Math.min(history.length, Math.max(24, 3 * c.horizon));
    const hist = history.slice(-shown);
    const stepLabel = stepLabeller(data, cells);
    const lab = [...labels.slice(-shown), ...fan.rows.map((r) => (stepLabel ? stepLabel(r.h) : `+${r.h}`))];
    const svg = fanChartSvg({ title: `${data.names[c.series]}: ${f.method}, λ ${f.lambda === null ? "none" : f.lambda.toFixed(2)}`, history: hist, labels: lab, fan, width: 300, height: 220 });
    const info = new Map(describeForecaster(f));
    const aicc = info.get("AICc");
    const lc = f.lambdaChoice;
    const range: [number, number] | null = lc && lc.interval[0] !== null && lc.interval[1] !== null ? [lc.interval[0], lc.interval[1]] : null;
    return {
      ok: true,
      svg,
      fan,
      readout: {
        method: f.method,
        lambda: f.lambda === null ? "none" : `${f.lambda.toFixed(3)} (${f.lambdaSource})`,
        sigma: f.model ? f.model.sigma.toPrecision(3) : "0",
        aicc: typeof aicc === "number" ? `${aicc.toFixed(1)} (original scale)` : String(aicc ?? "–"),
        mean: meanReadout(fan),
      },
      gap: gapSentence(fan),
      notes: f.notes.slice(),
      lambdaRange: range,
      forecaster: f,
      stepLabel,
    };
  } catch (e) {
    if (isEngineError(e)) return { ok: false, message: e.message };
    return { ok: false, message: `Fanwise could not draw this fan (${e instanceof Error ? e.message : String(e)}).` };
  }
}

/**
 * The period of forecast step h of one series, counted from the series' own last value: a series
 * that ends before the selection's last row (trailing blanks) starts its steps inside the selection,
 * at the row labels there, then continues with the dates after the last row. Undefined when the
 * rows are not dates. Common practice (a forecast starts after the last observation).
 * @example stepLabeller(data, [5, 6, null])?.(1) // the label of the third row, not the month after it
 */
export function stepLabeller(data: PaneData, cells: readonly unknown[]): ((h: number) => string) | undefined {
  const next = data.nextLabel;
  if (!next) return undefined;
  let last = cells.length - 1;
  while (last >= 0 && typeof cells[last] !== "number") last--;
  const labels = data.rowLabels ?? Array.from({ length: cells.length }, () => "");
  return (h: number): string => labelAfter(labels, next, last, h);
}

/**
 * Which mean the fan shows at its last step, and how far Taylor and exact differ there.
 * @example meanReadout(fan) // "exact (Taylor would be 3.1% lower)"
 */
export function meanReadout(fan: FanTable): string {
  const m = fan.rows[fan.rows.length - 1].meanDetail;
  if (m.value === null) return "not available";
  if (m.used === "exact") {
    if (m.taylor === null || m.exact === null || m.exact === 0) return "exact";
    const d = (100 * (m.taylor - m.exact)) / Math.abs(m.exact);
    return Math.abs(d) < 0.05 ? "exact (Taylor agrees)" : `exact (Taylor would be ${Math.abs(d).toFixed(1)}% ${d < 0 ? "lower" : "higher"})`;
  }
  return `Taylor (correction ${m.correction === null ? "–" : (100 * m.correction).toFixed(1)}% of the median${m.poleProbability > 0 ? `; ${(100 * m.poleProbability).toPrecision(2)}% past the pole` : ""})`;
}

function quote(s: string): string {
  return `"${s.replace(/"/g, '""')}"`;
}

/**
 * The `=FW.FAN(...)` formula matching the controls, for a series at `address` (so the sheet
 * recalculates with the data), in this build's namespace (FW deployed, FWDEV in development). With
 * zeros read as missing, the range is passed with its zeros blanked (`IF(range=0,"",range)`): in
 * cells a blank inside a series is a missing observation.
 * @example fanFormula("Sheet1!B2:B74", { series: 0, method: "auto", lambda: "auto", horizon: 12, period: 12, levels: "80,95" }) // '=FW.FAN(Sheet1!B2:B74,12,"auto","auto","80,95",12)'
 */
export function fanFormula(address: string, c: FanControls): string {
  const l = lambdaOption(c.lambda);
  const values = c.zeros === "missing" ? `IF(${address}=0,"",${address})` : address;
  const base = `=${FW_NAMESPACE}.FAN(${values},${c.horizon},${quote(c.method)},${typeof l === "number" ? String(l) : quote(l)},${quote(c.levels)},${c.period}`;
  const t = c.transform && c.transform !== "box-cox" ? c.transform : "";
  const sh = c.shift && c.shift !== "0" ? c.shift : "";
  if (!t && !sh) return `${base})`;
  const shiftArg = sh === "" ? "" : Number.isFinite(Number(sh)) ? sh : quote(sh);
  return `${base},FALSE,${t ? quote(t) : ""},${shiftArg})`.replace(/,+\)$/, ")");
}

