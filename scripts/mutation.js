#!/usr/bin/env node
// `npm run mutation -- [FOLDER…] [--concurrency N] [--sample N --seed S]`: mutation testing
// (StrykerJS) folder by folder.
//
// --sample N tests a seeded simple random sample of N mutants per folder (all of them by default):
// the mutants are listed with Stryker's instrumenter, N drawn without replacement, and the run is
// limited to them (mutate ranges + the ignorer in scripts/mutation-sample.mjs). The folder's score
// is then an estimate, given with its 95% Wilson interval. Mutant sampling as a cheaper estimate of
// the score: Acree (1980), Budd (1980); Wong & Mathur (1995).
//
// Each folder is mutated against its own fast test files only (PLAN below), not the whole suite:
// the jest runner loads every test file of its configuration for every mutant and filters tests by
// name, so a folder run with the 53 fast files cost minutes per mutant here, with its dedicated files
// about a second. A mutant that only some other folder's tests would catch counts as surviving, so
// each folder's score is a lower bound. Results: reports/mutation/<folder>.json (mutation-testing
// report schema) and .html; the per-folder table is printed at the end (and written to
// reports/mutation/summary.md) for MUTATION.md.
"use strict";
const { spawnSync } = require("node:child_process");
const fs = require("node:fs");
const path = require("node:path");

const root = path.resolve(__dirname, "..");

/**
 * Folder (or file group) → the test files that are about it: its own, plus the few other folders' files
 * that exercise it most (added after the seed-20 sample, where those files killed its survivors:
 * the published total for _lib's simulated sums, the λ tests for the models' profile likelihood).
 */
