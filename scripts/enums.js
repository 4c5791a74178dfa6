// Custom enums for the keyword arguments, so Excel's formula AutoComplete lists them ("Create custom
// enums for your custom functions": https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-custom-enums;
// older Excel ignores them and takes the argument as before, same page, Backwards compatibility).
// Added to functions.json by the build (scripts/origin.js, deployFunctionsJson) in the generator's
// own format (custom-functions-metadata 2: top-level `enums`, a parameter's `customEnumId`) rather
// than as TypeScript enum parameter types, so the functions' signatures stay plain strings.
// λ gets none: it takes a number or a keyword, and an enum is all strings or all numbers.
// test/functions/metadata.test.ts checks the forecasting list against the engine's METHODS.
"use strict";

const ENUMS = {
  FWMETHOD: [
    ["auto", "The smoothing model with the lowest AICc (default)"],
    ["mean", "The mean of the history"],
    ["naive", "The last value"],
    ["seasonal-naive", "The value one season ago"],
    ["drift", "The last value plus the average change"],
    ["ses", "Simple exponential smoothing"],
    ["holt", "Holt's linear trend"],
    ["damped", "Damped trend"],
    ["seasonal-ses", "Smoothing with a season, no trend"],
    ["holt-winters", "Trend and season"],
    ["damped-holt-winters", "Damped trend and season"],
    ["arima", "Automatic seasonal ARIMA (or type an order such as arima:0,1,1)"],
  ],
  FWLAMBDAMETHOD: [
    ["guerrero", "Guerrero's method (default)"],
    ["mle", "Maximum likelihood"],
  ],
  FWMEANMETHOD: [
    ["taylor", "Second-order Taylor correction (default)"],
    ["exact", "The exact integral (not for λ below 0)"],
  ],
  FWTRANSFORM: [
    ["box-cox", "Box-Cox (positive values)"],
    ["yeo-johnson", "Yeo-Johnson (zeros and negatives too)"],
    ["none", "No transform"],
  ],
  FWMEAN: [
    ["auto", "The default"],
    ["exact", "The exact integral"],
    ["taylor", "Second-order Taylor correction"],
  ],
};

/** Which enum a string parameter takes: by function and name, then by name for new functions. */
function enumFor(fnId, param) {
  if (param.type !== "string") return null;
  if (param.name === "method") {
    if (fnId === "FITLAMBDA") return "FWLAMBDAMETHOD";
    if (fnId === "BTMEAN" || fnId === "MEANFROMINTERVAL") return "FWMEANMETHOD";
    if (/forecasting method|"auto"|see FW\.FAN/i.test(param.description || "")) return "FWMETHOD";
    return null;
  }
  if (param.name === "transform") return "FWTRANSFORM";
  if (param.name === "mean") return "FWMEAN";
  return null;
}

/** Adds the enums that some parameter uses, and each such parameter's customEnumId (in place). */
function addKeywordEnums(meta) {
  const used = new Set();
  for (const f of meta.functions) {
    for (const p of f.parameters || []) {
      const id = enumFor(f.id, p);
      if (id && !p.customEnumId) {
        p.customEnumId = id;
        used.add(id);
      }
    }
  }
  const enums = (meta.enums || []).filter((e) => !ENUMS[e.id]);
  for (const id of Object.keys(ENUMS)) {
    if (used.has(id)) enums.push({ id, type: "string", values: ENUMS[id].map(([value, tooltip]) => ({ name: value, stringValue: value, tooltip })) });
  }
  if (enums.length) meta.enums = enums;
  return meta;
}

module.exports = { ENUMS, addKeywordEnums, enumFor };
