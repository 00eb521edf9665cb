/** What every view offers the workbench: draw into its element, follow the state, export its figure. */
import type { AppState } from '../state.js';

export interface ViewHandle {
  /** redraw after a change of state (keys that changed) or of size */
  update(state: AppState, changed: Set<string>): void;
  /** the figure as a standalone SVG at publication width (figure units; 1 unit = 0.25 mm), or null when there is none */
  figure?(): Promise<SVGSVGElement | null>;
  /** base of exported file names */
  fileBase?(): string;
  dispose(): void;
}

export type ViewFactory = (el: HTMLElement, state: AppState) => ViewHandle;

/** Publication width in figure units: 720 units = 180 mm (one unit is 0.25 mm). */
export const EXPORT_WIDTH = 720;

/** A message in place of a figure (loading, nothing to show, a failure). */
export function note(el: HTMLElement, text: string, kind: 'info' | 'error' | 'busy' = 'info'): void {
  el.replaceChildren();
  const p = document.createElement('p');
  p.className = `view-note ${kind}`;
  p.textContent = text;
  if (kind === 'error') p.setAttribute('role', 'alert');
  el.append(p);
}

export function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}
