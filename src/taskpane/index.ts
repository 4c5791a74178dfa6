// Pane bootstrap (an entry file: side effects allowed here). Inside Excel it follows the selected
// range; outside Office it runs on the invented demo workbook and offers a paste box.
// The page hosts the custom functions too (shared runtime): registering them from this bundle
// means the page loads one copy of the engine, not two (functions.js stays a bundle of its own
// for the manifest's script entry).
import "../functions/functions";
import { RawCell, parseLevels, backtestAsync } from "../engine";
import { buildDemoWorkbook, demoMonthlyCsv, DEMO_NOTICE } from "../demo/quillmere";
import { auditLogView, groupChoices } from "./audit-view";
import { checkRow, CheckRow, fanFormula, FanControls, fanView, FanView, PaneData, selectionProblem } from "./view-model";
import { pastedData } from "./paste";
import { publishedView } from "./views/published";
import { acrossRowView, totalOverSentence } from "./views/totals";
import { addSelectionHandler, columnAddress, readSelection, writeFan } from "./excel-io";
import { followWhileVisible, SelectionFollower } from "./selection-follow";
import { formatWhole } from "./locale";
import { applyOfficeTheme } from "./theme";

const $ = <T extends HTMLElement>(id: string): T => document.getElementById(id) as T;

interface State {
  data: PaneData;
  series: number;
  inExcel: boolean;
  lastView: FanView | null;
  lastRenderMs: number;
  renders: number;
  /** Series check in progress (a wide selection is checked a few columns at a time). */
  checking: boolean;
  /** How many slices the last series check took (1 = done in one go). */
  checkSlices: number;
  /** Bumped by every new check, so a check overtaken by a newer selection stops. */
  checkRun: number;
}

const state: State = { data: demoData(), series: 0, inExcel: false, lastView: null, lastRenderMs: 0, renders: 0, checking: false, checkSlices: 0, checkRun: 0 };

/** Longest stretch the series check works before letting the pane (and Excel) breathe. */
const CHECK_SLICE_MS = 25;

function demoData(): PaneData {
  // read like a pasted table, so the demo has its calendar too (period 12, dated forecast steps)
  const d = pastedData(demoMonthlyCsv(buildDemoWorkbook()));
  return { ...d, source: `Not running inside Excel: showing the demo workbook. ${DEMO_NOTICE}` };
}

function demoLog(): PaneData {
  const wb = buildDemoWorkbook();
  const L = wb.forecastLog;
  const cols: [string, number[]][] = [["median", L.map((r) => r.median)], ["lower80", L.map((r) => r.lower80)], ["upper80", L.map((r) => r.upper80)], ["lower95", L.map((r) => r.lower95)], ["upper95", L.map((r) => r.upper95)], ["actual", L.map((r) => r.actual)]];
  return { source: `Demo forecast log: past one-month-ahead forecasts for Harbour Street. ${DEMO_NOTICE}`, names: cols.map((c) => c[0]), columns: cols.map((c) => c[1]), rowLabels: L.map((r) => r.month), headerRows: 1 };
}

function el<K extends keyof HTMLElementTagNameMap>(tag: K, text?: string, cls?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (text !== undefined) e.textContent = text;
  if (cls) e.className = cls;
  return e;
}

/** The transform select as engine options: Box-Cox, Box-Cox with shift "auto", or Yeo-Johnson. */
function transformControl(): { transform: string; shift: string } {
  const v = $<HTMLSelectElement>("fw-transform").value;
  return v === "box-cox-shift" ? { transform: "box-cox", shift: "auto" } : { transform: v, shift: "" };
}

