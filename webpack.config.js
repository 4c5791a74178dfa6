// Builds the add-in into dist/: functions.js + functions.json (metadata generated from JSDoc by
// custom-functions-metadata-plugin; bad metadata fails the build), the task pane page that hosts
// both (shared runtime), the help pages and the icons. `npm start` serves the same build over https.
//
// The origin is a build input: `npm run build -- --env origin=https://host/path` (or FANWISE_ORIGIN)
// also writes dist/manifest.xml for that origin (the deployed identity, namespace FW) and moves the
// functions' help links there; without it, dist/ is for https://localhost:3000 and has no manifest
// (the repository's manifest.xml is the development one). `--env out=dir` builds elsewhere (tests).
const path = require("path");
const fs = require("fs");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");

const { markdownToHtml } = require("./scripts/readme-html");
const { DEV, PROD, DEV_ORIGIN, normaliseOrigin, productionManifest, deployFunctionsJson } = require("./scripts/origin");
const { checkManifest } = require("./scripts/check-manifest");
const pkg = require("./package.json");

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

/**
 * Makes the build deployable: rewrites functions.json for the origin (help links) with the
 * allowErrorForDataTypeAny flag (scripts/origin.js says why), writes the support page, and for an
 * origin build the production manifest, checked by scripts/check-manifest.js (a bad one fails the build).
 */
class DeployPlugin {
  constructor(options) {
    this.options = options;
  }
  apply(compiler) {
    const { origin, namespace } = this.options;
    compiler.hooks.thisCompilation.tap("DeployPlugin", (compilation) => {
      const { RawSource } = compiler.webpack.sources;
      compilation.hooks.processAssets.tapPromise({ name: "DeployPlugin", stage: compiler.webpack.Compilation.PROCESS_ASSETS_STAGE_ADDITIONAL }, async () => {
        const fail = (msg) => compilation.errors.push(new compiler.webpack.WebpackError(`DeployPlugin: ${msg}`));
        const meta = compilation.getAsset("functions.json");
        if (meta) {
          try {
            compilation.updateAsset("functions.json", new RawSource(deployFunctionsJson(meta.source.source().toString(), origin)));
          } catch (e) {
            fail(e.message);
          }
        }
        const supportFile = path.join(__dirname, "src", "help", "support.html");
        compilation.fileDependencies.add(supportFile);
        const fill = { VERSION: pkg.version, NAMESPACE: namespace };
        compilation.emitAsset("support.html", new RawSource(fs.readFileSync(supportFile, "utf8").replace(/\{\{(\w+)\}\}/g, (m, k) => fill[k] ?? m)));
        if (origin === undefined) return;
        try {
          const manifestFile = path.join(__dirname, "manifest.xml");
          compilation.fileDependencies.add(manifestFile);
          const xml = productionManifest(fs.readFileSync(manifestFile, "utf8"), origin, pkg.version);
          const problems = await checkManifest(xml, __dirname);
          if (problems.length) fail(`the manifest for ${origin} fails the check:\n  ${problems.join("\n  ")}`);
          else compilation.emitAsset("manifest.xml", new RawSource(xml));
        } catch (e) {
          fail(e.message);
        }
      });
    });
  }
}

module.exports = (env = {}, argv = {}) => {
  const dev = argv.mode !== "production";
  const originInput = env.origin ?? process.env.FANWISE_ORIGIN;
  // Refuse a bad origin before building anything (http://, a query, not a URL …).
  const origin = originInput === undefined || originInput === "" ? undefined : normaliseOrigin(originInput).base;
  if (origin === undefined && !dev && !process.env.JEST_WORKER_ID) {
    console.log(`Building for ${DEV_ORIGIN} (no dist/manifest.xml). To deploy: npm run build -- --env origin=https://your.host/path (README, Deploying).`);
  }
  // The pane writes =FW.FAN(…) formulas: in the development server the development manifest's
  // namespace is FWDEV; every production build (with or without an origin) uses FW.
  const namespace = dev ? DEV.namespace : PROD.namespace;
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
    // No eval-based source maps: the pane's Content-Security-Policy forbids eval. A build for an
    // origin (deployment) ships no source maps: they would carry the sources' text (development
    // URLs included) to every user; the sources of a version are in the repository.
    devtool: origin ? false : "source-map",
    entry: {
      functions: "./src/functions/functions.ts",
      taskpane: "./src/taskpane/index.ts",
    },
    output: {
      path: env.out ? path.resolve(env.out) : path.resolve(__dirname, "dist"),
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
      new DeployPlugin({ origin, namespace }),
      new (require("webpack").DefinePlugin)({ __FW_NAMESPACE__: JSON.stringify(namespace) }),
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
