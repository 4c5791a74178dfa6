// SVG → PNG without a browser, by resvg (a Rust renderer shipped as a prebuilt binary inside its
// npm package). Text uses the machine's fonts; a machine without any draws the chart without text.
import { Resvg } from "@resvg/resvg-js";

/**
 * Renders an SVG document to PNG bytes at `scale` × its own size.
 * @example svgToPng('<svg xmlns="http://www.w3.org/2000/svg" width="2" height="2"/>').subarray(1, 4).toString() // "PNG"
 */
export function svgToPng(svg: string, scale = 1): Buffer {
  const r = new Resvg(svg, {
    fitTo: scale === 1 ? { mode: "original" } : { mode: "zoom", value: scale },
    font: { loadSystemFonts: true },
    shapeRendering: 2, // geometricPrecision: anti-aliased edges
    textRendering: 1, // optimizeLegibility
  });
  return r.render().asPng();
}