function controls(): FanControls {
  const mode = $<HTMLSelectElement>("fw-lambda-mode").value;
  return {
    series: state.series,
    method: $<HTMLSelectElement>("fw-method").value,
    lambda: mode === "typed" ? $<HTMLInputElement>("fw-lambda-value").value : mode,
    ...transformControl(),
    horizon: Number($<HTMLInputElement>("fw-horizon").value),
    period: Number($<HTMLInputElement>("fw-period").value),
    levels: $<HTMLInputElement>("fw-levels").value,
    zeros: $<HTMLInputElement>("fw-zeros").checked ? "missing" : "keep",
  };
}

function renderCheck(rows: CheckRow[]): void {
  const host = $("fw-check");
  host.replaceChildren();
  const table = el("table", undefined, "fw-table");
  table.appendChild(el("caption", "One row per series. Box-Cox needs every value above zero; choose a series to preview its fan."));
  const head = el("tr");
  for (const h of ["Series", "n", "Min", "Suggested λ"]) {
    const th = el("th", h);
    th.scope = "col";
    head.appendChild(th);
  }
  table.appendChild(el("thead")).appendChild(head);
  const body = el("tbody");
  rows.forEach((r, j) => {
    const tr = el("tr");
    const name = el("td");
    const b = el("button", r.name, "fw-series-button");
    b.type = "button";
    b.setAttribute("aria-pressed", String(j === state.series));
    b.setAttribute("aria-label", `Preview the fan of ${r.name}`);
    b.addEventListener("click", () => selectSeries(j));
    name.appendChild(b);
    name.appendChild(document.createElement("br"));
    if (r.badge) {
      const badge = el("span", r.badge, "fw-badge");
      badge.dataset.badge = r.badge;
      name.appendChild(badge);
      name.appendChild(el("span", r.reason, "fw-reason"));
    } else name.appendChild(el("span", "ready", "fw-ok"));
    tr.dataset.series = r.name;
    tr.appendChild(name);
    tr.appendChild(el("td", String(r.n), "num"));
    tr.appendChild(el("td", r.min, "num"));
    tr.appendChild(el("td", r.lambda, "num"));
    body.appendChild(tr);
  });
  table.appendChild(body);
  if (rows.length >= 2) table.appendChild(acrossFooter());
  host.appendChild(table);
}

/** The series check's total row: the total across all selected series, computed on request (it fits every series). */
function acrossFooter(): HTMLTableSectionElement {
  const foot = el("tfoot");
  const tr = el("tr");
  const cell = el("td");
  cell.colSpan = 4;
  const b = el("button", "Total across all series", "fw-series-button");
  b.type = "button";
  b.id = "fw-across-go";
  const out = el("span", "", "fw-reason");
  out.id = "fw-across";
  out.setAttribute("role", "status");
  b.addEventListener("click", () => {
    const c = controls();
    const from = Number($<HTMLInputElement>("fw-total-from").value) || 1;
    const v = acrossRowView(state.data, { method: c.method, lambda: c.lambda, period: c.period, from: Math.min(from, Math.max(1, c.horizon)), horizon: c.horizon, level: 95 });
    out.textContent = v.ok ? `${v.label}: ${v.text}. ${v.notes.join(" ")}` : v.message;
  });
  cell.appendChild(b);
  cell.appendChild(document.createElement("br"));
  cell.appendChild(out);
  tr.appendChild(cell);
  foot.appendChild(tr);
  return foot;
}

function renderSeriesSelect(): void {
  const sel = $<HTMLSelectElement>("fw-series");
  sel.replaceChildren(...state.data.names.map((n, j) => {
    const o = el("option", n);
    o.value = String(j);
    return o;
  }));
  sel.value = String(state.series);
}

function fmtCell(v: number | null): string {
  return v === null ? "n/a" : Math.abs(v) >= 1000 ? formatWhole(v) : String(Number(v.toPrecision(4)));
}

