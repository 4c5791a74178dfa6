// Builds the add-in into dist/: functions.js + functions.json (metadata generated from JSDoc by
// custom-functions-metadata-plugin; bad metadata fails the build), the task pane page that hosts
// both (shared runtime), and the icons. `npm start` serves the same build over https.
const path = require("path");
const fs = require("fs");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");

const { markdownToHtml } = require("./scripts/readme-html");

const CERTS = path.join(__dirname, ".certs");

// Two @stdlib helpers probe the JavaScript runtime for generator support with eval() when they load,
// and a third carries a polynomial compiler built on new Function(); the pane's Content-Security-
// Policy forbids both. Point them at the plain-closure versions those same packages ship (what they
// use wherever eval is unavailable), so no eval or new Function is in the bundles at all
// (test/build/bundles.test.ts checks the bundles, test/taskpane/pane.test.ts the page).
const stdlib = (p) => path.join(__dirname, "node_modules", "@stdlib", p);
const NO_EVAL_ALIASES = {
  "@stdlib/math-base-tools-continued-fraction$": stdlib("math-base-tools-continued-fraction/lib/basic.js"),
  "@stdlib/math-base-tools-sum-series$": stdlib("math-base-tools-sum-series/lib/basic.js"),
  "@stdlib/math-base-tools-evalpoly$": stdlib("math-base-tools-evalpoly/lib/main.js"),
};

/** Emits README.html (the functions' help pages) from README.md. */
class ReadmeHtmlPlugin {
  apply(compiler) {
    compiler.hooks.thisCompilation.tap("ReadmeHtmlPlugin", (compilation) => {
      compilation.hooks.processAssets.tap({ name: "ReadmeHtmlPlugin", stage: compiler.webpack.Compilation.PROCESS_ASSETS_STAGE_ADDITIONAL }, () => {
        const md = fs.readFileSync(path.join(__dirname, "README.md"), "utf8");
        compilation.fileDependencies.add(path.join(__dirname, "README.md"));
        compilation.emitAsset("README.html", new compiler.webpack.sources.RawSource(markdownToHtml(md, "Fanwise — README")));
      });
    });
  }
}

module.exports = (env, argv) => {
  const dev = argv.mode !== "production";
  const https =
    fs.existsSync(path.join(CERTS, "localhost.crt"))
      ? {
          type: "https",
          options: {
            ca: fs.readFileSync(path.join(CERTS, "ca.crt")),
            cert: fs.readFileSync(path.join(CERTS, "localhost.crt")),
            key: fs.readFileSync(path.join(CERTS, "localhost.key")),
          },
        }
      : "http";
  return {
    mode: dev ? "development" : "production",
    // No eval-based source maps: the pane's Content-Security-Policy forbids eval.
    devtool: "source-map",
    entry: {
      functions: "./src/functions/functions.ts",
      taskpane: "./src/taskpane/index.ts",
    },
    output: {
      path: path.resolve(__dirname, "dist"),
      filename: "[name].js",
      clean: true,
    },
    resolve: { extensions: [".ts", ".js"], alias: NO_EVAL_ALIASES },
    module: {
      rules: [{ test: /\.ts$/, exclude: /node_modules/, use: { loader: "ts-loader", options: { configFile: "tsconfig.json", compilerOptions: { noEmit: false, sourceMap: true, module: "es2020" } } } }],
    },
    performance: { hints: false },
    plugins: [
      new ReadmeHtmlPlugin(),
      new CustomFunctionsMetadataPlugin({ output: "functions.json", input: "./src/functions/functions.ts" }),
      new HtmlWebpackPlugin({
        filename: "taskpane.html",
        template: "./src/taskpane/taskpane.html",
        // One bundle on the page: taskpane.js imports the functions module (and its registration).
        chunks: ["taskpane"],
        scriptLoading: "blocking",
        inject: "body",
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "assets/*.png", to: "assets/[name][ext]" },
          { from: "src/taskpane/taskpane.css", to: "taskpane.css" },
        ],
      }),
    ],
    devServer: {
      port: 3000,
      server: https,
      headers: { "Access-Control-Allow-Origin": "*" },
      static: false,
      devMiddleware: { writeToDisk: true },
      // Watch only the sources: watching the repo root makes the copy plugin rebuild forever.
      watchFiles: ["src/**/*"],
      hot: false,
      liveReload: false,
      client: false,
      open: false,
    },
  };
};
