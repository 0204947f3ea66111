import { useMemo, useRef, useState } from 'react';
import { toast } from 'sonner';
import { everyBoardKey, everyBoardRefs, repeatedFindings, waiverLookup } from '../../../../../shared/review';
import type { Finding } from '../../../../../shared/schemas/finding.schema';
import type { WaiverDto } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { TextField } from '../../../../components/ui/field';
import { Badge, EmptyState, ProgressBar } from '../../../../components/ui/misc';
import { useRunChecks, useUnwaive, useWaive } from '../../../../features/programs/api/programs';
import { RevisionCanvas } from '../../../../features/programs/components/revision-canvas';
import { waivedWhat } from '../../../../features/programs/lib/finding-labels';
import { dateTime, mm } from '../../../../lib/format';
import { findingKindLabel } from '../../../../features/programs/lib/finding-labels';
import { useWorkspace } from '../workspace';

/** The waive form; for scope 'every-board', `boards` are the boards the finding repeats on now. */
function WaiveForm({ finding, scope, boards, onDone }: { finding: Finding; scope: 'finding' | 'every-board'; boards: number[]; onDone: () => void }) {
  const { revision: r } = useWorkspace();
  const waive = useWaive(r.id);
  const [reason, setReason] = useState('');
  const every = scope === 'every-board';
  return (
    <form
      aria-label={every ? 'Waive on every board' : 'Waive this finding'}
      className="mt-2 flex flex-col gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        waive.mutate({ key: finding.key, reason, scope }, { onSuccess: () => { toast.success(every ? `Waived on every board (${boards.length} now).` : 'Waived.'); onDone(); }, onError: (err) => toast.error(err.message) });
      }}
    >
      {every && (
        <p className="text-xs text-ink-600">
          One decision for this finding on every board: now boards <span className="num">{boards.join(', ')}</span>, and any board added later with the same parts. Waivers already given on single boards are folded into it.
        </p>
      )}
      <div className="flex items-end gap-2">
        <TextField className="flex-1" label={every ? 'Why is this acceptable on every board?' : 'Why is this acceptable?'} value={reason} onChange={(e) => setReason(e.target.value)} error={reason && reason.trim().length < 5 ? 'At least 5 characters' : undefined} autoFocus />
        <Button type="submit" disabled={reason.trim().length < 5 || waive.isPending}>{every ? `Waive on ${boards.length} boards` : 'Waive'}</Button>
        <Button variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

function WaiverNote({ w, canEdit, onRemove }: { w: WaiverDto; canEdit: boolean; onRemove: () => void }) {
  return (
    <span className="text-xs text-ink-600">
      {w.scope === 'every-board' ? <>Waived on every board (one waiver, <span className="num">{w.covers}</span> finding{w.covers === 1 ? '' : 's'})</> : 'Waived'} by {w.userEmail}, {dateTime(w.at)}: <em>{w.reason}</em>
      {canEdit && <button type="button" className="ml-2 text-copper-700 underline" onClick={onRemove}>{w.scope === 'every-board' ? 'remove (every board)' : 'remove'}</button>}
    </span>
  );
}

