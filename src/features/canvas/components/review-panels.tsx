// Side pieces of the review: tools, filters, measure readout, underlay controls, comments.
import { useId, useMemo, useRef } from 'react';
import { initialUnderlay } from '../../../../shared/canvas';
import type { RunResult, Side } from '../../../../shared/core';
import { FINDING_KINDS, type Finding, type FindingKind } from '../../../../shared/schemas/finding.schema';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { fixed, mm } from '../../../lib/format';
import type { Scene } from '../scene';
import { useCanvasState, type CanvasStore, type Tool } from '../store';
import type { CanvasNote, UnderlayState } from '../types';

const TOOLS: { id: Tool; label: string; key: string }[] = [
  { id: 'select', label: 'Select', key: 'Esc' },
  { id: 'measure', label: 'Measure', key: 'M' },
  { id: 'note', label: 'Comment', key: 'N' },
];

export function ToolBar({ store, canNote }: { store: CanvasStore; canNote: boolean }) {
  const tool = useCanvasState(store, (s) => s.tool);
  return (
    <div role="toolbar" aria-label="Canvas tools" className="flex shrink-0 items-center gap-1 whitespace-nowrap">
      {TOOLS.filter((t) => canNote || t.id !== 'note').map((t) => (
        <Button key={t.id} variant={tool === t.id ? 'primary' : 'secondary'} aria-pressed={tool === t.id} onClick={() => store.setTool(t.id)} className="px-2.5 py-1" title={`${t.label} (${t.key})`}>
          {t.label}
        </Button>
      ))}
      <Button variant="secondary" className="px-2.5 py-1" onClick={() => store.requestFit()} title="Fit the panel (F)">
        Fit panel
      </Button>
    </div>
  );
}

export function SideSwitch({ side, sides, onChange }: { side: Side; sides: Side[]; onChange: (s: Side) => void }) {
  return (
    <div role="radiogroup" aria-label="Side shown" className="flex shrink-0 overflow-hidden rounded border border-ink-300">
      {(['top', 'bottom'] as const).map((s) => (
        <button
          key={s}
          type="button"
          role="radio"
          aria-checked={side === s}
          disabled={!sides.includes(s)}
          onClick={() => onChange(s)}
          className={`whitespace-nowrap px-3 py-1 text-sm ${side === s ? 'bg-ink-800 text-white' : 'bg-white text-ink-700 hover:bg-ink-100'} disabled:text-ink-300`}
        >
          {s === 'top' ? 'Top (from above)' : 'Bottom (from below)'}
        </button>
      ))}
    </div>
  );
}

export function Filters({ store, run, findings }: { store: CanvasStore; run: RunResult; findings: readonly Finding[] }) {
  const filters = useCanvasState(store, (s) => s.filters);
  const options = useMemo(() => {
    const pk = new Set<string>();
    const nz = new Set<string>();
    for (let i = 0; i < run.placements.count; i++) {
      pk.add(run.placements.packageName[i] ?? '(none)');
      nz.add(run.placements.nozzle[i] ?? '(none)');
    }
    const kinds = FINDING_KINDS.filter((k) => findings.some((f) => f.kind === k));
    return { packages: [...pk].sort(), nozzles: [...nz].sort(), kinds };
  }, [run, findings]);
  return (
    <div className="flex flex-col gap-2">
      <SelectField label="Package" value={filters.packages[0] ?? ''} onChange={(e) => store.setFilters({ packages: e.target.value ? [e.target.value] : [] })}>
        <option value="">all packages</option>
        {options.packages.map((p) => (
          <option key={p} value={p}>{p}</option>
        ))}
      </SelectField>
      <SelectField label="Nozzle" value={filters.nozzles[0] ?? ''} onChange={(e) => store.setFilters({ nozzles: e.target.value ? [e.target.value] : [] })}>
        <option value="">all nozzles</option>
        {options.nozzles.map((p) => (
          <option key={p} value={p}>{p}</option>
        ))}
      </SelectField>
      <SelectField label="Finding kind" value={filters.kinds[0] ?? ''} onChange={(e) => store.setFilters({ kinds: e.target.value ? [e.target.value as FindingKind] : [] })}>
        <option value="">all kinds</option>
        {options.kinds.map((p) => (
          <option key={p} value={p}>{p}</option>
        ))}
      </SelectField>
    </div>
  );
}

