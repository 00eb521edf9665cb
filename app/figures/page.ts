/**
 * Print geometry of a figure: its coordinates are typographic points (1/72 inch), so a font size in the
 * SVG is its size on paper. Single column 90 mm, double column 180 mm; PNG at 300 dpi.
 */

export const MM_PER_PT = 25.4 / 72;
export const COLUMN_MM = { single: 90, double: 180 } as const;
export type FigureWidth = keyof typeof COLUMN_MM;
export const PRINT_DPI = 300;

/** the smallest text on a printed figure, pt */
export const MIN_FONT_PT = 7;
export const FONT_PT = { tick: 7, label: 7.5, corner: 7, panelTitle: 8, title: 9 } as const;

export const FONT_FAMILY = "'DejaVu Sans', 'Helvetica Neue', Arial, sans-serif";
export const INK = '#1d2228';
export const MUTED = '#4f5761';
export const GRIDLINE = '#d5d9de';
export const NO_DATA = '#e3e5e8';
export const LAND = '#c9c5bd';

export function widthPt(width: FigureWidth): number {
  return COLUMN_MM[width] / MM_PER_PT;
}

/** Pixels across a figure of this many millimetres at this resolution (180 mm at 300 dpi: 2126). */
export function pixelsFor(mm: number, dpi = PRINT_DPI): number {
  return Math.round((mm / 25.4) * dpi);
}