export default function VerifyStage() {
  const { revision: r } = useWorkspace();
  const checks = useRunChecks(r.id);
  const unwaive = useUnwaive(r.id);
  const [waiving, setWaiving] = useState<{ key: string; scope: 'finding' | 'every-board' } | null>(null);
  const [openKinds, setOpenKinds] = useState<Set<string>>(new Set());
  const [shown, setShown] = useState<{ key: string; seq: number } | null>(null);
  const canvasRef = useRef<HTMLElement>(null);
  const showOnCanvas = (key: string) => {
    setShown((s) => ({ key, seq: (s?.seq ?? 0) + 1 }));
    canvasRef.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  };
  const waiverOf = useMemo(() => waiverLookup(r.waivers), [r.waivers]);
  const repeated = useMemo(() => repeatedFindings(r.findings ?? []), [r.findings]);
  const groups = useMemo(() => {
    const m = new Map<string, Finding[]>();
    for (const f of r.findings ?? []) m.set(f.kind, [...(m.get(f.kind) ?? []), f]);
    return [...m].sort((a, b) => (a[1][0].severity === b[1][0].severity ? a[0].localeCompare(b[0]) : a[1][0].severity === 'error' ? -1 : 1));
  }, [r.findings]);
  const openErrors = (r.findings ?? []).filter((f) => f.severity === 'error' && !waiverOf(f)).length;
  const canRun = !!(r.imported && r.settings.board && r.settings.panel);

  if (!canRun) return <EmptyState title="Nothing to check yet">Import a centroid file and set the panel first.</EmptyState>;
  return (
    <div className="flex flex-col gap-5">
      <section aria-label="Checks" className="flex flex-wrap items-center gap-4 rounded border border-ink-200 bg-white p-4">
        {r.can.edit && (
          <Button disabled={checks.isPending} onClick={() => checks.mutate(undefined, { onSuccess: () => toast.success('Checks done.'), onError: (e) => toast.error(e.message) })}>
            {checks.isPending ? 'Checking…' : r.findingsSummary ? 'Run the checks again' : 'Run the checks'}
          </Button>
        )}
        {checks.isPending && <div className="w-64"><ProgressBar label="Checking the panel" /></div>}
        {r.findingsSummary ? (
          <p className="num text-sm">
            <span className={r.findingsSummary.errors ? 'text-sev-error' : 'text-mask-600'}>{r.findingsSummary.errors} errors</span> · <span>{r.findingsSummary.warnings} warnings</span> · {r.findingsSummary.placements} placements checked in {(r.findingsSummary.seconds * 1000).toFixed(0)} ms · {dateTime(r.checkedAt)}
            {openErrors > 0 ? <span className="ml-2 text-sev-error">— {openErrors} error{openErrors === 1 ? '' : 's'} to fix or waive before release</span> : <span className="ml-2 text-mask-600">— nothing blocks release</span>}
          </p>
        ) : (
          <p className="text-sm text-ink-500">Not checked since the last change. Checks look for overlapping bodies and courtyards, parts off their board, fiducial clear areas, taller neighbours near the nozzle, reach, and missing packages or nozzles.</p>
        )}
      </section>

      {r.findings && r.findings.length > 0 && (
        <section aria-label="Findings by kind" className="flex flex-col gap-2">
          {groups.map(([kind, list]) => {
            const open = openKinds.has(kind);
            return (
              <div key={kind} className="rounded border border-ink-200 bg-white">
                <button type="button" aria-expanded={open} onClick={() => setOpenKinds((s) => { const n = new Set(s); if (n.has(kind)) n.delete(kind); else n.add(kind); return n; })} className="flex w-full items-center gap-3 px-4 py-2 text-left">
                  <Badge tone={list[0].severity === 'error' ? 'error' : 'warning'}>{list[0].severity}</Badge>
                  <span className="font-medium">{findingKindLabel(kind)}</span>
                  <span className="num text-xs text-ink-500">{list.length} · {list.filter((f) => waiverOf(f)).length} waived</span>
                  <span className="ml-auto text-ink-400">{open ? '▾' : '▸'}</span>
                </button>
                {open && (
                  <ul className="divide-y divide-ink-100 border-t border-ink-100">
                    {list.slice(0, 500).map((f) => {
                      const w = waiverOf(f);
                      const pattern = everyBoardKey(f);
                      const copies = pattern !== null ? repeated.get(pattern) : undefined;
                      return (
                        <li key={f.key} className="px-4 py-2 text-sm">
                          <div className="flex items-start gap-3">
                            <span className="flex-1">{f.message}{f.depth !== null && <span className="num ml-2 text-xs text-ink-500">depth {mm(f.depth)}</span>}{copies && <span className="num ml-2 text-xs text-ink-500">· same on boards {copies.map((c) => c.boards[0]).join(', ')}</span>}</span>
                            <Button variant="ghost" className="px-2 py-0.5 text-xs" onClick={() => showOnCanvas(f.key)}>Show on canvas</Button>
                            {w ? (
                              <WaiverNote w={w} canEdit={r.can.edit} onRemove={() => unwaive.mutate(w.id, { onError: (e) => toast.error(e.message) })} />
                            ) : (
                              r.can.edit && waiving?.key !== f.key && (
                                <>
                                  <Button variant="secondary" className="px-2 py-0.5 text-xs" onClick={() => setWaiving({ key: f.key, scope: 'finding' })}>Waive…</Button>
                                  {copies && <Button variant="secondary" className="px-2 py-0.5 text-xs" onClick={() => setWaiving({ key: f.key, scope: 'every-board' })}>Waive on every board…</Button>}
                                </>
                              )
                            )}
                          </div>
                          {waiving?.key === f.key && <WaiveForm finding={f} scope={waiving.scope} boards={(copies ?? [f]).map((c) => c.boards[0])} onDone={() => setWaiving(null)} />}
                        </li>
                      );
                    })}
                    {list.length > 500 && <li className="px-4 py-2 text-xs text-ink-500">…and {list.length - 500} more; filter them on the canvas below.</li>}
                  </ul>
                )}
              </div>
            );
          })}
        </section>
      )}
      {r.waivers.length > 0 && (
        <section aria-label="Waivers" className="rounded border border-ink-200 bg-white p-4 text-sm">
          <h2 className="mb-2 font-semibold">Waivers ({r.waivers.length})</h2>
          <ul className="flex flex-col gap-1">
            {r.waivers.map((w) => (
              <li key={w.id} className="flex flex-wrap items-baseline gap-2">
                <span className="font-medium">{findingKindLabel(w.kind)}</span>
                <span className="num text-xs">{waivedWhat(w.scope === 'every-board' ? everyBoardRefs(w.findingKey) : w.findingKey.split('|').slice(1))}</span>
                <WaiverNote w={w} canEdit={r.can.edit} onRemove={() => unwaive.mutate(w.id, { onError: (e) => toast.error(e.message) })} />
              </li>
            ))}
          </ul>
        </section>
      )}
      {r.findings && r.findings.length === 0 && <p className="rounded border border-mask-400/50 bg-mask-400/10 p-3 text-sm">No findings: the panel is clean.</p>}

      <section ref={canvasRef} aria-label="Canvas" className="flex flex-col gap-2">
        <h2 className="font-semibold">On the panel</h2>
        <RevisionCanvas r={r} showFinding={shown} />
      </section>
    </div>
  );
}
