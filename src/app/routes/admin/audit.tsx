import type { ColumnDef } from '@tanstack/react-table';
import { useState } from 'react';
import type { AuditEventDto } from '../../../../shared/schemas/audit.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorPanel, PageHeader, ProgressBar } from '../../../components/ui/misc';
import { useAudit, type AuditFilters } from '../../../features/audit/api/audit';
import { describeAction } from '../../../features/audit/components/describe-action';
import { dateTime } from '../../../lib/format';

const PAGE = 200;

const columns: ColumnDef<AuditEventDto, any>[] = [
  { accessorKey: 'at', header: 'When', cell: ({ getValue }) => <span className="num text-xs">{dateTime(getValue() as string)}</span> },
  { accessorKey: 'actorEmail', header: 'Who', cell: ({ getValue }) => (getValue() as string | null) ?? <span className="text-ink-400">anonymous</span> },
  { accessorKey: 'action', header: 'Action', cell: ({ getValue }) => <code className="num text-xs">{getValue() as string}</code> },
  { id: 'what', header: 'What', accessorFn: (e) => describeAction(e) },
  { accessorKey: 'ip', header: 'Address', cell: ({ getValue }) => <span className="num text-xs">{(getValue() as string | null) ?? '—'}</span> },
];

function toIso(local: string): string | undefined {
  return local ? new Date(local).toISOString() : undefined;
}

export default function AuditRoute() {
  const [draft, setDraft] = useState({ action: '', actor: '', from: '', to: '' });
  const [filters, setFilters] = useState<AuditFilters>({ limit: PAGE, offset: 0 });
  const audit = useAudit(filters);
  const apply = () => setFilters({ action: draft.action || undefined, actor: draft.actor || undefined, from: toIso(draft.from), to: toIso(draft.to), limit: PAGE, offset: 0 });
  const total = audit.data?.total ?? 0;
  const offset = filters.offset ?? 0;
  return (
    <div className="max-w-6xl">
      <PageHeader title="Audit log" subtitle="Who did what, and when" />
      <form
        className="mb-4 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          apply();
        }}
      >
        <SelectField label="Action" value={draft.action} onChange={(e) => setDraft({ ...draft, action: e.target.value })}>
          <option value="">Any action</option>
          {audit.data?.actions.map((a) => <option key={a} value={a}>{a}</option>)}
        </SelectField>
        <TextField label="Who (e-mail contains)" value={draft.actor} onChange={(e) => setDraft({ ...draft, actor: e.target.value })} />
        <TextField label="From" type="datetime-local" value={draft.from} onChange={(e) => setDraft({ ...draft, from: e.target.value })} />
        <TextField label="Before" type="datetime-local" value={draft.to} onChange={(e) => setDraft({ ...draft, to: e.target.value })} />
        <Button type="submit">Apply</Button>
      </form>
      {audit.isPending ? <ProgressBar label="Loading the audit log" /> : audit.isError ? <ErrorPanel error={audit.error} /> : (
        <>
          <DataTable label="Audit events" data={audit.data.items} columns={columns} getRowId={(e) => e.id} height={560} empty="No events match these filters." />
          <div className="mt-2 flex items-center gap-2 text-xs text-ink-600">
            <span className="num">{total === 0 ? 'No events' : `Events ${offset + 1}–${Math.min(offset + PAGE, total)} of ${total}`}</span>
            <Button variant="secondary" disabled={offset === 0} onClick={() => setFilters({ ...filters, offset: Math.max(0, offset - PAGE) })}>Newer</Button>
            <Button variant="secondary" disabled={offset + PAGE >= total} onClick={() => setFilters({ ...filters, offset: offset + PAGE })}>Older</Button>
          </div>
        </>
      )}
    </div>
  );
}
