#!/usr/bin/env node
"use strict";
// Entry point of the `fanwise` command. The TypeScript sources are compiled into build/
// by `npm ci` / `npm install` (the package's "prepare" script).
const path = require("path");
const fs = require("fs");
const entry = path.join(__dirname, "..", "build", "cli", "fanwise.js");
if (!fs.existsSync(entry)) {
  process.stderr.write("fanwise: not built yet. Run `npm ci` (or `npm run prepare`) in the project folder first.\n");
  process.exit(1);
}
// Output piped into a command that stops reading early (`fanwise fan … | head`) is not an error.
process.stdout.on("error", (e) => {
  if (e && e.code === "EPIPE") process.exit(0);
  process.stderr.write(`fanwise: cannot write the output (${e && e.code ? e.code : e}).\n`);
  process.exit(1);
});
// Anything unexpected still ends in one line, never a stack trace.
const fail = (e) => {
  process.stderr.write(`fanwise: unexpected problem: ${String(e && e.message ? e.message : e).replace(/\s*[\r\n]+\s*/g, " ")}. Please report it.\n`);
  process.exit(1);
};
process.on("uncaughtException", fail);
process.on("unhandledRejection", fail);
require(entry).main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
}, fail);
