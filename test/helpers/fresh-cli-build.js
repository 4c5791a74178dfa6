// Jest globalSetup: the CLI tests spawn bin/fanwise.js, which runs the compiled build/. A build
// older than the sources would test yesterday's engine, so before any test runs the CLI is
// recompiled (`tsc -p tsconfig.cli.json`, what `npm run prepare` does) whenever a file it compiles
// (the folders listed in tsconfig.cli.json's "include") or a tsconfig is newer than the build.
// A fresh build is left alone, so runs that do not touch the sources pay only the file scan.
// FANWISE_NO_CLI_BUILD=1 skips it (the mutation run, which runs no CLI test, sets it).
const { spawnSync } = require("child_process");
const fs = require("fs");
const path = require("path");

const ROOT = path.join(__dirname, "..", "..");
const OUTPUT = path.join(ROOT, "build", "cli", "fanwise.js");

function newestUnder(dir) {
  let newest = 0;
  if (!fs.existsSync(dir)) return newest;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) newest = Math.max(newest, newestUnder(p));
    else if (e.name.endsWith(".ts")) newest = Math.max(newest, fs.statSync(p).mtimeMs);
  }
  return newest;
}

/** Newest modification time among the CLI build's inputs. */
function newestInput() {
  const config = JSON.parse(fs.readFileSync(path.join(ROOT, "tsconfig.cli.json"), "utf8"));
  let newest = Math.max(fs.statSync(path.join(ROOT, "tsconfig.cli.json")).mtimeMs, fs.statSync(path.join(ROOT, "tsconfig.json")).mtimeMs);
  for (const pattern of config.include ?? []) {
    const dir = pattern.split("/").filter((part) => !part.includes("*")).join("/");
    newest = Math.max(newest, newestUnder(path.join(ROOT, dir)));
  }
  return newest;
}

async function freshCliBuild() {
  if (process.env.FANWISE_NO_CLI_BUILD === "1") return;
  const built = fs.existsSync(OUTPUT) ? fs.statSync(OUTPUT).mtimeMs : -1;
  if (built >= newestInput()) return;
  process.stdout.write(`\nbuild/ is ${built < 0 ? "missing" : "older than the sources"}: compiling the CLI (tsc -p tsconfig.cli.json) so the CLI tests run today's code…\n`);
  const tsc = path.join(ROOT, "node_modules", "typescript", "bin", "tsc");
  const r = spawnSync(process.execPath, [tsc, "-p", "tsconfig.cli.json"], { cwd: ROOT, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`Compiling the CLI failed; the CLI tests cannot run:\n${r.stdout}${r.stderr}`);
}

/** True when build/ exists and is at least as new as every input (runCli checks it too). */
function cliBuildIsFresh() {
  return fs.existsSync(OUTPUT) && fs.statSync(OUTPUT).mtimeMs >= newestInput();
}

module.exports = freshCliBuild;
module.exports.cliBuildIsFresh = cliBuildIsFresh;
