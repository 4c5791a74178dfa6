// Reading CSV as a user's file is read, through the command line (so the test holds wherever the
// parser lives): RFC 4180 §2.7 (a double quote inside a quoted field is written twice), numbers
// with several thousands separators ("1,234,567" inside quotes, RFC 4180 §2.6), and the header
// row. The expected numbers are computed here from the file's values by hand (naive method, no
// transform: the forecast is the last value; σ̂² is the mean square of the first differences,
// METHODS §3).
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runCli } from "../helpers/cli";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fanwise-reading-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function file(name: string, content: string): string {
  const p = path.join(dir, name);
  fs.writeFileSync(p, content);
  return p;
}

// Invented sales of two Quillmere shops (invented data).
const CSV = [
  'month,"Harbour ""North"" shop",Mill Lane',
  '2024-01,"1,100,000",5',
  '2024-02,"1,200,000",6',
  '2024-03,"1,234,567",7.5',
  "",
].join("\r\n");

describe("CSV reading through `fanwise fan` (RFC 4180; common practice for thousands separators)", () => {
  const r = runCli(["fan", file("shops.csv", CSV), "--horizon", "1", "--method", "naive", "--lambda", "none", "--json"]);
  const out = r.code === 0 ? JSON.parse(r.out) : null;
  test("the run succeeds", () => {
    expect(r.err).toBe("");
    expect(r.code).toBe(0);
  });
  test('a doubled quote inside a quoted header field is one quote (RFC 4180 §2.7): Harbour "North" shop', () => {
    expect(Object.keys(out.series)).toEqual(['Harbour "North" shop', "Mill Lane"]);
  });
  test('"1,234,567" (two thousands separators) is read as 1234567, and so are its neighbours', () => {
    const s = out.series['Harbour "North" shop'];
    expect(s.steps[0].median).toBe(1234567);
    // σ̂² = ((1,200,000 − 1,100,000)² + (1,234,567 − 1,200,000)²) / 2 — wrong if any value was misread
    expect(s.sigma).toBeCloseTo(Math.sqrt((100000 ** 2 + 34567 ** 2) / 2), 6);
  });
  test("the plain column beside it is read as written", () => {
    const s = out.series["Mill Lane"];
    expect(s.steps[0].median).toBe(7.5);
    expect(s.sigma).toBeCloseTo(Math.sqrt((1 + 1.5 ** 2) / 2), 12);
  });
  test("the CSV output quotes the name again with doubled quotes (RFC 4180 §2.7)", () => {
    const csv = runCli(["fan", path.join(dir, "shops.csv"), "--horizon", "1", "--method", "naive", "--lambda", "none"]);
    expect(csv.code).toBe(0);
    expect(csv.out.split("\n")[1]).toMatch(/^"Harbour ""North"" shop",/);
  });
});
