// The command line against malformed and hostile CSV files: every problem ends in one line on
// stderr ("fanwise: …") and exit 1, never a stack trace; what is legal CSV (RFC 4180 quoting, a
// BOM, CRLF) is read correctly; a 50 MB file is read without holding its text whole. Expectations
// are RFC 4180 (the CSV format) and the project's own error contract (README), common practice.
import { spawn, spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import fc from "fast-check";
import { runCli } from "../helpers/cli";
import { main } from "../../src/cli/fanwise";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-hostile-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function file(name: string, content: string | Buffer): string {
  const p = path.join(dir, name);
  fs.writeFileSync(p, content);
  return p;
}

/** Exit 1 and exactly one line on stderr, starting "fanwise: ", with no stack frame. */
function expectOneLineError(r: { code: number; out: string; err: string }, pattern: RegExp): void {
  expect(r.code).toBe(1);
  const lines = r.err.split("\n").filter((l) => l !== "");
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(/^fanwise: /);
  expect(lines[0]).toMatch(pattern);
  expect(r.err).not.toMatch(/\n\s+at |Error:|TypeError|\.js:\d+/);
}

const SIX = "month,sales\n2024-01,100\n2024-02,110\n2024-03,121\n2024-04,118\n2024-05,130\n2024-06,140\n";

describe("malformed files: one line on stderr, exit 1", () => {
  test("no header row (the first row is numbers)", () => {
    const f = file("noheader.csv", "100,5\n110,6\n121,7\n118,8\n");
    expectOneLineError(runCli(["screen", f]), /first row .* is numbers, not column names.*header row/);
  });
  test("unequal rows name the line and say how to quote a comma", () => {
    const f = file("unequal.csv", "month,sales\n2024-01,100\n2024-02,1,100\n2024-03,121\n");
    expectOneLineError(runCli(["lambda", f]), /Line 3 has 3 fields but the header has 2.*quotes/);
  });
  test("an unterminated quote names the line it starts on", () => {
    const f = file("quote.csv", 'month,sales\n2024-01,100\n"2024-02,110\n2024-03,121\n');
    expectOneLineError(runCli(["fan", f, "--horizon", "2"]), /quoted field starting on line 3 is never closed/);
  });
  test("binary junk with NUL bytes is refused as not text", () => {
    const junk = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256));
    expectOneLineError(runCli(["screen", file("junk.bin", junk)]), /not text/);
  });
  test("binary junk without NUL bytes still ends in one line", () => {
    const junk = Buffer.from(Array.from({ length: 4096 }, (_, i) => 1 + ((i * 7919) % 255)));
    const r = runCli(["total", file("junk2.bin", junk), "--horizon", "3"]);
    expect(r.code).toBe(1);
    expect(r.err.trim().split("\n")).toHaveLength(1);
    expect(r.err).toMatch(/^fanwise: /);
    expect(r.err).not.toMatch(/\n\s+at /);
  });
  test("a missing file, a folder, an empty file, a header without rows", () => {
    expectOneLineError(runCli(["screen", path.join(dir, "nope.csv")]), /File not found/);
    expectOneLineError(runCli(["lambda", dir]), /is a folder, not a CSV file/);
    expectOneLineError(runCli(["fan", file("empty.csv", ""), "--horizon", "2"]), /no rows.*header row/);
    expectOneLineError(runCli(["total", file("header.csv", "month,sales\n"), "--horizon", "2"]), /header row but no data rows/);
  });
  test("unknown flags, a flag without its value, a single-dash option, an unknown command", () => {
    const f = file("six.csv", SIX);
    expectOneLineError(runCli(["screen", f, "--frobnicate"]), /Unknown option --frobnicate\. Options here: --period, .*--delimiter, --decimal, .*--json/);
    expectOneLineError(runCli(["fan", f, "--horizon"]), /--horizon needs a value/);
    expectOneLineError(runCli(["fan", f, "-h", "3"]), /Unknown option -h\. Options start with two dashes/);
    expectOneLineError(runCli(["forecast", f]), /unknown command "forecast"/);
    expectOneLineError(runCli(["backtest", f, "--horizon", "1e9"]), /horizon 1000000000 is more than 10 times the series length \(6\)/);
    expectOneLineError(runCli(["backtest", f, "--horizon", "2.5"]), /--horizon must be a whole number/);
  });
  test("a line break inside a quoted field does not break the message onto two lines", () => {
    const f = file("multiline.csv", 'month,"sales\nnet"\n2024-01,100\n2024-02,"x\ny"\n2024-03,121\n2024-04,5\n');
    const r = runCli(["fan", f, "--horizon", "2", "--method", "naive"]);
    // one series, one message: on one line, naming the text cell
    expect(r.err.trim().split("\n")).toHaveLength(1);
    expect(r.err).toMatch(/^fanwise: sales net: .*text/);
  });
});

