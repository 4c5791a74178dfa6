// The offline manifest check (the PLATFORM.md rules + xmllint) passes on manifest.xml and catches
// each rule when it is broken.
import * as fs from "fs";
import * as path from "path";
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { checkManifest, run, LEAST_PERMISSION } = require("../../scripts/check-manifest.js");

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { productionManifest, normaliseOrigin, PROD, DEV } = require("../../scripts/origin.js");

const ROOT = path.join(__dirname, "..", "..");
const xml = fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8");
const INVENTED = "https://addins.quillmere.example/tools/fanwise"; // an invented origin (Quillmere is the project's invented scenario)

test("manifest.xml passes the structure check and xmllint", async () => {
  expect(await run(path.join(ROOT, "manifest.xml"))).toEqual([]);
});

const breakages: [string, (s: string) => string, RegExp][] = [
  ["short-lived runtime", (s) => s.replace('lifetime="long"', 'lifetime="short"'), /lifetime must be "long"/],
  ["no shared runtime requirement", (s) => s.replace('<Set Name="SharedRuntime" MinVersion="1.1"/>', ""), /SharedRuntime/],
  ["functions page on another resid", (s) => s.replace(/<Page>\s*<SourceLocation resid="Taskpane.Url"\/>/, '<Page><SourceLocation resid="GetStarted.LearnMoreUrl"/>'), /Page must use the Runtime's resid/],
  ["undefined resid", (s) => s.replace('<bt:Url id="Functions.Metadata.Url"', '<bt:Url id="Functions.Meta.Url"'), /does not define/],
  ["wrong namespace", (s) => s.replace('id="Functions.Namespace" DefaultValue="FWDEV"', 'id="Functions.Namespace" DefaultValue="FANWISE"'), /namespace must be FWDEV for the development Id/],
  ["the development manifest claiming the deployed namespace FW", (s) => s.replace('id="Functions.Namespace" DefaultValue="FWDEV"', 'id="Functions.Namespace" DefaultValue="FW"'), /namespace must be FWDEV/],
  ["the development manifest under the deployed display name", (s) => s.replace('<DisplayName DefaultValue="Fanwise (development)"/>', '<DisplayName DefaultValue="Fanwise"/>'), /DisplayName must be "Fanwise \(development\)"/],
  ["an Id that is neither the development nor the deployed one", (s) => s.replace(/<Id>[^<]+<\/Id>/, "<Id>00000000-0000-4000-8000-000000000000</Id>"), /Id must be the development Id/],
  ["http URL", (s) => s.replace("https://localhost:3000/functions.js", "http://localhost:3000/functions.js"), /functions\.js uses http:\/\//],
  ["a mixture of origins", (s) => s.replace("https://localhost:3000/functions.json", "https://cdn.example.org/functions.json"), /cdn\.example\.org\/functions\.json is not on https:\/\/localhost:3000\/.*must not mix origins/],
  ["a TaskpaneId on the shared runtime's pane", (s) => s.replace('<Action xsi:type="ShowTaskpane">', '<Action xsi:type="ShowTaskpane"><TaskpaneId>Fanwise.Pane</TaskpaneId>'), /must have no TaskpaneId/],
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

describe("the deployed manifest, built from the development one for any HTTPS origin", () => {
  const prod: string = productionManifest(xml, INVENTED, "0.1.0");
  test("passes the same check, with the deployed identity and every URL on the origin", async () => {
    expect(await checkManifest(prod, ROOT)).toEqual([]);
    expect(prod).toContain(`<Id>${PROD.id}</Id>`);
    expect(prod).toContain('<DisplayName DefaultValue="Fanwise"/>');
    expect(prod).toContain('id="Functions.Namespace" DefaultValue="FW"');
    expect(prod).toContain("<AppDomain>https://addins.quillmere.example</AppDomain>");
    const urls = [...prod.matchAll(/DefaultValue="(https?:[^"]+)"/g)].map((m) => m[1]);
    expect(urls.length).toBe(11); // 3 icons, 4 resource URLs, IconUrl, HighResolutionIconUrl, SupportUrl, SourceLocation
    for (const u of urls) expect(u.startsWith(`${INVENTED}/`)).toBe(true);
    expect(prod).not.toMatch(/localhost/);
  });
  test("the two identities differ in Id, display name and namespace (so both can be loaded at once)", () => {
    expect(DEV.id).not.toBe(PROD.id);
    expect(DEV.displayName).not.toBe(PROD.displayName);
    expect(DEV.namespace).not.toBe(PROD.namespace);
  });
  test("the deployed manifest's version is package.json's, and so is the development one's", () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, "package.json"), "utf8"));
    expect(prod).toContain(`<Version>${pkg.version}.0</Version>`);
    expect(xml).toContain(`<Version>${pkg.version}.0</Version>`);
  });
  test("a trailing slash, a port and a deeper path are fine", async () => {
    for (const o of ["https://fanwise.quillmere.example/", "https://intranet.quillmere.example:8443/apps/fw/v1"]) {
      expect(await checkManifest(productionManifest(xml, o, "0.1.0"), ROOT)).toEqual([]);
    }
  });
  test("http://, a query, a fragment, credentials or no URL at all are refused with what to give instead", () => {
    expect(() => normaliseOrigin("http://addins.quillmere.example")).toThrow(/must use https:\/\//);
    expect(() => normaliseOrigin("https://addins.quillmere.example/?v=2")).toThrow(/query/);
    expect(() => normaliseOrigin("https://addins.quillmere.example/#x")).toThrow(/fragment/);
    expect(() => normaliseOrigin("https://me:pw@addins.quillmere.example")).toThrow(/user name or password/);
    expect(() => normaliseOrigin("addins.quillmere.example")).toThrow(/not a URL.*https:\/\//);
    expect(() => normaliseOrigin("")).toThrow(/origin is empty/);
  });
  test("the check refuses a deployed manifest pointing at this machine, or at http://, or mixing origins", async () => {
    expect((await checkManifest(productionManifest(xml, "https://localhost:4000", "0.1.0"), ROOT)).join("\n")).toMatch(/must not point at this machine/);
    expect((await checkManifest(prod.split(`${INVENTED}/assets/icon-16.png`).join("http://addins.quillmere.example/tools/fanwise/assets/icon-16.png"), ROOT)).join("\n")).toMatch(/uses http:\/\//);
    expect((await checkManifest(prod.replace(`${INVENTED}/functions.js`, "https://other.quillmere.example/functions.js"), ROOT)).join("\n")).toMatch(/must not mix origins/);
  });
});
