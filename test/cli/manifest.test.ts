// The offline manifest check (the PLATFORM.md rules + xmllint) passes on manifest.xml and catches
// each rule when it is broken.
import * as fs from "fs";
import * as path from "path";
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { checkManifest, run, LEAST_PERMISSION } = require("../../scripts/check-manifest.js");

const ROOT = path.join(__dirname, "..", "..");
const xml = fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8");

test("manifest.xml passes the structure check and xmllint", async () => {
  expect(await run(path.join(ROOT, "manifest.xml"))).toEqual([]);
});

const breakages: [string, (s: string) => string, RegExp][] = [
  ["short-lived runtime", (s) => s.replace('lifetime="long"', 'lifetime="short"'), /lifetime must be "long"/],
  ["no shared runtime requirement", (s) => s.replace('<Set Name="SharedRuntime" MinVersion="1.1"/>', ""), /SharedRuntime/],
  ["functions page on another resid", (s) => s.replace(/<Page>\s*<SourceLocation resid="Taskpane.Url"\/>/, '<Page><SourceLocation resid="GetStarted.LearnMoreUrl"/>'), /Page must use the Runtime's resid/],
  ["undefined resid", (s) => s.replace('<bt:Url id="Functions.Metadata.Url"', '<bt:Url id="Functions.Meta.Url"'), /does not define/],
  ["wrong namespace", (s) => s.replace('id="Functions.Namespace" DefaultValue="FW"', 'id="Functions.Namespace" DefaultValue="FANWISE"'), /namespace must be FW/],
  ["http URL", (s) => s.replace("https://localhost:3000/functions.js", "http://localhost:3000/functions.js"), /must be on https:\/\/localhost:3000/],
  ["resid over 32 characters", (s) => s.split("OpenPane.Tooltip").join("OpenPane.Tooltip.That.Is.Far.Too.Long"), /1–32 characters/],
  ["missing icon file", (s) => s.replace("icon-16.png", "icon-17.png"), /icon-17.png/],
  ["a broader permission", (s) => s.replace("<Permissions>ReadWriteDocument</Permissions>", "<Permissions>ReadAllDocument</Permissions>"), /Permissions must be ReadWriteDocument, the least/],
  ["single sign-on", (s) => s.replace("</VersionOverrides>", "<WebApplicationInfo><Id>x</Id></WebApplicationInfo></VersionOverrides>"), /WebApplicationInfo/],
  ["Runtimes not first", (s) => s.replace(/<Runtimes>[\s\S]*?<\/Runtimes>/, "").replace("</AllFormFactors>", "</AllFormFactors><Runtimes><Runtime resid=\"Taskpane.Url\" lifetime=\"long\"/></Runtimes>"), /Runtimes must be the first/],
];

for (const [what, mutate, pattern] of breakages) {
  test(`catches: ${what}`, async () => {
    const problems: string[] = await checkManifest(mutate(xml), ROOT);
    expect(problems.join("\n")).toMatch(pattern);
  });
}

test("ReadWriteDocument is the least permission the features need: the pane writes to the sheet, and only through excel-io.ts", () => {
  // Office's permission levels (manifest Permissions element): ReadDocument cannot write a formula
  // or add a chart; ReadWriteDocument can. If the pane ever stops writing, this test says to lower it.
  expect(LEAST_PERMISSION).toBe("ReadWriteDocument");
  expect(xml).toMatch(/<Permissions>ReadWriteDocument<\/Permissions>/);
  const writers: string[] = [];
  const walk = (dir: string): void => {
    for (const d of fs.readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, d.name);
      if (d.isDirectory()) walk(p);
      else if (/\.ts$/.test(d.name) && /\.(formulas|formulasR1C1|values)\s*=|charts\.add\(/.test(fs.readFileSync(p, "utf8"))) writers.push(path.relative(ROOT, p));
    }
  };
  walk(path.join(ROOT, "src"));
  expect(writers).toEqual([path.join("src", "taskpane", "excel-io.ts")]);
});
