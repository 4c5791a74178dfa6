// Small helpers shared by the audit pictures: escaping text for SVG/HTML and short axis numbers.

/** Escapes text for an SVG or HTML text node or attribute. */
export function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

/** The system font stack the pictures use (no web fonts: nothing is fetched). */
export const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";

/** Colours of the audit pictures (the pane's palette: graphite, ochre, red-brown, plum). */
export const AUDIT_COLORS = {
  hit: "#e9c27a",
  above: "#9c3d1f",
  below: "#5a2d82",
  text: "#3b3b3b",
  axis: "#6b665d",
  grid: "#ece6da",
  paper: "#fffdf8",
  diagonal: "#8a8378",
} as const;
