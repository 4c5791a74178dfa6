#!/usr/bin/env node
// `npm run bench`: speed of λ estimation and smoothing fits, side by side with scipy and
// statsmodels in the same run (ratios, not absolute times, because these machines are noisy), and
// with a baseline build when FANWISE_BENCH_BASELINE is set. Not a test: it asserts nothing.
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { spawnSync } = require("child_process");
const engine = require("../build/engine");
// FANWISE_BENCH_BASELINE=<a checkout of another commit, built with `npm run prepare`>: time that
// engine too, side by side in the same run (same series, same load), e.g. a branch's start commit.
const BASELINE = process.env.FANWISE_BENCH_BASELINE ? require(path.resolve(process.env.FANWISE_BENCH_BASELINE, "build", "engine")) : null;
const ENGINES = BASELINE ? [["baseline", BASELINE], ["current", engine]] : [["current", engine]];

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
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  const r = f();
  const c = process.cpuUsage(c0);
  // CPU time as well as wall time: on a shared machine the wall time of one side can catch a burst
  // of other jobs that the other side missed; the processor time spent is steadier.
  return { seconds: Number(process.hrtime.bigint() - t0) / 1e9, cpu: (c.user + c.system) / 1e6, result: r };
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
  let tmp = null;
  if (haveStatsmodels) {
    tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-bench-")), "ets.f64");
    fs.writeFileSync(tmp, Buffer.from(data.buffer));
  }
  for (const method of ["holt-winters", "damped"]) {
    const timed = {};
    for (let round = 0; round < (BASELINE ? 2 : 1); round++) {
      for (const [name, E] of ENGINES) {
        for (let s = 0; s < 10; s++) E.fitSmoothing(rows[s], method, 12);
        const t = time(() => rows.map((x) => E.fitSmoothing(x, method, 12).loglik));
        if (!timed[name] || t.cpu < timed[name].cpu) timed[name] = t;
      }
    }
    let ref = null;
    if (haveStatsmodels) {
      const r = spawnSync(py, [path.join(__dirname, "statsmodels_ets.py"), tmp, String(count), String(length), method], { encoding: "utf8", maxBuffer: 1 << 28 });
      if (r.status !== 0) console.log(`  statsmodels comparison failed: ${r.stderr.trim().split("\n").pop()}`);
      else ref = JSON.parse(r.stdout);
    }
    if (ref) console.log(`${method}, ${count} series × ${length}: statsmodels ETSModel (default start) ${ref.seconds.toFixed(2)} s (${((ref.seconds / count) * 1e3).toFixed(1)} ms per fit; CPU ${ref.cpu_seconds.toFixed(2)} s)`);
    for (const [name] of ENGINES) {
      const ours = timed[name];
      const tag = BASELINE ? `[${name}] ` : "";
      let line = `${tag}${method}, ${count} series × ${length}: Fanwise ${ours.seconds.toFixed(2)} s (${((ours.seconds / count) * 1e3).toFixed(2)} ms per fit; CPU ${ours.cpu.toFixed(2)} s)`;
      if (ref) {
        let asGood = 0;
        let worst = 0;
        ref.llf.forEach((l, i) => {
          if (ours.result[i] >= l - 1e-6) asGood++;
          worst = Math.min(worst, ours.result[i] - l);
        });
        line += `; speed ratio ${(ref.seconds / ours.seconds).toFixed(1)}× (CPU time ${(ref.cpu_seconds / ours.cpu).toFixed(1)}×); log-likelihood ≥ statsmodels' − 1e-6 on ${((100 * asGood) / count).toFixed(1)}% of series (worst shortfall ${worst.toExponential(2)})`;
      }
      console.log(line);
    }
  }
  for (const [name, E] of ENGINES) {
    const tag = BASELINE ? `[${name}] ` : "";
    // Cost of a total: 10,000 paths × 24 steps, simulated and back-transformed.
    const f = E.fitForecast(rows[0].map(Math.exp), { method: "holt-winters", lambda: 0, period: 12 });
    E.totalForecast(f, 24);
    const tot = time(() => E.totalForecast(f, 24, { paths: 10000 }));
    console.log(`${tag}total over 24 steps from 10,000 simulated paths (holt-winters, log scale): ${(tot.seconds * 1e3).toFixed(0)} ms`);
    const long = Array.from({ length: 240 }, (_, t) => Math.exp(data[t % data.length] + 0.002 * t));
    E.fitForecast(long, { period: 12 });
    const auto = time(() => E.fitForecast(long, { period: 12 }));
    console.log(`${tag}worst realistic cell call: auto on 20 years of monthly data: ${(auto.seconds * 1e3).toFixed(0)} ms (${auto.result.method})`);
    // Backtest: holt-winters on 20 years of monthly data, every origin from two seasons + parameters on.
    const bt = time(() => E.backtest(long, 12, { method: "holt-winters", lambda: 0, period: 12, level: 80 }));
    console.log(`${tag}backtest, holt-winters, 240 monthly points, every origin (${bt.result.rows[0].origins} refits), 12 steps: ${bt.seconds.toFixed(2)} s`);
  }
}

