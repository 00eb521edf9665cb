/**
 * Redrawing a group of controls replaces the elements that had the keyboard focus; this puts the focus back on
 * the control with the same id, so that one arrow key on a menu does not send the focus to the page body.
 */
export function keepFocus(container: HTMLElement, redraw: () => void): void {
  const active = document.activeElement;
  const id = active instanceof HTMLElement && container.contains(active) ? active.id : '';
  const value = active instanceof HTMLElement ? active.dataset.value : undefined;
  redraw();
  if (!id && value === undefined) return;
  const again = id ? document.getElementById(id) : null;
  const target = again ?? (value !== undefined && active instanceof HTMLElement && active.parentElement?.id ? container.querySelector<HTMLElement>(`#${CSS.escape(active.parentElement.id)} [data-value="${CSS.escape(value)}"]`) : null);
  target?.focus();
}
