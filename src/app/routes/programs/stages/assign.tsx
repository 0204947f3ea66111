import { useMutation } from '@tanstack/react-query';
import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { toast } from 'sonner';
import { placementRecords } from '../../../../../shared/core';
import type { PlacementRecord, Side } from '../../../../../shared/core';
import type { Override } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { DataTable } from '../../../../components/ui/data-table';
import { SelectField } from '../../../../components/ui/field';
import { Badge, EmptyState, ErrorPanel, ProgressBar } from '../../../../components/ui/misc';
import { usePackageRefs } from '../../../../features/programs/api/library-refs';
import { useRun, useSaveOverrides } from '../../../../features/programs/api/programs';
import { OverrideEditor } from '../../../../features/programs/components/override-editor';
import { api } from '../../../../lib/api-client';
import { deg, mm } from '../../../../lib/format';
import { useWorkspace } from '../workspace';

type Row = PlacementRecord & { overridden: boolean };

function ProposeAlias({ footprint }: { footprint: string }) {
  const packages = usePackageRefs();
  const [packageId, setPackageId] = useState('');
  const propose = useMutation({
    mutationFn: () => api('/library/proposals', { method: 'POST', body: { kind: 'alias', pattern: footprint, packageId, footprint, note: `Seen unmatched in a program import.` } }),
    onSuccess: () => toast.success(`Proposed ${footprint} as an alias. The librarians were told by e-mail.`),
    onError: (e) => toast.error(e.message),
  });
  return (
    <div className="flex items-end gap-2">
      <SelectField label={`Alias of package`} value={packageId} onChange={(e) => setPackageId(e.target.value)}>
        <option value="">choose…</option>
        {packages.data?.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
      </SelectField>
      <Button variant="secondary" disabled={!packageId || propose.isPending || propose.isSuccess} onClick={() => propose.mutate()}>{propose.isSuccess ? 'Proposed' : 'Propose alias'}</Button>
    </div>
  );
}

export default function AssignStage() {
  const { revision: r } = useWorkspace();
  const [side, setSide] = useState<Side>('top');
  const canRun = !!(r.imported && r.settings.board && r.settings.panel);
  // keep the table (and its filter) on screen while a saved override is run again
  const run = useRun(r.id, side, r.version, canRun, true);
  const save = useSaveOverrides(r.id);
  const [selected, setSelected] = useState<string | null>(null);
  const rows: Row[] = useMemo(() => (run.data ? placementRecords(run.data.placements).map((p) => ({ ...p, overridden: !!r.overrides[p.ref] })) : []), [run.data, r.overrides]);
  const columns = useMemo<ColumnDef<Row, any>[]>(
    () => [
      { accessorKey: 'seq', header: '#', cell: ({ getValue }) => <span className="num text-xs text-ink-500">{getValue() as number}</span> },
      { accessorKey: 'board', header: 'Board', cell: ({ getValue }) => <span className="num">{getValue() as number}</span> },
      { accessorKey: 'ref', header: 'Ref', cell: ({ row }) => <span className="num font-medium">{row.original.ref}{row.original.overridden && <span className="ml-1"><Badge tone="copper">override</Badge></span>}</span> },
      { accessorKey: 'footprint', header: 'Footprint' },
      { id: 'package', header: 'Package', accessorFn: (p) => p.packageName ?? '', cell: ({ row }) => row.original.packageName ?? <Badge tone="error">no package</Badge> },
      { id: 'nozzle', header: 'Nozzle', accessorFn: (p) => p.nozzle ?? '', cell: ({ row }) => (row.original.nozzle ? <span className="num">{row.original.nozzle}</span> : <Badge tone="error">none</Badge>) },
      { id: 'vision', header: 'Vision preset', accessorFn: (p) => p.vision ?? '' },
      { accessorKey: 'x', header: 'X', cell: ({ getValue }) => <span className="num">{mm(getValue() as number)}</span> },
      { accessorKey: 'y', header: 'Y', cell: ({ getValue }) => <span className="num">{mm(getValue() as number)}</span> },
      { accessorKey: 'rotation', header: 'Rotation', cell: ({ getValue }) => <span className="num">{deg(getValue() as number)}</span> },
      { id: 'height', header: 'Height', accessorFn: (p) => p.bodyHeight ?? -1, cell: ({ row }) => <span className="num">{mm(row.original.bodyHeight)}</span> },
      { accessorKey: 'value', header: 'Value' },
    ],
    [],
  );
  const setOverride = (ref: string, o: Override | null) => {
    const next = { ...r.overrides };
    if (o) next[ref] = o;
    else delete next[ref];
    save.mutate({ overrides: next, version: r.version }, { onSuccess: () => { toast.success(o ? `Override saved for ${ref}.` : `Override removed from ${ref}.`); setSelected(null); }, onError: (e) => toast.error(e.message) });
  };

  if (!canRun) return <EmptyState title="Nothing to assign yet">Import a centroid file and set the panel first; then every part shows the package, nozzle and vision preset the library gives it.</EmptyState>;
  const sides: Side[] = r.imported && r.imported.bottom > 0 ? ['top', 'bottom'] : ['top'];
  return (
    <div className="flex flex-col gap-4">
      <div className="flex items-center gap-3">
        <div role="radiogroup" aria-label="Side" className="flex gap-1">
          {sides.map((s) => (
            <button key={s} role="radio" aria-checked={side === s} onClick={() => setSide(s)} className={`rounded px-3 py-1 text-sm capitalize ${side === s ? 'bg-ink-800 text-white' : 'bg-white ring-1 ring-ink-200'}`}>{s}</button>
          ))}
        </div>
        {run.data && <span className="num text-xs text-ink-500">{run.data.placements.count} placements on {run.data.boardsPlaced} boards · frame {run.data.frame}</span>}
      </div>
      {run.isPending ? <ProgressBar label="Assigning packages" /> : run.isError ? <ErrorPanel error={run.error} /> : (
        <>
          {run.data.unmatched.length > 0 && (
            <section aria-label="Unmatched footprints" className="rounded border border-sev-error/40 bg-sev-error/5 p-4">
              <h2 className="font-semibold text-sev-error">Footprints with no package ({run.data.unmatched.length})</h2>
              <p className="mb-2 text-xs text-ink-600">These parts cannot be released until the library knows their package. Propose an alias of an existing package here, or ask a librarian to add the package (they see it in the library's <Link className="underline" to="/library/unmatched">unmatched queue</Link>). An override with a package also works for a single part.</p>
              <ul className="flex flex-col gap-2">
                {run.data.unmatched.map((u) => (
                  <li key={u.footprint} className="flex flex-wrap items-end justify-between gap-3 border-t border-sev-error/20 pt-2">
                    <span><span className="num font-medium">{u.footprint}</span> <span className="num text-xs text-ink-500">{u.count} parts · {u.placements} placements · {u.refs.slice(0, 8).join(', ')}{u.refs.length > 8 ? '…' : ''}</span></span>
                    {r.can.edit && <ProposeAlias footprint={u.footprint} />}
                  </li>
                ))}
              </ul>
            </section>
          )}
          {selected && r.can.edit && <OverrideEditor key={selected} refName={selected} current={r.overrides[selected]} saving={save.isPending} onSave={(o) => setOverride(selected, o)} onClear={() => setOverride(selected, null)} onCancel={() => setSelected(null)} />}
          <DataTable
            label="Placements"
            data={rows}
            columns={columns}
            getRowId={(p) => String(p.seq)}
            onRowClick={r.can.edit ? (p) => setSelected(p.ref) : undefined}
            selectedIds={new Set(rows.filter((p) => p.ref === selected).map((p) => String(p.seq)))}
            height={560}
            toolbar={r.can.edit ? <span className="text-xs text-ink-500">Click a row to override its package, nozzle or preset.</span> : undefined}
          />
          {Object.keys(r.overrides).length > 0 && (
            <section aria-label="Overrides" className="rounded border border-ink-200 bg-white p-4 text-sm">
              <h2 className="mb-2 font-semibold">Overrides</h2>
              <ul>{Object.entries(r.overrides).map(([ref, o]) => <li key={ref}><span className="num font-medium">{ref}</span>: {[o.package && `package ${o.package}`, o.nozzle && `nozzle ${o.nozzle}`, o.vision && `preset ${o.vision}`].filter(Boolean).join(', ')} — <em>{o.reason}</em></li>)}</ul>
            </section>
          )}
        </>
      )}
    </div>
  );
}