export function MeasureReadout({ store, scene }: { store: CanvasStore; scene: Scene }) {
  const m = useCanvasState(store, (s) => s.measure);
  const tool = useCanvasState(store, (s) => s.tool);
  if (tool !== 'measure' && m.length === 0) return null;
  const p = scene.run.placements;
  const name = (k: number) => (m[k].part >= 0 ? `${p.board[m[k].part]}:${p.ref[m[k].part]} centre` : `point ${k + 1}`);
  return (
    <div role="status" aria-label="Measurement" className="rounded border border-ink-200 bg-white px-3 py-2 text-sm">
      {m.length < 2 ? (
        <p className="text-ink-600">{m.length === 0 ? 'Click a first point or part.' : `From ${name(0)}: click a second point or part.`}</p>
      ) : (
        <>
          <p className="text-xs text-ink-500">
            {name(0)} → {name(1)}
          </p>
          <p className="num text-base font-medium" data-testid="measure-distance">
            {mm(Math.hypot(m[1].x - m[0].x, m[1].y - m[0].y))}
          </p>
          <p className="num text-xs text-ink-600">
            ΔX {mm(m[1].x - m[0].x)} · ΔY {mm(m[1].y - m[0].y)}
          </p>
        </>
      )}
    </div>
  );
}

export function UnderlayControls({
  side,
  scene,
  underlay,
  onChange,
  store,
}: {
  side: Side;
  scene: Scene;
  underlay: UnderlayState | null;
  onChange: (u: UnderlayState | null, file?: File) => void;
  store: CanvasStore;
}) {
  const fileId = useId();
  const opacityId = useId();
  const input = useRef<HTMLInputElement>(null);
  const tool = useCanvasState(store, (s) => s.tool);
  const load = (file: File) => {
    // FileReader → Blob → object URL: the image never leaves the browser until the lead stores it
    const reader = new FileReader();
    reader.onload = () => {
      const url = URL.createObjectURL(new Blob([reader.result as ArrayBuffer], { type: file.type || 'image/png' }));
      const img = new Image();
      img.onload = () => {
        onChange(
          { side, url, name: file.name, width: img.naturalWidth, height: img.naturalHeight, transform: initialUnderlay(img.naturalWidth, img.naturalHeight, scene.bounds), opacity: 0.5 },
          file,
        );
      };
      img.src = url;
    };
    reader.readAsArrayBuffer(file);
  };
  return (
    <div className="flex flex-col gap-2">
      <p className="text-xs font-medium text-ink-700">Underlay image ({side} side)</p>
      <label htmlFor={fileId} className="sr-only">
        Load an underlay image
      </label>
      <input
        ref={input}
        id={fileId}
        type="file"
        accept="image/*"
        aria-label="Load an underlay image"
        className="text-xs"
        onChange={(e) => {
          const f = e.target.files?.[0];
          if (f) load(f);
          e.target.value = '';
        }}
      />
      {underlay && (
        <>
          <p className="truncate text-xs text-ink-600" title={underlay.name}>
            {underlay.name} · <span className="num">{underlay.width} × {underlay.height} px</span>
          </p>
          <label htmlFor={opacityId} className="flex items-center gap-2 text-xs text-ink-700">
            Opacity
            <input
              id={opacityId}
              type="range"
              min={0}
              max={1}
              step={0.05}
              value={underlay.opacity}
              aria-label="Underlay opacity"
              onChange={(e) => onChange({ ...underlay, opacity: Number(e.target.value) })}
              className="flex-1"
            />
            <span className="num w-10 text-right">{Math.round(underlay.opacity * 100)} %</span>
          </label>
          <div className="flex gap-2">
            <Button variant={tool === 'align' ? 'primary' : 'secondary'} aria-pressed={tool === 'align'} className="px-2 py-1 text-xs" onClick={() => store.setTool(tool === 'align' ? 'select' : 'align')}>
              Align with two points
            </Button>
            <Button variant="ghost" className="px-2 py-1 text-xs" onClick={() => onChange(null)}>
              Remove
            </Button>
          </div>
          {underlay.pairs && (
            <p className="num text-2xs text-ink-500">
              aligned on {underlay.pairs.panel.map((q) => `(${fixed(q.x)}, ${fixed(q.y)})`).join(' and ')} mm
            </p>
          )}
        </>
      )}
    </div>
  );
}

export function CommentsList({ notes, side, store }: { notes: readonly CanvasNote[]; side: Side; store: CanvasStore }) {
  const mine = notes.map((n, k) => ({ n, k })).filter(({ n }) => n.side === side);
  return (
    <section aria-label="Comments" className="flex flex-col gap-1">
      <p className="text-xs font-medium text-ink-700">Comments on this side ({mine.length})</p>
      {mine.length === 0 ? (
        <p className="text-xs text-ink-500">None yet. Use Comment (N) and click the panel.</p>
      ) : (
        <ol className="flex flex-col gap-1">
          {mine.map(({ n, k }) => (
            <li key={n.id}>
              <button type="button" className="w-full rounded px-1.5 py-1 text-left text-xs hover:bg-ink-100" onClick={() => store.focusOn(n.x, n.y)}>
                <span className="mr-1 inline-block w-4 rounded-full bg-copper-400 text-center text-2xs font-semibold text-ink-950">{k + 1}</span>
                {n.text}
                <span className="num block text-2xs text-ink-500">
                  {n.author ? `${n.author} · ` : ''}
                  {fixed(n.x)}, {fixed(n.y)} mm
                </span>
              </button>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
