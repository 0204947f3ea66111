import { useMemo } from 'react';
import type { RevisionSettingsInput } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { SelectField } from '../../../../components/ui/field';
import { useMachines } from '../../../../features/programs/api/library-refs';
import { NumInput } from '../../../../features/programs/components/num-input';
import { PanelPreview } from '../../../../features/programs/components/panel-preview';
import { useSettingsDraft } from '../../../../features/programs/hooks/use-settings-draft';
import { useWorkspace } from '../workspace';
import { BOARD_GAP_MM, defaultPitch, FIT_MARGIN_MM, outlineFromExtent, panelProblems } from './panelize-help';
import { fixed } from '../../../../lib/format';

type Panel = NonNullable<RevisionSettingsInput['panel']>;
type Grid = NonNullable<Panel['grid']>;
type Instance = NonNullable<Panel['instances']>[number];

const EMPTY_GRID: Grid = { rows: 1, cols: 2, pitchX: 0, pitchY: 0, offsetX: 5, offsetY: 5, rotation: 0, cellRotations: [], skip: [] };

/** A new grid for this board: pitch = board size + BOARD_GAP_MM. */
const newGrid = (board: { width?: number; height?: number } | undefined): Grid => ({ ...EMPTY_GRID, ...defaultPitch(board) });

