#!/usr/bin/env node
// `node bench/many.js` (after `npm run prepare`): many series through the command line —
// `fanwise fan --method auto --horizon 12` on N invented monthly series × 120 points, in a long file
// (--long) and in the wide file of the same series, with --jobs 1 and --jobs 2: wall time, CPU
// time, series per second and peak memory (maximum resident set, worker threads included, from
// /usr/bin/time). Also the `auto` rule (readable λ × smoothing forms by AICc) per series on 20
// years of monthly data, in-process. Not a test: it asserts nothing, except that the outputs of
// every run are byte-equal (long = wide, --jobs 2 = --jobs 1).
// FANWISE_BENCH_MANY=N series (default 500); FANWISE_BENCH_MANY_MEMORY=a,b runs --jobs 2 on the long
// file at those sizes too, for memory against the number of series. FANWISE_BENCH_MANY_HEAP=MB runs
// only `--jobs 1` on the long file at each of FANWISE_BENCH_MANY_MEMORY's sizes with Node's heap
// capped at MB (--max-old-space-size) and without the cap: whether what the run holds grows with
// the number of series, or only the garbage collector's slack does.
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { spawnSync } = require("child_process");
const engine = require("../build/engine");

const ROOT = path.join(__dirname, "..");
const BIN = path.join(ROOT, "bin", "fanwise.js");
const COUNT = Number(process.env.FANWISE_BENCH_MANY || 500);
const MEMORY_SIZES = (process.env.FANWISE_BENCH_MANY_MEMORY || "").split(",").filter(Boolean).map(Number);
const HEAP_MB = Number(process.env.FANWISE_BENCH_MANY_HEAP || 0);
const LENGTH = 120;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-bench-many-"));

/** N invented positive monthly series (seasonal log random walks with drift, each its own scale). */
function makeSeries(n, length, seed) {
  const rng = engine.createRandom(seed);
  return Array.from({ length: n }, () => {
    const level = Math.log(50 + 500 * rng.uniform());
    const sd = 0.02 + 0.06 * rng.uniform();
    const season = Array.from({ length: 12 }, () => 0.15 * rng.normal());
    let w = 0;
    return Array.from({ length }, (_, t) => {
      w += 0.003 + sd * rng.normal();
      return Number(Math.exp(level + w + season[t % 12]).toFixed(2));
    });
  });
}

function month(t) {
  return `${2016 + Math.floor(t / 12)}-${String((t % 12) + 1).padStart(2, "0")}`;
}

/** Writes the series as a long file (shop,month,sales: shop after shop) and as a wide file. */
function writeFiles(series, tag) {
  const long = path.join(dir, `long-${tag}.csv`);
  const wide = path.join(dir, `wide-${tag}.csv`);
  const names = series.map((_, s) => `Shop ${String(s + 1).padStart(5, "0")}`);
  const fdl = fs.openSync(long, "w");
  fs.writeSync(fdl, "shop,month,sales\n");
  series.forEach((x, s) => fs.writeSync(fdl, x.map((v, t) => `${names[s]},${month(t)},${v}`).join("\n") + "\n"));
  fs.closeSync(fdl);
  const fdw = fs.openSync(wide, "w");
  fs.writeSync(fdw, ["month", ...names].join(",") + "\n");
  for (let t = 0; t < series[0].length; t++) fs.writeSync(fdw, [month(t), ...series.map((x) => x[t])].join(",") + "\n");
  fs.closeSync(fdw);
  return { long, wide };
}

/** Runs fanwise under /usr/bin/time; its output goes to a file. */
function runFan(file, long, jobs, outFile, nodeArgs = []) {
  const args = [...nodeArgs, BIN, "fan", file, "--horizon", "12", "--method", "auto", "--jobs", String(jobs), "--out", outFile, ...(long ? ["--long", "shop,month,sales"] : [])];
  const r = spawnSync("/usr/bin/time", ["-f", "%e %U %S %M", process.execPath, ...args], { encoding: "utf8", maxBuffer: 1 << 26 });
  const last = r.stderr.trim().split("\n").pop();
  const [wall, user, sys, kb] = last.split(" ").map(Number);
  if (r.status !== 0 && r.status !== 3) throw new Error(`fanwise failed: ${r.stderr}`);
  return { wall, cpu: user + sys, mb: kb / 1024 };
}

/**
 * What two threads can gain on this machine now: the same pure computation in 1 and in 2 worker
 * threads (2× the work), as a ratio of throughput (2.0 on two idle cores; less when others share them).
 */
function calibrate() {
  const code = `const { parentPort } = require("worker_threads"); let x = 0; for (let i = 0; i < 2e8; i++) x += Math.sqrt(i); parentPort.postMessage(x);`;
  const script = path.join(dir, "spin.js");
  fs.writeFileSync(script, code);
  const timeThreads = (n) => {
    const r = spawnSync(process.execPath, ["-e", `const { Worker } = require("worker_threads"); const t = Date.now(); let d = 0; for (let k = 0; k < ${n}; k++) new Worker(${JSON.stringify(script)}).on("message", () => { if (++d === ${n}) console.log(Date.now() - t); });`], { encoding: "utf8" });
    return Number(r.stdout.trim()) / 1000;
  };
  const one = timeThreads(1);
  const two = timeThreads(2);
  return { one, two, gain: (2 * one) / two };
}

