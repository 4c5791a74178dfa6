// Stryker ignorer plugin for sampled mutation runs (scripts/mutation.js --sample N): a node is
// ignored (its mutants and its children's are not run) unless its source range holds one of the
// sampled mutants, listed in the file named by FANWISE_MUTATION_SAMPLE. Together with the mutate
// ranges (one per sampled mutant) this keeps the run to the sample and the few mutants that share a
// node with a sampled one; the score is computed on the sampled mutants only.
import fs from "node:fs";
import path from "node:path";
import process from "node:process";
import { PluginKind, declareValuePlugin } from "@stryker-mutator/api/plugin";

const listFile = process.env.FANWISE_MUTATION_SAMPLE;
/** file name (absolute) → sampled locations (babel: lines 1-based, columns 0-based). */
const byFile = new Map();
const all = [];
if (listFile) {
  for (const m of JSON.parse(fs.readFileSync(listFile, "utf8")).mutants) {
    const loc = { start: { line: m.location.start.line + 1, column: m.location.start.column }, end: { line: m.location.end.line + 1, column: m.location.end.column } };
    const key = path.resolve(m.fileName);
    if (!byFile.has(key)) byFile.set(key, []);
    byFile.get(key).push(loc);
    all.push(loc);
  }
}

const before = (a, b) => a.line < b.line || (a.line === b.line && a.column <= b.column);
const holds = (outer, inner) => before(outer.start, inner.start) && before(inner.end, outer.end);

export const strykerPlugins = [
  declareValuePlugin(PluginKind.Ignore, "fanwise-sample", {
    shouldIgnore(nodePath) {
      const loc = nodePath.node && nodePath.node.loc;
      if (!loc || !listFile) return undefined;
      const file = nodePath.hub && nodePath.hub.file && nodePath.hub.file.opts && nodePath.hub.file.opts.filename;
      const candidates = (file && byFile.get(path.resolve(file))) || all;
      return candidates.some((s) => holds(loc, s)) ? undefined : "not in this run's sample (scripts/mutation.js --sample)";
    },
  }),
];
