// Headless Chromium (Debian's /usr/bin/chromium) driven by playwright-core, with every request
// that leaves the loopback address aborted and recorded, and a tiny static server for test pages.
import * as fs from "fs";
import * as http from "http";
import * as path from "path";
import { AddressInfo } from "net";
import { chromium, Browser, BrowserContext } from "playwright-core";

export const CHROMIUM = "/usr/bin/chromium";
export const CHROMIUM_FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"];

const ROOT = path.join(__dirname, "..", "..");

const TYPES: Record<string, string> = { ".html": "text/html", ".js": "text/javascript", ".json": "application/json", ".css": "text/css", ".png": "image/png", ".svg": "image/svg+xml" };

/** Serves files: `routes` maps a URL path to a file on disk, or to inline content. */
export async function serve(routes: Record<string, string | { body: string; type: string }>): Promise<{ url: string; close: () => Promise<void>; requests: string[] }> {
  const requests: string[] = [];
  const server = http.createServer((req, res) => {
    const p = (req.url ?? "/").split("?")[0];
    requests.push(`${req.method} ${p}`);
    const r = routes[p];
    if (r === undefined) {
      res.writeHead(404, { "content-type": "text/plain" });
      res.end("not found");
      return;
    }
    if (typeof r === "string") {
      res.writeHead(200, { "content-type": TYPES[path.extname(r)] ?? "application/octet-stream" });
      fs.createReadStream(r).pipe(res);
    } else {
      res.writeHead(200, { "content-type": r.type });
      res.end(r.body);
    }
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as AddressInfo).port;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise((resolve) => server.close(() => resolve())), requests };
}

/** A browser context in which only 127.0.0.1 is reachable; `offSite` collects what was refused. */
export async function isolatedBrowser(): Promise<{ browser: Browser; context: BrowserContext; offSite: string[] }> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: apt-get install -y chromium (the .ci/run script does)`);
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_FLAGS });
  const context = await browser.newContext({ viewport: { width: 320, height: 900 } });
  const offSite: string[] = [];
  await context.route("**/*", (route) => {
    const u = route.request().url();
    if (u.startsWith("http://127.0.0.1:") || u.startsWith("data:") || u.startsWith("blob:")) return route.continue();
    offSite.push(u);
    return route.abort();
  });
  return { browser, context, offSite };
}

export function fromRoot(...p: string[]): string {
  return path.join(ROOT, ...p);
}

/** Serves the built add-in (dist/) on 127.0.0.1, plus any `extra` routes (test scripts); `requests` logs what was asked. */
export async function serveDist(extra: Record<string, string | { body: string; type: string }> = {}): Promise<{ url: string; close: () => Promise<void>; requests: string[] }> {
  const dist = path.join(ROOT, "dist");
  if (!fs.existsSync(path.join(dist, "taskpane.html"))) throw new Error("dist/ is missing: run `npm run build` first (npm test does)");
  const routes: Record<string, string> = {};
  const walk = (dir: string, prefix: string): void => {
    for (const d of fs.readdirSync(dir, { withFileTypes: true })) {
      if (d.isDirectory()) walk(path.join(dir, d.name), `${prefix}${d.name}/`);
      else routes[`/${prefix}${d.name}`] = path.join(dir, d.name);
    }
  };
  walk(dist, "");
  return serve({ ...routes, ...extra });
}

const OFFICE_CDN = "https://appsforoffice.microsoft.com/lib/1/hosted/";

/**
 * Like {@link isolatedBrowser}, but the platform's office.js (and the files it loads next to itself)
 * is served from node_modules instead of the CDN, or replaced by `officeJs` (a stand-in host for
 * tests); every other non-loopback request is aborted and recorded.
 */
export async function paneBrowser(options: { officeJs?: string } = {}): Promise<{ browser: Browser; context: BrowserContext; offSite: string[] }> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: apt-get install -y chromium (the .ci/run script does)`);
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_FLAGS });
  const context = await browser.newContext({ viewport: { width: 320, height: 1400 }, acceptDownloads: true });
  const offSite: string[] = [];
  const officeDist = path.join(ROOT, "node_modules", "@microsoft", "office-js", "dist");
  await context.route("**/*", (route) => {
    const u = route.request().url();
    if (u.startsWith(OFFICE_CDN) && options.officeJs !== undefined && u.split("?")[0] === `${OFFICE_CDN}office.js`) {
      return route.fulfill({ body: options.officeJs, contentType: "text/javascript" });
    }
    if (u.startsWith(OFFICE_CDN)) {
      const f = path.join(officeDist, u.slice(OFFICE_CDN.length).split("?")[0]);
      if (f.startsWith(officeDist) && fs.existsSync(f)) return route.fulfill({ path: f, contentType: "text/javascript" });
      return route.fulfill({ status: 404, body: "" });
    }
    if (u.startsWith("http://127.0.0.1:") || u.startsWith("data:") || u.startsWith("blob:")) return route.continue();
    offSite.push(u);
    return route.abort();
  });
  return { browser, context, offSite };
}
