// Lint rules. The engine must stay pure: no Office, DOM or Node I/O imports (DESIGN.md habit 1).
const js = require("@eslint/js");
const tseslint = require("typescript-eslint");

module.exports = tseslint.config(
  { ignores: ["node_modules/", "dist/", "build/", "coverage/", "test-output/", "demo-out/", "bench/out/"] },
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
      "no-restricted-imports": ["error", { patterns: ["fs", "path", "os", "child_process", "node:*", "office-*", "*/functions/*", "*/taskpane/*", "*/cli/*"] }],
      "no-restricted-globals": ["error", "window", "document", "Office", "Excel", "CustomFunctions", "process"],
    },
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
