#!/usr/bin/env node
// Offline check of a manifest: the online validator cannot run here, and no package ships the
// schemas, so this checks the structure the add-in depends on (shared runtime, custom functions,
// the pane button, resource ids, URLs, icons) and then runs `xmllint --noout` for well-formedness.
// It checks the development manifest.xml (https://localhost:3000, namespace FWDEV) and a built
// dist/manifest.xml for any HTTPS origin (namespace FW): every URL on one HTTPS origin, never http://.
// Usage: node scripts/check-manifest.js manifest.xml     (exit 1 with one line per problem)
"use strict";
const fs = require("fs");
const path = require("path");
const { spawnSync } = require("child_process");
const xml2js = require("xml2js");
const { URL } = require("url");
const { DEV, PROD, DEV_ORIGIN } = require("./origin");

/** The least permission the features need: reading the selection, writing a formula and a chart. */
const LEAST_PERMISSION = "ReadWriteDocument";

function arr(x) {
  return x === undefined ? [] : Array.isArray(x) ? x : [x];
}
function attr(node, name) {
  return node && node.$ ? node.$[name] : undefined;
}
function first(node, ...names) {
  let cur = node;
  for (const n of names) {
    cur = cur ? arr(cur[n])[0] : undefined;
  }
  return cur;
}
function text(node) {
  if (node === undefined) return undefined;
  return typeof node === "string" ? node : node._;
}

