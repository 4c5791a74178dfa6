#!/usr/bin/env node
"use strict";
// Supply-chain check of what ships (the runtime dependencies), run by .ci/run:
//  1. `npm audit --omit=dev`: fails on any high or critical advisory, and on a moderate or low one
//     that is not listed in ACCEPTED below with a reason (the README lists them too). When the
//     registry's advisory service does not answer, it says so plainly: that run did not check.
//  2. Offline, always: every runtime package in package-lock.json is pinned with an integrity hash,
//     none runs an install script, and none is older than the first version free of the advisories
//     named in MINIMUM (so a downgrade fails even where the advisory service is out of reach).
// Exit 0 when clean, 1 when not.
const { spawnSync } = require("child_process");
const fs = require("fs");
const path = require("path");

const ROOT = path.join(__dirname, "..");

/** Moderate/low advisories accepted for now: { "GHSA-…": "why it does not reach Fanwise" }. None today. */
const ACCEPTED = {};

/**
 * First versions free of published advisories that concern what Fanwise ships. mathjs: two
 * high-severity code-execution flaws through its expression parser, GHSA-5v89-rwgr-qj6g and
 * GHSA-29qv-4j9f-fjw5, affect 13.1.0 ≤ v < 15.2.0 (mathjs security advisories, 2026). Fanwise never
 * bundles that parser (test/build/bundles.test.ts), but the floor keeps the package clean anyway.
 */
const MINIMUM = { mathjs: "15.2.0" };

function compare(a, b) {
  const pa = a.split(/[.-]/).map((x) => (/^\d+$/.test(x) ? Number(x) : x));
  const pb = b.split(/[.-]/).map((x) => (/^\d+$/.test(x) ? Number(x) : x));
  for (let i = 0; i < Math.max(pa.length, pb.length); i++) {
    const x = pa[i] ?? 0;
    const y = pb[i] ?? 0;
    if (x === y) continue;
    return typeof x === "number" && typeof y === "number" ? x - y : String(x) < String(y) ? -1 : 1;
  }
  return 0;
}

/** The lockfile's runtime packages and what is wrong with them (offline). */
function offlineProblems(lock) {
  const problems = [];
  const runtime = Object.entries(lock.packages).filter(([k, v]) => k !== "" && !v.dev && !v.devOptional && !v.peer);
  for (const [key, v] of runtime) {
    const name = key.replace(/^.*node_modules\//, "");
    if (!v.integrity || !/^sha512-/.test(v.integrity)) problems.push(`${name}@${v.version} has no sha512 integrity hash in package-lock.json`);
    if (v.hasInstallScript) problems.push(`${name}@${v.version} runs an install script; runtime dependencies must not`);
    if (MINIMUM[name] && compare(v.version, MINIMUM[name]) < 0) problems.push(`${name}@${v.version} is older than ${MINIMUM[name]}, the first version free of its published advisories`);
  }
  return { problems, count: runtime.length };
}

function npmAudit() {
  const r = spawnSync("npm", ["audit", "--omit=dev", "--json"], { cwd: ROOT, encoding: "utf8", timeout: 120000 });
  let report;
  try {
    report = JSON.parse(r.stdout || "{}");
  } catch {
    return { checked: false, why: `npm audit printed no report (${(r.stderr || "").trim().split("\n").pop() || `exit ${r.status}`})` };
  }
  if (report.error || !report.metadata) {
    const e = report.error || {};
    const why = report.message || e.summary || e.detail || (r.stderr || "").trim().split("\n").pop() || `exit ${r.status}`;
    return { checked: false, why: `${e.code ? `${e.code}: ` : ""}${String(why).split("\n")[0]}` };
  }
  return { checked: true, ...classify(report) };
}

/** Sorts an npm audit report (v2 JSON) into problems and accepted advisories. */
function classify(report, accepted_ = ACCEPTED) {
  const problems = [];
  const accepted = [];
  for (const [name, v] of Object.entries(report.vulnerabilities || {})) {
    const ids = (v.via || []).filter((x) => typeof x === "object").map((x) => (x.url || "").split("/").pop() || x.title);
    if (v.severity === "high" || v.severity === "critical") problems.push(`${name}: ${v.severity} (${ids.join(", ") || "via dependencies"})`);
    else if (ids.length && ids.every((id) => accepted_[id])) accepted.push(`${name}: ${v.severity} ${ids.join(", ")} (accepted: ${ids.map((id) => accepted_[id]).join("; ")})`);
    else if (v.severity !== "info") problems.push(`${name}: ${v.severity} (${ids.join(", ") || "via dependencies"}), not in the accepted list`);
  }
  return { problems, accepted, counts: report.metadata.vulnerabilities };
}

function main() {
  const lock = JSON.parse(fs.readFileSync(path.join(ROOT, "package-lock.json"), "utf8"));
  const off = offlineProblems(lock);
  console.log(`audit: ${off.count} runtime packages pinned in package-lock.json; offline checks: ${off.problems.length ? "FAILED" : "passed"} (integrity hashes, no install scripts, advisory floors ${Object.entries(MINIMUM).map(([k, v]) => `${k} ≥ ${v}`).join(", ")}).`);
  for (const p of off.problems) console.log(`  - ${p}`);
  const a = npmAudit();
  if (!a.checked) {
    console.log(`audit: npm audit --omit=dev did NOT run a check: the advisory service did not answer (${a.why}). Nothing is known from it for this run.`);
  } else {
    const c = a.counts;
    console.log(`audit: npm audit --omit=dev: ${c.critical} critical, ${c.high} high, ${c.moderate} moderate, ${c.low} low.`);
    for (const x of a.accepted) console.log(`  accepted: ${x}`);
    for (const p of a.problems) console.log(`  - ${p}`);
  }
  return off.problems.length || (a.checked && a.problems.length) ? 1 : 0;
}

if (require.main === module) process.exit(main());
module.exports = { offlineProblems, classify, compare, MINIMUM };