function renderFan(): void {
  const t0 = performance.now();
  const c = controls();
  const view = fanView(state.data, c);
  state.lastView = view;
  const chart = $("fw-chart");
  const error = $("fw-error");
  const readout = $("fw-readout");
  const table = $("fw-table");
  if (!view.ok) {
    chart.replaceChildren();
    readout.replaceChildren();
    table.replaceChildren();
    error.hidden = false;
    error.textContent = view.message;
    $("fw-gap").textContent = "";
    $("fw-notes").textContent = "";
    $("fw-total").textContent = "";
  } else {
    error.hidden = true;
    // The SVG is generated by our own code from numbers (labels escaped), so parsing it is safe.
    const doc = new DOMParser().parseFromString(view.svg, "image/svg+xml");
    chart.replaceChildren(document.importNode(doc.documentElement, true));
    readout.replaceChildren();
    for (const [k, v] of [["method", view.readout.method], ["λ", view.readout.lambda], ["σ", view.readout.sigma], ["AICc", view.readout.aicc], ["mean", view.readout.mean]]) {
      readout.appendChild(el("dt", k));
      readout.appendChild(el("dd", v));
    }
    $("fw-gap").textContent = view.gap;
    $("fw-notes").textContent = view.notes.join(" ");
    const from = Number($<HTMLInputElement>("fw-total-from").value) || 1;
    $("fw-total").textContent = totalOverSentence(view.forecaster, Math.min(from, Math.max(1, c.horizon)), c.horizon, 95, view.stepLabel);
    renderTable(view);
    updateSlider(view.lambdaRange);
    if (state.inExcel && state.data.address) {
      $("fw-formula").textContent = fanFormula(columnAddress(state.data.address, state.data.rangeColumns?.[c.series] ?? c.series), { ...c, levels: c.levels });
    }
  }
  state.lastRenderMs = performance.now() - t0;
  state.renders++;
}

function renderTable(view: Extract<FanView, { ok: true }>): void {
  const host = $("fw-table");
  const t = el("table", undefined, "fw-table");
  t.appendChild(el("caption", "The fan as numbers (original scale)."));
  const levels = view.fan.levels;
  const head = el("tr");
  for (const h of ["step", "mean", "median", ...levels.flatMap((l) => [`low ${l}%`, `high ${l}%`])]) {
    const th = el("th", h);
    th.scope = "col";
    head.appendChild(th);
  }
  t.appendChild(el("thead")).appendChild(head);
  const body = el("tbody");
  for (const r of view.fan.rows) {
    const tr = el("tr");
    tr.appendChild(el("td", String(r.h), "num"));
    tr.appendChild(el("td", fmtCell(r.mean.value), "num"));
    tr.appendChild(el("td", fmtCell(r.median.value), "num"));
    for (const l of levels) {
      tr.appendChild(el("td", fmtCell(r.intervals[String(l)][0].value), "num"));
      tr.appendChild(el("td", fmtCell(r.intervals[String(l)][1].value), "num"));
    }
    body.appendChild(tr);
  }
  t.appendChild(body);
  host.replaceChildren(t);
}

function updateSlider(range: [number, number] | null): void {
  const slider = $<HTMLInputElement>("fw-lambda-slider");
  const lo = range ? Math.max(-5, range[0]) : -1;
  const hi = range ? Math.min(5, range[1]) : 2;
  slider.min = lo.toFixed(2);
  slider.max = hi.toFixed(2);
}

function showLambdaTyped(): void {
  const typed = $<HTMLSelectElement>("fw-lambda-mode").value === "typed";
  document.querySelectorAll<HTMLElement>(".fw-lambda-typed").forEach((e) => e.classList.toggle("fw-hidden", !typed));
}

function renderAll(): void {
  const t0 = performance.now();
  const period = Number($<HTMLInputElement>("fw-period").value) || 1;
  const problem = selectionProblem(state.data);
  $("fw-source").textContent = problem ? `${state.data.source}: ${problem}` : [state.data.source, ...(state.data.notes ?? [])].join(" ");
  renderSeriesSelect();
  renderAuditSelects();
  renderPublishedSelects();
  if (problem) {
    state.checkRun++;
    state.checking = false;
    $("fw-check").textContent = "Nothing to check: see Data above.";
    showFanMessage(problem);
  } else {
    renderFan();
    checkSeries(Number.isInteger(period) && period >= 1 ? period : 1);
  }
  state.lastRenderMs = performance.now() - t0;
}