export default function PanelizeStage() {
  const { revision: r } = useWorkspace();
  const s = useSettingsDraft(r);
  const machines = useMachines();
  const ro = !r.can.edit;
  const d = s.draft;
  const board = d.board ?? { originX: 0, originY: 0, width: NaN, height: NaN };
  const panel: Panel = d.panel ?? { width: NaN, height: NaN, flipAxis: 'vertical', grid: newGrid(board) };
  const mode = panel.instances ? 'instances' : 'grid';
  const grid: Grid = { ...EMPTY_GRID, ...(panel.grid ?? {}) };
  const setBoard = (patch: Partial<typeof board>) => {
    const next = { ...board, ...patch };
    // a grid pitch still at its default (or unset) follows the board size as it is typed
    let nextPanel = d.panel;
    if (d.panel && panel.grid && !panel.instances) {
      const was = defaultPitch(board);
      const now = defaultPitch(next);
      const g = { ...grid };
      if (g.pitchX === was.pitchX || !(g.pitchX > 0)) g.pitchX = now.pitchX;
      if (g.pitchY === was.pitchY || !(g.pitchY > 0)) g.pitchY = now.pitchY;
      if (g.pitchX !== grid.pitchX || g.pitchY !== grid.pitchY) nextPanel = { ...panel, grid: g };
    }
    s.setDraft({ ...d, board: next as never, panel: nextPanel });
  };
  const extent = r.imported?.extent ?? null;
  const problems = useMemo(() => panelProblems(board, panel), [board, panel]);
  const setPanel = (patch: Partial<Panel>) => s.setDraft({ ...d, panel: { ...panel, ...patch } as Panel });
  const setGrid = (patch: Partial<Grid>) => setPanel({ grid: { ...grid, ...patch }, instances: undefined });
  const instances: Instance[] = panel.instances ?? [];
  const setInstance = (i: number, patch: Partial<Instance>) => setPanel({ instances: instances.map((x, j) => (j === i ? { ...x, ...patch } : x)), grid: undefined });
  const cellRotation = (row: number, col: number) => grid.cellRotations?.find((c) => c.row === row && c.col === col)?.rotation;
  const isSkipped = (row: number, col: number) => !!grid.skip?.some((c) => c.row === row && c.col === col);
  const machine = d.machine;
  const tooBig = machine && panel.width > 0 && panel.height > 0 && (panel.width > machine.reachX || panel.height > machine.reachY);

  const cycleCell = (row: number, col: number) => {
    // Click: 0° → 180° → skipped → 0° (other angles in the table below)
    const rot = cellRotation(row, col);
    const skipped = isSkipped(row, col);
    const others = (grid.cellRotations ?? []).filter((c) => !(c.row === row && c.col === col));
    const skipsOthers = (grid.skip ?? []).filter((c) => !(c.row === row && c.col === col));
    if (skipped) setGrid({ skip: skipsOthers, cellRotations: others });
    else if (rot === 180) setGrid({ cellRotations: others, skip: [...skipsOthers, { row, col }] });
    else setGrid({ cellRotations: [...others, { row, col, rotation: 180 }], skip: skipsOthers });
  };

  return (
    <div className="grid gap-6 xl:grid-cols-[26rem_1fr]">
      <form
        aria-label="Panel"
        className="flex flex-col gap-5"
        onSubmit={(e) => {
          e.preventDefault();
          s.save();
        }}
      >
        <fieldset disabled={ro} className="grid grid-cols-2 gap-3 rounded border border-ink-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold">Board outline (design coordinates)</legend>
          <NumInput label="Origin X" value={board.originX} onChange={(v) => setBoard({ originX: v ?? 0 })} error={s.fieldError('board.originX')} />
          <NumInput label="Origin Y" value={board.originY} onChange={(v) => setBoard({ originY: v ?? 0 })} error={s.fieldError('board.originY')} />
          <NumInput label="Width" value={board.width} onChange={(v) => setBoard({ width: v })} error={s.fieldError('board.width')} />
          <NumInput label="Height" value={board.height} onChange={(v) => setBoard({ height: v })} error={s.fieldError('board.height')} />
          <p className="col-span-2 text-xs text-ink-500">The lower-left corner of the board in the centroid file's coordinates, and its size.</p>
          {extent && (
            <div className="col-span-2 flex flex-wrap items-center gap-2 rounded bg-ink-50 px-2 py-1.5 text-xs text-ink-700" data-testid="parts-extent">
              <span>
                Parts span <span className="num">{fixed(extent.minX)} … {fixed(extent.maxX)} mm</span> in X and <span className="num">{fixed(extent.minY)} … {fixed(extent.maxY)} mm</span> in Y.
              </span>
              {!ro && (
                <Button variant="secondary" className="px-2 py-0.5 text-xs" title={`Outline = the parts' centres plus ${FIT_MARGIN_MM} mm on every side; check it against the board's drawing`} onClick={() => setBoard(outlineFromExtent(extent))}>
                  Fit outline to parts
                </Button>
              )}
            </div>
          )}
        </fieldset>

        <fieldset disabled={ro} className="grid grid-cols-2 gap-3 rounded border border-ink-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold">Panel</legend>
          <NumInput label="Panel width" value={panel.width} onChange={(v) => setPanel({ width: v as number })} error={s.fieldError('panel.width')} />
          <NumInput label="Panel height" value={panel.height} onChange={(v) => setPanel({ height: v as number })} error={s.fieldError('panel.height')} />
          <SelectField className="col-span-2" label="Bottom side flips about" value={panel.flipAxis ?? 'vertical'} onChange={(e) => setPanel({ flipAxis: e.target.value as Panel['flipAxis'] })}>
            <option value="vertical">the vertical axis (left–right)</option>
            <option value="horizontal">the horizontal axis (top–bottom)</option>
          </SelectField>
          <SelectField className="col-span-2" label="Boards are placed by" value={mode} onChange={(e) => (e.target.value === 'grid' ? setPanel({ grid: newGrid(board), instances: undefined }) : setPanel({ instances: [{ x: 5, y: 5, rotation: 0, skip: false }], grid: undefined }))}>
            <option value="grid">a grid (rows × columns)</option>
            <option value="instances">a list of boards</option>
          </SelectField>
        </fieldset>

        {mode === 'grid' ? (
          <fieldset disabled={ro} className="grid grid-cols-2 gap-3 rounded border border-ink-200 bg-white p-4">
            <legend className="px-1 text-sm font-semibold">Grid</legend>
            <NumInput label="Rows" unit="" integer value={grid.rows} onChange={(v) => setGrid({ rows: v as number })} error={s.fieldError('panel.grid.rows')} />
            <NumInput label="Columns" unit="" integer value={grid.cols} onChange={(v) => setGrid({ cols: v as number })} error={s.fieldError('panel.grid.cols')} />
            <NumInput label="Pitch X" value={grid.pitchX} onChange={(v) => setGrid({ pitchX: v as number })} />
            <NumInput label="Pitch Y" value={grid.pitchY} onChange={(v) => setGrid({ pitchY: v as number })} />
            <p className="col-span-2 -mt-1 text-2xs text-ink-500">Pitch: from one board's corner to the next one's. A new grid starts at the board size + {BOARD_GAP_MM} mm (a routing gap); for V-scored boards use the board size.</p>
            <NumInput label="Offset X" value={grid.offsetX} onChange={(v) => setGrid({ offsetX: v ?? 0 })} />
            <NumInput label="Offset Y" value={grid.offsetY} onChange={(v) => setGrid({ offsetY: v ?? 0 })} />
            <NumInput label="Board rotation" unit="°" value={grid.rotation} onChange={(v) => setGrid({ rotation: v ?? 0 })} />
            <div className="col-span-2">
              <p className="mb-1 text-xs font-medium text-ink-700">Cells — click to turn a board 180°, click again to skip it</p>
              <div role="grid" aria-label="Grid cells" className="inline-grid gap-1" style={{ gridTemplateColumns: `repeat(${Math.max(1, Math.min(grid.cols || 1, 20))}, 2.6rem)` }}>
                {Array.from({ length: Math.min(grid.rows || 0, 20) }, (_, k) => (grid.rows || 0) - 1 - k).flatMap((row) =>
                  Array.from({ length: Math.min(grid.cols || 0, 20) }, (_, col) => {
                    const n = row * grid.cols + col + 1;
                    const rot = cellRotation(row, col);
                    const sk = isSkipped(row, col);
                    return (
                      <button
                        key={`${row}-${col}`}
                        type="button"
                        role="gridcell"
                        aria-label={`Board ${n}, row ${row}, column ${col}: ${sk ? 'skipped' : `${rot ?? grid.rotation}°`}`}
                        onClick={() => cycleCell(row, col)}
                        className={`num h-9 rounded text-2xs ${sk ? 'bg-ink-100 text-ink-400 line-through' : rot !== undefined ? 'bg-copper-200 text-copper-900' : 'bg-mask-400/30 text-mask-700'}`}
                      >
                        {n}
                        <br />
                        {sk ? 'skip' : `${rot ?? grid.rotation}°`}
                      </button>
                    );
                  }),
                )}
              </div>
              <p className="mt-1 text-2xs text-ink-500">Row 0 is the bottom row; boards are numbered row by row from the bottom left.</p>
            </div>
          </fieldset>
        ) : (
          <fieldset disabled={ro} className="flex flex-col gap-2 rounded border border-ink-200 bg-white p-4">
            <legend className="px-1 text-sm font-semibold">Boards</legend>
            {instances.map((inst, i) => (
              <div key={i} className="grid grid-cols-[2rem_1fr_1fr_1fr_auto_auto] items-end gap-2">
                <span className="num pb-2 text-sm">{i + 1}</span>
                <NumInput label="Anchor X" value={inst.x} onChange={(v) => setInstance(i, { x: v as number })} />
                <NumInput label="Anchor Y" value={inst.y} onChange={(v) => setInstance(i, { y: v as number })} />
                <NumInput label="Rotation" unit="°" value={inst.rotation} onChange={(v) => setInstance(i, { rotation: v ?? 0 })} />
                <label className="flex items-center gap-1 pb-2 text-xs"><input type="checkbox" checked={!!inst.skip} onChange={(e) => setInstance(i, { skip: e.target.checked })} />skip</label>
                <Button variant="ghost" aria-label={`Remove board ${i + 1}`} onClick={() => setPanel({ instances: instances.filter((_, j) => j !== i), grid: undefined })}>✕</Button>
              </div>
            ))}
            <Button variant="secondary" onClick={() => setPanel({ instances: [...instances, { x: 5, y: 5, rotation: 0, skip: false }], grid: undefined })}>Add a board</Button>
          </fieldset>
        )}

        {problems && (problems.overlaps.length > 0 || problems.offPanel.length > 0) && (
          <div role="alert" aria-label="Panel problems" className="flex flex-col gap-1 rounded border border-sev-error/40 bg-sev-error/5 px-3 py-2 text-xs text-sev-error">
            {problems.overlaps.length > 0 && (
              <p>
                Boards overlap: {problems.overlaps.slice(0, 6).map(([a, b]) => `${a} and ${b}`).join(', ')}{problems.overlaps.length > 6 ? ` and ${problems.overlaps.length - 6} more pairs` : ''}.
                {mode === 'grid' && board.width > 0 && board.height > 0 && <> Make the pitch at least the board size (<span className="num">{fixed(board.width)} × {fixed(board.height)} mm</span>, turned boards count with their turned size).</>}
              </p>
            )}
            {problems.offPanel.length > 0 && <p>Board{problems.offPanel.length === 1 ? '' : 's'} {problems.offPanel.slice(0, 10).join(', ')}{problems.offPanel.length > 10 ? '…' : ''} reach{problems.offPanel.length === 1 ? 'es' : ''} outside the panel: enlarge the panel or move the boards.</p>}
          </div>
        )}

        <fieldset disabled={ro} className="flex flex-col gap-2 rounded border border-ink-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold">Machine</legend>
          <SelectField
            label="Machine profile"
            value={machine?.name ?? ''}
            onChange={(e) => {
              const m = machines.data?.find((x) => x.name === e.target.value);
              s.setDraft({ ...d, machine: m ? { name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: m.nozzles } : undefined });
            }}
          >
            <option value="">(none: no reach or nozzle check)</option>
            {machines.data?.map((m) => <option key={m.id} value={m.name}>{m.name} — {m.reachX} × {m.reachY} mm</option>)}
          </SelectField>
          {machine && <p className="num text-xs text-ink-600">Reach {fixed(machine.reachX)} × {fixed(machine.reachY)} mm · nozzles {machine.nozzles?.join(', ') || 'none'}</p>}
          {tooBig && <p role="alert" className="rounded bg-sev-error/10 px-2 py-1 text-xs text-sev-error">The panel ({panel.width} × {panel.height} mm) does not fit the machine's reach ({machine!.reachX} × {machine!.reachY} mm).</p>}
        </fieldset>

        {!ro && (
          <div className="flex gap-2">
            <Button type="submit" disabled={!s.dirty || s.saving}>{s.saving ? 'Saving…' : 'Save panel'}</Button>
            <Button variant="secondary" disabled={!s.dirty} onClick={s.reset}>Discard changes</Button>
          </div>
        )}
      </form>
      <section aria-label="Panel drawing" className="min-w-0">
        <PanelPreview settings={d} reach={machine ? { x: machine.reachX, y: machine.reachY } : null} height={520} />
      </section>
    </div>
  );
}
