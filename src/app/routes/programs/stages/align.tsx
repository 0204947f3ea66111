import type { Side } from '../../../../../shared/core';
import type { RevisionSettingsInput } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { SelectField } from '../../../../components/ui/field';
import { ErrorPanel, ProgressBar } from '../../../../components/ui/misc';
import { useRun } from '../../../../features/programs/api/programs';
import { NumInput } from '../../../../features/programs/components/num-input';
import { PanelPreview } from '../../../../features/programs/components/panel-preview';
import { useSettingsDraft } from '../../../../features/programs/hooks/use-settings-draft';
import { deg, mm } from '../../../../lib/format';
import { useWorkspace } from '../workspace';

type Fid = NonNullable<RevisionSettingsInput['fiducials']>[number];

const MODEL_HELP: Record<string, string> = {
  auto: 'The most general model the points fix: 1 point → translation, 2 → similarity, 3 or more → affine.',
  translation: 'Shift only. Rotation is not corrected.',
  rigid: 'Shift and rotation; scale fixed at 1.',
  similarity: 'Shift, rotation and one scale (least squares, Umeyama 1991).',
  affine: 'Shift, rotation, two scales and shear (6 parameters); needs 3 points not in a line.',
};

function TransformReport({ revisionId, version, side }: { revisionId: string; version: number; side: Side }) {
  const run = useRun(revisionId, side, version);
  if (run.isPending) return <ProgressBar label={`Fitting the ${side} transform`} />;
  if (run.isError) return <ErrorPanel error={run.error} />;
  const t = run.data.transform;
  return (
    <section aria-label={`${side} side transform`} className="rounded border border-ink-200 bg-white p-4">
      <h3 className="mb-2 text-sm font-semibold capitalize">{side} side</h3>
      {!t ? (
        <p className="text-sm text-ink-500">No measured fiducial on this side: the output stays in the panel frame.</p>
      ) : (
        <>
          <dl className="num grid grid-cols-[8rem_1fr] gap-y-0.5 text-sm">
            <dt className="font-sans text-ink-500">Model</dt><dd>{t.model}</dd>
            <dt className="font-sans text-ink-500">Rotation</dt><dd>{deg(t.rotationDeg)}</dd>
            <dt className="font-sans text-ink-500">Scale</dt><dd>{t.scale.toFixed(6)} ({t.scalePpm.toFixed(0)} ppm)</dd>
            {t.model === 'affine' && (<><dt className="font-sans text-ink-500">Shear</dt><dd>{deg(t.shearDeg)}</dd></>)}
            <dt className="font-sans text-ink-500">Shift</dt><dd>{mm(t.tx)}, {mm(t.ty)}</dd>
            <dt className="font-sans text-ink-500">RMS residual</dt><dd>{mm(t.rmsResidual)}</dd>
          </dl>
          <table aria-label={`${side} residuals`} className="mt-3 w-full text-sm">
            <thead className="text-left text-xs text-ink-500"><tr><th className="py-1 font-medium">Fiducial</th><th className="font-medium text-right">dx</th><th className="font-medium text-right">dy</th><th className="font-medium text-right">distance</th></tr></thead>
            <tbody>
              {t.residuals.map((r) => (
                <tr key={r.name} className="num border-t border-ink-100">
                  <td className="py-1">{r.name}</td><td className="text-right">{mm(r.dx)}</td><td className="text-right">{mm(r.dy)}</td>
                  <td className={`text-right ${r.distance > 0.05 ? 'text-sev-error' : ''}`}>{mm(r.distance)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
      {run.data.boardTransforms.length > 0 && (
        <p className="mt-2 text-xs text-ink-600">Boards with their own local fiducial correction: <span className="num">{run.data.boardTransforms.map((b) => b.board).join(', ')}</span></p>
      )}
      {[...(t?.warnings ?? []), ...run.data.warnings.filter((w) => w.code?.startsWith('transform') || /fiducial|transform|rotation|scale/i.test(w.message))].map((w, i) => (
        <p key={i} role="alert" className="mt-2 rounded bg-sev-warning/15 px-2 py-1 text-xs text-copper-900">{w.message}</p>
      ))}
    </section>
  );
}

export default function AlignStage() {
  const { revision: r } = useWorkspace();
  const s = useSettingsDraft(r);
  const ro = !r.can.edit;
  const fids: Fid[] = s.draft.fiducials ?? [];
  const setFid = (i: number, f: Fid) => s.setDraft({ ...s.draft, fiducials: fids.map((x, j) => (j === i ? f : x)) });
  const limits = s.draft.limits ?? { residual: 0.05, scalePpm: 1000, rotationDeg: 2 };
  const sides: Side[] = r.imported && r.imported.bottom > 0 ? ['top', 'bottom'] : ['top'];
  const canRun = !!(r.imported && r.settings.board && r.settings.panel);
  return (
    <div className="grid gap-6 xl:grid-cols-[1fr_24rem]">
      <form aria-label="Fiducials" onSubmit={(e) => { e.preventDefault(); s.save(); }} className="flex min-w-0 flex-col gap-4">
        <fieldset disabled={ro} className="rounded border border-ink-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold">Fiducials</legend>
          <p className="mb-3 text-xs text-ink-500">
            Design positions in the panel frame (top view) or in the board frame (stepped out to every board). Measured positions are the machine's camera readings: with none on a side, that side's list stays in panel coordinates. Practice: at least three per panel, placed asymmetrically, with a clear area at least twice the fiducial's diameter.
          </p>
          {fids.length === 0 && <p className="mb-3 rounded border border-dashed border-ink-300 p-3 text-sm text-ink-500">No fiducials yet. Add the panel's fiducials, then the measured positions from the machine.</p>}
          <div className="flex flex-col gap-3">
            {fids.map((f, i) => (
              <div key={i} className="rounded border border-ink-100 p-3">
                <div className="grid grid-cols-[7rem_6rem_6rem_1fr_1fr_1fr_auto] items-end gap-2">
                  <div className="flex flex-col gap-1">
                    <label htmlFor={`fid-name-${i}`} className="text-xs font-medium text-ink-700">Name</label>
                    <input id={`fid-name-${i}`} value={f.name} onChange={(e) => setFid(i, { ...f, name: e.target.value })} className="num rounded border border-ink-300 px-2 py-1 text-sm" />
                  </div>
                  <SelectField label="Side" value={f.side ?? 'top'} onChange={(e) => setFid(i, { ...f, side: e.target.value as 'top' | 'bottom' })}>
                    <option value="top">top</option><option value="bottom">bottom</option>
                  </SelectField>
                  <SelectField label="Frame" value={f.frame} onChange={(e) => setFid(i, e.target.value === 'panel' ? { name: f.name, side: f.side, x: f.x, y: f.y, clearRadius: f.clearRadius, frame: 'panel' } : { name: f.name, side: f.side, x: f.x, y: f.y, clearRadius: f.clearRadius, frame: 'board' })}>
                    <option value="panel">panel</option><option value="board">board</option>
                  </SelectField>
                  <NumInput label="Design X" value={f.x} onChange={(v) => setFid(i, { ...f, x: v as number })} />
                  <NumInput label="Design Y" value={f.y} onChange={(v) => setFid(i, { ...f, y: v as number })} />
                  <NumInput label="Clear radius" value={f.clearRadius ?? 1} onChange={(v) => setFid(i, { ...f, clearRadius: v ?? 1 })} />
                  {!ro && <Button variant="ghost" aria-label={`Remove fiducial ${f.name}`} onClick={() => s.setDraft({ ...s.draft, fiducials: fids.filter((_, j) => j !== i) })}>✕</Button>}
                </div>
                {f.frame === 'panel' ? (
                  <div className="mt-2 grid grid-cols-[7rem_1fr_1fr_auto] items-end gap-2">
                    <span className="pb-2 text-xs text-ink-500">Measured</span>
                    <NumInput label="Machine X" value={f.measured?.x} onChange={(v) => setFid(i, { ...f, measured: v === undefined && f.measured?.y === undefined ? undefined : { x: v as number, y: f.measured?.y as number } })} />
                    <NumInput label="Machine Y" value={f.measured?.y} onChange={(v) => setFid(i, { ...f, measured: v === undefined && f.measured?.x === undefined ? undefined : { x: f.measured?.x as number, y: v as number } })} />
                    {!ro && f.measured && <Button variant="ghost" onClick={() => setFid(i, { ...f, measured: undefined })}>Clear</Button>}
                  </div>
                ) : (
                  <div className="mt-2 flex flex-col gap-1">
                    <span className="text-xs text-ink-500">Measured on boards (two or more local fiducials measured on a board give it its own correction)</span>
                    {Object.entries(f.measured ?? {}).map(([b, m]) => (
                      <div key={b} className="grid grid-cols-[7rem_1fr_1fr_auto] items-end gap-2">
                        <span className="num pb-2 text-xs">board {b}</span>
                        <NumInput label="Machine X" value={m.x} onChange={(v) => setFid(i, { ...f, measured: { ...(f.measured ?? {}), [b]: { ...m, x: v as number } } })} />
                        <NumInput label="Machine Y" value={m.y} onChange={(v) => setFid(i, { ...f, measured: { ...(f.measured ?? {}), [b]: { ...m, y: v as number } } })} />
                        {!ro && <Button variant="ghost" aria-label={`Remove board ${b} measurement`} onClick={() => { const n = { ...(f.measured ?? {}) }; delete n[b]; setFid(i, { ...f, measured: Object.keys(n).length ? n : undefined }); }}>✕</Button>}
                      </div>
                    ))}
                    {!ro && <Button variant="secondary" className="self-start" onClick={() => { const used = Object.keys(f.measured ?? {}).map(Number); const next = used.length ? Math.max(...used) + 1 : 1; setFid(i, { ...f, measured: { ...(f.measured ?? {}), [String(next)]: { x: 0, y: 0 } } }); }}>Add a board measurement</Button>}
                  </div>
                )}
              </div>
            ))}
          </div>
          {!ro && <Button variant="secondary" className="mt-3" onClick={() => s.setDraft({ ...s.draft, fiducials: [...fids, { name: `F${fids.length + 1}`, side: 'top', frame: 'panel', x: 0, y: 0, clearRadius: 1 }] })}>Add a fiducial</Button>}
        </fieldset>

        <fieldset disabled={ro} className="grid grid-cols-4 gap-3 rounded border border-ink-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold">Transform</legend>
          <SelectField label="Model" value={s.draft.transform ?? 'auto'} onChange={(e) => s.setDraft({ ...s.draft, transform: e.target.value as RevisionSettingsInput['transform'] })}>
            {Object.keys(MODEL_HELP).map((m) => <option key={m} value={m}>{m}</option>)}
          </SelectField>
          <NumInput label="Warn: residual above" value={limits.residual} onChange={(v) => s.setDraft({ ...s.draft, limits: { ...limits, residual: v as number } })} />
          <NumInput label="Warn: scale off by more than" unit="ppm" value={limits.scalePpm} onChange={(v) => s.setDraft({ ...s.draft, limits: { ...limits, scalePpm: v as number } })} />
          <NumInput label="Warn: rotation above" unit="°" value={limits.rotationDeg} onChange={(v) => s.setDraft({ ...s.draft, limits: { ...limits, rotationDeg: v as number } })} />
          <p className="col-span-4 text-xs text-ink-500">{MODEL_HELP[s.draft.transform ?? 'auto']} A large residual or scale usually means a mis-measured or mis-named fiducial.</p>
        </fieldset>
        {!ro && (
          <div className="flex gap-2">
            <Button type="submit" disabled={!s.dirty || s.saving}>{s.saving ? 'Saving…' : 'Save fiducials'}</Button>
            <Button variant="secondary" disabled={!s.dirty} onClick={s.reset}>Discard changes</Button>
          </div>
        )}
      </form>
      <aside aria-label="Transform results" className="flex flex-col gap-3">
        <section aria-label="Fiducials on the panel" className="flex flex-col gap-1">
          <h2 className="font-semibold">On the panel (as typed)</h2>
          <PanelPreview settings={s.draft} height={260} labelFiducials />
        </section>
        <h2 className="font-semibold">Fit (saved settings)</h2>
        {!canRun ? <p className="text-sm text-ink-500">Import a file and set the panel first.</p> : sides.map((side) => <TransformReport key={side} revisionId={r.id} version={r.version} side={side} />)}
      </aside>
    </div>
  );
}