function showFanMessage(message: string): void {
  state.lastView = null;
  $("fw-chart").replaceChildren();
  $("fw-readout").replaceChildren();
  $("fw-table").replaceChildren();
  $("fw-gap").textContent = "";
  $("fw-notes").textContent = "";
  const error = $("fw-error");
  error.hidden = false;
  error.textContent = message;
  state.renders++;
}

/**
 * Checks every series for the table. A few series take one slice (done at once, as before); a wide
 * selection is checked in slices of about CHECK_SLICE_MS with the event loop free in between, so the
 * pane and Excel stay responsive and the table says how far it has got. A newer selection stops an
 * older check.
 */
function checkSeries(period: number): void {
  const run = ++state.checkRun;
  const data = state.data;
  const n = data.columns.length;
  const rows: CheckRow[] = [];
  state.checking = true;
  state.checkSlices = 0;
  const slice = (): void => {
    if (run !== state.checkRun) return;
    state.checkSlices++;
    const t0 = performance.now();
    try {
      while (rows.length < n && performance.now() - t0 < CHECK_SLICE_MS) rows.push(checkRow(data, rows.length, period, $<HTMLInputElement>("fw-zeros").checked ? "missing" : "keep"));
    } catch (e) {
      state.checking = false;
      $("fw-check").textContent = e instanceof Error ? e.message : String(e);
      return;
    }
    if (rows.length < n) {
      $("fw-check").textContent = `Checking the series: ${rows.length} of ${n}…`;
      setTimeout(slice, 0);
      return;
    }
    state.checking = false;
    renderCheck(rows);
  };
  slice();
}

function renderAuditSelects(): void {
  const names = state.data.names;
  const guess = (re: RegExp, fallback: number): number => {
    const i = names.findIndex((n) => re.test(n));
    return i >= 0 ? i : Math.min(fallback, names.length - 1);
  };
  const picks: [string, number][] = [["fw-audit-actual", guess(/actual/i, 0)], ["fw-audit-lower", guess(/low/i, 1)], ["fw-audit-upper", guess(/up|high/i, 2)]];
  for (const [id, pick] of picks) {
    const sel = $<HTMLSelectElement>(id);
    sel.replaceChildren(...names.map((n, j) => {
      const o = el("option", n);
      o.value = String(j);
      return o;
    }));
    sel.value = String(Math.max(0, pick));
  }
  const m = /(\d+(?:\.\d+)?)/.exec(names[picks[1][1]] ?? "");
  // A level in the lower end's name ("lower80", "low 95%"); a column number ("column 1") is not one.
  if (m && Number(m[1]) >= 50 && Number(m[1]) < 100) $<HTMLInputElement>("fw-audit-level").value = m[1];
  const group = $<HTMLSelectElement>("fw-audit-group");
  const gc = groupChoices(state.data);
  group.replaceChildren(...gc.options.map(([value, label]) => {
    const o = el("option", label);
    o.value = value;
    return o;
  }));
  group.value = gc.pick;
  $("fw-audit-readout").replaceChildren();
  clearAudit();
}

function clearAudit(): void {
  for (const id of ["fw-audit-readout", "fw-audit-strip", "fw-audit-calibration", "fw-audit-notes"]) $(id).replaceChildren();
  $("fw-audit-verdict").textContent = "";
  $("fw-audit-headline").textContent = "";
  $("fw-audit-headline").className = "fw-verdict";
  $("fw-audit-show-row").hidden = true;
}

