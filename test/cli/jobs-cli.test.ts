// --jobs N: series spread over worker threads (the compiled build/cli/series-worker.js) give output
// byte-equal to the serial run (--jobs 1), in the same order, with the same messages and exit codes.
// Data: 26 series cut from the open elnino dataset (statsmodels 0.13.5; test/fixtures/datasets),
// plus a few series that fail, invented. In-process (main); the workers are threads, not processes.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { main } from "../../src/cli/fanwise";
import { jobsFor, PARALLEL_MIN_SERIES } from "../../src/cli/parallel";
import { parseOptions } from "../../src/cli/options";
import { fanCommand } from "../../src/cli/commands/fan";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-jobs-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (s) => void (out += s), err: (s) => void (err += s) });
  return { code, out, err };
}

const nino = fs.readFileSync(path.join(__dirname, "..", "fixtures", "datasets", "elnino.csv"), "utf8")
  .split("\n").filter((l) => l && !l.startsWith("#") && !l.startsWith("period,"));
// 26 series: 6-year windows of elnino starting a year apart (1950–1955, 1951–1956, …), long format;
// then three that fail (a negative value, too short, all zeros).
const rows = ["shop,month,sales"];
for (let k = 0; k < 26; k++) for (const l of nino.slice(12 * k, 12 * k + 72)) rows.push(`elnino ${1950 + k},${l}`);
rows.push("Bad,1960-01,-5", ...["02", "03", "04", "05", "06", "07", "08"].map((m) => `Bad,1960-${m},1${m}`), "Short,1960-01,5", "Short,1960-02,6");
rows.push(...["01", "02", "03", "04", "05", "06"].map((m) => `Zero,1961-${m},0`));
const file = path.join(dir, "many.csv");
fs.writeFileSync(file, rows.join("\n") + "\n");
const L = ["--long", "shop,month,sales"];

describe("--jobs 2 gives byte-equal output to --jobs 1 (26 elnino series and 3 that fail)", () => {
  const cases: [string, string[]][] = [
    ["fan --method auto, JSON", ["fan", "--horizon", "12", "--json"]],
    ["lambda (Guerrero), JSON", ["lambda", "--method", "guerrero", "--json"]],
    ["backtest, CSV", ["backtest", "--horizon", "2", "--method", "ses", "--lambda", "0"]],
    ["total, JSON", ["total", "--horizon", "6", "--method", "ses", "--lambda", "0", "--paths", "500", "--json"]],
  ];
  test.each(cases)("%s", async (_name, args) => {
    const serial = await run([args[0], file, ...args.slice(1), ...L, "--jobs", "1"]);
    const parallel = await run([args[0], file, ...args.slice(1), ...L, "--jobs", "2"]);
    expect(serial.code).toBe(3);
    expect(serial.err.split("\n").filter(Boolean).map((l) => l.split(":")[1].trim())).toEqual(["Bad", "Short", "Zero"]);
    expect(parallel.err).toBe(serial.err);
    expect(parallel.code).toBe(serial.code);
    expect(serial.out.length).toBeGreaterThan(2000);
    expect(parallel.out).toBe(serial.out);
    if (args.includes("--json")) expect(Object.keys(JSON.parse(parallel.out).series)).toEqual([...Array.from({ length: 26 }, (_, k) => `elnino ${1950 + k}`), "Bad", "Short", "Zero"]);
  }, 120000);
  test("--out FILE.json from worker threads holds the same text as stdout", async () => {
    const out = path.join(dir, "fan.json");
    const serial = await run(["fan", file, "--horizon", "3", "--method", "ses", "--lambda", "0", "--json", ...L, "--jobs", "1"]);
    const r = await run(["fan", file, "--horizon", "3", "--method", "ses", "--lambda", "0", ...L, "--jobs", "2", "--out", out]);
    expect(r.out).toBe(`Wrote ${out}\n`);
    expect(fs.readFileSync(out, "utf8")).toBe(serial.out);
  }, 60000);
  test("a message the serial run stops at (horizon longer than 10× a series) stops the parallel run the same way", async () => {
    const serial = await run(["fan", file, "--horizon", "25", "--method", "naive", "--lambda", "0", ...L, "--jobs", "1"]);
    const parallel = await run(["fan", file, "--horizon", "25", "--method", "naive", "--lambda", "0", ...L, "--jobs", "2"]);
    expect(serial.code).toBe(1);
    expect(serial.err).toMatch(/^fanwise: horizon 25 is more than 10 times the series length \(2\)/);
    expect([parallel.code, parallel.err, parallel.out]).toEqual([serial.code, serial.err, serial.out]);
  }, 60000);
});

describe("how many threads (common practice: a thread's start is repaid only over several series)", () => {
  const parsed = (argv: string[]): ReturnType<typeof parseOptions> => parseOptions("fan", ["x.csv", "--horizon", "1", ...argv], fanCommand.options);
  test("--jobs N is used, at most one per series", () => {
    expect(jobsFor(parsed(["--jobs", "4"]), 100)).toBe(4);
    expect(jobsFor(parsed(["--jobs", "4"]), 3)).toBe(3);
    expect(jobsFor(parsed(["--jobs", "1"]), 100)).toBe(1);
  });
  test(`without --jobs: one thread below ${PARALLEL_MIN_SERIES} series, every core from there`, () => {
    expect(jobsFor(parsed([]), PARALLEL_MIN_SERIES - 1)).toBe(1);
    const cores = typeof os.availableParallelism === "function" ? os.availableParallelism() : os.cpus().length;
    expect(jobsFor(parsed([]), 1000)).toBe(cores);
  });
  test("--jobs 0 is a usage error", async () => {
    const r = await run(["fan", file, "--horizon", "1", "--jobs", "0"]);
    expect([r.code, r.out, r.err]).toEqual([1, "", 'fanwise: --jobs must be a whole number of at least 1; got "0".\n']);
  });
});
