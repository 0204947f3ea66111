/** Scroll `container` (only it, never the page) so that `el` is in view. */
export function scrollWithin(container: HTMLElement | null, el: HTMLElement | null) {
  if (!container || !el) return;
  const c = container.getBoundingClientRect();
  const r = el.getBoundingClientRect();
  if (r.top < c.top) container.scrollTop -= c.top - r.top + 4;
  else if (r.bottom > c.bottom) container.scrollTop += r.bottom - c.bottom + 4;
}