function svgNode(svg: string): Node {
  const doc = new DOMParser().parseFromString(svg, "image/svg+xml");
  return document.importNode(doc.documentElement, true);
}

function renderPublishedSelects(): void {
  const names = state.data.names;
  const guess = (re: RegExp, fallback: number): number => {
    const i = names.findIndex((n) => re.test(n));
    return i >= 0 ? i : Math.min(fallback, names.length - 1);
  };
  const picks: [string, number][] = [["fw-pub-median", guess(/median|point|forecast/i, 0)], ["fw-pub-lower", guess(/low/i, 1)], ["fw-pub-upper", guess(/up|high/i, 2)]];
  for (const [id, pick] of picks) {
    const sel = $<HTMLSelectElement>(id);
    sel.replaceChildren(...names.map((n, j) => {
      const o = el("option", n);
      o.value = String(j);
      return o;
    }));
    sel.value = String(Math.max(0, pick));
  }
  const m = /(\d+(?:\.\d+)?)/.exec(names[picks[1][1]] ?? "");
  if (m && Number(m[1]) >= 50 && Number(m[1]) < 100) $<HTMLInputElement>("fw-pub-level").value = m[1];
  $("fw-pub-readout").replaceChildren();
  $("fw-pub-table").replaceChildren();
  $("fw-pub-notes").textContent = "";
}

function renderPublished(): void {
  const v = publishedView(state.data, Number($<HTMLSelectElement>("fw-pub-median").value), Number($<HTMLSelectElement>("fw-pub-lower").value), Number($<HTMLSelectElement>("fw-pub-upper").value),
    Number($<HTMLInputElement>("fw-pub-level").value), $<HTMLInputElement>("fw-pub-lambda").value, $<HTMLSelectElement>("fw-pub-dependence").value);
  const err = $("fw-pub-error");
  const readout = $("fw-pub-readout");
  readout.replaceChildren();
  $("fw-pub-table").replaceChildren();
  $("fw-pub-notes").textContent = "";
  if (!v.ok) {
    err.hidden = false;
    err.textContent = v.message;
    return;
  }
  err.hidden = true;
  for (const [k, val] of v.lines) {
    readout.appendChild(el("dt", k));
    readout.appendChild(el("dd", val));
  }
  $("fw-pub-notes").textContent = v.total.notes.join(" ");
  const table = el("table", undefined, "fw-table");
  table.appendChild(el("caption", "Each month's mean (what a budget adds up) beside its published median."));
  const head = el("tr");
  for (const h of ["Month", "Median", "Mean", "Low", "High"]) {
    const th = el("th", h);
    th.scope = "col";
    head.appendChild(th);
  }
  table.appendChild(head);
  for (const r of v.rows) {
    const tr = el("tr");
    for (const c of [r.label, fmtCell(r.median), fmtCell(r.mean), fmtCell(r.lower), fmtCell(r.upper)]) tr.appendChild(el("td", c));
    table.appendChild(tr);
  }
  $("fw-pub-table").appendChild(table);
}

function renderAudit(): void {
  const show = $<HTMLSelectElement>("fw-audit-show");
  const v = auditLogView(state.data, {
    actual: Number($<HTMLSelectElement>("fw-audit-actual").value), lower: Number($<HTMLSelectElement>("fw-audit-lower").value), upper: Number($<HTMLSelectElement>("fw-audit-upper").value),
    level: Number($<HTMLInputElement>("fw-audit-level").value), group: $<HTMLSelectElement>("fw-audit-group").value, show: show.value || undefined,
  });
  const err = $("fw-audit-error");
  if (!v.ok) {
    err.hidden = false;
    err.textContent = v.message;
    clearAudit();
    return;
  }
  err.hidden = true;
  clearAudit();
  if (v.choices.length) {
    show.replaceChildren(...v.choices.map((g) => el("option", g)));
    show.value = v.shown;
    $("fw-audit-show-row").hidden = false;
  }
  const head = $("fw-audit-headline");
  head.textContent = `${v.shown ? `${v.shown}: ` : ""}${v.row.verdict.headline} (zone ${v.colour})`;
  head.className = `fw-verdict zone-${v.colour}`;
  const readout = $("fw-audit-readout");
  for (const [k, val] of v.lines) {
    readout.appendChild(el("dt", k));
    readout.appendChild(el("dd", val));
  }
  if (v.strip) $("fw-audit-strip").replaceChildren(svgNode(v.strip));
  $("fw-audit-calibration").replaceChildren(svgNode(v.calibration));
  $("fw-audit-verdict").textContent = v.verdict;
  $("fw-audit-notes").replaceChildren(...v.notes.map((n) => el("li", n)));
}