function timeLambda(E, rows) {
  // Warm up the JIT on a few series so the timing reflects steady state.
  for (let s = 0; s < 50; s++) E.lambdaMle(rows[s], { lower: -5, upper: 5 });
  const mle = time(() => rows.map((x) => E.lambdaMle(x, { lower: -5, upper: 5 }).lambda));
  const mleOnly = time(() => rows.map((x) => E.lambdaMle(x, { lower: -5, upper: 5, withInterval: false }).lambda));
  const mleDefault = time(() => rows.map((x) => E.lambdaMle(x).lambda));
  const guerrero = time(() => rows.map((x) => E.lambdaGuerrero(x, { window: 12 }).lambda));
  return { mle, mleOnly, mleDefault, guerrero };
}

function main() {
  const data = makeSeries();
  const rows = [];
  for (let s = 0; s < COUNT; s++) rows.push(Array.from(data.subarray(s * LENGTH, (s + 1) * LENGTH)));
  const timed = {};
  // Interleaved (baseline, current, baseline, current) and the run with less CPU time kept, so a
  // burst of load on the shared machine does not land on one engine only.
  for (let round = 0; round < 2; round++) {
    for (const [name, E] of ENGINES) {
      const t = timeLambda(E, rows);
      const prev = timed[name];
      timed[name] = prev ? Object.fromEntries(Object.entries(t).map(([k, v]) => [k, v.cpu < prev[k].cpu ? v : prev[k]])) : t;
    }
  }
  for (const [name] of ENGINES) {
    const { mle, mleOnly, mleDefault, guerrero } = timed[name];
    const tag = BASELINE ? `[${name}] ` : "";
    console.log(`${tag}λ by maximum likelihood (bounds [-5, 5], with 95% interval), ${COUNT} series × ${LENGTH}: ${mle.seconds.toFixed(2)} s (${((mle.seconds / COUNT) * 1e6).toFixed(0)} µs per series)`);
    console.log(`${tag}λ by maximum likelihood (bounds [-5, 5], λ only, as scipy):         ${mleOnly.seconds.toFixed(2)} s`);
    console.log(`${tag}λ by maximum likelihood (default bounds [-1, 2], with interval):  ${mleDefault.seconds.toFixed(2)} s`);
    console.log(`${tag}λ by Guerrero's method (window 12):                               ${guerrero.seconds.toFixed(2)} s (${((guerrero.seconds / COUNT) * 1e6).toFixed(0)} µs per series)`);
  }
  lambdaFloor(rows, timed.current.mle.seconds / COUNT, timed.current.mleOnly.seconds / COUNT);

  const py = "/usr/bin/python3";
  const has = (mod) => fs.existsSync(py) && spawnSync(py, ["-c", `import ${mod}`], { encoding: "utf8" }).status === 0;
  const haveScipy = has("scipy");
  const haveStatsmodels = has("statsmodels");
  if (!haveStatsmodels) console.log("statsmodels comparison skipped: Debian's python3-statsmodels is not installed.");
  for (const [name] of ENGINES) benchLambda(py, haveScipy, data, rows, timed[name].mle, timed[name].mleOnly, BASELINE ? `[${name}] ` : "");
  console.log("");
  benchEts(py, haveStatsmodels);
}

/**
 * The physical floor of the λ search: its exponentials and logarithms alone. Counts the profile
 * evaluations per series (each is one Math.expm1 per value, or none at λ = 0 exactly) and times
 * Math.expm1 and Math.log in a bare loop over as many values.
 */
