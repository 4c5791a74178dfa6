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

/** Days before expiry from which `npm start` warns. */
const WARN_DAYS = 7;

/**
 * A warning when the development certificate has expired or expires within WARN_DAYS (null when it is
 * fine). Office and the browser refuse an expired certificate, and the add-in then fails to load with
 * no clear message, so say it here. Pure, for tests: `pem` is the certificate, `now` a Date.
 */
function certificateWarning(pem, now = new Date()) {
  const { X509Certificate } = require("crypto");
  let cert;
  try {
    cert = new X509Certificate(pem);
  } catch (e) {
    return `the development certificate ${path.join(".certs", "localhost.crt")} cannot be read (${e.message}). Delete .certs/ and run npm start again to make new ones.`;
  }
  const until = new Date(cert.validTo);
  const days = (until.getTime() - now.getTime()) / 86400000;
  const renew = "Delete .certs/ and run npm start again to make new ones, then trust the new .certs/ca.crt (README, In Excel).";
  if (days <= 0) return `the development certificate expired on ${until.toISOString().slice(0, 10)}: Excel and the browser will refuse to load the add-in. ${renew}`;
  if (days <= WARN_DAYS) return `the development certificate expires on ${until.toISOString().slice(0, 10)} (in ${Math.ceil(days)} day${Math.ceil(days) === 1 ? "" : "s"}). ${renew}`;
  return null;
}

async function ensureCertificates() {
  if (Object.values(files).every((f) => fs.existsSync(f))) {
    const warning = certificateWarning(fs.readFileSync(files.cert));
    if (warning) console.warn(`npm start: WARNING: ${warning}`);
    return;
  }
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
    "  Add-in manifest (development: Fanwise (development), functions =FWDEV.…):  manifest.xml",
    "",
    "Sideload into Excel:",
    "  Excel on the web: open a workbook, Home > Add-ins > More settings > Upload my add-in, choose manifest.xml.",
    "  Excel desktop (Windows): share the folder holding manifest.xml, add its \\\\machine\\share path as a trusted",
    "    catalog (File > Options > Trust Center > Trust Center Settings > Trusted Add-in Catalogs, Show in Menu),",
    "    restart Excel, then Home > Add-ins > More Add-ins > Shared Folder > Fanwise (development).",
    "    If the pane cannot reach this server, allow the webview loopback access (README, Sideloading on Windows).",
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

module.exports = { certificateWarning, WARN_DAYS };

if (require.main === module) {
  main().catch((e) => {
    console.error(`npm start: ${e.message}`);
    process.exit(1);
  });
}
