// Jest configuration for the mutation run (`npm run mutation`, stryker.config.json): the fast tests
// only. Left out: fuzzing (minutes per mutant), the browser tests, the build/bundle and CLI tests
// (they run compiled output, not the mutated sources), and the static checks that read the source
// text (doc comments, purity, functions.json), which the mutation tool's instrumented copy would upset.
// FANWISE_MUTATION_TESTS="test/engine/audit*.test.ts,test/engine/backtest*.test.ts" narrows the
// test set further (globs from the repo root) for a quick run over one folder: a mutant that only
// another test would catch then counts as surviving, so such a score is a lower bound.
const base = require("./jest.config.js");

const only = (process.env.FANWISE_MUTATION_TESTS ?? "").split(",").map((s) => s.trim()).filter((s) => s !== "");

module.exports = {
  ...base,
  ...(only.length ? { testMatch: only.map((g) => `<rootDir>/${g}`) } : {}),
  // ts-jest without type information (transpile only): the sources are type-checked by
  // `npm run typecheck`, and the mutation tool's instrumented copy starts jest once per worker;
  // transpiling alone cuts each start by more than half (measured: one engine test file 8.8 s → 3.5 s).
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json", diagnostics: false, isolatedModules: true }] },
  globalSetup: undefined,
  maxWorkers: 1, // the mutation tool runs its own parallel test processes (stryker.config.json concurrency)
  reporters: ["default"],
  testPathIgnorePatterns: [
    "/node_modules/",
    "/test/build/",
    "/test/cli/",
    "/test/taskpane/pane",
    "/test/functions/fuzz-",
    "/test/functions/browser-smoke",
    "/test/functions/metadata",
    "/test/engine/docs",
    "/test/engine/purity",
  ],
};
