// DESIGN.md habit 3: every engine export has a doc comment with an example. This test reads the
// sources, so a new export without one fails here.
import * as fs from "fs";
import * as path from "path";
import * as engine from "../../src/engine";

const ROOT = path.join(__dirname, "..", "..", "src", "engine");

function sources(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? sources(path.join(dir, d.name)) : d.name.endsWith(".ts") ? [path.join(dir, d.name)] : []));
}

test("every function exported by src/engine/index.ts has a doc comment with @example", () => {
  const all = sources(ROOT).map((f) => fs.readFileSync(f, "utf8")).join("\n");
  const missing: string[] = [];
  for (const [name, value] of Object.entries(engine)) {
    if (typeof value !== "function" || /^[A-Z]/.test(name)) continue; // classes are documented on the class
    const aliased = new RegExp(`(\\w+) as ${name}\\b`).exec(fs.readFileSync(path.join(ROOT, "index.ts"), "utf8"));
    const real = aliased ? aliased[1] : name;
    const m = new RegExp(`/\\*\\*((?:(?!\\*/)[\\s\\S])*)\\*/\\s*export (?:async )?function ${real}\\b`).exec(all);
    if (!m || !/@example/.test(m[1])) missing.push(name);
  }
  expect(missing).toEqual([]);
});
