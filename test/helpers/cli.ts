// Runs the built `fanwise` command (bin/fanwise.js → build/). Jest's globalSetup
// (test/helpers/fresh-cli-build.js) recompiles build/ first whenever the sources are newer.
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as path from "path";
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { cliBuildIsFresh } = require("./fresh-cli-build") as { cliBuildIsFresh: () => boolean };

const ROOT = path.join(__dirname, "..", "..");
const BIN = path.join(ROOT, "bin", "fanwise.js");

export interface CliResult { code: number; out: string; err: string }

let checked = false;

export function runCli(args: string[], cwd = ROOT): CliResult {
  if (!fs.existsSync(path.join(ROOT, "build", "cli", "fanwise.js"))) {
    throw new Error("build/ is missing: run `npm run prepare` (npm ci does it) before the CLI tests");
  }
  if (!checked) {
    if (!cliBuildIsFresh()) throw new Error("build/ is older than the sources, so the CLI tests would run old code: run `npm run prepare` (jest's globalSetup does it unless FANWISE_NO_CLI_BUILD=1)");
    checked = true;
  }
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: "utf8" });
  return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
}
