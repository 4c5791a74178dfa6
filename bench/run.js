#!/usr/bin/env node
// `npm run bench`: speed of λ estimation, side by side with scipy in the same run (ratios, not
// absolute times, because these machines are noisy). Not a test: it asserts nothing.
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { spawnSync } = require("child_process");
const engine = require("../build/engine");

const COUNT = Number(process.env.FANWISE_BENCH_SERIES || 10000);
const LENGTH = 120;

function makeSeries() {
  // Positive monthly series: a seasonal log random walk with drift, each with its own scale,
  // noise and curvature, so λ estimates spread over [-1, 2].
  const rng = engine.createRandom(20261201);
  const out = new Float64Array(COUNT * LENGTH);
  for (let s = 0; s < COUNT; s++) {
    const lambda = -0.5 + 2 * rng.uniform();
    const level = 50 + 500 * rng.uniform();
    const sd = 0.02 + 0.08 * rng.uniform();
    let w = 0;
    for (let t = 0; t < LENGTH; t++) {
      w += 0.004 + sd * rng.normal();
      const v = w + 0.15 * Math.sin((2 * Math.PI * t) / 12);
      // Values whose Box-Cox(λ) scale is the log-like walk above.
      const y = Math.abs(lambda) < 1e-9 ? level * Math.exp(v) : level * Math.pow(Math.max(1 + lambda * v, 0.05), 1 / lambda);
      out[s * LENGTH + t] = y;
    }
  }
  return out;
}

function time(f) {
  const t0 = process.hrtime.bigint();
  const r = f();
  return { seconds: Number(process.hrtime.bigint() - t0) / 1e9, result: r };
}

function etsSeries(count, length) {
  // Log-scale monthly series: a local level with drift and a changing season, plus noise.
  const rng = engine.createRandom(4242);
  const out = new Float64Array(count * length);
  for (let s = 0; s < count; s++) {
    let level = Math.log(100 + 900 * rng.uniform());
    let slope = 0.002 + 0.01 * rng.uniform();
    const amp = 0.05 + 0.3 * rng.uniform();
    const noise = 0.01 + 0.05 * rng.uniform();
    const season = Array.from({ length: 12 }, (_, k) => amp * Math.sin((2 * Math.PI * k) / 12));
    for (let t = 0; t < length; t++) {
      slope += 0.0005 * rng.normal();
      level += slope + 0.3 * noise * rng.normal();
      season[t % 12] += 0.1 * noise * rng.normal();
      out[s * length + t] = level + season[t % 12] + noise * rng.normal();
    }
  }
  return out;
}

function benchEts(py, haveStatsmodels) {
  const count = Number(process.env.FANWISE_BENCH_ETS_SERIES || 1000);
  const length = 120;
  const data = etsSeries(count, length);
  const rows = [];
  for (let s = 0; s < count; s++) rows.push(Array.from(data.subarray(s * length, (s + 1) * length)));
  for (let s = 0; s < 20; s++) engine.fitSmoothing(rows[s], "holt-winters", 12);
  let tmp = null;
  if (haveStatsmodels) {
    tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-bench-")), "ets.f64");
    fs.writeFileSync(tmp, Buffer.from(data.buffer));
  }
  for (const method of ["holt-winters", "damped"]) {
    const ours = time(() => rows.map((x) => engine.fitSmoothing(x, method, 12).loglik));
    console.log(`${method}, ${count} series × ${length}: Fanwise ${ours.seconds.toFixed(2)} s (${((ours.seconds / count) * 1e3).toFixed(2)} ms per fit, grid of starts + Nelder–Mead)`);
    if (!haveStatsmodels) continue;
    const r = spawnSync(py, [path.join(__dirname, "statsmodels_ets.py"), tmp, String(count), String(length), method], { encoding: "utf8", maxBuffer: 1 << 28 });
    if (r.status !== 0) {
      console.log(`  statsmodels comparison failed: ${r.stderr.trim().split("\n").pop()}`);
      continue;
    }
    const ref = JSON.parse(r.stdout);
    let asGood = 0;
    let worst = 0;
    ref.llf.forEach((l, i) => {
      if (ours.result[i] >= l - 1e-6) asGood++;
      worst = Math.min(worst, ours.result[i] - l);
    });
    console.log(`  statsmodels ETSModel (default start) on the same series: ${ref.seconds.toFixed(2)} s; speed ratio ${(ref.seconds / ours.seconds).toFixed(1)}×; our log-likelihood ≥ statsmodels' − 1e-6 on ${((100 * asGood) / count).toFixed(1)}% of series (worst shortfall ${worst.toExponential(2)})`);
  }
  // Cost of a total: 10,000 paths × 24 steps, simulated and back-transformed.
  const f = engine.fitForecast(rows[0].map(Math.exp), { method: "holt-winters", lambda: 0, period: 12 });
  engine.totalForecast(f, 24);
  const tot = time(() => engine.totalForecast(f, 24, { paths: 10000 }));
  console.log(`total over 24 steps from 10,000 simulated paths (holt-winters, log scale): ${(tot.seconds * 1e3).toFixed(0)} ms`);
  const auto = time(() => engine.fitForecast(Array.from({ length: 240 }, (_, t) => Math.exp(data[t % data.length] + 0.002 * t)), { period: 12 }));
  console.log(`worst realistic cell call: auto on 20 years of monthly data: ${(auto.seconds * 1e3).toFixed(0)} ms (${auto.result.method})`);
  // Backtest: holt-winters on 20 years of monthly data, every origin from two seasons + parameters on.
  const long = Array.from({ length: 240 }, (_, t) => Math.exp(data[t % data.length] + 0.002 * t));
  const bt = time(() => engine.backtest(long, 12, { method: "holt-winters", lambda: 0, period: 12, level: 80 }));
  console.log(`backtest, holt-winters, 240 monthly points, every origin (${bt.result.rows[0].origins} refits), 12 steps: ${bt.seconds.toFixed(2)} s`);
}

