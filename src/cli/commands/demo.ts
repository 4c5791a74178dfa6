// fanwise demo: writes the invented Quillmere workbook (CSV), a fan chart (SVG) and a summary.
import * as fs from "fs";
import * as path from "path";
import { EngineError, fanTable, fitForecast, screenSeries, totalForecast } from "../../engine";
import { buildDemoWorkbook, demoForecastLogCsv, demoMonthlyCsv } from "../../demo/quillmere";
import { fanChartSvg } from "../../chart/fan-chart";
import { Command } from "../command";
import { errorMessage } from "../series-input";

export const demoCommand: Command = {
  name: "demo",
  summary: "write the invented demo data (CSV), a fan chart (SVG) and a summary",
  args: "",
  options: {
    out: { type: { kind: "text" }, value: "DIR", help: "folder to write into", example: "quillmere", default: "fanwise-demo" },
  },
  examples: ["fanwise demo --out quillmere"],
  run(p, io) {
    if (p.positional.length) throw new EngineError("input", `fanwise demo takes no file; got "${p.positional[0]}". Use --out DIR to choose where it writes.`);
    const dir = p.text("out") ?? "fanwise-demo";
    const wb = buildDemoWorkbook();
    fs.mkdirSync(dir, { recursive: true });
    const monthly = path.join(dir, "quillmere-monthly.csv");
    const log = path.join(dir, "quillmere-forecast-log.csv");
    fs.writeFileSync(monthly, demoMonthlyCsv(wb));
    fs.writeFileSync(log, demoForecastLogCsv(wb));
    const lines: string[] = [wb.title, wb.notice, ""];
    lines.push("Series check (Box-Cox needs values > 0; suggested λ by Guerrero's method, windows of 12 months):");
    for (const c of wb.columns) {
      const r = screenSeries(c.values, { period: 12, label: c.name, where: (i) => wb.months[i] ?? `row ${i + 1}` });
      lines.push(`  ${c.name.padEnd(18)} n=${String(r.n).padStart(2)}  min=${String(r.min).padStart(6)}  ${r.boxCoxUsable ? "ready    " : "NOT READY"}  ${r.message}`);
    }
    // The main job: next year's budget per shop, the mean (which adds up) against the median.
    lines.push("");
    lines.push("Next 12 months (Jan–Dec 2026), method auto, λ auto, period 12 — totals by shop:");
    lines.push(`  ${"series".padEnd(18)} ${"method".padEnd(20)} ${"λ".padStart(6)} ${"mean total".padStart(11)} ${"Σ medians".padStart(11)} ${"gap".padStart(7)}  95% interval of the total`);
    let chart: string | null = null;
    for (const c of wb.columns) {
      try {
        const screen = screenSeries(c.values, { period: 12, label: c.name, where: (i) => wb.months[i] ?? `row ${i + 1}` });
        if (!screen.boxCoxUsable) {
          lines.push(`  ${c.name.padEnd(18)} skipped: ${screen.message}`);
          continue;
        }
        const f = fitForecast(c.values, { period: 12, label: c.name });
        const fan = fanTable(f, 12, { levels: [50, 80, 95] });
        const t = totalForecast(f, 12, { level: 95, seed: 1 });
        const sumMedian = fan.rows.reduce((s2, r) => s2 + (r.median.value ?? NaN), 0);
        const mean = t.mean.value;
        const gap = mean === null ? "" : `${(100 * (mean - sumMedian) / sumMedian).toFixed(1)}%`;
        lines.push(`  ${c.name.padEnd(18)} ${f.method.padEnd(20)} ${(f.lambda === null ? "none" : f.lambda.toFixed(2)).padStart(6)} ${money(mean).padStart(11)} ${money(sumMedian).padStart(11)} ${gap.padStart(7)}  ${money(t.interval[0])} to ${money(t.interval[1])}`);
        if (!chart) {
          const history = (c.values.filter((v) => v !== null) as number[]).slice(-36);
          const future = Array.from({ length: 12 }, (_, i) => `2026-${String(i + 1).padStart(2, "0")}`);
          chart = fanChartSvg({ title: `${c.name}: monthly revenue and 12-month fan (invented data)`, history, labels: [...wb.months.slice(-36), ...future], fan, width: 640, height: 320 });
        }
      } catch (e) {
        lines.push(`  ${c.name.padEnd(18)} ${errorMessage(e)}`);
      }
    }
    lines.push("  (mean total = sum of the monthly bias-adjusted means; Σ medians = what back-transformed point forecasts add up to.)");
    let miss80 = 0;
    let miss95 = 0;
    for (const r of wb.forecastLog) {
      if (r.actual < r.lower80 || r.actual > r.upper80) miss80++;
      if (r.actual < r.lower95 || r.actual > r.upper95) miss95++;
    }
    const n = wb.forecastLog.length;
    lines.push("");
    lines.push(`Forecast log: ${n} past one-month-ahead forecasts for Harbour Street; the 80% intervals missed ${times(miss80)} (${Math.round((100 * miss80) / n)}%), the 95% intervals ${times(miss95)} (${Math.round((100 * miss95) / n)}%).`);
    lines.push("");
    if (chart) {
      fs.writeFileSync(path.join(dir, "quillmere-fan.svg"), chart);
      lines.push(`Wrote ${path.join(dir, "quillmere-fan.svg")}`);
    }
    lines.push(`Wrote ${monthly}`);
    lines.push(`Wrote ${log}`);
    lines.push(`Next: fanwise fan ${monthly} --horizon 12 --period 12    (or screen, lambda, total, backtest)`);
    lines.push(`      fanwise audit ${log} --actual actual --lower lower80 --upper upper80 --level 80`);
    lines.push("");
    lines.push("Forecasts are estimates from past patterns; intervals assume the model holds. Check results before committing money, and follow your organisation's forecasting and audit policies.");
    const summary = lines.join("\n") + "\n";
    fs.writeFileSync(path.join(dir, "summary.txt"), summary);
    io.out(summary);
    return 0;
  },
};

/** "once", "twice", "3 times". */
function times(k: number): string {
  return k === 1 ? "once" : k === 2 ? "twice" : `${k} times`;
}

function money(x: number | null): string {
  return x === null || !Number.isFinite(x) ? "n/a" : Math.round(x).toLocaleString("en-GB");
}