const PLAN = {
  "src/engine/distribution": ["distribution", "distribution-edges", "mean", "backtransform", "transform-forecast"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/transform": ["transform", "transform-edges", "lambda", "lambda-newton", "lambda-model", "transform-forecast"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/audit": ["audit", "audit-edges", "audit-definitions", "audit-log", "backtest-recomputed"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/totals": ["totals-published", "totals-edges", "totals-across", "totals-window", "smearing"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/series": [...["screen", "series-edges", "missing", "bad-input"].map((n) => `test/engine/${n}.test.ts`), "test/functions/header-rule.test.ts"],
  "src/engine/_lib": ["lib", "lib-edges", "projected-bfgs", "distribution", "backtransform", "simulation", "totals-published", "ets"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/models/arima": ["arima", "arima-gaps", "arima-se", "models-edges"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/models": ["ets", "ets-gradient", "models-edges", "forecast", "simulation", "fit-quality", "missing", "transform-forecast", "lambda-model", "screen"].map((n) => `test/engine/${n}.test.ts`),
  // single files, run only when named (e.g. a new file, every one of its mutants)
  "src/engine/_lib/projected-bfgs.ts": ["projected-bfgs", "fit-quality", "ets"].map((n) => `test/engine/${n}.test.ts`),
  "src/engine/models/ets-gradient.ts": ["ets-gradient", "fit-quality", "ets"].map((n) => `test/engine/${n}.test.ts`),
  "src/functions": ["functions", "forecast-functions", "audit-functions", "totals-functions", "arima-functions", "bad-input",
    "error-messages", "forecast-cache-keys", "header-rule", "missing-cells", "cancel", "coerce-edges"].map((n) => `test/functions/${n}.test.ts`),
};

const args = process.argv.slice(2);
const flag = (name, fallback) => {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : fallback;
};
const valued = new Set(["--concurrency", "--sample", "--seed"].map((f) => args.indexOf(f) + 1).filter((i) => i > 0));
const concurrency = flag("--concurrency", 2);
const sampleSize = flag("--sample", 0);
const seed = flag("--seed", 19);
const chosen = args.filter((a, i) => !a.startsWith("--") && !valued.has(i));
for (const f of chosen) {
  if (!PLAN[f.replace(/\/$/, "")]) {
    console.error(`mutation: no plan for "${f}". Folders: ${Object.keys(PLAN).join(", ")}`);
    process.exit(2);
  }
}
const folders = chosen.length ? chosen.map((f) => f.replace(/\/$/, "")) : Object.keys(PLAN).filter((k) => !k.endsWith(".ts"));
const slug = (folder) => folder.replace(/^src\//, "").replace(/[/]/g, "-");

fs.mkdirSync(path.join(root, "reports", "mutation"), { recursive: true });
const base = JSON.parse(fs.readFileSync(path.join(root, "stryker.config.json"), "utf8"));
delete base.$schema;

/** The folder's source files (the models folder's own run leaves out arima/, which has its own line). */
function sourceFiles(folder) {
  if (folder.endsWith(".ts")) return [folder];
  const out = [];
  const walk = (dir) => {
    for (const e of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
      const rel = `${dir}/${e.name}`;
      if (e.isDirectory()) { if (folder !== "src/engine/models") walk(rel); }
      else if (e.name.endsWith(".ts") && !rel.endsWith("mathjs-factories.ts")) out.push(rel);
    }
  };
  walk(folder);
  return out.sort();
}

/** A seeded sample of n of the folder's mutants (Park–Miller generator; Fisher–Yates draw). */
async function drawSample(folder, n) {
  const { Instrumenter } = await import("@stryker-mutator/instrumenter");
  const quiet = new Proxy({}, { get: (_, k) => (String(k).startsWith("is") ? () => false : () => undefined) });
  const files = sourceFiles(folder).map((name) => ({ name, mutate: true, content: fs.readFileSync(path.join(root, name), "utf8") }));
  const { mutants } = await new Instrumenter(quiet).instrument(files, { plugins: null, excludedMutations: [], ignorers: [], noHeader: true });
  let state = seed % 2147483647 || 1;
  const next = () => (state = (state * 48271) % 2147483647) / 2147483647;
  const pool = mutants.slice();
  for (let i = 0; i < Math.min(n, pool.length); i++) {
    const j = i + Math.floor(next() * (pool.length - i));
    [pool[i], pool[j]] = [pool[j], pool[i]];
  }
  return { total: mutants.length, mutants: pool.slice(0, Math.min(n, pool.length)) };
}

/**
 * The engine's and the cell layer's fast test files: the wider set a folder's survivors are
 * re-tested against (`--recheck`), so a mutant that another folder's tests catch counts as killed.
 */
const WIDE = [...new Set(Object.values(PLAN).flat())];

/** Re-tests a folder's survivors (and mutants without coverage) against the wider test set. */
function recheck(folder) {
  const name = slug(folder);
  const file = path.join(root, "reports", "mutation", `${name}.json`);
  if (!fs.existsSync(file)) return;
  const report = JSON.parse(fs.readFileSync(file, "utf8"));
  const sampleFile = path.join(root, "reports", "mutation", `${name}.sample.json`);
  const sample = fs.existsSync(sampleFile) ? JSON.parse(fs.readFileSync(sampleFile, "utf8")) : null;
  const inSample = sample ? new Set(sample.mutants.map((m) => `${m.fileName}|${m.location.start.line + 1}:${m.location.start.column + 1}|${m.mutatorName}|${m.replacement}`)) : null;
  const mutants = [];
  for (const [fname, f] of Object.entries(report.files)) {
    const rel = path.relative(root, path.resolve(root, fname));
    for (const m of f.mutants) {
      if (m.status !== "Survived" && m.status !== "NoCoverage") continue;
      if (inSample && !inSample.has(`${rel}|${m.location.start.line}:${m.location.start.column}|${m.mutatorName}|${m.replacement}`)) continue;
      // Back to the instrumenter's form: lines and columns 0-based.
      mutants.push({ fileName: rel, mutatorName: m.mutatorName, replacement: m.replacement, location: { start: { line: m.location.start.line - 1, column: m.location.start.column - 1 }, end: { line: m.location.end.line - 1, column: m.location.end.column - 1 } } });
    }
  }
  if (!mutants.length) return;
  const listFile = path.join(root, "reports", "mutation", `${name}.recheck-list.json`);
  fs.writeFileSync(listFile, JSON.stringify({ mutants }));
  const config = {
    ...base,
    plugins: ["@stryker-mutator/*", "./scripts/mutation-sample.mjs"],
    ignorers: ["fanwise-sample"],
    incremental: false,
    mutate: mutants.map((m) => `${m.fileName}:${m.location.start.line + 1}:${m.location.start.column}-${m.location.end.line + 1}:${m.location.end.column}`),
    concurrency,
    htmlReporter: { fileName: `reports/mutation/${name}.recheck.html` },
    jsonReporter: { fileName: `reports/mutation/${name}.recheck.json` },
    reporters: ["progress-append-only", "json"],
  };
  const configFile = path.join(root, "reports", `stryker-${name}.recheck.config.json`);
  fs.writeFileSync(configFile, JSON.stringify(config, null, 2));
  console.log(`\n== ${folder}: re-testing ${mutants.length} survivors against the wider test set`);
  spawnSync(process.execPath, [path.join(root, "node_modules", "@stryker-mutator", "core", "bin", "stryker.js"), "run", configFile], {
    cwd: root,
    stdio: "inherit",
    env: { ...process.env, FANWISE_MUTATION_TESTS: WIDE.join(","), FANWISE_MUTATION_SAMPLE: listFile },
  });
}

(async () => {
if (args.includes("--recheck")) {
  for (const folder of folders) recheck(folder);
  summarise();
  return;
}
// --summary: only the table, from the reports already written.
for (const folder of args.includes("--summary") ? [] : folders) {
  const name = slug(folder);
  let mutate = folder.endsWith(".ts") ? [folder] : folder === "src/engine/models"
    ? [`${folder}/*.ts`]
    : [`${folder}/**/*.ts`, "!src/engine/_lib/mathjs-factories.ts"];
  const extra = {};
  const sampleFile = path.join(root, "reports", "mutation", `${name}.sample.json`);
  if (sampleSize > 0) {
    const sample = await drawSample(folder, sampleSize);
    fs.writeFileSync(sampleFile, JSON.stringify({ seed, size: sampleSize, ...sample }));
    // Stryker's mutate range: lines 1-based, columns 0-based (the instrumenter's lines are 0-based).
    mutate = sample.mutants.map((m) => `${m.fileName}:${m.location.start.line + 1}:${m.location.start.column}-${m.location.end.line + 1}:${m.location.end.column}`);
    extra.plugins = ["@stryker-mutator/*", "./scripts/mutation-sample.mjs"];
    extra.ignorers = ["fanwise-sample"];
    extra.incremental = false;
  } else if (fs.existsSync(sampleFile)) {
    fs.unlinkSync(sampleFile);
  }
  const config = {
    ...base,
    ...extra,
    mutate,
    concurrency,
    incrementalFile: `reports/stryker-incremental-${name}.json`,
    htmlReporter: { fileName: `reports/mutation/${name}.html` },
    jsonReporter: { fileName: `reports/mutation/${name}.json` },
    reporters: ["progress-append-only", "html", "json"],
  };
  const configFile = path.join(root, "reports", `stryker-${name}.config.json`);
  fs.writeFileSync(configFile, JSON.stringify(config, null, 2));
  const started = Date.now();
  console.log(`\n== ${folder}: tests ${PLAN[folder].join(", ")}`);
  const r = spawnSync(process.execPath, [path.join(root, "node_modules", "@stryker-mutator", "core", "bin", "stryker.js"), "run", configFile], {
    cwd: root,
    stdio: "inherit",
    env: { ...process.env, FANWISE_MUTATION_TESTS: PLAN[folder].join(","), FANWISE_MUTATION_SAMPLE: sampleSize > 0 ? sampleFile : "" },
  });
  const minutes = ((Date.now() - started) / 60000).toFixed(1);
  fs.appendFileSync(path.join(root, "reports", "mutation", "times.txt"), `${folder}\t${minutes} min\texit ${r.status}\n`);
}

summarise();
})();

/** 95% Wilson score interval for a proportion (Wilson 1927), in percent. */
function wilson(k, n) {
  const z = 1.959963984540054;
  const p = k / n;
  const c = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
  const h = (z / (1 + (z * z) / n)) * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n));
  return `${(100 * (c - h)).toFixed(0)}–${(100 * (c + h)).toFixed(0)}%`;
}

// Per-folder table from the JSON reports (mutation-testing-report-schema statuses; its lines and
// columns are 1-based). A sampled run counts its sampled mutants only.
function summarise() {
const rows = [];
const survivors = [];
for (const folder of Object.keys(PLAN)) {
  const file = path.join(root, "reports", "mutation", `${slug(folder)}.json`);
  if (!fs.existsSync(file)) continue;
  const report = JSON.parse(fs.readFileSync(file, "utf8"));
  const sampleFile = path.join(root, "reports", "mutation", `${slug(folder)}.sample.json`);
  const sample = fs.existsSync(sampleFile) ? JSON.parse(fs.readFileSync(sampleFile, "utf8")) : null;
  const key = (f, l, mutator, replacement) => `${f}|${l.start.line}:${l.start.column}-${l.end.line}:${l.end.column}|${mutator}|${replacement}`;
  const wanted = sample
    ? new Set(sample.mutants.map((m) => key(path.resolve(root, m.fileName), { start: { line: m.location.start.line + 1, column: m.location.start.column + 1 }, end: { line: m.location.end.line + 1, column: m.location.end.column + 1 } }, m.mutatorName, m.replacement)))
    : null;
  const n = { Killed: 0, Timeout: 0, Survived: 0, NoCoverage: 0, Ignored: 0, CompileError: 0, RuntimeError: 0, Wider: 0 };
  // Survivors that the wider test set killed (--recheck), by location and mutation.
  const recheckFile = path.join(root, "reports", "mutation", `${slug(folder)}.recheck.json`);
  const killedWider = new Set();
  if (fs.existsSync(recheckFile)) {
    for (const [fname, f] of Object.entries(JSON.parse(fs.readFileSync(recheckFile, "utf8")).files)) {
      for (const m of f.mutants) if (m.status === "Killed" || m.status === "Timeout") killedWider.add(key(path.resolve(root, fname), m.location, m.mutatorName, m.replacement));
    }
  }
  let matched = 0;
  for (const [fname, f] of Object.entries(report.files)) {
    for (const m of f.mutants) {
      if (wanted && !wanted.has(key(path.resolve(root, fname), m.location, m.mutatorName, m.replacement))) continue;
      matched++;
      const status = (m.status === "Survived" || m.status === "NoCoverage") && killedWider.has(key(path.resolve(root, fname), m.location, m.mutatorName, m.replacement)) ? "Wider" : m.status;
      n[status] = (n[status] ?? 0) + 1;
      if (status === "Survived" || status === "NoCoverage") {
        survivors.push(`${path.relative(root, path.resolve(root, fname))}:${m.location.start.line}:${m.location.start.column} ${m.status} ${m.mutatorName}: ${String(m.replacement).replace(/\s+/g, " ").slice(0, 100)}`);
      }
    }
  }
  const detected = n.Killed + n.Timeout + n.Wider;
  const valid = detected + n.Survived + n.NoCoverage;
  const of = sample ? `${matched} of ${sample.total} (sample, seed ${sample.seed})` : "all";
  const missing = sample && matched < sample.mutants.length ? ` (${sample.mutants.length - matched} sampled not found in the report)` : "";
  rows.push(`| ${folder} | ${of}${missing} | ${valid} | ${n.Killed} | ${n.Timeout} | ${n.Wider} | ${n.Survived} | ${n.NoCoverage} | ${n.Ignored} | ${valid ? ((100 * detected) / valid).toFixed(1) : "—"}% | ${valid ? wilson(detected, valid) : "—"} |`);
}
const table = ["| Folder | Mutants tested | Valid | Killed | Timed out | Killed by other folders' tests | Survived | No coverage | Ignored (static) | Score | 95% interval |", "|---|---|---|---|---|---|---|---|---|---|---|", ...rows].join("\n");
fs.writeFileSync(path.join(root, "reports", "mutation", "summary.md"), `${table}\n\nSurvivors:\n${survivors.join("\n")}\n`);
console.log(`\n${table}\n\nSurvivors (${survivors.length}): reports/mutation/summary.md`);
}
