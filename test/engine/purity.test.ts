// DESIGN.md habit 1: the engine imports nothing from Office, the DOM or Node I/O. (Lint enforces
// the same; this test fails even if the lint config is loosened.)
import * as fs from "fs";
import * as path from "path";

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? files(path.join(dir, d.name)) : d.name.endsWith(".ts") ? [path.join(dir, d.name)] : []));
}

test("src/engine imports only its own files, @stdlib and mathjs", () => {
  const root = path.join(__dirname, "..", "..", "src", "engine");
  const bad: string[] = [];
  for (const f of files(root)) {
    const src = fs.readFileSync(f, "utf8");
    for (const m of src.matchAll(/(?:import|export)[^;]*?from\s+"([^"]+)"|require\("([^"]+)"\)/g)) {
      const spec = m[1] ?? m[2];
      const ok = spec.startsWith("./") || spec.startsWith("../") ? path.resolve(path.dirname(f), spec).startsWith(root) : spec.startsWith("@stdlib/") || spec === "mathjs";
      if (!ok) bad.push(`${path.relative(root, f)} imports ${spec}`);
    }
    if (/\b(window|document|Office|Excel|process)\./.test(src.replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, ""))) bad.push(`${path.relative(root, f)} uses a host global`);
  }
  expect(bad).toEqual([]);
});