function lambdaFloor(rows, perSeries, perSeriesOnly) {
  let profileMod;
  let searchMod;
  try {
    profileMod = require("../build/engine/transform/box-cox-profile");
    searchMod = require("../build/engine/transform/lambda-mle");
  } catch {
    return;
  }
  let evalsMax = 0;
  let evalsAll = 0;
  let zeroStarts = 0;
  for (const x of rows) {
    const p = new profileMod.BoxCoxProfile(x);
    const top = searchMod.maximiseProfile(p, -5, 5);
    evalsMax += p.evaluations;
    zeroStarts++; // the first evaluation is at λ = 0: no exponential
    searchMod.intervalEnd(p, top, 0.5 * engine.chiSquareQuantile(0.95, 1), -1);
    searchMod.intervalEnd(p, top, 0.5 * engine.chiSquareQuantile(0.95, 1), +1);
    evalsAll += p.evaluations;
  }
  const n = rows[0].length;
  const N = 1 << 20;
  const xs = new Float64Array(N);
  for (let i = 0; i < N; i++) xs[i] = ((i % 1000) / 1000) * 2 - 1;
  const perCall = (f) => {
    let best = Infinity;
    let sink = 0;
    for (let r = 0; r < 7; r++) {
      const t0 = process.hrtime.bigint();
      sink += f();
      best = Math.min(best, Number(process.hrtime.bigint() - t0));
    }
    return sink === 12345.678 ? 0 : best / N / 1e9;
  };
  const tExp = perCall(() => { let s = 0; for (let i = 0; i < N; i++) s += Math.expm1(0.3 * xs[i]); return s; });
  const tLog = perCall(() => { let s = 0; for (let i = 0; i < N; i++) s += Math.log(2 + xs[i]); return s; });
  const count = rows.length;
  const expCalls = (evalsAll - zeroStarts) / count;
  const expCallsOnly = (evalsMax - zeroStarts) / count;
  const floor = (expCalls * tExp + tLog) * n;
  const floorOnly = (expCallsOnly * tExp + tLog) * n;
  console.log(`λ floor: ${(evalsMax / count).toFixed(2)} profile evaluations per series for λ̂ (the first at λ = 0 needs no exponential), ${(evalsAll / count).toFixed(2)} with both interval ends; Math.expm1 ${(tExp * 1e9).toFixed(1)} ns, Math.log ${(tLog * 1e9).toFixed(1)} ns per call`);
  console.log(`  floor (one log pass + ${expCallsOnly.toFixed(2)} / ${expCalls.toFixed(2)} exponential passes over ${n} values): ${(floorOnly * 1e6).toFixed(1)} µs λ only, ${(floor * 1e6).toFixed(1)} µs with interval; measured ${(perSeriesOnly * 1e6).toFixed(1)} / ${(perSeries * 1e6).toFixed(1)} µs (${(perSeriesOnly / floorOnly).toFixed(1)}× / ${(perSeries / floor).toFixed(1)}× the floor)`);
}

let scipyRef = null;

function benchLambda(py, haveScipy, data, rows, mle, mleOnly, tag = "") {
  if (!haveScipy) {
    console.log("scipy comparison skipped: Debian's python3-scipy is not installed (apt-get install -y python3-scipy).");
    return;
  }
  if (!scipyRef) {
    const tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-bench-")), "series.f64");
    fs.writeFileSync(tmp, Buffer.from(data.buffer));
    const r = spawnSync(py, [path.join(__dirname, "scipy_lambda.py"), tmp, String(COUNT), String(LENGTH)], { encoding: "utf8", maxBuffer: 1 << 28 });
    if (r.status !== 0) {
      console.log(`scipy comparison failed: ${r.stderr.trim().split("\n").pop()}`);
      return;
    }
    scipyRef = JSON.parse(r.stdout);
    console.log(`scipy ${scipyRef.scipy} boxcox_normmax(method='mle') on the same series:            ${scipyRef.seconds.toFixed(2)} s (no interval)`);
  }
  const ref = scipyRef;
  let worst = 0;
  let worstAt = -1;
  ref.lambdas.forEach((l, i) => {
    const d = Math.max(Math.abs(l - mle.result[i]), Math.abs(l - mleOnly.result[i]));
    if (d > worst) { worst = d; worstAt = i; }
  });
  console.log(`${tag}speed ratio (scipy time / Fanwise time): ${(ref.seconds / mleOnly.seconds).toFixed(1)}× for λ alone, ${(ref.seconds / mle.seconds).toFixed(1)}× with the 95% interval too; in CPU time ${(ref.cpu_seconds / mleOnly.cpu).toFixed(1)}× and ${(ref.cpu_seconds / mle.cpu).toFixed(1)}× (scipy ${ref.cpu_seconds.toFixed(2)} s, Fanwise ${mleOnly.cpu.toFixed(2)} / ${mle.cpu.toFixed(2)} s)`);
  console.log(`${tag}largest |Δλ| against scipy: ${worst.toExponential(2)} (series ${worstAt})`);
}

main();
