#!/usr/bin/env node
// Issue 17 §2, inside the spreadsheet: what a sheet of 50 `FW.FAN(…, "auto")` cells costs to
// recalculate in the shared runtime, and whether a pool of Web Workers would make it faster.
// Chromium (Debian's, via playwright-core) stands in for the host's browser runtime.
//
// - "runtime": the built functions bundle in the page, with office.js and the custom-functions
//   runtime, as the smoke test loads it; the 50 cells are started together (as a recalculation
//   starts every dirty cell) and awaited; the longest gap between 10 ms ticks of a timer on the
//   same thread says how long the pane would be frozen.
// - "pool": the same bundle loaded in N dedicated Web Workers (a minimal CustomFunctions stand-in
//   that only collects the functions), warmed up first; the 50 calls are queued to whichever worker
//   is free. Start-up (loading the bundle in a worker) is timed separately: a pool started with the
//   runtime pays it once, before the first recalculation.
//
// Every series is new in every round (the cell layer caches fits by series), the rounds alternate
// the two ways, and the output of both ways is compared cell by cell. Run after `npm run build`:
// `node bench/cells.js` (FANWISE_BENCH_CELLS=N cells, FANWISE_BENCH_POOL=N workers, default 2).
"use strict";
/* global window, performance, Worker, navigator, setInterval, clearInterval -- these run inside the page, via page.evaluate */
const fs = require("fs");
const path = require("path");
const http = require("http");

const CELLS = Number(process.env.FANWISE_BENCH_CELLS || 50);
const POOL = Number(process.env.FANWISE_BENCH_POOL || 2);
const ROUNDS = 3;

// The worker: collects the FW functions the bundle registers, answers {id, name, args} messages.
const WORKER = `
self.CustomFunctions = {
  ErrorCode: { invalidValue: "#VALUE!", invalidNumber: "#NUM!", notAvailable: "#N/A" },
  Error: class CFError extends Error { constructor(code, message) { super(message); this.code = code; } },
  associate(name, fn) { (self.fw = self.fw || {})[name] = fn; },
};
importScripts("/functions.js");
self.onmessage = async (e) => {
  const { id, name, args } = e.data;
  try {
    const v = await self.fw[name](...args);
    self.postMessage({ id, value: v.map((r) => r.map((c) => (c instanceof self.CustomFunctions.Error ? { error: c.code + "|" + c.message } : c))) });
  } catch (err) {
    self.postMessage({ id, value: [[{ error: String(err && err.message) }]] });
  }
};
self.postMessage({ ready: true });
`;

