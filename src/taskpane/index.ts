// Pane bootstrap (an entry file: side effects allowed here). Inside Excel it checks the selected
// range; outside Office it runs on the invented demo workbook.
import { RawCell } from "../engine";
import { buildDemoWorkbook, DEMO_NOTICE } from "../demo/quillmere";
import { checkRows, CheckRow } from "./view-model";
import { readSelection } from "./excel-io";

function el<K extends keyof HTMLElementTagNameMap>(tag: K, text?: string, cls?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (text !== undefined) e.textContent = text;
  if (cls) e.className = cls;
  return e;
}

function renderCheck(rows: CheckRow[]): void {
  const host = document.getElementById("fw-check");
  if (!host) return;
  host.replaceChildren();
  const table = el("table", undefined, "fw-table");
  const cap = el("caption", "One row per series: Box-Cox needs every value above zero.");
  cap.className = "fw-note";
  table.appendChild(cap);
  const head = el("tr");
  for (const h of ["Series", "n", "Min", "Suggested λ"]) {
    const th = el("th", h);
    th.scope = "col";
    head.appendChild(th);
  }
  table.appendChild(el("thead")).appendChild(head);
  const body = el("tbody");
  for (const r of rows) {
    const tr = el("tr");
    const name = el("td");
    name.appendChild(el("span", r.name));
    name.appendChild(document.createElement("br"));
    name.appendChild(r.badge ? el("span", r.badge, "fw-badge") : el("span", r.ready ? "ready" : "check", "fw-ok"));
    if (!r.ready || r.badge) name.appendChild(el("span", r.reason, "fw-reason"));
    tr.appendChild(name);
    tr.appendChild(el("td", String(r.n), "num"));
    tr.appendChild(el("td", r.min, "num"));
    tr.appendChild(el("td", r.lambda, "num"));
    body.appendChild(tr);
  }
  table.appendChild(body);
  host.appendChild(table);
}

function setSource(text: string): void {
  const p = document.getElementById("fw-source");
  if (p) p.textContent = text;
}

function standalone(): void {
  const wb = buildDemoWorkbook();
  setSource(`Not running inside Excel: showing the demo workbook. ${DEMO_NOTICE}`);
  renderCheck(checkRows(wb.columns.map((c) => ({ name: c.name, cells: c.values as RawCell[] })), 12, wb.months));
}

async function inExcel(): Promise<void> {
  setSource("Select the series (one per column, names in the first row) and the check follows the selection.");
  const refresh = async (): Promise<void> => {
    try {
      const sel = await readSelection();
      setSource(`Selection ${sel.address}`);
      renderCheck(checkRows(sel.columns, 12));
    } catch (e) {
      setSource(e instanceof Error ? e.message : String(e));
    }
  };
  await refresh();
  let timer: ReturnType<typeof setTimeout> | undefined;
  await Excel.run(async (ctx) => {
    ctx.workbook.onSelectionChanged.add(async () => {
      if (timer) clearTimeout(timer);
      timer = setTimeout(() => void refresh(), 300);
    });
    await ctx.sync();
  });
}

function start(): void {
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
