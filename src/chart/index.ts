// The audit pictures (hit strip, calibration chart): pure geometry and SVG, shared by the pane and
// the command line. The fan chart lives beside the pane (src/taskpane/chart) until it moves here.
export { hitStripGeometry, hitStripSvg } from "./hit-strip";
export type { HitStripGeometry, HitStripInput } from "./hit-strip";
export { calibrationGeometry, calibrationChartSvg, coveragePoints } from "./calibration-chart";
export type { CalibrationChartInput, CalibrationGeometry, CalibrationPoint, CoverageLike } from "./calibration-chart";
export { esc } from "./svg-text";