async function runBacktest(): Promise<void> {
  const c = controls();
  const bar = $<HTMLProgressElement>("fw-backtest-progress");
  const out = $("fw-backtest");
  bar.hidden = false;
  bar.value = 0;
  out.textContent = "Backtesting…";
  try {
    let last = 0;
    const b = await backtestAsync(state.data.columns[c.series], Math.min(c.horizon, 12), {
      method: c.method, lambda: c.lambda === "typed" ? "auto" : c.lambda, transform: c.transform, shift: c.shift || undefined, period: c.period, zeros: c.zeros, level: 80, label: state.data.names[c.series],
      onProgress: (done, total) => { bar.max = total; bar.value = done; },
    }, () => {
      const now = performance.now();
      if (now - last < 30) return Promise.resolve();
      last = now;
      return new Promise((r) => setTimeout(r, 0));
    });
    const t = el("table", undefined, "fw-table");
    t.appendChild(el("caption", `Rolling-origin backtest of ${state.data.names[c.series]} (80% intervals; error = actual − forecast).`));
    const head = el("tr");
    for (const h of ["h", "origins", "coverage", "Kupiec p", "error of mean", "error of median"]) {
      const th = el("th", h);
      th.scope = "col";
      head.appendChild(th);
    }
    t.appendChild(el("thead")).appendChild(head);
    const body = el("tbody");
    for (const r of b.rows) {
      const tr = el("tr");
      tr.appendChild(el("td", String(r.h), "num"));
      tr.appendChild(el("td", String(r.origins), "num"));
      tr.appendChild(el("td", r.coverage === null ? "n/a" : `${(100 * r.coverage).toFixed(0)}%`, "num"));
      tr.appendChild(el("td", r.kupiecP === null ? "n/a" : r.kupiecP < 0.001 ? r.kupiecP.toExponential(1) : r.kupiecP.toFixed(3), "num"));
      tr.appendChild(el("td", fmtCell(r.meanErrorOfMean), "num"));
      tr.appendChild(el("td", fmtCell(r.meanErrorOfMedian), "num"));
      body.appendChild(tr);
    }
    t.appendChild(body);
    // One verdict per step (the audit's rule), and which origins were used.
    const verdicts = el("ul");
    verdicts.className = "fw-backtest-verdicts";
    for (const r of b.rows) if (r.verdict) verdicts.appendChild(el("li", `h = ${r.h}: ${r.verdict.headline} (zone ${r.verdict.colour})`, `zone-${r.verdict.colour}`));
    out.replaceChildren(t, verdicts, el("p", b.originNote, "fw-note"));
  } catch (e) {
    out.textContent = e instanceof Error ? e.message : String(e);
  } finally {
    bar.hidden = true;
  }
}

function selectSeries(j: number): void {
  state.series = j;
  document.querySelectorAll<HTMLButtonElement>(".fw-series-button").forEach((b, k) => b.setAttribute("aria-pressed", String(k === j)));
  $<HTMLSelectElement>("fw-series").value = String(j);
  renderFan();
}

let timer: ReturnType<typeof setTimeout> | undefined;
function later(f: () => void, ms = 150): void {
  if (timer) clearTimeout(timer);
  timer = setTimeout(f, ms);
}