async function main() {
  const dist = path.join(__dirname, "..", "dist");
  if (!fs.existsSync("/usr/bin/chromium") || !fs.existsSync(path.join(dist, "functions.js"))) {
    console.log("cells benchmark skipped: needs /usr/bin/chromium and a build (npm run build).");
    return;
  }
  const office = path.join(__dirname, "..", "node_modules", "@microsoft", "office-js", "dist");
  const files = {
    "/cells.html": ["text/html", '<!doctype html><html><head><script src="/office.js"></script><script src="/custom-functions-runtime.js"></script></head><body><script src="/functions.js"></script></body></html>'],
    "/worker.js": ["text/javascript", WORKER],
    "/office.js": ["text/javascript", null, path.join(office, "office.js")],
    "/custom-functions-runtime.js": ["text/javascript", null, path.join(office, "custom-functions-runtime.js")],
    "/functions.js": ["text/javascript", null, path.join(dist, "functions.js")],
  };
  const server = http.createServer((req, res) => {
    const f = files[(req.url || "/").split("?")[0]];
    if (!f) { res.writeHead(404); res.end(); return; }
    res.writeHead(200, { "content-type": f[0] });
    if (f[1] !== null) res.end(f[1]);
    else fs.createReadStream(f[2]).pipe(res);
  });
  await new Promise((r) => server.listen(0, "127.0.0.1", r));
  const port = server.address().port;
  const { chromium } = require("playwright-core");
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"] });
  try {
    const context = await browser.newContext();
    await context.route("**/*", (route) => (route.request().url().startsWith(`http://127.0.0.1:${port}`) ? route.continue() : route.abort()));
    const page = await context.newPage();
    await page.goto(`http://127.0.0.1:${port}/cells.html`);
    await page.waitForFunction(() => {
      const cf = window.CustomFunctions;
      return !!cf && !!cf._association && Object.keys(cf._association.mappings || {}).length > 0;
    }, undefined, { timeout: 20000 });
    const result = await page.evaluate(async ({ CELLS, POOL, ROUNDS }) => {
      const cf = window.CustomFunctions;
      const m = cf._association.mappings;
      // 50 invented monthly series of 120 points (10 years), a new set each round.
      const seriesSet = (round) => Array.from({ length: CELLS }, (_, s) => {
        let lv = Math.log(800 + 37 * s + 11 * round);
        return Array.from({ length: 120 }, (_, t) => {
          lv += 0.003 + 0.02 * Math.sin(5 * t + s + 3 * round);
          return [Math.round(100 * Math.exp(lv + 0.15 * Math.cos((2 * Math.PI * t) / 12))) / 100];
        });
      });
      const argsOf = (col) => [col, 12, "auto", "auto", null, 12, null, null, null, null];
      const plain = (v) => v.map((r) => r.map((c) => (c instanceof cf.Error ? { error: `${c.code}|${c.message}` } : c)));
      // The longest time the page's thread did not get to run a 10 ms timer.
      const watch = () => {
        let last = performance.now();
        let worst = 0;
        const id = setInterval(() => { const t = performance.now(); worst = Math.max(worst, t - last); last = t; }, 10);
        return () => { clearInterval(id); return Math.max(worst, performance.now() - last); };
      };
      const runtime = async (cols) => {
        const stop = watch();
        const t0 = performance.now();
        const out = await Promise.all(cols.map((c) => m.FAN(...argsOf(c))));
        const ms = performance.now() - t0;
        return { ms, frozen: stop(), out: out.map(plain) };
      };
      // The pool.
      const t0 = performance.now();
      const workers = await Promise.all(Array.from({ length: POOL }, () => new Promise((resolve) => {
        const w = new Worker("/worker.js");
        w.onmessage = (e) => { if (e.data.ready) resolve(w); };
      })));
      const startup = performance.now() - t0;
      let next = 0;
      const call = (w, args) => new Promise((resolve) => {
        const id = next++;
        w.onmessage = (e) => { if (e.data.id === id) resolve(e.data.value); };
        w.postMessage({ id, name: "FAN", args });
      });
      const pool = async (cols) => {
        const stop = watch();
        const t1 = performance.now();
        const out = new Array(cols.length);
        let k = 0;
        await Promise.all(workers.map(async (w) => {
          while (k < cols.length) {
            const i = k++;
            out[i] = await call(w, argsOf(cols[i]));
          }
        }));
        const ms = performance.now() - t1;
        return { ms, frozen: stop(), out };
      };
      // Warm up both (JIT, the workers' first fit), on a set not used again.
      const warm = seriesSet(99).slice(0, 4);
      await runtime(warm);
      await pool(warm);
      const rounds = [];
      let same = true;
      let worstDiff = 0;
      for (let r = 0; r < ROUNDS; r++) {
        const a = seriesSet(2 * r);
        const b = seriesSet(2 * r + 1);
        // alternate which goes first; each way gets its own fresh series (no cache hits)
        const ra = r % 2 === 0 ? await runtime(a) : null;
        const pa = await pool(r % 2 === 0 ? b : a);
        const rb = r % 2 === 0 ? null : await runtime(b);
        const rt = ra || rb;
        // same numbers: the pool's output for the set the runtime computed, computed again
        const check = await pool(r % 2 === 0 ? a : b);
        rt.out.forEach((rows, i) => rows.forEach((row, j) => row.forEach((c, k) => {
          const d = check.out[i][j][k];
          if (typeof c === "number" && typeof d === "number") worstDiff = Math.max(worstDiff, Math.abs(c - d) / Math.max(1, Math.abs(c)));
          else if (JSON.stringify(c) !== JSON.stringify(d)) same = false;
        })));
        rounds.push({ runtime: rt.ms, runtimeFrozen: rt.frozen, pool: pa.ms, poolFrozen: pa.frozen });
      }
      workers.forEach((w) => w.terminate());
      return { startup, rounds, same, worstDiff, cores: navigator.hardwareConcurrency };
    }, { CELLS, POOL, ROUNDS });
    const f = (x) => x.toFixed(0);
    console.log(`cells: ${CELLS} FW.FAN(…, "auto") cells, 120 monthly points each, Chromium, ${result.cores} cores; pool of ${POOL} Web Workers (start-up ${f(result.startup)} ms, once)`);
    for (const r of result.rounds) {
      console.log(`  runtime ${f(r.runtime)} ms (page frozen up to ${f(r.runtimeFrozen)} ms) | pool ${f(r.pool)} ms (frozen up to ${f(r.poolFrozen)} ms) | ratio ${(r.runtime / r.pool).toFixed(2)}×`);
    }
    const ratios = result.rounds.map((r) => r.runtime / r.pool).sort((a, b) => a - b);
    console.log(`  median ratio ${ratios[Math.floor(ratios.length / 2)].toFixed(2)}× (adopt at ≥ 1.7×); same cells: ${result.same ? "yes" : "NO"}, largest relative difference ${result.worstDiff.toExponential(1)}`);
  } finally {
    await browser.close();
    server.close();
  }
}

main().catch((e) => {
  console.log(`cells benchmark failed: ${e.message}`);
  process.exitCode = 1;
});
