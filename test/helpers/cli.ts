// Runs the built `fanwise` command (bin/fanwise.js → build/, made by `npm run prepare`).
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as path from "path";

const ROOT = path.join(__dirname, "..", "..");
const BIN = path.join(ROOT, "bin", "fanwise.js");

export interface CliResult { code: number; out: string; err: string }

export function runCli(args: string[], cwd = ROOT): CliResult {
  if (!fs.existsSync(path.join(ROOT, "build", "cli", "fanwise.js"))) {
    throw new Error("build/ is missing: run `npm run prepare` (npm ci does it) before the CLI tests");
  }
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: "utf8" });
  return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
}
