// The build's functions.json (generated from JSDoc by custom-functions-metadata-plugin) lists
// every function with the expected id, parameters and result shape.
import * as fs from "fs";
import * as path from "path";

const file = path.join(__dirname, "..", "..", "dist", "functions.json");

interface Param { name: string; type: string; dimensionality?: string; optional?: boolean; customEnumId?: string }
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
  FAN: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["levels", true], ["period", true], ["header", true], ["transform", true], ["shift", true], ["mean", true]],
  QUANTILES: [["values", false], ["horizon", false], ["probs", false], ["method", true], ["lambda", true], ["period", true], ["transform", true], ["shift", true]],
  TOTAL: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["seed", true], ["from", true], ["transform", true], ["shift", true], ["mean", true]],
  TOTALFROMINTERVALS: [["medians", false], ["lowers", false], ["uppers", false], ["level", false], ["lambda", true], ["dependence", true]],
  TOTALACROSS: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["seed", true], ["from", true]],
  SMEARMEAN: [["mu", false], ["residuals", false], ["lambda", false]],
  MODELINFO: [["values", false], ["method", true], ["lambda", true], ["period", true], ["transform", true], ["shift", true]],
  COVERAGE: [["actuals", false], ["lower", false], ["upper", false], ["level", false], ["groups", true], ["horizons", true]],
  INTERVALSCORE: [["actuals", false], ["lower", false], ["upper", false], ["level", false], ["groups", true], ["horizons", true]],
  PINBALL: [["actuals", false], ["quantiles", false], ["p", false]],
  CALIBRATION: [["actuals", false], ["quantiles", false], ["probs", false]],
  BACKTEST: [["values", false], ["horizon", false], ["method", true], ["lambda", true], ["level", true], ["period", true], ["first", true], ["transform", true], ["shift", true], ["mean", true]],
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
    expect(f.helpUrl).toMatch(/^https:\/\/[^/?#]+(\/[^?#]*)?\/README\.html#fw[a-z]+$/);
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

test("every help link is HTTPS and on one origin (the one dist/ was built for; never http:// or a mixture)", () => {
  const meta = JSON.parse(fs.readFileSync(file, "utf8")) as { functions: Fn[] };
  const bases = new Set(meta.functions.map((f) => (f.helpUrl ?? "").replace(/\/README\.html#.*$/, "")));
  expect(bases.size).toBe(1);
  const [base] = [...bases];
  expect(base).toMatch(/^https:\/\//);
  expect(base).not.toMatch(/^http:/);
});

test("error values in input ranges reach the functions (allowErrorForDataTypeAny), and only `any` parameters can receive them", () => {
  // "Manually create JSON metadata for custom functions", allowErrorForDataTypeAny: parameters of
  // type any or any[][] receive errors as input values when the top-level flag is true
  // (https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-json). The JSDoc
  // generator cannot emit it; the build adds it (scripts/origin.js, deployFunctionsJson).
  const meta = JSON.parse(fs.readFileSync(file, "utf8")) as { allowErrorForDataTypeAny?: boolean; functions: Fn[] };
  expect(meta.allowErrorForDataTypeAny).toBe(true);
  // Every range argument (a "values"-like matrix) is `any`, so an error cell in it is seen and refused
  // with its position by coerce.ts instead of Excel answering a bare #VALUE! for the whole call.
  for (const f of meta.functions) for (const p of f.parameters) if (p.dimensionality === "matrix") expect([f.id, p.name, p.type]).toEqual([f.id, p.name, "any"]);
});

describe("the build step that moves help links to the deployed origin (scripts/origin.js)", () => {
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const { deployFunctionsJson } = require("../../scripts/origin.js");
  const src = JSON.stringify({ functions: [{ id: "FAN", helpUrl: "https://localhost:3000/README.html#fwfan", parameters: [] }] });
  test("moves them to any HTTPS origin, keeping the anchor", () => {
    const out = JSON.parse(deployFunctionsJson(src, "https://addins.quillmere.example/fw/"));
    expect(out.functions[0].helpUrl).toBe("https://addins.quillmere.example/fw/README.html#fwfan");
    expect(out.allowErrorForDataTypeAny).toBe(true);
  });
  test("refuses an http:// origin and a help link written for somewhere else", () => {
    expect(() => deployFunctionsJson(src, "http://addins.quillmere.example")).toThrow(/https:\/\//);
    expect(() => deployFunctionsJson(src.replace("https://localhost:3000", "http://elsewhere.example"), "https://addins.quillmere.example")).toThrow(/FW\.FAN: @helpurl http:\/\/elsewhere\.example.* must start with https:\/\/localhost:3000\//);
  });
});

describe("keyword arguments carry custom enums, so Excel's AutoComplete lists them (platform: 'Create custom enums for your custom functions')", () => {
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const { ENUMS } = require("../../scripts/enums.js");
  interface Enum { id: string; type: string; values: { name: string; stringValue: string; tooltip: string }[] }
  const meta = (): { enums?: Enum[]; functions: (Fn & { parameters: (Param & { customEnumId?: string })[] })[] } => JSON.parse(fs.readFileSync(file, "utf8"));
  test("the forecasting methods' list is exactly the engine's METHODS", () => {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const { METHODS } = require("../../src/engine");
    expect(ENUMS.FWMETHOD.map((v: [string, string]) => v[0]).sort()).toEqual([...METHODS].sort());
  });
  test("every forecasting function's method, FITLAMBDA's and the back-transforms' methods point at their enums; λ at none", () => {
    const m = meta();
    const byId = new Map(m.functions.map((f) => [f.id, f]));
    const enumOf = (id: string, p: string): string | undefined => byId.get(id)?.parameters.find((x) => x.name === p)?.customEnumId;
    for (const id of ["FAN", "QUANTILES", "TOTAL", "MODELINFO", "BACKTEST"]) expect([id, enumOf(id, "method")]).toEqual([id, "FWMETHOD"]);
    expect(enumOf("FITLAMBDA", "method")).toBe("FWLAMBDAMETHOD");
    expect(enumOf("BTMEAN", "method")).toBe("FWMEANMETHOD");
    for (const f of m.functions) for (const p of f.parameters) if (p.name === "lambda") expect([f.id, p.customEnumId]).toEqual([f.id, undefined]);
    // every referenced enum is defined, as strings with a tooltip
    const defined = new Map((m.enums ?? []).map((e) => [e.id, e]));
    for (const f of m.functions) for (const p of f.parameters) if (p.customEnumId) {
      const e = defined.get(p.customEnumId);
      expect([f.id, p.name, e?.type]).toEqual([f.id, p.name, "string"]);
      for (const v of e?.values ?? []) expect(v.tooltip.length).toBeGreaterThan(3);
    }
  });
});
