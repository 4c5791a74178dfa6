/** @type {import('jest').Config} */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json", diagnostics: false }] },
  moduleNameMapper: {
    // office-addin-mock@4 pulls an ESM-only entry; point it at the CommonJS file (see DEVELOPERS.md).
    "^office-addin-manifest$": "<rootDir>/node_modules/office-addin-manifest/lib/officeApp.js",
  },
  testTimeout: 60000,
  // Two test files at a time: jest's default on a 2-core machine is one worker (cores − 1), which
  // leaves a core idle while the main process only waits (CI runs on 2 cores; common practice).
  maxWorkers: 2,
  testSequencer: "<rootDir>/test/helpers/slow-first-sequencer.js",
  // Recompiles build/ when the sources are newer, so the CLI tests never run a stale build.
  globalSetup: "<rootDir>/test/helpers/fresh-cli-build.js",
  reporters: ["default", "<rootDir>/test/helpers/summary-reporter.js"],
};
