// The pane follows Office's theme. Inside Office, Office.context.officeTheme says whether the user
// chose a dark theme (isDarkTheme) and gives its colours ("Office.OfficeTheme":
// https://learn.microsoft.com/javascript/api/office/office.officetheme); the pane then uses its own
// dark palette (taskpane.css, html[data-theme="dark"]), checked for 4.5:1 contrast, rather than
// mixing Office's colours with its accents. Outside Office, or where the host gives no theme, the
// operating system's prefers-color-scheme decides (CSS), and forced-colors / high-contrast mode
// hands every colour to the system (CSS). The pane's own light palette stays the default.

/** The part of Office.OfficeTheme the pane reads. */
export interface OfficeThemeInfo {
  isDarkTheme?: boolean;
  bodyBackgroundColor?: string;
}

/** Relative luminance of a #rrggbb colour (WCAG 2.1 definition), or null when it is not one. */
export function luminance(hex: string): number | null {
  const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex.trim());
  if (!m) return null;
  const [r, g, b] = [m[1], m[2], m[3]].map((h) => {
    const s = parseInt(h, 16) / 255;
    return s <= 0.03928 ? s / 12.92 : Math.pow((s + 0.055) / 1.055, 2.4);
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/**
 * "dark" or "light" from Office's theme: isDarkTheme where the host gives it, else a body background
 * darker than mid-grey; null when there is no theme to follow (the CSS media queries decide then).
 * @example themeFromOffice({ bodyBackgroundColor: "#262626" }) // "dark"
 */
export function themeFromOffice(theme: OfficeThemeInfo | undefined | null): "dark" | "light" | null {
  if (!theme) return null;
  if (typeof theme.isDarkTheme === "boolean") return theme.isDarkTheme ? "dark" : "light";
  const l = theme.bodyBackgroundColor ? luminance(theme.bodyBackgroundColor) : null;
  return l === null ? null : l < 0.18 ? "dark" : "light";
}

/** Sets html[data-theme] from Office's theme (or removes it, leaving the choice to the CSS). */
export function applyOfficeTheme(root: HTMLElement, theme: OfficeThemeInfo | undefined | null): void {
  const t = themeFromOffice(theme);
  if (t) root.dataset.theme = t;
  else delete root.dataset.theme;
}
