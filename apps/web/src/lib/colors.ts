/**
 * Black or white, whichever reads better on a background colour (#RRGGBB), by the relative
 * luminance and contrast ratio of WCAG 2.1 (W3C, "Web Content Accessibility Guidelines 2.1",
 * definitions "relative luminance" and "contrast ratio").
 */
export function readableTextColor(background: string): "#000000" | "#FFFFFF" {
  const hex = /^#?([0-9a-f]{6})$/i.exec(background)?.[1];
  if (!hex) return "#000000";
  const channel = (i: number) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  const l = 0.2126 * channel(0) + 0.7152 * channel(2) + 0.0722 * channel(4);
  const onBlack = (l + 0.05) / 0.05;
  const onWhite = 1.05 / (l + 0.05);
  return onBlack >= onWhite ? "#000000" : "#FFFFFF";
}

/** The colour with an alpha channel, for light fills behind text (`#RRGGBB` + alpha in [0, 1]). */
export function withAlpha(color: string, alpha: number): string {
  const a = Math.round(Math.min(1, Math.max(0, alpha)) * 255)
    .toString(16)
    .padStart(2, "0");
  return `${color}${a}`;
}
