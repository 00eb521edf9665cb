/**
 * A refusal shown at the field itself: the input is marked invalid and a sentence beside it says why, read out
 * by assistive technology; the value is not applied. Accepting a value clears the sentence.
 */
import { h } from '../elements.js';

let counter = 0;

function messageOf(input: HTMLInputElement): HTMLElement {
  const id = input.getAttribute('aria-describedby');
  const existing = id ? document.getElementById(id) : null;
  if (existing) return existing;
  const mid = `field-message-${++counter}`;
  const m = h('span', { class: 'field-message', id: mid, role: 'alert', hidden: true });
  input.setAttribute('aria-describedby', mid);
  input.after(m);
  return m;
}

/** Refuse the field's value with one sentence. */
export function refuse(input: HTMLInputElement, sentence: string): void {
  input.setAttribute('aria-invalid', 'true');
  const m = messageOf(input);
  m.textContent = sentence;
  m.hidden = false;
}

/** The field's value is good: clear any refusal. */
export function accept(input: HTMLInputElement): void {
  input.removeAttribute('aria-invalid');
  const id = input.getAttribute('aria-describedby');
  const m = id ? document.getElementById(id) : null;
  if (m) {
    m.textContent = '';
    m.hidden = true;
  }
}

/** A finite number typed in a field, or the sentence that says what is wrong with it. */
export function readNumber(input: HTMLInputElement, what: string, limits: { min?: number; max?: number; above?: number } = {}): number | string {
  const raw = input.value.trim();
  if (raw === '') return `${what} is empty: type a number.`;
  const v = Number(raw);
  if (!Number.isFinite(v)) return `${what} "${raw}" is not a number.`;
  if (limits.above !== undefined && !(v > limits.above)) return `${what} must be more than ${limits.above}; ${raw} is not.`;
  if (limits.min !== undefined && v < limits.min) return `${what} must be at least ${limits.min}; ${raw} is less.`;
  if (limits.max !== undefined && v > limits.max) return `${what} must be at most ${limits.max}; ${raw} is more.`;
  return v;
}