describe("legal CSV is read as RFC 4180 says", () => {
  test("quoted commas: a grouped number and a label with a comma", () => {
    const f = file("quoted.csv", 'month,"sales, net"\n"Jan, 2024","12,500"\n"Feb, 2024","13,100"\n"Mar, 2024",12900\n"Apr, 2024","14,000"\n');
    const r = runCli(["screen", f, "--json"]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series["sales, net"];
    expect(s.n).toBe(4);
    expect(s.min).toBe(12500);
    expect(s.textCells).toBe(0);
  });
  test("a UTF-8 byte-order mark and CRLF line ends give the same answer as plain LF", () => {
    const plain = runCli(["lambda", file("lf.csv", SIX), "--json"]);
    const bom = runCli(["lambda", file("bom-crlf.csv", "\ufeff" + SIX.replace(/\n/g, "\r\n")), "--json"]);
    expect(plain.code).toBe(0);
    expect(bom.code).toBe(0);
    expect(JSON.parse(bom.out)).toEqual(JSON.parse(plain.out));
    expect(Object.keys(JSON.parse(bom.out).series)).toEqual(["sales"]);
  });
  test("a file in Windows-1252 (not UTF-8) is read with its accented names intact", () => {
    const f = file("cp1252.csv", Buffer.from("month,Caf\xe9 sales\n2024-01,100\n2024-02,110\n2024-03,121\n2024-04,118\n", "latin1"));
    const r = runCli(["screen", f, "--json"]);
    expect(r.code).toBe(0);
    expect(Object.keys(JSON.parse(r.out).series)).toEqual(["Café sales"]);
  });
  test("repeated column names are told apart, so no series is lost", () => {
    const f = file("dupes.csv", "month,sales,sales\n2024-01,100,5\n2024-02,110,6\n2024-03,121,7\n2024-04,118,8\n");
    const r = runCli(["screen", f, "--json"]);
    expect(Object.keys(JSON.parse(r.out).series)).toEqual(["sales", "sales (2)"]);
  });
  test("output piped into a reader that stops early ends quietly", async () => {
    const f = file("long.csv", "t,v\n" + Array.from({ length: 3000 }, (_, i) => `${i},${100 + (i % 7)}`).join("\n"));
    const child = spawn(process.execPath, [path.join(__dirname, "..", "..", "bin", "fanwise.js"), "fan", f, "--horizon", "2000", "--method", "naive", "--lambda", "none"]);
    let err = "";
    child.stderr.on("data", (d) => (err += d));
    child.stdout.once("data", () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on("close", resolve));
    expect(err).toBe("");
    expect(code).toBe(0);
  });
});

describe("hostile bytes through every command (fast-check, seeded)", () => {
  // Random files built from CSV's own hard parts: quotes, commas, line breaks of three kinds,
  // a BOM, comments, blanks, numbers with separators, text, high bytes. Each goes through every
  // command in-process; the promise is: exit 0, 1 or 3, nothing thrown, every stderr line one
  // "fanwise: …" message without a stack frame.
  const piece = fc.oneof(
    fc.constantFrom('"', ",", "\n", "\r\n", "\r", "\ufeff", "#", " ", "", "12,500", "1e308", "-0", "0", "NaN", "month", "sales", "\u00e9", "\u0000", "\t"),
    fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
    fc.integer({ min: 1, max: 1000 }).map(String),
    fc.string({ maxLength: 4 }),
  );
  const content = fc.array(piece, { maxLength: 60 }).map((p) => p.join(""));
  const command = fc.constantFrom(
    ["screen"], ["lambda"], ["lambda", "--method", "mle"], ["fan", "--horizon", "3", "--method", "naive"], ["fan", "--horizon", "2"],
    ["total", "--horizon", "3", "--method", "drift", "--paths", "200"], ["backtest", "--horizon", "1", "--method", "naive"],
    ["audit", "--actual", "sales", "--lower", "month", "--upper", "sales", "--level", "80"], ["screen", "--json"],
  );
  test("300 random files × a random command", async () => {
    let n = 0;
    await fc.assert(fc.asyncProperty(content, command, async (text, cmd) => {
      const f = file(`fuzz-${n++ % 8}.csv`, text);
      let out = "";
      let err = "";
      const code = await main([cmd[0], f, ...cmd.slice(1)], { out: (s) => void (out += s), err: (s) => void (err += s) });
      expect([0, 1, 3]).toContain(code);
      for (const line of err.split("\n").filter((l) => l !== "")) {
        expect(line).toMatch(/^fanwise: /);
        expect(line).not.toMatch(/unexpected problem/);
      }
      if (code === 1) expect(err).not.toBe("");
      void out;
    }), { numRuns: 300, seed: 7 });
  }, 120000);
});

describe("a 50 MB file", () => {
  // About 50 MB: a period column and four series (invented values), written in pieces.
  let big = "";
  let rows = 0;
  beforeAll(() => {
    big = path.join(dir, "big.csv");
    const fd = fs.openSync(big, "w");
    let chunk = "period,a,b,c,d\n";
    for (let i = 0; fs.fstatSync(fd).size < 50e6; i++) {
      chunk += `p${i},${(100 + Math.sin(i) * 10).toFixed(3)},${(200 + Math.cos(i) * 20).toFixed(3)},${50 + (i % 12)},${1000 + (i % 97)}.5\n`;
      rows++;
      if (chunk.length > 1 << 20) { fs.writeSync(fd, chunk); chunk = ""; }
    }
    fs.writeSync(fd, chunk);
    fs.closeSync(fd);
  });

  test("fanwise screen reads every row of it", () => {
    const r = runCli(["screen", big, "--json"]);
    expect(r.err).toBe("");
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out).series;
    expect(Object.keys(s)).toEqual(["a", "b", "c", "d"]);
    expect(s.c.n).toBe(rows);
    expect(s.c.min).toBe(50);
  }, 180000);

  test("reading it never holds the text whole: peak memory grows by less than 3× the file's size", () => {
    // A text-then-table reader holds the 50 MB text, every field as a string and then the cells
    // (well over 10× the file here); the chunked reader holds only its compact columns (a double
    // and a byte per cell, about the file's size) plus one 256 KiB piece. Peak resident memory of a
    // process that only reads the file is compared with the same process reading a tiny file.
    const script = (f: string) => `const {readCsvFile}=require(${JSON.stringify(path.join(__dirname, "..", "..", "build", "cli", "csv-file.js"))});
      const c=readCsvFile(${JSON.stringify(f)});process.stdout.write(String(process.resourceUsage().maxRSS*1024)+" "+c.rows);`;
    const peak = (f: string): [number, number] => {
      const r = spawnSync(process.execPath, ["-e", script(f)], { encoding: "utf8" });
      const [rss, n] = r.stdout.trim().split(" ").map(Number);
      return [rss, n];
    };
    const [base] = peak(file("tiny.csv", SIX));
    const [rss, n] = peak(big);
    const size = fs.statSync(big).size;
    expect(n).toBe(rows);
    console.log(`reading ${(size / 1e6).toFixed(1)} MB: peak resident memory +${((rss - base) / 1e6).toFixed(0)} MB over a tiny file`);
    expect(rss - base).toBeLessThan(3 * size);
  }, 120000);
});
