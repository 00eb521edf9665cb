/**
 * The frame every figure view draws in: a toolbar of options above a stage where the figure (or a message in
 * its place) goes.
 */
import { h } from '../elements.js';
import { note } from '../views/view.js';

export interface FigureFrame {
  toolbar: HTMLElement;
  stage: HTMLElement;
  /** a message in place of the figure */
  say(text: string, kind?: 'info' | 'error' | 'busy'): void;
  /** the figure's parts, replacing what was there; `drawn` marks what is shown (tests wait for it) */
  show(drawn: string, ...parts: Node[]): void;
  /** width available to the figure, at least `min` */
  width(min: number): number;
}

export function figureFrame(el: HTMLElement, opts: { label: string; stageClass?: string; toolbarTag?: 'div' | 'form' }): FigureFrame {
  const toolbar = h(opts.toolbarTag ?? 'div', { class: 'view-toolbar', 'aria-label': opts.label, ...(opts.toolbarTag === 'form' ? {} : { role: 'toolbar' }) });
  const stage = h('div', { class: `figure-stage${opts.stageClass ? ` ${opts.stageClass}` : ''}` });
  el.append(toolbar, stage);
  return {
    toolbar,
    stage,
    say: (text, kind = 'info') => note(stage, text, kind),
    show(drawn, ...parts) {
      stage.replaceChildren(...parts);
      stage.dataset.drawn = drawn;
    },
    width: (min) => Math.max(min, Math.floor(stage.clientWidth || el.clientWidth || 900)),
  };
}
