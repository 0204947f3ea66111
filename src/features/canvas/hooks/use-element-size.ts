import { useLayoutEffect, useState, type RefObject } from 'react';

/** Width and height of an element in CSS px, following resizes. */
export function useElementSize(ref: RefObject<HTMLElement | null>, fallback = { width: 800, height: 500 }) {
  const [size, setSize] = useState(fallback);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const read = () => {
      const r = el.getBoundingClientRect();
      const w = Math.round(r.width) || fallback.width;
      const h = Math.round(r.height) || fallback.height;
      setSize((s) => (s.width === w && s.height === h ? s : { width: w, height: h }));
    };
    read();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(read);
    ro.observe(el);
    return () => ro.disconnect();
  }, [ref, fallback.width, fallback.height]);
  return size;
}