/** Heap-capped and uncapped runs at several sizes (FANWISE_BENCH_MANY_HEAP). */
function heapRuns() {
  console.log(`many series, memory: fan --method auto --horizon 12, long file, --jobs 1; heap capped at ${HEAP_MB} MB and uncapped; Node ${process.version}, load ${os.loadavg().map((x) => x.toFixed(1)).join(" ")}`);
  for (const n of MEMORY_SIZES) {
    const fm = writeFiles(makeSeries(n, LENGTH, 20261202), n);
    const outs = [];
    for (const nodeArgs of [[`--max-old-space-size=${HEAP_MB}`], []]) {
      const out = path.join(dir, `out-heap-${n}-${nodeArgs.length}.csv`);
      const m = runFan(fm.long, true, 1, out, nodeArgs);
      outs.push(fs.readFileSync(out, "utf8"));
      console.log(`${n} series, ${nodeArgs.length ? `heap ≤ ${HEAP_MB} MB` : "no cap"}: peak ${m.mb.toFixed(0)} MB, ${m.wall.toFixed(1)} s wall (${(n / m.wall).toFixed(1)} series/s), CPU ${m.cpu.toFixed(1)} s`);
    }
    console.log(`  outputs equal: ${outs[0] === outs[1] ? "yes" : "NO"}`);
  }
  fs.rmSync(dir, { recursive: true, force: true });
}

function main() {
  if (HEAP_MB) return heapRuns();
  console.log(`many series: ${COUNT} × ${LENGTH} monthly points, fan --method auto --horizon 12; ${os.cpus().length} cores, load ${os.loadavg().map((x) => x.toFixed(1)).join(" ")}, Node ${process.version}`);
  const series = makeSeries(COUNT, LENGTH, 20261202);
  const f = writeFiles(series, COUNT);
  console.log(`files: long ${(fs.statSync(f.long).size / 1e6).toFixed(1)} MB, wide ${(fs.statSync(f.wide).size / 1e6).toFixed(1)} MB`);
  const outs = {};
  const rows = [];
  for (const [shape, file, long] of [["long", f.long, true], ["wide", f.wide, false]]) {
    for (const jobs of [1, 2]) {
      const out = path.join(dir, `out-${shape}-${jobs}.csv`);
      const m = runFan(file, long, jobs, out);
      outs[`${shape}-${jobs}`] = fs.readFileSync(out, "utf8");
      rows.push({ shape, jobs, ...m });
      console.log(`${shape}, --jobs ${jobs}: ${m.wall.toFixed(1)} s wall (${(COUNT / m.wall).toFixed(1)} series/s), CPU ${m.cpu.toFixed(1)} s, peak memory ${m.mb.toFixed(0)} MB`);
    }
  }
  const cal = calibrate();
  console.log(`this machine now: the same pure computation in 2 threads gives ${cal.gain.toFixed(2)}× the throughput of 1 thread (${cal.one.toFixed(1)} s for 1 unit, ${cal.two.toFixed(1)} s for 2 units in 2 threads; 2.00× on two idle cores)`);
  const ref = outs["long-1"];
  const same = Object.values(outs).every((o) => o === ref);
  console.log(`outputs byte-equal (long = wide, --jobs 2 = --jobs 1): ${same ? "yes" : "NO"} (${(ref.length / 1e6).toFixed(2)} MB of CSV)`);
  for (const shape of ["long", "wide"]) {
    const one = rows.find((r) => r.shape === shape && r.jobs === 1);
    const two = rows.find((r) => r.shape === shape && r.jobs === 2);
    console.log(`${shape}: ratio --jobs 2 / --jobs 1 in series per second: ${(one.wall / two.wall).toFixed(2)}×`);
  }
  for (const n of MEMORY_SIZES) {
    const fm = writeFiles(makeSeries(n, LENGTH, 20261202), n);
    const m = runFan(fm.long, true, 2, path.join(dir, `out-mem-${n}.csv`));
    console.log(`memory: ${n} series, long, --jobs 2: peak ${m.mb.toFixed(0)} MB, ${m.wall.toFixed(1)} s wall (${(n / m.wall).toFixed(1)} series/s)`);
  }
  // The auto rule per series on 20 years of monthly data (issue 17 §1: ≤ 100 ms).
  const twenty = makeSeries(40, 240, 7);
  engine.fitForecast(twenty[0], { period: 12 });
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  const picked = new Map();
  for (const x of twenty) {
    const fit = engine.fitForecast(x, { period: 12 });
    const key = `${fit.method}, λ ${fit.lambda}`;
    picked.set(key, (picked.get(key) || 0) + 1);
  }
  const wall = Number(process.hrtime.bigint() - t0) / 1e6 / twenty.length;
  const cu = process.cpuUsage(c0);
  console.log(`auto (readable λ × forms by AICc) on 240 monthly points: ${wall.toFixed(1)} ms wall, ${((cu.user + cu.system) / 1e3 / twenty.length).toFixed(1)} ms CPU per series (${twenty.length} series; picked ${Array.from(picked, ([k, v]) => `${k}: ${v}`).join("; ")})`);
  const l0 = process.cpuUsage();
  for (const x of twenty) engine.fitLambdaForModel(x, { kind: "box-cox", shift: 0, period: 12, label: "x", lambdaMethod: "auto" });
  const lu = process.cpuUsage(l0);
  console.log(`λ alone (fanwise lambda's auto: the same rule) on 240 monthly points: ${((lu.user + lu.system) / 1e3 / twenty.length).toFixed(1)} ms CPU per series`);
  fs.rmSync(dir, { recursive: true, force: true });
}

main();
