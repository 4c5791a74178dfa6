// Lint rules. The engine must stay pure: no Office, DOM or Node I/O imports (DESIGN.md habit 1).
// Nothing may import mathjs's expression parser (text → code): user input must never reach it.
const js = require("@eslint/js");
const tseslint = require("typescript-eslint");

const NO_MATHJS_PARSER = {
  name: "mathjs",
  importNames: ["evaluate", "parse", "compile", "Parser", "parser", "all", "evaluateDependencies", "parseDependencies", "compileDependencies", "ParserDependencies", "parserDependencies", "createEvaluate", "createParse", "createCompile", "createParser"],
  message: "mathjs's expression parser turns text into code; Fanwise never uses it (README, Privacy and security).",
};

module.exports = tseslint.config(
  { ignores: ["node_modules/", "dist/", "build/", "coverage/", "test-output/", "demo-out/", "bench/out/", ".stryker-tmp/", "reports/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.js"],
    languageOptions: { sourceType: "commonjs", globals: { require: "readonly", module: "writable", process: "readonly", __dirname: "readonly", console: "readonly", Buffer: "readonly", setTimeout: "readonly" } },
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
  {
    files: ["src/engine/**/*.ts"],
    rules: {
      "@typescript-eslint/no-explicit-any": "error",
      "no-restricted-imports": ["error", { paths: [NO_MATHJS_PARSER], patterns: ["fs", "path", "os", "child_process", "node:*", "office-*", "*/functions/*", "*/taskpane/*", "*/cli/*"] }],
      "no-restricted-globals": ["error", "window", "document", "Office", "Excel", "CustomFunctions", "process"],
    },
  },
  {
    // The shared reader is pure too: faces read files or cells and hand it text or values.
    files: ["src/io/**/*.ts"],
    rules: {
      "@typescript-eslint/no-explicit-any": "error",
      "no-restricted-imports": ["error", { paths: [NO_MATHJS_PARSER], patterns: ["fs", "path", "os", "child_process", "node:*", "office-*", "*/functions/*", "*/taskpane/*", "*/cli/*"] }],
      "no-restricted-globals": ["error", "window", "document", "Office", "Excel", "CustomFunctions", "process"],
    },
  },
  {
    files: ["src/functions/**/*.ts", "src/taskpane/**/*.ts", "src/cli/**/*.ts", "src/demo/**/*.ts"],
    rules: { "no-restricted-imports": ["error", { paths: [NO_MATHJS_PARSER] }] },
  },
  {
    // Excel passes ranges as any[][] and the metadata generator needs that spelling.
    files: ["src/functions/functions.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "no-eval": "error",
      "no-new-func": "error",
    },
  },
);
