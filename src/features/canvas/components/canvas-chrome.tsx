// The HTML pieces laid over the canvas: side and frame badge, scale bar, cursor coordinates, hover
// card, the shortcut help and the note editor.
import { useEffect, useId, useRef, useState } from 'react';
import { applyAffine, scaleBarLength, worldToScreen } from '../../../../shared/canvas';
import type { RunResult } from '../../../../shared/core';
import { deg, fixed, mm } from '../../../lib/format';
import type { Scene } from '../scene';
import { LAYERS, useCanvasState, type CanvasStore } from '../store';

export function frameName(run: RunResult): string {
  if (run.frame === 'machine') return 'machine frame';
  return run.side === 'bottom' ? 'bottom panel frame' : 'panel frame';
}

/** The side and frame, one line in the strip above the drawing. */
export function SideBadge({ run }: { run: RunResult }) {
  return (
    <div className="flex min-w-0 shrink items-baseline gap-2 truncate" data-testid="side-badge">
      <span className="font-semibold">{run.side === 'top' ? 'Top side · seen from above' : 'Bottom side · seen from below'}</span>
      <span className="truncate text-ink-400">drawn in the {frameName(run)}, X right, Y up</span>
    </div>
  );
}

/** The scale bar, in the strip below the drawing. */
export function ScaleBar({ store }: { store: CanvasStore }) {
  const s = useCanvasState(store, (st) => st.view?.s ?? 0);
  if (!s) return <span />;
  const len = scaleBarLength(s, 120);
  const px = len * s;
  const text = len >= 1 ? `${len} mm` : `${len.toFixed(len < 0.1 ? 2 : 1)} mm`;
  return (
    <div className="flex items-center gap-2" aria-label={`Scale bar: ${text}`} role="img">
      <div className="h-1.5 border-x-2 border-b-2 border-ink-100" style={{ width: px }} />
      <span className="num text-2xs text-ink-100">{text}</span>
    </div>
  );
}

/** Cursor coordinates and their frame, in the strip below the drawing. */
export function CursorReadout({ store, scene }: { store: CanvasStore; scene: Scene }) {
  const cursor = useCanvasState(store, (s) => s.cursor);
  const frame = useCanvasState(store, (s) => s.cursorFrame);
  const id = useId();
  const map = frame === 'panel' ? scene.toPanel : scene.toMachine;
  const p = cursor && map ? applyAffine(map, cursor.x, cursor.y) : null;
  const frameLabel = frame === 'panel' ? (scene.run.side === 'bottom' ? 'bottom panel frame' : 'panel frame') : 'machine frame';
  return (
    <div className="flex items-center gap-2 text-xs text-ink-100">
      <span className="num min-w-[17rem] whitespace-pre text-right" aria-live="off" data-testid="cursor-readout">
        {p ? `X ${fixed(p.x)} mm  Y ${fixed(p.y)} mm` : cursor && !map ? 'not measured: no fiducial transform' : 'X —  Y —'}
      </span>
      <label htmlFor={id} className="sr-only">
        Frame of the cursor coordinates
      </label>
      <select
        id={id}
        aria-label="Frame of the cursor coordinates"
        value={frame}
        onChange={(e) => store.set({ cursorFrame: e.target.value as 'panel' | 'machine' })}
        className="rounded border border-ink-600 bg-ink-800 px-1 py-0.5 text-xs text-ink-100"
      >
        <option value="panel">{scene.run.side === 'bottom' ? 'bottom panel frame' : 'panel frame'}</option>
        <option value="machine">machine frame</option>
      </select>
      <span className="sr-only">{frameLabel}</span>
    </div>
  );
}

