/** Small helpers for writing SVG by hand. */
export function escapeXml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f]/g, '');
}

/** Coordinates to one decimal: enough for a raster, and keeps the SVG small. */
export function px(value: number): string {
  return (Math.round(value * 10) / 10).toString();
}

export function polylinePoints(points: Array<[number, number]>): string {
  return points.map(([x, y]) => `${px(x)},${px(y)}`).join(' ');
}

/** The font family every chart asks for; the rasteriser loads DejaVu Sans by file path. */
export const CHART_FONT_FAMILY = 'DejaVu Sans';
