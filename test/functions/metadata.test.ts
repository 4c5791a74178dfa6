// The build's functions.json (generated from JSDoc by custom-functions-metadata-plugin) lists
// every function with the expected id, parameters and result shape.
import * as fs from "fs";
import * as path from "path";

const file = path.join(__dirname, "..", "..", "dist", "functions.json");

interface Param { name: string; type: string; dimensionality?: string; optional?: boolean }
interface Fn { id: string; name: string; description: string; helpUrl?: string; parameters: Param[]; result: { type?: string; dimensionality?: string } }

const expected: Record<string, [string, boolean][]> = {
  BOXCOX: [["values", false], ["lambda", false], ["shift", true]],
  BOXCOXINV: [["values", false], ["lambda", false], ["shift", true]],
  YEOJOHNSON: [["values", false], ["lambda", false]],
  YEOJOHNSONINV: [["values", false], ["lambda", false]],
  FITLAMBDA: [["values", false], ["method", true], ["period", true], ["lower", true], ["upper", true]],
  SCREEN: [["values", false], ["period", true]],
  BTMEAN: [["mu", false], ["sd", false], ["lambda", false], ["method", true]],
  BTQUANTILE: [["mu", false], ["sd", false], ["lambda", false], ["p", false]],
  MEANFROMINTERVAL: [["median", false], ["lower", false], ["upper", false], ["level", false], ["lambda", true], ["method", true]],
  IMPLIEDLAMBDA: [["median", false], ["lower", false], ["upper", false]],
  FAN: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["levels", true], ["period", true], ["header", true]],
  QUANTILES: [["values", false], ["horizon", false], ["probs", false], ["method", true], ["lambda", true], ["period", true]],
  TOTAL: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["seed", true], ["from", true]],
  TOTALFROMINTERVALS: [["medians", false], ["lowers", false], ["uppers", false], ["level", false], ["lambda", true], ["dependence", true]],
  TOTALACROSS: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["seed", true], ["from", true]],
  SMEARMEAN: [["mu", false], ["residuals", false], ["lambda", false]],
  MODELINFO: [["values", false], ["method", true], ["lambda", true], ["period", true]],
  COVERAGE: [["actuals", false], ["lower", false], ["upper", false], ["level", false], ["groups", true], ["horizons", true]],
  INTERVALSCORE: [["actuals", false], ["lower", false], ["upper", false], ["level", false], ["groups", true], ["horizons", true]],
  PINBALL: [["actuals", false], ["quantiles", false], ["p", false]],
  BACKTEST: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["first", true]],
};

test("functions.json was built (npm run build) and lists every FW function with its parameters", () => {
  if (!fs.existsSync(file)) throw new Error("dist/functions.json is missing: run `npm run build` first (npm test does)");
  const meta = JSON.parse(fs.readFileSync(file, "utf8")) as { functions: Fn[] };
  const byId = new Map(meta.functions.map((f) => [f.id, f]));
  for (const [id, params] of Object.entries(expected)) {
    const f = byId.get(id);
    expect(f).toBeDefined();
    if (!f) continue;
    expect(f.name).toBe(id);
    expect(f.description.length).toBeGreaterThan(20);
    expect(f.helpUrl).toMatch(/^https:\/\/localhost:3000\//);
    expect(f.parameters.map((p) => [p.name, Boolean(p.optional)])).toEqual(params);
    // a scalar result carries no dimensionality in the generated metadata
    expect(f.result.dimensionality).toBe(id === "PINBALL" ? undefined : "matrix");
  }
  expect(meta.functions.map((f) => f.id).sort()).toEqual(Object.keys(expected).sort());
});

test("every function's help link points at a section that exists in the built README.html", () => {
  const meta = JSON.parse(fs.readFileSync(file, "utf8")) as { functions: Fn[] };
  const html = fs.readFileSync(path.join(__dirname, "..", "..", "dist", "README.html"), "utf8");
  const ids = new Set(Array.from(html.matchAll(/id="?([\w-]+)"?/g)).map((m) => m[1]));
  const missing = meta.functions.filter((f) => !ids.has((f.helpUrl ?? "").split("#")[1] ?? "")).map((f) => f.id);
  expect(missing).toEqual([]);
});
