// The supply-chain check that .ci/run runs (scripts/audit-deps.js): its offline rules hold on this
// lockfile and catch each kind of problem when it is planted; npm audit reports are sorted as the
// README says (high/critical fail; moderate/low fail unless accepted with a reason). Common practice.
import * as fs from "fs";
import * as path from "path";
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { offlineProblems, classify, compare } = require("../../scripts/audit-deps.js");

const lock = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "..", "package-lock.json"), "utf8"));

test("this lockfile: every runtime package pinned with a sha512 hash, no install scripts, mathjs ≥ 15.2.0", () => {
  const r = offlineProblems(lock);
  expect(r.problems).toEqual([]);
  expect(r.count).toBeGreaterThan(10);
});

test("planted problems are caught: an old mathjs, a missing hash, an install script", () => {
  const bad = JSON.parse(JSON.stringify(lock));
  bad.packages["node_modules/mathjs"].version = "15.1.1";
  bad.packages["node_modules/complex.js"].integrity = undefined;
  bad.packages["node_modules/decimal.js"].hasInstallScript = true;
  const p = offlineProblems(bad).problems.join("\n");
  expect(p).toMatch(/mathjs@15\.1\.1 is older than 15\.2\.0/);
  expect(p).toMatch(/complex\.js@.* has no sha512 integrity hash/);
  expect(p).toMatch(/decimal\.js@.* runs an install script/);
});

test("version order: 15.10.0 > 15.2.0 > 15.1.9 (numeric, not text)", () => {
  expect(compare("15.10.0", "15.2.0")).toBeGreaterThan(0);
  expect(compare("15.1.9", "15.2.0")).toBeLessThan(0);
  expect(compare("15.2.0", "15.2.0")).toBe(0);
});

test("audit reports: high and critical fail, a moderate one fails unless accepted with a reason", () => {
  const report = (severity: string, id: string) => ({
    metadata: { vulnerabilities: { critical: 0, high: 0, moderate: 0, low: 0, info: 0 } },
    vulnerabilities: { somelib: { severity, via: [{ url: `https://github.com/advisories/${id}`, title: "t" }] } },
  });
  expect(classify(report("high", "GHSA-aaaa")).problems).toEqual(["somelib: high (GHSA-aaaa)"]);
  expect(classify(report("critical", "GHSA-bbbb")).problems).toHaveLength(1);
  expect(classify(report("moderate", "GHSA-cccc")).problems[0]).toMatch(/not in the accepted list/);
  const ok = classify(report("moderate", "GHSA-cccc"), { "GHSA-cccc": "only in a code path Fanwise does not bundle" });
  expect(ok.problems).toEqual([]);
  expect(ok.accepted[0]).toMatch(/accepted: only in a code path/);
});
