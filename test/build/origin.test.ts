// Builds the add-in for an invented HTTPS origin (the project's invented Quillmere scenario) into
// test-output/dist-origin/ and checks what an organisation would host: a manifest for that origin
// that passes the manifest check, help links there, the support page, and no address on this
// machine anywhere. Also: an http:// origin stops the build with a message (FANWISE_ORIGIN path).
// One webpack build: slow on a busy machine (minutes), hence the long timeout.
import * as fs from "fs";
import * as path from "path";
import { spawnSync } from "child_process";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { checkManifest } = require("../../scripts/check-manifest.js");

const ROOT = path.join(__dirname, "..", "..");
const OUT = path.join(ROOT, "test-output", "dist-origin");
const ORIGIN = "https://addins.quillmere.example/tools/fanwise"; // invented
const WEBPACK = path.join(ROOT, "node_modules", "webpack", "bin", "webpack.js");
/** An address on this machine, in any of its spellings. */
const LOCAL = /(https?:)?\/\/(localhost|127\.0\.0\.1|\[::1\])/i;

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? files(path.join(dir, d.name)) : [path.join(dir, d.name)]));
}

let build: ReturnType<typeof spawnSync>;
beforeAll(() => {
  fs.rmSync(OUT, { recursive: true, force: true });
  build = spawnSync(process.execPath, [WEBPACK, "--mode", "production", "--env", `origin=${ORIGIN}/`, "--env", `out=${OUT}`], { cwd: ROOT, encoding: "utf8", env: { ...process.env, FANWISE_ORIGIN: "" } });
}, 900000);

test("npm run build -- --env origin=… succeeds and writes manifest.xml, functions.json, the pane and the support page", () => {
  expect([build.status, String(build.stderr).split("\n").filter((l) => /ERROR/.test(l))]).toEqual([0, []]);
  for (const f of ["manifest.xml", "functions.json", "functions.js", "taskpane.html", "taskpane.js", "taskpane.css", "support.html", "README.html", "assets/icon-32.png"]) {
    expect([f, fs.existsSync(path.join(OUT, f))]).toEqual([f, true]);
  }
});

test("dist/ holds no address on this machine (localhost, 127.0.0.1, [::1]) in any file", () => {
  const hits = files(OUT).filter((f) => !/\.png$/.test(f) && LOCAL.test(fs.readFileSync(f, "utf8"))).map((f) => path.relative(OUT, f));
  expect(hits).toEqual([]);
  // …and the check would see one: the development manifest has them.
  expect(LOCAL.test(fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8"))).toBe(true);
  // A deployed build ships no source maps (they would carry the sources' text to every user).
  expect(files(OUT).filter((f) => f.endsWith(".map"))).toEqual([]);
});

test("the manifest is the deployed one for the origin and passes the manifest check", async () => {
  const xml = fs.readFileSync(path.join(OUT, "manifest.xml"), "utf8");
  expect(await checkManifest(xml, ROOT)).toEqual([]);
  expect(xml).toContain('<SourceLocation DefaultValue="https://addins.quillmere.example/tools/fanwise/taskpane.html"/>');
  expect(xml).toContain('<SupportUrl DefaultValue="https://addins.quillmere.example/tools/fanwise/support.html"/>');
  expect(xml).toContain('id="Functions.Namespace" DefaultValue="FW"');
});

test("every help link in functions.json is on the origin and points at a section of the built README.html", () => {
  const meta = JSON.parse(fs.readFileSync(path.join(OUT, "functions.json"), "utf8")) as { allowErrorForDataTypeAny: boolean; functions: { id: string; helpUrl: string }[] };
  expect(meta.functions.length).toBeGreaterThanOrEqual(18);
  const html = fs.readFileSync(path.join(OUT, "README.html"), "utf8");
  const ids = new Set(Array.from(html.matchAll(/id="?([\w-]+)"?/g)).map((m) => m[1]));
  for (const f of meta.functions) {
    expect([f.id, f.helpUrl.startsWith(`${ORIGIN}/README.html#`)]).toEqual([f.id, true]);
    expect([f.id, ids.has(f.helpUrl.split("#")[1])]).toEqual([f.id, true]);
  }
  expect(meta.allowErrorForDataTypeAny).toBe(true);
});

test("the support page says how to get help, the cautions and the version, and runs no script", () => {
  const page = fs.readFileSync(path.join(OUT, "support.html"), "utf8");
  const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, "package.json"), "utf8"));
  expect(page).toContain(`Version ${pkg.version}`);
  expect(page).toMatch(/Getting help/);
  expect(page).toMatch(/Forecasts are estimates from past patterns/);
  expect(page).toMatch(/#NUM!.*too large to represent/s);
  expect(page).toContain("<code>=FW.</code>");
  expect(page).not.toMatch(/\{\{\w+\}\}/);
  expect(page).not.toMatch(/<script\b/i);
});

test("an http:// origin (here from FANWISE_ORIGIN) stops the build and says to use https://", () => {
  const r = spawnSync(process.execPath, [WEBPACK, "--mode", "production", "--env", `out=${OUT}-refused`], { cwd: ROOT, encoding: "utf8", env: { ...process.env, FANWISE_ORIGIN: "http://addins.quillmere.example" } });
  expect(r.status).not.toBe(0);
  expect(`${r.stdout}${r.stderr}`).toMatch(/the origin must use https:\/\//);
  expect(fs.existsSync(path.join(`${OUT}-refused`, "manifest.xml"))).toBe(false);
}, 120000);