function download(name: string, blob: Blob): void {
  const a = el("a");
  a.href = URL.createObjectURL(blob);
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 1000);
}

function exportSvg(): void {
  if (state.lastView?.ok) download("fanwise-fan.svg", new Blob([state.lastView.svg], { type: "image/svg+xml" }));
}

function exportPng(): void {
  const v = state.lastView;
  if (!v?.ok) return;
  const img = new Image();
  const url = URL.createObjectURL(new Blob([v.svg], { type: "image/svg+xml" }));
  img.onload = () => {
    const scale = 2;
    const canvas = el("canvas");
    canvas.width = img.width * scale;
    canvas.height = img.height * scale;
    const ctx = canvas.getContext("2d");
    if (!ctx) return;
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0);
    URL.revokeObjectURL(url);
    canvas.toBlob((b) => b && download("fanwise-fan.png", b), "image/png");
  };
  img.src = url;
}

function wire(): void {
  $("fw-series").addEventListener("change", (e) => selectSeries(Number((e.target as HTMLSelectElement).value)));
  $("fw-method").addEventListener("change", renderFan);
  $("fw-transform").addEventListener("change", renderFan);
  $("fw-lambda-mode").addEventListener("change", () => { showLambdaTyped(); renderFan(); });
  $("fw-lambda-value").addEventListener("input", () => {
    $<HTMLInputElement>("fw-lambda-slider").value = $<HTMLInputElement>("fw-lambda-value").value;
    later(renderFan);
  });
  $("fw-lambda-slider").addEventListener("input", () => {
    $<HTMLInputElement>("fw-lambda-value").value = $<HTMLInputElement>("fw-lambda-slider").value;
    later(renderFan, 60);
  });
  $("fw-horizon").addEventListener("input", () => later(renderFan));
  $("fw-levels").addEventListener("input", () => later(renderFan, 300));
  $("fw-total-from").addEventListener("input", () => later(renderFan, 300));
  $("fw-period").addEventListener("input", () => later(renderAll));
  $("fw-zeros").addEventListener("change", () => later(renderAll));
  $("fw-controls").addEventListener("submit", (e) => e.preventDefault());
  $("fw-export-svg").addEventListener("click", exportSvg);
  $("fw-export-png").addEventListener("click", exportPng);
  $("fw-paste-go").addEventListener("click", () => {
    const msg = $("fw-paste-msg");
    try {
      const decimal = $<HTMLSelectElement>("fw-paste-decimal").value;
      state.data = pastedData($<HTMLTextAreaElement>("fw-paste").value, decimal === "," || decimal === "." ? decimal : undefined);
      state.series = 0;
      usePeriodOfData();
      msg.textContent = `Using the pasted table: ${state.data.names.length} series.`;
      renderAll();
    } catch (e) {
      msg.textContent = e instanceof Error ? e.message : String(e);
    }
  });
  $("fw-demo-go").addEventListener("click", () => {
    state.data = demoData();
    state.series = 0;
    $("fw-paste-msg").textContent = "";
    renderAll();
  });
  $("fw-write-go").addEventListener("click", () => void writeToSheet());
  $("fw-write-overwrite").addEventListener("click", () => void writeToSheet(true));
  $("fw-audit-go").addEventListener("click", () => {
    $<HTMLSelectElement>("fw-audit-show").replaceChildren();
    renderAudit();
  });
  $("fw-audit-show").addEventListener("change", renderAudit);
  $("fw-pub-go").addEventListener("click", renderPublished);
  $("fw-pub-controls").addEventListener("submit", (e) => e.preventDefault());
  $("fw-audit-controls").addEventListener("submit", (e) => e.preventDefault());
  $("fw-backtest-go").addEventListener("click", () => void runBacktest());
  $("fw-demo-log-go").addEventListener("click", () => {
    state.data = demoLog();
    state.series = 0;
    renderAll();
    renderAudit();
  });
  showLambdaTyped();
}

