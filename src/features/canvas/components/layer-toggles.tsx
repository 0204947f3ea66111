import { LAYERS, useCanvasState, type CanvasStore } from '../store';

/** One checkbox per layer, with its number-key shortcut. */
export function LayerToggles({ store, hasUnderlay = false }: { store: CanvasStore; hasUnderlay?: boolean }) {
  const layers = useCanvasState(store, (s) => s.layers);
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-xs font-medium text-ink-700">Layers</legend>
      {LAYERS.map((l, k) =>
        l.id === 'underlay' && !hasUnderlay ? null : (
          <label key={l.id} className="flex items-center gap-2 text-sm text-ink-800">
            <input type="checkbox" checked={layers[l.id]} onChange={() => store.toggleLayer(l.id)} aria-keyshortcuts={String((k + 1) % 10)} />
            <span className="flex-1">{l.label}</span>
            <kbd className="num rounded border border-ink-200 px-1 text-2xs text-ink-500">{(k + 1) % 10}</kbd>
          </label>
        ),
      )}
    </fieldset>
  );
}