/** Returns a list of problems (empty when the manifest is fine). */
async function checkManifest(xml, rootDir) {
  const problems = [];
  let doc;
  try {
    doc = await xml2js.parseStringPromise(xml, { explicitArray: true });
  } catch (e) {
    return [`not well-formed XML: ${e.message.split("\n")[0]}`];
  }
  const app = doc.OfficeApp;
  if (!app) return ["the root element must be OfficeApp"];
  if (attr(app, "xsi:type") !== "TaskPaneApp") problems.push("OfficeApp xsi:type must be TaskPaneApp");
  const id = text(first(app, "Id"));
  if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id || "")) problems.push("Id must be a GUID");
  // Development and deployed copies must not clash (two add-ins claiming one namespace show #REF!:
  // "Custom functions naming and localization", https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-naming).
  const identity = id === DEV.id ? DEV : id === PROD.id ? PROD : null;
  if (!identity) problems.push(`Id must be the development Id ${DEV.id} (manifest.xml) or the deployed Id ${PROD.id} (dist/manifest.xml)`);
  if (!/^\d+(\.\d+){0,3}$/.test(text(first(app, "Version")) || "")) problems.push("Version must look like 1.0.0.0");
  const display = attr(first(app, "DisplayName"), "DefaultValue") || "";
  if (!display || display.length > 125) problems.push("DisplayName must be 1–125 characters");
  else if (identity && display !== identity.displayName) problems.push(`DisplayName must be "${identity.displayName}" for ${identity === DEV ? "the development" : "the deployed"} Id; got "${display}"`);
  const desc = attr(first(app, "Description"), "DefaultValue") || "";
  if (!desc || desc.length > 250) problems.push("Description must be 1–250 characters");
  const hosts = arr(first(app, "Hosts") && first(app, "Hosts").Host).map((h) => attr(h, "Name"));
  if (!hosts.includes("Workbook")) problems.push("Hosts must include Workbook (Excel)");
  const sets = arr(first(app, "Requirements", "Sets") && first(app, "Requirements", "Sets").Set);
  const shared = sets.find((s) => attr(s, "Name") === "SharedRuntime");
  if (!shared || attr(shared, "MinVersion") !== "1.1") problems.push('Requirements must list <Set Name="SharedRuntime" MinVersion="1.1"/>');
  const perm = text(first(app, "Permissions"));
  if (!["Restricted", "ReadDocument", "ReadWriteDocument", "ReadAllDocument", "WriteDocument"].includes(perm)) problems.push("Permissions must be one of the manifest's permission levels");
  // Least privilege: the pane reads the selection and writes one formula and a chart, which is
  // ReadWriteDocument; nothing needs the whole document's hidden content (ReadAllDocument), and
  // nothing signs in or calls other services (no WebApplicationInfo / single sign-on).
  else if (perm !== LEAST_PERMISSION) problems.push(`Permissions must be ${LEAST_PERMISSION}, the least the features need (README, Privacy and security); got ${perm}`);
  if (first(app, "WebApplicationInfo") || /<WebApplicationInfo\b/.test(xml)) problems.push("WebApplicationInfo (single sign-on) must not be there: Fanwise calls no other service");

  const vo = first(app, "VersionOverrides");
  if (!vo) return problems.concat(["VersionOverrides is missing"]);
  const host = arr(first(vo, "Hosts") && first(vo, "Hosts").Host).find((h) => attr(h, "xsi:type") === "Workbook");
  if (!host) return problems.concat(['VersionOverrides needs <Host xsi:type="Workbook">']);
  // Runtimes must come first inside the Workbook host (order is lost by the parser: check the text).
  const hostText = xml.slice(xml.indexOf('<Host xsi:type="Workbook">'));
  const firstChild = /<Host xsi:type="Workbook">\s*(?:<!--[\s\S]*?-->\s*)*<([A-Za-z:]+)/.exec(hostText);
  if (!firstChild || firstChild[1] !== "Runtimes") problems.push("Runtimes must be the first element inside the Workbook host");
  const runtime = first(host, "Runtimes", "Runtime");
  const runtimeId = attr(runtime, "resid");
  if (!runtimeId) problems.push("Runtimes/Runtime needs a resid");
  if (attr(runtime, "lifetime") !== "long") problems.push('Runtime lifetime must be "long" (shared runtime)');

  const points = arr(first(host, "AllFormFactors") && first(host, "AllFormFactors").ExtensionPoint);
  const cf = points.find((p) => attr(p, "xsi:type") === "CustomFunctions");
  const used = new Map(); // resid → kind
  const use = (resid, kind, where) => {
    if (!resid) problems.push(`${where} has no resid`);
    else used.set(resid, { kind, where });
  };
  if (!cf) problems.push("no CustomFunctions extension point under AllFormFactors");
  else {
    use(attr(first(cf, "Script", "SourceLocation"), "resid"), "Url", "CustomFunctions Script");
    const page = attr(first(cf, "Page", "SourceLocation"), "resid");
    use(page, "Url", "CustomFunctions Page");
    if (page !== runtimeId) problems.push("CustomFunctions Page must use the Runtime's resid (shared runtime)");
    use(attr(first(cf, "Metadata", "SourceLocation"), "resid"), "Url", "CustomFunctions Metadata");
    use(attr(first(cf, "Namespace"), "resid"), "ShortString", "CustomFunctions Namespace");
  }
  const desktop = first(host, "DesktopFormFactor");
  if (!desktop) problems.push("DesktopFormFactor is missing");
  else {
    const ff = attr(first(desktop, "FunctionFile"), "resid");
    if (ff !== runtimeId) problems.push("FunctionFile must use the Runtime's resid (shared runtime)");
    for (const gs of ["Title", "Description"]) use(attr(first(desktop, "GetStarted", gs), "resid"), gs === "Title" ? "ShortString" : "LongString", `GetStarted ${gs}`);
    use(attr(first(desktop, "GetStarted", "LearnMoreUrl"), "resid"), "Url", "GetStarted LearnMoreUrl");
    const surfaces = arr(desktop.ExtensionPoint).filter((p) => attr(p, "xsi:type") === "PrimaryCommandSurface");
    let panes = 0;
    for (const s of surfaces) for (const tab of arr(s.OfficeTab).concat(arr(s.CustomTab))) for (const g of arr(tab.Group)) {
      use(attr(first(g, "Label"), "resid"), "ShortString", `Group ${attr(g, "id")} Label`);
      for (const img of arr(first(g, "Icon") && first(g, "Icon")["bt:Image"])) use(attr(img, "resid"), "Image", `Group ${attr(g, "id")} Icon`);
      for (const c of arr(g.Control)) {
        use(attr(first(c, "Label"), "resid"), "ShortString", `Control ${attr(c, "id")} Label`);
        use(attr(first(c, "Supertip", "Title"), "resid"), "ShortString", `Control ${attr(c, "id")} Supertip Title`);
        use(attr(first(c, "Supertip", "Description"), "resid"), "LongString", `Control ${attr(c, "id")} Supertip Description`);
        for (const img of arr(first(c, "Icon") && first(c, "Icon")["bt:Image"])) use(attr(img, "resid"), "Image", `Control ${attr(c, "id")} Icon`);
        const action = first(c, "Action");
        if (attr(action, "xsi:type") === "ShowTaskpane") {
          panes++;
          if (first(action, "TaskpaneId") !== undefined) problems.push("the ShowTaskpane action must have no TaskpaneId: the shared runtime's pane is the runtime page itself (one task pane per shared runtime)");
          const src = attr(first(action, "SourceLocation"), "resid");
          if (src !== runtimeId) problems.push("the ShowTaskpane action must use the Runtime's resid (shared runtime)");
          use(src, "Url", "ShowTaskpane SourceLocation");
        }
      }
    }
    if (panes === 0) problems.push("no ribbon button opens the task pane (ShowTaskpane action)");
  }
  if (runtimeId) used.set(runtimeId, { kind: "Url", where: "Runtime" });

  // Resources: every referenced id is defined with the right kind; ids ≤ 32 characters.
  const res = first(vo, "Resources") || {};
  const defined = new Map();
  const kinds = [["bt:Images", "bt:Image", "Image"], ["bt:Urls", "bt:Url", "Url"], ["bt:ShortStrings", "bt:String", "ShortString"], ["bt:LongStrings", "bt:String", "LongString"]];
  for (const [group, item, kind] of kinds) {
    for (const r of arr(first(res, group) && first(res, group)[item])) {
      const rid = attr(r, "id");
      const val = attr(r, "DefaultValue") || "";
      if (!rid || rid.length > 32) problems.push(`resource id "${rid}" must be 1–32 characters`);
      if (defined.has(rid)) problems.push(`resource id "${rid}" is defined twice`);
      defined.set(rid, { kind, val });
      if (kind === "ShortString" && val.length > 125) problems.push(`short string ${rid} is over 125 characters`);
      if (kind === "LongString" && val.length > 250) problems.push(`long string ${rid} is over 250 characters`);
    }
  }
  for (const [rid, u] of used) {
    const d = defined.get(rid);
    if (!d) problems.push(`${u.where} refers to resid "${rid}", which Resources does not define`);
    else if (d.kind !== u.kind) problems.push(`${u.where} refers to "${rid}", a ${d.kind}, where a ${u.kind} is needed`);
  }
  const urlOf = (rid) => (defined.get(rid) || {}).val || "";
  if (cf) {
    if (!urlOf(attr(first(cf, "Script", "SourceLocation"), "resid")).endsWith("/functions.js")) problems.push("CustomFunctions Script must point at functions.js");
    if (!urlOf(attr(first(cf, "Metadata", "SourceLocation"), "resid")).endsWith("/functions.json")) problems.push("CustomFunctions Metadata must point at functions.json");
    const ns = urlOf(attr(first(cf, "Namespace"), "resid"));
    const wantNs = identity ? identity.namespace : PROD.namespace;
    if (ns !== wantNs) problems.push(`the custom functions namespace must be ${wantNs} for ${identity === DEV ? "the development" : "the deployed"} Id; got "${ns}"`);
    if (ns.length > 32) problems.push("the namespace must be at most 32 characters");
  }

  // Every URL (resources and top-level) is HTTPS ("SourceLocation element": the source location must
  // be an HTTPS address, https://learn.microsoft.com/javascript/api/manifest/sourcelocation) and on
  // ONE base: the pane's own (SourceLocation without /taskpane.html). The development manifest's base
  // is https://localhost:3000; a deployed one's is the origin it was built for. Icons exist in assets/.
  const urls = [];
  for (const [, d] of defined) if (d.kind === "Url" || d.kind === "Image") urls.push(d.val);
  for (const tag of ["IconUrl", "HighResolutionIconUrl", "SupportUrl"]) urls.push(attr(first(app, tag), "DefaultValue") || "");
  const source = attr(first(app, "DefaultSettings", "SourceLocation"), "DefaultValue") || "";
  urls.push(source);
  const sm = /^(https:\/\/[^/?#]+(?:\/[^?#]*)?)\/taskpane\.html$/.exec(source);
  if (!sm) problems.push(`DefaultSettings SourceLocation ${source || "(empty)"} must be an https:// address ending in /taskpane.html`);
  const base = sm ? sm[1] : null;
  if (base && identity === DEV && base !== DEV_ORIGIN) problems.push(`the development manifest must be served from ${DEV_ORIGIN}; got ${base}`);
  if (base && identity === PROD && /^https:\/\/(localhost|127\.0\.0\.1|\[::1\])(:|\/|$)/i.test(base)) problems.push(`the deployed manifest must not point at this machine (${base}); build it for the organisation's HTTPS origin`);
  const mixed = new Set();
  for (const u of urls) {
    if (/^http:\/\//i.test(u)) problems.push(`URL ${u} uses http://; Office add-ins load only over HTTPS`);
    else if (!/^https:\/\//.test(u)) problems.push(`URL ${u || "(empty)"} must be an https:// address`);
    else if (base && !u.startsWith(base + "/")) mixed.add(u);
    const m = /\/assets\/([^/?#]+\.png)$/.exec(u);
    if (m && !fs.existsSync(path.join(rootDir, "assets", m[1]))) problems.push(`icon ${m[1]} is referenced but assets/${m[1]} does not exist`);
  }
  for (const u of mixed) problems.push(`URL ${u} is not on ${base}/, the pane's own base: a manifest must not mix origins (rebuild with one --env origin=...)`);
  const origin = base ? new URL(base).origin : null;
  for (const d of arr(first(app, "AppDomains") && first(app, "AppDomains").AppDomain)) {
    if (origin && text(d) !== origin) problems.push(`AppDomain ${text(d)} must be ${origin}, the pane's origin`);
  }
  return problems;
}

function xmllint(file) {
  const r = spawnSync("xmllint", ["--noout", file], { encoding: "utf8" });
  if (r.error && r.error.code === "ENOENT") return ["xmllint is not installed (apt-get install -y libxml2-utils)"];
  return r.status === 0 ? [] : [`xmllint: ${(r.stderr || "").trim().split("\n")[0]}`];
}

async function run(file) {
  const xml = fs.readFileSync(file, "utf8");
  const problems = (await checkManifest(xml, path.dirname(path.resolve(file)))).concat(xmllint(file));
  return problems;
}

module.exports = { checkManifest, run, LEAST_PERMISSION };

if (require.main === module) {
  const file = process.argv[2] || "manifest.xml";
  run(file).then((problems) => {
    if (problems.length) {
      for (const p of problems) console.error(`manifest: ${p}`);
      process.exit(1);
    }
    console.log(`manifest: ${file} passes the structure check and xmllint.`);
  }, (e) => {
    console.error(`manifest: ${e.message}`);
    process.exit(1);
  });
}
