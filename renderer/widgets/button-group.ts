/**
 * A group of toggle buttons of which one is pressed (a choice among a few values). Arrow keys move the choice
 * within the group and keep the focus on the pressed button.
 */
import { h } from '../elements.js';

export interface ButtonGroupSpec<T extends string> {
  /** what the group chooses, read by assistive technology and shown before it when `showLabel` */
  label: string;
  id?: string;
  options: readonly (readonly [T, string])[];
  value: T;
  onPick: (value: T) => void;
  /** a visible label before the buttons */
  showLabel?: boolean;
  /** hover text per value */
  titles?: Partial<Record<T, string>>;
}

export interface ButtonGroup<T extends string> {
  /** the element to place (the group, or the label and the group when shown) */
  el: HTMLElement;
  group: HTMLElement;
  /** show a value as pressed without calling onPick */
  set(value: T): void;
}

export function buttonGroup<T extends string>(spec: ButtonGroupSpec<T>): ButtonGroup<T> {
  const group = h('div', { class: 'segmented', role: 'group', 'aria-label': spec.label, id: spec.id });
  const buttons: HTMLButtonElement[] = [];
  const set = (value: T): void => {
    for (const b of buttons) b.setAttribute('aria-pressed', String(b.dataset.value === value));
  };
  const pick = (value: T, focus: boolean): void => {
    set(value);
    if (focus) buttons.find((b) => b.dataset.value === value)?.focus();
    spec.onPick(value);
  };
  spec.options.forEach(([value, text], i) => {
    const b = h('button', { type: 'button', 'aria-pressed': String(value === spec.value), 'data-value': value, title: spec.titles?.[value] }, text);
    b.addEventListener('click', () => pick(value, false));
    b.addEventListener('keydown', (ev) => {
      if (ev.key !== 'ArrowRight' && ev.key !== 'ArrowLeft') return;
      ev.preventDefault();
      const n = spec.options.length;
      pick(spec.options[(i + (ev.key === 'ArrowRight' ? 1 : n - 1)) % n][0], true);
    });
    buttons.push(b);
    group.append(b);
  });
  const el = spec.showLabel ? h('span', { class: 'row' }, h('span', { class: 'toolbar-label' }, spec.label), group) : group;
  return { el, group, set };
}
