/**
 * A figure of app/figures on the screen: the very text that the exports and `stillwater report` write,
 * parsed into the page. Its coordinates are print points; on screen it takes the width it is given and
 * keeps its proportions through the viewBox.
 */
import type { Figure } from '../../app/figures/parts.js';
import { serialise } from '../../app/figures/svg-tree.js';

export function figureElement(fig: Figure): SVGSVGElement {
  const doc = new DOMParser().parseFromString(serialise(fig.svg), 'image/svg+xml');
  const root = doc.documentElement;
  if (root.nodeName !== 'svg') throw new Error(`The figure ${fig.name} could not be drawn: its SVG does not parse.`);
  const svg = document.importNode(root, true) as unknown as SVGSVGElement;
  svg.classList.add('figure-svg');
  return svg;
}

/** The same figure sized for the screen: as wide as `widthPx`, height from its proportions. */
export function screenFigure(fig: Figure, widthPx: number): SVGSVGElement {
  const svg = figureElement(fig);
  svg.setAttribute('width', String(Math.round(widthPx)));
  svg.setAttribute('height', String(Math.round((widthPx * fig.heightPt) / fig.widthPt)));
  return svg;
}
