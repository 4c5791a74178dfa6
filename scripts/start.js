#!/usr/bin/env node
// `npm start`: make development certificates (no sudo: they go to the git-ignored .certs/), build,
// and serve dist/ over https://localhost:3000, then say how to sideload the add-in.
"use strict";
const fs = require("fs");
const path = require("path");
const { spawn } = require("child_process");

const root = path.join(__dirname, "..");
const certs = path.join(root, ".certs");
const files = { ca: path.join(certs, "ca.crt"), cert: path.join(certs, "localhost.crt"), key: path.join(certs, "localhost.key") };

async function ensureCertificates() {
  if (Object.values(files).every((f) => fs.existsSync(f))) return;
  // generateCertificates writes a CA and a localhost certificate signed by it; trusting the CA
  // system-wide needs sudo, so we only generate and tell the user how to trust it.
  const { generateCertificates } = require("office-addin-dev-certs/lib/generate");
  await generateCertificates(files.ca, files.cert, files.key, 30);
  console.log(`Generated development certificates in ${path.relative(root, certs)}/ (valid 30 days).`);
}

function banner() {
  const lines = [
    "",
    "Fanwise is being served at https://localhost:3000",
    "",
    "  Stand-alone pane (runs on the invented demo workbook):  https://localhost:3000/taskpane.html",
    "  Add-in manifest:                                          manifest.xml",
    "",
    "Sideload into Excel:",
    "  Excel on the web: open a workbook, Home > Add-ins > More settings > Upload my add-in, choose manifest.xml.",
    "  Excel desktop (Windows): put manifest.xml in a shared-folder catalog (File > Options > Trust Center >",
    "    Trusted Add-in Catalogs), restart Excel, then Home > Add-ins > Shared Folder > Fanwise.",
    "  Excel desktop (Mac): copy manifest.xml to ~/Library/Containers/com.microsoft.Excel/Data/Documents/wef/.",
    "",
    `The browser must trust the development CA ${path.join(".certs", "ca.crt")} (import it as a trusted root,`,
    "or open https://localhost:3000/taskpane.html once and accept the warning). Press Ctrl+C to stop.",
    "",
  ];
  console.log(lines.join("\n"));
}

function portFree(port) {
  return new Promise((resolve) => {
    const srv = require("net").createServer();
    srv.once("error", () => resolve(false));
    srv.listen(port, () => srv.close(() => resolve(true)));
  });
}

async function main() {
  if (!(await portFree(3000))) {
    console.error("npm start: port 3000 is already in use (is another `npm start` running?). Stop it and try again.");
    process.exit(1);
  }
  await ensureCertificates();
  const bin = path.join(root, "node_modules", "webpack", "bin", "webpack.js");
  const child = spawn(process.execPath, [bin, "serve", "--mode", "development"], { cwd: root, stdio: ["ignore", "pipe", "inherit"] });
  let shown = false;
  child.stdout.on("data", (d) => {
    const s = d.toString();
    for (const line of s.split("\n")) if (/^(ERROR|WARNING) in /.test(line)) process.stdout.write(line + "\n");
    if (!shown && /compiled/.test(s)) {
      shown = true;
      if (/compiled successfully|compiled with \d+ warning/.test(s)) banner();
      else process.stdout.write(s);
    }
  });
  const stop = () => child.kill("SIGTERM");
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  child.on("exit", (code) => process.exit(code ?? 0));
}

main().catch((e) => {
  console.error(`npm start: ${e.message}`);
  process.exit(1);
});