function main() {
  const data = makeSeries();
  const rows = [];
  for (let s = 0; s < COUNT; s++) rows.push(Array.from(data.subarray(s * LENGTH, (s + 1) * LENGTH)));
  // Warm up the JIT on a few series so the timing reflects steady state.
  for (let s = 0; s < 50; s++) engine.lambdaMle(rows[s], { lower: -5, upper: 5 });
  const mle = time(() => rows.map((x) => engine.lambdaMle(x, { lower: -5, upper: 5 }).lambda));
  const mleOnly = time(() => rows.map((x) => engine.lambdaMle(x, { lower: -5, upper: 5, withInterval: false }).lambda));
  const mleDefault = time(() => rows.map((x) => engine.lambdaMle(x).lambda));
  const guerrero = time(() => rows.map((x) => engine.lambdaGuerrero(x, { window: 12 }).lambda));
  console.log(`λ by maximum likelihood (bounds [-5, 5], with 95% interval), ${COUNT} series × ${LENGTH}: ${mle.seconds.toFixed(2)} s (${((mle.seconds / COUNT) * 1e6).toFixed(0)} µs per series)`);
  console.log(`λ by maximum likelihood (bounds [-5, 5], λ only, as scipy):         ${mleOnly.seconds.toFixed(2)} s`);
  console.log(`λ by maximum likelihood (default bounds [-1, 2], with interval):  ${mleDefault.seconds.toFixed(2)} s`);
  console.log(`λ by Guerrero's method (window 12):                               ${guerrero.seconds.toFixed(2)} s (${((guerrero.seconds / COUNT) * 1e6).toFixed(0)} µs per series)`);

  const py = "/usr/bin/python3";
  const has = (mod) => fs.existsSync(py) && spawnSync(py, ["-c", `import ${mod}`], { encoding: "utf8" }).status === 0;
  const haveScipy = has("scipy");
  const haveStatsmodels = has("statsmodels");
  if (!haveStatsmodels) console.log("statsmodels comparison skipped: Debian's python3-statsmodels is not installed.");
  benchLambda(py, haveScipy, data, rows, mle, mleOnly);
  console.log("");
  benchEts(py, haveStatsmodels);
}

function benchLambda(py, haveScipy, data, rows, mle, mleOnly) {
  if (!haveScipy) {
    console.log("scipy comparison skipped: Debian's python3-scipy is not installed (apt-get install -y python3-scipy).");
    return;
  }
  const tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-bench-")), "series.f64");
  fs.writeFileSync(tmp, Buffer.from(data.buffer));
  const r = spawnSync(py, [path.join(__dirname, "scipy_lambda.py"), tmp, String(COUNT), String(LENGTH)], { encoding: "utf8", maxBuffer: 1 << 28 });
  if (r.status !== 0) {
    console.log(`scipy comparison failed: ${r.stderr.trim().split("\n").pop()}`);
    return;
  }
  const ref = JSON.parse(r.stdout);
  let worst = 0;
  let worstAt = -1;
  ref.lambdas.forEach((l, i) => {
    const d = Math.max(Math.abs(l - mle.result[i]), Math.abs(l - mleOnly.result[i]));
    if (d > worst) { worst = d; worstAt = i; }
  });
  console.log(`scipy ${ref.scipy} boxcox_normmax(method='mle') on the same series:            ${ref.seconds.toFixed(2)} s (no interval)`);
  console.log(`speed ratio (scipy time / Fanwise time): ${(ref.seconds / mleOnly.seconds).toFixed(1)}× for λ alone, ${(ref.seconds / mle.seconds).toFixed(1)}× with the 95% interval too`);
  console.log(`largest |Δλ| against scipy: ${worst.toExponential(2)} (series ${worstAt})`);
}

main();
