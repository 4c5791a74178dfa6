// The custom functions' namespace the pane writes formulas in. The development manifest claims FWDEV
// (so a development copy can sit beside a deployed one without both claiming FW, which Excel answers
// with #REF!: "Custom functions naming and localization",
// https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-naming); webpack.config.js
// sets it per build. Outside webpack (jest) it is the deployed FW.
declare const __FW_NAMESPACE__: string | undefined;

/** The namespace of the FW functions in this build: "FW" deployed, "FWDEV" from the development server. */
export const FW_NAMESPACE: string = typeof __FW_NAMESPACE__ === "string" ? __FW_NAMESPACE__ : "FW";
