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
require(entry).main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
