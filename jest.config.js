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
  reporters: ["default", "<rootDir>/test/helpers/summary-reporter.js"],
};
