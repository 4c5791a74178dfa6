// Where the add-in is served from, as a build input. `manifest.xml` in the repository is the
// DEVELOPMENT manifest (https://localhost:3000, served by `npm start`) with its own add-in id,
// display name and function namespace; `npm run build -- --env origin=https://host/path` (or
// FANWISE_ORIGIN) writes dist/manifest.xml with the PRODUCTION identity and every URL on that origin,
// and rewrites the @helpurl links in dist/functions.json to match (webpack.config.js calls these).
//
// Two identities because two loaded add-ins that claim one namespace make Excel show #REF! for both
// ("Custom functions naming and localization", Naming conflicts:
// https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-naming); the platform
// advises one manifest per environment with its own URLs and a name users can tell apart (same page).
"use strict";
const { URL } = require("url");
const { addKeywordEnums } = require("./enums");

/** The development server's origin (scripts/start.js, webpack devServer). */
const DEV_ORIGIN = "https://localhost:3000";

/** The development manifest's identity (manifest.xml). */
const DEV = {
  id: "cb661c7f-2575-473e-8685-083265b4f21c",
  displayName: "Fanwise (development)",
  namespace: "FWDEV",
  groupLabel: "Fanwise (dev)",
};

/** The identity an organisation deploys (dist/manifest.xml from an origin build). */
const PROD = {
  id: "f05a464e-aa1e-48dc-90e0-0d54e1561e99",
  displayName: "Fanwise",
  namespace: "FW",
  groupLabel: "Fanwise",
};

/**
 * Checks and normalises the origin (a base URL: scheme, host, optional port and path) the add-in
 * will be served from. The source location must be an HTTPS address ("SourceLocation element":
 * https://learn.microsoft.com/javascript/api/manifest/sourcelocation), so
 * http:// is refused, as are credentials, a query or a fragment (they would end up in every URL).
 * Returns { base: "https://host/path" (no trailing slash), origin: "https://host[:port]" }.
 */
function normaliseOrigin(input) {
  const raw = String(input ?? "").trim();
  if (raw === "") throw new Error("the origin is empty: give the HTTPS address dist/ will be served from, e.g. --env origin=https://addins.example.org/fanwise");
  let u;
  try {
    u = new URL(raw);
  } catch {
    throw new Error(`the origin "${raw}" is not a URL: give the full HTTPS address dist/ will be served from, e.g. https://addins.example.org/fanwise`);
  }
  if (u.protocol !== "https:") throw new Error(`the origin must use https:// (Office loads add-ins only over HTTPS); got ${u.protocol}//`);
  if (u.username || u.password) throw new Error("the origin must not contain a user name or password");
  if (u.search || u.hash || raw.includes("?") || raw.includes("#")) throw new Error("the origin must not contain a query (?…) or a fragment (#…)");
  const path = u.pathname.replace(/\/+$/, "");
  return { base: `${u.origin}${path}`, origin: u.origin };
}

function replaceExactlyOnce(xml, from, to, what) {
  const n = xml.split(from).length - 1;
  if (n !== 1) throw new Error(`manifest.xml: expected ${what} (${from}) exactly once, found it ${n} times; update scripts/origin.js with the manifest`);
  return xml.replace(from, to);
}

/**
 * The production manifest for `base` from the development manifest's text: production id, display
 * name, ribbon group label and namespace; every https://localhost:3000 URL moved to `base`; the
 * AppDomain set to the origin; Version from package.json. Throws if the development manifest does
 * not have the shape this expects (so a change to it cannot silently leave localhost behind).
 */
function productionManifest(devXml, originInput, version) {
  const { base, origin } = normaliseOrigin(originInput);
  let xml = devXml;
  xml = replaceExactlyOnce(xml, `<Id>${DEV.id}</Id>`, `<Id>${PROD.id}</Id>`, "the development Id");
  xml = replaceExactlyOnce(xml, `<DisplayName DefaultValue="${DEV.displayName}"/>`, `<DisplayName DefaultValue="${PROD.displayName}"/>`, "the development DisplayName");
  xml = replaceExactlyOnce(xml, `id="Functions.Namespace" DefaultValue="${DEV.namespace}"`, `id="Functions.Namespace" DefaultValue="${PROD.namespace}"`, "the development namespace");
  xml = replaceExactlyOnce(xml, `id="Group.Label" DefaultValue="${DEV.groupLabel}"`, `id="Group.Label" DefaultValue="${PROD.groupLabel}"`, "the development ribbon group label");
  xml = replaceExactlyOnce(xml, `<AppDomain>${DEV_ORIGIN}</AppDomain>`, `<AppDomain>${origin}</AppDomain>`, "the development AppDomain");
  if (version !== undefined) {
    const v = String(version).split(".").concat(["0", "0", "0"]).slice(0, 4).join(".");
    xml = xml.replace(/<Version>[^<]*<\/Version>/, `<Version>${v}</Version>`);
  }
  xml = xml.split(`${DEV_ORIGIN}/`).join(`${base}/`);
  // The header comment describes the development manifest; say what this one is instead.
  // (No double hyphen may appear inside an XML comment, so the command is described, not quoted.)
  xml = xml.replace(/<!--[\s\S]*?-->/, `<!-- Fanwise add-in manifest for ${base}/, generated by npm run build with origin=${base} from the
     development manifest.xml; do not edit, rebuild. Custom functions (namespace ${PROD.namespace}) and the task pane share one
     runtime (SharedRuntime 1.1). -->`);
  if (xml.includes(DEV_ORIGIN)) throw new Error(`the production manifest still mentions ${DEV_ORIGIN}; update scripts/origin.js with manifest.xml`);
  return xml;
}

/**
 * functions.json for `base`: every helpUrl written for the development server (the JSDoc
 * @helpurl tags) moved to `base`, and the top-level allowErrorForDataTypeAny flag set, so a
 * function receives an error value in an input range and can refuse it with its position
 * ("Manually create JSON metadata for custom functions", allowErrorForDataTypeAny:
 * https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-json#allowerrorfordatatypeany;
 * the JSDoc generator cannot emit it, hence this step), and the keyword arguments' custom enums
 * (scripts/enums.js). Throws if a helpUrl is elsewhere.
 */
function deployFunctionsJson(jsonText, originInput) {
  const meta = JSON.parse(jsonText);
  const base = originInput === undefined ? DEV_ORIGIN : normaliseOrigin(originInput).base;
  for (const f of meta.functions) {
    if (f.helpUrl === undefined) continue;
    if (!f.helpUrl.startsWith(`${DEV_ORIGIN}/`)) throw new Error(`FW.${f.id}: @helpurl ${f.helpUrl} must start with ${DEV_ORIGIN}/ in the source (the build moves it to the deployed origin)`);
    f.helpUrl = `${base}/${f.helpUrl.slice(DEV_ORIGIN.length + 1)}`;
  }
  addKeywordEnums(meta); // AutoComplete lists for the keyword arguments (scripts/enums.js)
  return JSON.stringify({ allowErrorForDataTypeAny: true, ...meta }, null, 2);
}

module.exports = { DEV_ORIGIN, DEV, PROD, normaliseOrigin, productionManifest, deployFunctionsJson };
