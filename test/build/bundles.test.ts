// What ships, checked over dist/ (made by `npm run build`; `npm test` builds first): size budgets,
// one bundle on the pane's page, no code built from strings, no expression parser, and a strict
// Content-Security-Policy. The budgets and their history are in bench/README.md.
import * as fs from "fs";
import * as path from "path";
import * as zlib from "zlib";

const ROOT = path.join(__dirname, "..", "..");
const DIST = path.join(ROOT, "dist");
const read = (f: string): string => {
  const p = path.join(DIST, f);
  if (!fs.existsSync(p)) throw new Error(`dist/${f} is missing: run \`npm run build\` first (npm test does)`);
  return fs.readFileSync(p, "utf8");
};
const gzipSize = (f: string): number => zlib.gzipSync(fs.readFileSync(path.join(DIST, f)), { level: 9 }).length;

/** Gzip budgets in KiB (gzip -9). Raise one only with a reason in bench/README.md. */
export const BUDGET_KIB = { "functions.js": 112, "taskpane.js": 138 } as const;

describe("size budgets (gzip -9)", () => {
  for (const [f, kib] of Object.entries(BUDGET_KIB)) {
    test(`${f} is under ${kib} KiB`, () => {
      const size = gzipSize(f);
      console.log(`${f}: ${(size / 1024).toFixed(1)} KiB gzip (budget ${kib} KiB)`);
      expect(size).toBeLessThan(kib * 1024);
    });
  }
  test("the pane's page loads one bundle of ours (taskpane.js, which registers the functions too) and the platform's office.js", () => {
    const html = read("taskpane.html");
    const scripts = [...html.matchAll(/<script\b[^>]*\bsrc=["']?([^"' >]+)/g)].map((m) => m[1]);
    expect(scripts).toEqual(["https://appsforoffice.microsoft.com/lib/1/hosted/office.js", "taskpane.js"]);
    expect(html).not.toMatch(/<script\b(?![^>]*\bsrc=)[^>]*>/); // no inline script
    expect(read("taskpane.js")).toMatch(/CustomFunctions\.associate\("BOXCOX"/);
  });
});

describe("no code built from strings in the bundles", () => {
  // What a Content-Security-Policy without 'unsafe-eval' forbids, and what would let text become code.
  const PATTERNS: [string, RegExp][] = [
    ["eval(…)", /(?<![\w$.])eval\s*\(/],
    ["a reference to eval", /[=(,:]\s*eval\s*[;,)}]/],
    ["new Function(…)", /\bnew\s+Function\s*\(/],
    ["Function(…) called without new", /(?<![\w$.])Function\s*\(\s*["'`]/],
    ["a string passed to setTimeout/setInterval", /\bset(Timeout|Interval)\s*\(\s*["'`]/],
    ["document.write", /\bdocument\.write(ln)?\s*\(/],
    ["innerHTML/outerHTML assignment", /\.(inner|outer)HTML\s*=/],
    ["insertAdjacentHTML", /\.insertAdjacentHTML\s*\(/],
  ];
  for (const f of ["functions.js", "taskpane.js"]) {
    test(`${f} has no eval, new Function, string timers or HTML injection`, () => {
      const js = read(f);
      for (const [what, re] of PATTERNS) expect([what, re.test(js)]).toEqual([what, false]);
    });
  }
  test("the patterns do find what they look for (so a pass means something)", () => {
    const planted = 'var a=eval("1");var b=new Function("x");var c=Function("return this");setTimeout("x()",1);var e=eval;d.innerHTML=s;';
    expect(/(?<![\w$.])eval\s*\(/.test(planted)).toBe(true);
    expect(/[=(,:]\s*eval\s*[;,)}]/.test(planted)).toBe(true);
    expect(/\bnew\s+Function\s*\(/.test(planted)).toBe(true);
    expect(/(?<![\w$.])Function\s*\(\s*["'`]/.test(planted)).toBe(true);
    expect(/\bset(Timeout|Interval)\s*\(\s*["'`]/.test(planted)).toBe(true);
    expect(/\.(inner|outer)HTML\s*=/.test(planted)).toBe(true);
  });
});

describe("mathjs: matrix product only, never its expression parser", () => {
  test("the bundles hold none of the parser's messages, nor BigNumber, Complex or Fraction support", () => {
    // Messages that only mathjs's parse/evaluate code contains (mathjs 15, lib/esm/expression/parse.js),
    // and the errors of the decimal.js / fraction.js libraries mathjs uses for BigNumber and Fraction.
    const markers = ["Syntax error in part", "Digit expected, got", "Unexpected end of expression", "Parenthesis ) expected", "[DecimalError]", "Invalid argument", "Division by Zero"];
    for (const f of ["functions.js", "taskpane.js"]) {
      const js = read(f);
      for (const m of markers) expect([f, m, js.includes(m)]).toEqual([f, m, false]);
    }
    // …and the check would see the parser if it were there: mathjs's own file holds the first two.
    const parser = fs.readFileSync(path.join(ROOT, "node_modules", "mathjs", "lib", "esm", "expression", "parse.js"), "utf8");
    expect(parser).toContain("Syntax error in part");
    expect(parser).toContain("Digit expected, got");
  });
  test("the sources import from mathjs only the factories of matrix and multiply (no parse, evaluate, compile or all)", () => {
    const imports: string[] = [];
    const walk = (dir: string): void => {
      for (const d of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, d.name);
        if (d.isDirectory()) walk(p);
        else if (/\.ts$/.test(d.name)) {
          const src = fs.readFileSync(p, "utf8");
          for (const m of src.matchAll(/import\s+(type\s+)?\{([^}]*)\}\s+from\s+"mathjs"/g)) imports.push(...m[2].split(",").map((x) => x.trim()).filter(Boolean));
          expect(src).not.toMatch(/import\s+\*\s+as\s+\w+\s+from\s+"mathjs"|require\("mathjs"\)|from\s+"mathjs\/[^"]*"/);
        }
      }
    };
    walk(path.join(ROOT, "src"));
    const allowed = new Set(["create", "Matrix", "FactoryFunction", "createTyped", "createMatrixClass", "createDenseMatrixClass", "createSparseMatrixClass", "createMatrix", "createEqualScalar", "createAddScalar", "createMultiplyScalar", "createConj", "createSize", "createDot", "createMultiply"]);
    expect(imports.length).toBeGreaterThan(0);
    expect(imports.filter((i) => !allowed.has(i))).toEqual([]);
  });
});

describe("the pane page's Content-Security-Policy is strict", () => {
  const policy = (): Map<string, string[]> => {
    const m = /<meta http-equiv="?Content-Security-Policy"? content="([^"]+)"/.exec(read("taskpane.html"));
    if (!m) throw new Error("no Content-Security-Policy meta tag in dist/taskpane.html");
    return new Map(m[1].split(";").map((d) => d.trim()).filter(Boolean).map((d) => {
      const [name, ...values] = d.split(/\s+/);
      return [name, values] as [string, string[]];
    }));
  };
  test("nothing by default; scripts from this origin and the Office platform only; no connections at all", () => {
    const p = policy();
    expect(p.get("default-src")).toEqual(["'none'"]);
    expect(p.get("script-src")).toEqual(["'self'", "https://appsforoffice.microsoft.com"]);
    expect(p.get("style-src")).toEqual(["'self'"]);
    expect(p.get("connect-src")).toEqual(["'none'"]);
    for (const d of ["object-src", "frame-src", "worker-src", "base-uri", "form-action"]) expect([d, p.get(d)]).toEqual([d, ["'none'"]]);
  });
  test("no unsafe-inline, unsafe-eval, wildcard, data: scripts or bare schemes anywhere", () => {
    for (const [d, values] of policy()) {
      for (const v of values) {
        expect([d, v, /^'unsafe-|^\*$|^https?:$|^\*\./.test(v)]).toEqual([d, v, false]);
        if (d === "script-src") expect([d, v, /^data:|^blob:/.test(v)]).toEqual([d, v, false]);
      }
    }
  });
});
