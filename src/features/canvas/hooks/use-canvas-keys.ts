// Keyboard of the panel canvas: our own shortcuts (listed in the help popover and the README).
import { useState, type KeyboardEvent as ReactKeyboardEvent, type RefObject } from 'react';
import { panBy, zoomAbout } from '../../../../shared/canvas';
import { LAYERS, type CanvasStore } from '../store';

interface KeyDeps {
  store: CanvasStore;
  containerRef: RefObject<HTMLDivElement | null>;
  sizeRef: RefObject<{ width: number; height: number }>;
  fit: () => void;
  /** whether the comment tool exists (N does nothing without it) */
  canNote: boolean;
}

export function useCanvasKeys({ store, containerRef, sizeRef, fit, canNote }: KeyDeps) {
  const [helpOpen, setHelpOpen] = useState(false);
  const onKeyDown = (e: ReactKeyboardEvent<HTMLDivElement>) => {
    if (e.target !== containerRef.current) return; // typing in the note editor
    const s = store.getState();
    if (!s.view) return;
    const { width: w, height: h } = sizeRef.current;
    const step = e.shiftKey ? 200 : 60;
    let handled = true;
    switch (e.key) {
      case 'f': case 'F': fit(); break;
      case '+': case '=': store.set({ view: zoomAbout(s.view, w / 2, h / 2, 1.5) }); break;
      case '-': case '_': store.set({ view: zoomAbout(s.view, w / 2, h / 2, 1 / 1.5) }); break;
      case 'ArrowLeft': store.set({ view: panBy(s.view, step, 0) }); break;
      case 'ArrowRight': store.set({ view: panBy(s.view, -step, 0) }); break;
      case 'ArrowUp': store.set({ view: panBy(s.view, 0, step) }); break;
      case 'ArrowDown': store.set({ view: panBy(s.view, 0, -step) }); break;
      case 'm': case 'M': store.setTool(s.tool === 'measure' ? 'select' : 'measure'); break;
      case 'n': case 'N': if (canNote) store.setTool(s.tool === 'note' ? 'select' : 'note'); break;
      case 'Escape':
        setHelpOpen(false);
        if (s.tool !== 'select') store.setTool('select');
        else store.clearSelection();
        break;
      case '?': setHelpOpen((o) => !o); break;
      default: {
        const n = e.key >= '0' && e.key <= '9' && !e.ctrlKey && !e.metaKey && !e.altKey ? (e.key === '0' ? 9 : Number(e.key) - 1) : -1;
        if (n >= 0 && n < LAYERS.length) store.toggleLayer(LAYERS[n].id);
        else handled = false;
      }
    }
    if (handled) e.preventDefault();
  };
  return { helpOpen, setHelpOpen, onKeyDown };
}
