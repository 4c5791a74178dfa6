#!/usr/bin/env node
// ARIMA benchmark (part of `npm run bench`): fitting a given seasonal ARIMA(0,1,1)(0,1,1)12 and the
// automatic search on monthly series, side by side with statsmodels' SARIMAX(...).fit() in the same
// run (ratios, not absolute times: these machines are noisy). Not a test: it asserts nothing.
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { spawnSync } = require("child_process");
const engine = require("../build/engine");

const COUNT = Number(process.env.FANWISE_BENCH_ARIMA || 200);
const LENGTH = 120;

function series() {
  // Log-scale monthly series from a seasonal ARIMA(0,1,1)(0,1,1)12 with random coefficients,
  // each with its own level and noise (seeded).
  const rng = engine.createRandom(18);
  const out = new Float64Array(COUNT * LENGTH);
  for (let s = 0; s < COUNT; s++) {
    const theta = -0.2 - 0.6 * rng.uniform();
    const Theta = -0.2 - 0.6 * rng.uniform();
    const sd = 0.01 + 0.05 * rng.uniform();
    const e = [];
    const w = [];
    for (let t = 0; t < LENGTH; t++) {
      const et = sd * rng.normal();
      e.push(et);
      const back = (k) => (t - k >= 0 ? e[t - k] : 0);
      const x = et + theta * back(1) + Theta * back(12) + theta * Theta * back(13);
      const prev = (k) => (t - k >= 0 ? w[t - k] : 5 + 0.2 * Math.sin((2 * Math.PI * (t - k)) / 12));
      w.push(x + prev(1) + prev(12) - prev(13));
    }
    out.set(w, s * LENGTH);
  }
  return out;
}

// Wall and CPU time of f (CPU time is steadier on a shared machine).
function time(f) {
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  const r = f();
  const c = process.cpuUsage(c0);
  return { seconds: Number(process.hrtime.bigint() - t0) / 1e9, cpu: (c.user + c.system) / 1e6, result: r };
}

// FANWISE_BENCH_BASELINE=<a checkout of another commit, built with `npm run prepare`>: time that
// engine too, in this process, interleaved with this one (baseline, current, baseline, current). The
// fixed-order fits run twice per engine and the round with less CPU time is kept (the first pays for
// compiling the code).
const BASELINE = process.env.FANWISE_BENCH_BASELINE ? require(path.resolve(process.env.FANWISE_BENCH_BASELINE, "build", "engine")) : null;
const ENGINES = BASELINE ? [["baseline", BASELINE], ["current", engine]] : [["current", engine]];

const data = series();
const rows = Array.from({ length: COUNT }, (_, s) => Array.from(data.subarray(s * LENGTH, (s + 1) * LENGTH)));
const airline = { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false };
const fixed = {};
for (let round = 0; round < 2; round++) {
  for (const [name, e] of ENGINES) {
    const t = time(() => rows.map((w) => e.fitArima(w, airline)));
    if (!fixed[name] || t.cpu < fixed[name].cpu) fixed[name] = t;
  }
}
for (const [name] of ENGINES) {
  const t = fixed[name];
  console.log(`ARIMA(0,1,1)(0,1,1)12 on ${COUNT} series × ${LENGTH}: Fanwise${BASELINE ? ` [${name}]` : ""} ${t.seconds.toFixed(2)} s wall, ${t.cpu.toFixed(2)} s CPU`);
}
const python = "/usr/bin/python3";
let sm = null;
if (fs.existsSync(python)) {
  const file = path.join(os.tmpdir(), `fanwise-arima-${process.pid}.f64`);
  fs.writeFileSync(file, Buffer.from(data.buffer));
  // this engine's fitted θ, Θ, σ² (statsmodels' order), for its log-likelihood at them
  const given = path.join(os.tmpdir(), `fanwise-arima-${process.pid}-params.f64`);
  fs.writeFileSync(given, Buffer.from(Float64Array.from(fixed.current.result.flatMap((m) => [m.coefficients.theta[0], m.coefficients.Theta[0], m.sigma ** 2])).buffer));
  const r = spawnSync(python, [path.join(__dirname, "statsmodels_arima.py"), file, String(COUNT), String(LENGTH), "0,1,1", "0,1,1", given], { encoding: "utf8" });
  fs.unlinkSync(file);
  fs.unlinkSync(given);
  if (r.status === 0) sm = JSON.parse(r.stdout.trim().split("\n").pop());
  else console.log(`statsmodels side did not run: ${(r.stderr || "").trim().split("\n").pop()}`);
}
if (sm) {
  console.log(`  statsmodels SARIMAX.fit: ${sm.seconds.toFixed(2)} s wall, ${sm.cpu.toFixed(2)} s CPU`);
  for (const [name] of ENGINES) {
    const t = fixed[name];
    let asGood = 0, worst = 0;
    t.result.forEach((m, i) => { const d = sm.llf[i] - m.loglik; if (d <= 1e-4) asGood++; if (d > worst) worst = d; });
    console.log(`  Fanwise${BASELINE ? ` [${name}]` : ""} is ${(sm.seconds / t.seconds).toFixed(1)}× faster (wall), ${(sm.cpu / t.cpu).toFixed(1)}× (CPU); likelihood as good (within 1e-4) on ${(100 * asGood / COUNT).toFixed(1)}% of series, worst shortfall ${worst.toExponential(2)}`);
  }
  if (sm.llf_at_given) {
    // Where statsmodels' fit scores higher than Fanwise's, is it a better optimum or another likelihood?
    const short = fixed.current.result.map((m, i) => ({ i, d: sm.llf[i] - m.loglik })).filter((v) => v.d > 0);
    const ours = short.filter((v) => sm.llf_at_given[v.i] >= sm.llf[v.i]).length;
    console.log(`  on the ${short.length} series where statsmodels' fitted log-likelihood is above Fanwise's, statsmodels' own log-likelihood is at least as high at Fanwise's parameters as at its own fit on ${ours} (there the two likelihood functions differ; the optimum is not worse)`);
  }
} else console.log("  (install Debian's python3-statsmodels for the side-by-side figure)");
const autoCount = Math.min(COUNT, Number(process.env.FANWISE_BENCH_ARIMA_AUTO || 50));
const autos = {};
for (const [name, e] of ENGINES) {
  const auto = time(() => rows.slice(0, autoCount).map((w) => e.autoArima(w, 12)));
  autos[name] = auto;
  const models = auto.result.reduce((s, r) => s + r.tried.length, 0);
  console.log(`automatic ARIMA on ${autoCount} of them${BASELINE ? ` [${name}]` : ""}: ${(1000 * auto.seconds / autoCount).toFixed(0)} ms per series wall, ${(1000 * auto.cpu / autoCount).toFixed(0)} ms CPU, ${(models / autoCount).toFixed(1)} models per series (${(1000 * auto.cpu / models).toFixed(1)} ms CPU per model)`);
}
if (BASELINE) {
  const b = autos.baseline.result, c = autos.current.result;
  let same = 0, lower = 0, higher = 0, worst = 0;
  c.forEach((r, i) => {
    if (r.model.title === b[i].model.title) same++;
    const d = r.model.aicc - b[i].model.aicc;
    if (d < -1e-6) lower++;
    if (d > 1e-6) higher++;
    if (d > worst) worst = d;
  });
  console.log(`  current vs baseline search: same model on ${same} of ${autoCount}; chosen AICc lower on ${lower}, higher on ${higher} (largest rise ${worst.toExponential(2)})`);
}