async function writeToSheet(overwrite = false): Promise<void> {
  const msg = $("fw-write-msg");
  const confirm = $<HTMLButtonElement>("fw-write-overwrite");
  confirm.hidden = true;
  const c = controls();
  if (!state.data.address) {
    msg.textContent = "Select the data range first.";
    return;
  }
  try {
    const formula = fanFormula(columnAddress(state.data.address, state.data.rangeColumns?.[c.series] ?? c.series), c);
    // Checks what is in the way first and asks before overwriting (excel-io.ts, write-plan.ts).
    const r = await writeFan($<HTMLInputElement>("fw-target").value.trim(), formula, c.horizon, parseLevels(c.levels), $<HTMLInputElement>("fw-with-chart").checked, { overwrite });
    if (!r.written) {
      msg.textContent = `Nothing written yet: ${r.note}`;
      confirm.hidden = false;
      return;
    }
    msg.textContent = `${r.note} (${r.formulaAt})`;
  } catch (e) {
    msg.textContent = `Could not write to the sheet: ${e instanceof Error ? e.message : String(e)}`;
  }
}

/** When the data's dates imply a period (monthly 12, quarterly 4, …), the period box takes it. */
function usePeriodOfData(): void {
  if (state.data.period !== undefined) $<HTMLInputElement>("fw-period").value = String(state.data.period);
}

function standalone(): void {
  state.inExcel = false;
  $("fw-paste-box").hidden = false;
  state.data = demoData();
  renderAll();
}

async function inExcel(): Promise<void> {
  state.inExcel = true;
  applyOfficeTheme(document.documentElement, Office.context.officeTheme);
  $("fw-write").hidden = false;
  const refresh = async (): Promise<void> => {
    try {
      applyOfficeTheme(document.documentElement, Office.context.officeTheme); // the user may have changed it meanwhile
      state.data = await readSelection();
      if (state.series >= state.data.columns.length) state.series = 0;
      usePeriodOfData();
      renderAll();
    } catch (e) {
      $("fw-source").textContent = e instanceof Error ? e.message : String(e);
    }
  };
  // Read the selection and follow it only while the pane is visible (selection-follow.ts says why).
  follower = new SelectionFollower({
    addSelectionHandler,
    refresh,
    stopWork: () => {
      if (timer) clearTimeout(timer);
      state.checkRun++;
      state.checking = false;
    },
    schedule: (f) => later(f, 300),
  });
  await followWhileVisible(follower, typeof Office.addin === "undefined" ? undefined : Office.addin, document.visibilityState === "hidden");
}

let follower: SelectionFollower | null = null;

/** For tests and the in-browser benchmark: set data, re-render, and read the last render time. */
(globalThis as unknown as { fanwisePane: unknown }).fanwisePane = {
  setData(names: string[], columns: RawCell[][]): void {
    state.data = { source: "Benchmark data", names, columns, headerRows: 1 };
    state.series = 0;
    renderAll();
  },
  renderAll,
  renderFan,
  get lastRenderMs(): number { return state.lastRenderMs; },
  get lastFan(): unknown { return state.lastView && state.lastView.ok ? state.lastView.fan : null; },
  get renders(): number { return state.renders; },
  get checking(): boolean { return state.checking; },
  get checkSlices(): number { return state.checkSlices; },
  get following(): { visible: boolean; listening: boolean; refreshes: number } | null {
    return follower ? { visible: follower.isVisible, listening: follower.listening, refreshes: follower.refreshes } : null;
  },
};

function start(): void {
  wire();
  if (typeof Office === "undefined") {
    standalone();
    return;
  }
  void Office.onReady((info) => {
    if (info.host === Office.HostType.Excel) void inExcel();
    else standalone();
  });
}

start();
