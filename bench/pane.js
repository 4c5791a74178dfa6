#!/usr/bin/env node
// In-browser benchmark of the pane's re-render (Debian's Chromium + playwright-core): 10 series ×
// 240 monthly points, then the time of a full re-render (series check of all 10 + fan of one) and
// of a fan-only re-render (a control change), median of repeated runs. Run by `npm run bench`
// after `npm run build`; skipped when /usr/bin/chromium or dist/ is missing.
"use strict";
/* global window, document, performance -- these run inside the page, via page.evaluate */
const fs = require("fs");
const path = require("path");
const http = require("http");

async function main() {
  const dist = path.join(__dirname, "..", "dist");
  if (!fs.existsSync("/usr/bin/chromium") || !fs.existsSync(path.join(dist, "taskpane.html"))) {
    console.log("pane benchmark skipped: needs /usr/bin/chromium and a build (npm run build).");
    return;
  }
  const { chromium } = require("playwright-core");
  const server = http.createServer((req, res) => {
    const f = path.join(dist, (req.url || "/").split("?")[0]);
    if (!f.startsWith(dist) || !fs.existsSync(f) || fs.statSync(f).isDirectory()) { res.writeHead(404); res.end(); return; }
    res.writeHead(200, { "content-type": { ".html": "text/html", ".js": "text/javascript", ".css": "text/css" }[path.extname(f)] || "application/octet-stream" });
    fs.createReadStream(f).pipe(res);
  });
  await new Promise((r) => server.listen(0, "127.0.0.1", r));
  const port = server.address().port;
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"] });
  try {
    const context = await browser.newContext({ viewport: { width: 320, height: 1200 } });
    await context.route("**/*", (route) => (route.request().url().startsWith(`http://127.0.0.1:${port}`) ? route.continue() : route.abort()));
    const page = await context.newPage();
    await page.goto(`http://127.0.0.1:${port}/taskpane.html`);
    await page.waitForFunction(() => window.fanwisePane && window.fanwisePane.renders > 0);
    const result = await page.evaluate(() => {
      // 10 positive seasonal series × 240 months, made in the page from a fixed recipe.
      const names = [];
      const columns = [];
      for (let s = 0; s < 10; s++) {
        names.push(`Series ${s + 1}`);
        const col = [];
        let lv = Math.log(1000 + 500 * s);
        for (let t = 0; t < 240; t++) {
          lv += 0.004 + 0.03 * Math.sin(7 * t + s);
          col.push(Math.round(Math.exp(lv + 0.2 * Math.cos((2 * Math.PI * t) / 12))));
        }
        columns.push(col);
      }
      const pane = window.fanwisePane;
      const time = (f, n) => {
        const xs = [];
        for (let i = 0; i < n; i++) {
          const t0 = performance.now();
          f();
          xs.push(performance.now() - t0);
        }
        xs.sort((a, b) => a - b);
        return xs[Math.floor(n / 2)];
      };
      pane.setData(names, columns);
      const full = time(() => pane.renderAll(), 7);
      const fanOnly = time(() => pane.renderFan(), 7);
      document.getElementById("fw-method").value = "holt-winters";
      const fanHw = time(() => pane.renderFan(), 7);
      return { full, fanOnly, fanHw };
    });
    console.log(`pane re-render, 10 series × 240 points (Chromium, median of 7): full (check all + fan, method auto) ${result.full.toFixed(0)} ms; fan only (a control change, auto) ${result.fanOnly.toFixed(0)} ms; fan only, holt-winters ${result.fanHw.toFixed(0)} ms`);
  } finally {
    await browser.close();
    server.close();
  }
}

main().catch((e) => {
  console.log(`pane benchmark failed: ${e.message}`);
});
