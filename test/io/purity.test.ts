// The shared reader (src/io) is pure like the engine (DESIGN.md habit 1): it imports only its own
// files and the engine, and touches no host global, so the pane bundles it and the CLI feeds it.
import * as fs from "fs";
import * as path from "path";

test("src/io imports only its own files and the engine, and uses no host global", () => {
  const root = path.join(__dirname, "..", "..", "src", "io");
  const engine = path.join(__dirname, "..", "..", "src", "engine");
  const bad: string[] = [];
  for (const f of fs.readdirSync(root).filter((n) => n.endsWith(".ts"))) {
    const src = fs.readFileSync(path.join(root, f), "utf8");
    for (const m of src.matchAll(/(?:import|export)[^;]*?from\s+"([^"]+)"/g)) {
      const target = path.resolve(root, m[1]);
      if (!m[1].startsWith(".") || !(target.startsWith(root) || target === engine)) bad.push(`${f} imports ${m[1]}`);
    }
    if (/\b(window|document|Office|Excel|process|require)[.(]/.test(src.replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, ""))) bad.push(`${f} uses a host global`);
  }
  expect(bad).toEqual([]);
});
