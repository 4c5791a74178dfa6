// Jest configuration for the mutation run (`npm run mutation`, stryker.config.json): the fast tests
// only. Left out: fuzzing (minutes per mutant), the browser tests, the build/bundle and CLI tests
// (they run compiled output, not the mutated sources), and the static checks that read the source
// text (doc comments, purity, functions.json), which the mutation tool's instrumented copy would upset.
const base = require("./jest.config.js");

module.exports = {
  ...base,
  globalSetup: undefined,
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