export function HoverCard({ store, scene, pos, width, height }: { store: CanvasStore; scene: Scene; pos: { x: number; y: number }; width: number; height: number }) {
  const i = useCanvasState(store, (s) => s.hovered);
  if (i < 0 || i >= scene.run.placements.count) return null;
  const p = scene.run.placements;
  const rows: [string, string][] = [
    ['Package', p.packageName[i] ?? `none (${p.footprint[i]})`],
    ['Value', p.value[i] || '—'],
    ['Position', `${mm(p.x[i])}, ${mm(p.y[i])}`],
    ['Rotation', deg(p.rotation[i])],
    ['Nozzle', p.nozzle[i] ?? '—'],
    ['Vision preset', p.vision[i] ?? '—'],
  ];
  return (
    <div
      role="tooltip"
      data-testid="hover-card"
      className="pointer-events-none absolute z-20 rounded border border-ink-600 bg-ink-900/95 px-2.5 py-1.5 text-xs text-ink-100 shadow-lg"
      // beside the cursor, flipped to the other side near the right and bottom edges
      style={{ left: pos.x + 270 > width ? Math.max(0, pos.x - 264) : pos.x + 14, top: pos.y + 170 > height ? Math.max(0, pos.y - 164) : pos.y + 14 }}
    >
      <p className="mb-1 font-semibold">
        {p.ref[i]} <span className="font-normal text-ink-400">board {p.board[i]}</span>
      </p>
      <dl className="grid grid-cols-[auto_auto] gap-x-3 gap-y-0.5">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-ink-400">{k}</dt>
            <dd className={k === 'Position' || k === 'Rotation' ? 'num' : ''}>{v}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

export const SHORTCUTS: [string, string][] = [
  ['F', 'fit the panel'],
  ['+  /  −', 'zoom in / out (the wheel zooms about the cursor)'],
  ['arrow keys', 'move the view (Shift: further)'],
  ['drag', 'move the view'],
  ['Shift + drag', 'select the parts inside a box'],
  ['click', 'select a part (Shift adds, Ctrl toggles)'],
  ...LAYERS.map((l, k): [string, string] => [String((k + 1) % 10), `show / hide ${l.label.toLowerCase()}`]),
  ['M', 'measure: two points or two parts'],
  ['N', 'pin a comment'],
  ['Esc', 'leave the tool, then clear the selection'],
  ['?', 'this help'],
];

export function HelpPopover({ open, onOpenChange, canNote }: { open: boolean; onOpenChange: (o: boolean) => void; canNote: boolean }) {
  const id = useId();
  return (
    <div className="relative ml-auto flex shrink-0 flex-col items-end">
      <button
        type="button"
        aria-label="Keyboard shortcuts"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => onOpenChange(!open)}
        className="h-6 w-6 rounded-full bg-ink-700 text-sm font-semibold text-ink-100 hover:bg-ink-600"
      >
        ?
      </button>
      {open && (
        <div id={id} role="dialog" aria-label="Keyboard shortcuts" className="absolute right-0 top-full z-30 mt-1.5 w-80 rounded border border-ink-600 bg-ink-900/95 p-3 text-xs text-ink-100 shadow-xl">
          <p className="mb-2 font-semibold">Keys (click the canvas first)</p>
          <table className="w-full">
            <tbody>
              {SHORTCUTS.filter(([k]) => canNote || k !== 'N').map(([k, v]) => (
                <tr key={k + v}>
                  <td className="num whitespace-nowrap pr-3 align-top text-copper-300">{k}</td>
                  <td className="text-ink-200">{v}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

export function NoteEditor({ store, at, onSubmit, onCancel }: { store: CanvasStore; at: { x: number; y: number }; onSubmit: (t: string) => void; onCancel: () => void }) {
  const view = useCanvasState(store, (s) => s.view);
  const [text, setText] = useState('');
  const ref = useRef<HTMLTextAreaElement>(null);
  useEffect(() => ref.current?.focus(), []);
  if (!view) return null;
  const p = worldToScreen(view, at.x, at.y);
  return (
    <form
      aria-label="New comment"
      className="absolute z-30 w-64 rounded border border-ink-600 bg-white p-2 shadow-xl"
      style={{ left: p.x + 10, top: p.y + 4 }}
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit(text);
      }}
    >
      <label className="text-xs font-medium text-ink-700" htmlFor="pw-note-text">
        Comment at <span className="num">{fixed(at.x)}, {fixed(at.y)} mm</span>
      </label>
      <textarea
        id="pw-note-text"
        ref={ref}
        value={text}
        onChange={(e) => setText(e.target.value)}
        onKeyDown={(e) => {
          if (e.key === 'Escape') onCancel();
          if (e.key === 'Enter' && !e.shiftKey) {
            e.preventDefault();
            onSubmit(text);
          }
        }}
        rows={3}
        className="mt-1 w-full rounded border border-ink-300 px-2 py-1 text-sm"
      />
      <div className="mt-1 flex justify-end gap-2">
        <button type="button" className="rounded px-2 py-1 text-xs text-ink-700 hover:bg-ink-100" onClick={onCancel}>
          Cancel
        </button>
        <button type="submit" className="rounded bg-copper-500 px-2 py-1 text-xs font-medium text-white hover:bg-copper-600">
          Pin comment
        </button>
      </div>
    </form>
  );
}
