// A large workbook through the command line: writes an invented workbook of about 20 MB (a month
// column and 40 series; seeded values, marked as invented) with the xlsx library's streaming
// writer, then times `fanwise screen book.xlsx` and reads its peak resident memory from
// /usr/bin/time -v when present (else from the child's resource usage). Run: node bench/xlsx.js
"use strict";
/* global setImmediate */
const fs = require("fs");
const os = require("os");
const path = require("path");
const { spawnSync } = require("child_process");
const ExcelJS = require("exceljs");

const TARGET = Number(process.env.FANWISE_XLSX_MB || 20) * 1e6;

async function write(file, rows) {
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: file, useSharedStrings: false });
  const ws = wb.addWorksheet("Invented data");
  const cols = 40;
  ws.addRow(["month", ...Array.from({ length: cols }, (_, j) => `shop ${j + 1}`)]).commit();
  let seed = 1;
  const rnd = () => ((seed = (seed * 48271) % 2147483647) / 2147483647);
  for (let i = 0; i < rows; i++) {
    const d = new Date(Date.UTC(1900 + Math.floor(i / 12), i % 12, 1));
    ws.addRow([d, ...Array.from({ length: cols }, (_, j) => Math.round((1000 + 100 * j + 50 * Math.sin(i / 6) + 30 * rnd()) * 100) / 100)]).commit();
    if (i % 2000 === 1999) await new Promise((r) => setImmediate(r));
  }
  await ws.commit();
  await wb.commit();
  return { rows, cols };
}

(async () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-xlsx-bench-"));
  const file = path.join(dir, "big.xlsx");
  const t0 = Date.now();
  // A trial of 2,000 rows gives the bytes per row; the real file is sized from it.
  await write(file, 2000);
  const perRow = fs.statSync(file).size / 2000;
  const { rows, cols } = await write(file, Math.round(TARGET / perRow));
  const size = fs.statSync(file).size;
  console.log(`wrote ${(size / 1e6).toFixed(1)} MB: ${rows} rows × ${cols + 1} columns (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
  const bin = path.join(__dirname, "..", "bin", "fanwise.js");
  const args = [bin, "screen", file, "--period", "12", "--json"];
  const timeBin = fs.existsSync("/usr/bin/time") ? "/usr/bin/time" : null;
  const t1 = Date.now();
  const r = timeBin ? spawnSync(timeBin, ["-v", process.execPath, ...args], { encoding: "utf8", maxBuffer: 1 << 28 }) : spawnSync(process.execPath, args, { encoding: "utf8", maxBuffer: 1 << 28 });
  const secs = (Date.now() - t1) / 1000;
  const peak = timeBin ? Number((/Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr) || [])[1]) * 1024 : NaN;
  const cpu = timeBin ? ["User", "System"].map((k) => Number((new RegExp(`${k} time \\(seconds\\): ([\\d.]+)`).exec(r.stderr) || [])[1])).reduce((a, b) => a + b, 0) : NaN;
  const series = r.status === 0 ? Object.keys(JSON.parse(r.stdout).series).length : 0;
  console.log(`fanwise screen: exit ${r.status}, ${series} series, ${secs.toFixed(1)} s wall clock (${Number.isFinite(cpu) ? cpu.toFixed(1) + " s CPU" : "CPU not measured"}), load average ${os.loadavg()[0].toFixed(1)}, peak resident memory ${Number.isFinite(peak) ? (peak / 1e6).toFixed(0) + " MB" : "not measured"}`);
  if (r.status !== 0) console.log(r.stderr.split("\n").filter((l) => l.startsWith("fanwise")).join("\n"));
  fs.rmSync(dir, { recursive: true, force: true });
})();
