// View state of the canvas overlay: layers, selection, hover, tool, filters, measure points and
// the view transform. A tiny external store (subscribe + selectors through useSyncExternalStore)
// so that a pan or a hover re-renders only the pieces that show them, never the tables.
import { useSyncExternalStore } from 'react';
import type { FindingKind } from '../../../shared/schemas/finding.schema';
import type { ViewTransform } from '../../../shared/canvas';

/** Layers, in the order of their number-key shortcuts 1…9, 0. */
export const LAYERS = [
  { id: 'panel', label: 'Panel edge' },
  { id: 'boards', label: 'Boards' },
  { id: 'bodies', label: 'Bodies' },
  { id: 'courtyards', label: 'Courtyards' },
  { id: 'marks', label: 'Pin-1 marks' },
  { id: 'labels', label: 'References' },
  { id: 'fiducials', label: 'Fiducials' },
  { id: 'findings', label: 'Findings' },
  { id: 'reach', label: 'Machine reach' },
  { id: 'underlay', label: 'Underlay image' },
] as const;
export type LayerId = (typeof LAYERS)[number]['id'];
export type LayerVisibility = Record<LayerId, boolean>;

export const DEFAULT_LAYERS: LayerVisibility = {
  panel: true, boards: true, bodies: true, courtyards: false, marks: true, labels: true,
  fiducials: true, findings: true, reach: true, underlay: true,
};

export type Tool = 'select' | 'measure' | 'note' | 'align';
export type CursorFrame = 'panel' | 'machine';

export interface MeasurePoint {
  x: number;
  y: number;
  /** placement index when the point snapped to a part centre, else -1 */
  part: number;
}

export interface Filters {
  packages: string[];
  nozzles: string[];
  kinds: FindingKind[];
}

export interface CanvasState {
  layers: LayerVisibility;
  /** placement indices of the shown run */
  selected: ReadonlySet<number>;
  selectedFindings: ReadonlySet<string>;
  hovered: number;
  tool: Tool;
  measure: MeasurePoint[];
  cursorFrame: CursorFrame;
  /** cursor in the output frame, mm; null when outside */
  cursor: { x: number; y: number } | null;
  filters: Filters;
  view: ViewTransform | null;
  /** bumped by "fit" requests so the canvas refits */
  fitRequest: number;
  /** a point to centre on (selection from a table) */
  focus: { x: number; y: number; seq: number; size?: number } | null;
}

/** Part ↔ finding links of the shown run, so that selecting one side selects the other. */
export interface SelectionLinks {
  partFindings: Map<number, string[]>;
  findingParts: Map<string, number[]>;
}

export type SelectMode = 'replace' | 'add' | 'toggle';

const EMPTY_LINKS: SelectionLinks = { partFindings: new Map(), findingParts: new Map() };

export function initialCanvasState(over: Partial<CanvasState> = {}): CanvasState {
  return {
    layers: { ...DEFAULT_LAYERS },
    selected: new Set(),
    selectedFindings: new Set(),
    hovered: -1,
    tool: 'select',
    measure: [],
    cursorFrame: 'panel',
    cursor: null,
    filters: { packages: [], nozzles: [], kinds: [] },
    view: null,
    fitRequest: 0,
    focus: null,
    ...over,
  };
}

function merge<T>(cur: ReadonlySet<T>, add: Iterable<T>, mode: SelectMode): Set<T> {
  if (mode === 'replace') return new Set(add);
  const out = new Set(cur);
  for (const v of add) {
    if (mode === 'toggle' && out.has(v)) out.delete(v);
    else out.add(v);
  }
  return out;
}

export class CanvasStore {
  private state: CanvasState;
  private listeners = new Set<() => void>();
  links: SelectionLinks = EMPTY_LINKS;

  constructor(initial: Partial<CanvasState> = {}) {
    this.state = initialCanvasState(initial);
  }

  getState = (): CanvasState => this.state;

  subscribe = (fn: () => void): (() => void) => {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  };

  set(patch: Partial<CanvasState>) {
    this.state = { ...this.state, ...patch };
    for (const fn of this.listeners) fn();
  }

  toggleLayer(id: LayerId, on?: boolean) {
    this.set({ layers: { ...this.state.layers, [id]: on ?? !this.state.layers[id] } });
  }

  setLayers(layers: Partial<LayerVisibility>) {
    this.set({ layers: { ...this.state.layers, ...layers } });
  }

  /** Select parts; the findings that name them are selected with them. */
  selectParts(parts: Iterable<number>, mode: SelectMode = 'replace') {
    const selected = merge(this.state.selected, parts, mode);
    const selectedFindings = new Set<string>();
    for (const i of selected) for (const k of this.links.partFindings.get(i) ?? []) selectedFindings.add(k);
    this.set({ selected, selectedFindings });
  }

  /** Select findings; the parts they name are selected with them. */
  selectFindings(keys: Iterable<string>, mode: SelectMode = 'replace') {
    const selectedFindings = merge(this.state.selectedFindings, keys, mode);
    const selected = new Set<number>();
    for (const k of selectedFindings) for (const i of this.links.findingParts.get(k) ?? []) selected.add(i);
    this.set({ selected, selectedFindings });
  }

  clearSelection() {
    if (this.state.selected.size === 0 && this.state.selectedFindings.size === 0 && this.state.measure.length === 0) return;
    this.set({ selected: new Set(), selectedFindings: new Set(), measure: [] });
  }

  setTool(tool: Tool) {
    this.set({ tool, measure: tool === 'measure' ? this.state.measure : [] });
  }

  addMeasurePoint(p: MeasurePoint) {
    const m = this.state.measure.length >= 2 ? [p] : [...this.state.measure, p];
    this.set({ measure: m });
  }

  setFilters(f: Partial<Filters>) {
    this.set({ filters: { ...this.state.filters, ...f } });
  }

  requestFit() {
    this.set({ fitRequest: this.state.fitRequest + 1 });
  }

  /** Centre the view on (x, y); with `size` (mm) zoom so that about that much fills a third of
   * the view. */
  focusOn(x: number, y: number, size?: number) {
    this.set({ focus: { x, y, size, seq: (this.state.focus?.seq ?? 0) + 1 } });
  }
}

export function useCanvasState<T>(store: CanvasStore, select: (s: CanvasState) => T): T {
  return useSyncExternalStore(store.subscribe, () => select(store.getState()), () => select(store.getState()));
}
