import type { ColumnDef } from '@tanstack/react-table';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import type { UnmatchedDto } from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { SelectField, TextField } from '../../../components/ui/field';
import { Badge, EmptyState } from '../../../components/ui/misc';
import { usePackages } from '../../../features/library/api/packages';
import { useCreateProposal } from '../../../features/library/api/proposals';
import { useAddAliasFromUnmatched, useUnmatched } from '../../../features/library/api/unmatched';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { dateTime, fixed } from '../../../lib/format';
import { Loaded } from './shared';

function AddAlias({ u, onDone, propose }: { u: UnmatchedDto; onDone: () => void; propose: boolean }) {
  const pkgs = usePackages();
  const add = useAddAliasFromUnmatched();
  const proposal = useCreateProposal();
  const [packageId, setPackageId] = useState('');
  const [pattern, setPattern] = useState(u.footprint);
  const [error, setError] = useState<string | null>(null);
  return (
    <form
      aria-label={`Add ${u.footprint} as an alias`}
      className="flex flex-wrap items-end gap-2 rounded border border-copper-300 bg-white p-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (propose) {
          proposal.mutate({ kind: 'alias', pattern: pattern.trim(), packageId, footprint: u.footprint, note: '' }, { onSuccess: () => { toast.success('Alias proposed to the librarians.'); onDone(); }, onError: (x) => setError(x.message) });
          return;
        }
        add.mutate({ id: u.id, packageId, pattern: pattern.trim() === u.footprint ? undefined : pattern.trim() }, {
          onSuccess: (a) => { toast.success(`${a.pattern} now matches ${a.packageName}.`); onDone(); },
          onError: (x) => setError(x.message),
        });
      }}
    >
      <TextField label="Alias" value={pattern} onChange={(e) => setPattern(e.target.value)} error={error ?? undefined} hint="The footprint itself, or a pattern that matches it." />
      <SelectField label="Existing package" value={packageId} onChange={(e) => setPackageId(e.target.value)}>
        <option value="">Choose…</option>
        {(pkgs.data ?? []).map((p) => <option key={p.id} value={p.id}>{p.name} ({fixed(p.bodyLength)} × {fixed(p.bodyWidth)} mm)</option>)}
      </SelectField>
      <Button type="submit" disabled={!packageId || add.isPending || proposal.isPending}>{propose ? 'Propose alias' : 'Add alias'}</Button>
      <Button variant="ghost" onClick={onDone}>Cancel</Button>
    </form>
  );
}

export default function UnmatchedRoute() {
  const q = useUnmatched();
  const access = useLibraryAccess();
  const navigate = useNavigate();
  const [aliasFor, setAliasFor] = useState<UnmatchedDto | null>(null);
  const createFrom = (u: UnmatchedDto) => navigate(`/library/packages/new?footprint=${encodeURIComponent(u.footprint)}&unmatched=${u.id}`);
  const columns: ColumnDef<UnmatchedDto, any>[] = [
    { accessorKey: 'footprint', header: 'Footprint', cell: ({ getValue }) => <span className="num font-medium">{getValue() as string}</span> },
    { accessorKey: 'count', header: 'Placements', cell: ({ getValue }) => <span className="num">{getValue() as number}</span> },
    { id: 'programs', header: 'Programs', accessorFn: (u) => u.programs.map((p) => p.label).join(', '), cell: ({ row }) => <span className="text-xs">{row.original.programs.map((p) => `${p.label} (${p.count})`).join(', ')}</span> },
    { accessorKey: 'lastSeen', header: 'Last seen', cell: ({ getValue }) => <span className="num text-xs">{dateTime(getValue() as string)}</span> },
    { accessorKey: 'status', header: 'Status', cell: ({ row: { original: u } }) => (u.status === 'open' ? <Badge tone="warning">open</Badge> : <span className="text-xs"><Badge tone="mask">resolved</Badge> → {u.resolvedPackageName}</span>) },
    {
      id: 'actions', header: '', enableSorting: false,
      cell: ({ row: { original: u } }) =>
        u.status !== 'open' ? null : access.canEdit ? (
          <span className="flex gap-1">
            <Button variant="secondary" onClick={() => createFrom(u)}>Create package</Button>
            <Button variant="ghost" onClick={() => setAliasFor(u)}>Add as alias…</Button>
          </span>
        ) : access.canPropose ? (
          <span className="flex gap-1">
            <Button variant="secondary" onClick={() => createFrom(u)}>Propose a package</Button>
            <Button variant="ghost" onClick={() => setAliasFor(u)}>Propose as alias…</Button>
          </span>
        ) : null,
    },
  ];
  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-ink-600">Footprints seen in centroid imports that match no package. Each one leaves its parts without a nozzle, a vision preset and a rotation offset until it is resolved.</p>
      {aliasFor && <AddAlias key={aliasFor.id} u={aliasFor} propose={!access.canEdit} onDone={() => setAliasFor(null)} />}
      <Loaded q={q} label="unmatched footprints">
        {(items) =>
          items.length === 0 ? (
            <EmptyState title="Every imported footprint matches a package">When a centroid import meets a footprint the library does not know, it is listed here with its programs.</EmptyState>
          ) : (
            <DataTable<UnmatchedDto> label="Unmatched footprints" data={items} columns={columns} getRowId={(u) => u.id} />
          )
        }
      </Loaded>
    </div>
  );
}
