import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import { createProgramInputSchema, type CreateProgramInput, type ProgramDto } from '../../../../shared/schemas/program.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { TextField } from '../../../components/ui/field';
import { EmptyState, ErrorPanel, PageHeader, ProgressBar } from '../../../components/ui/misc';
import { useCreateProgram, usePrograms } from '../../../features/programs/api/programs';
import { StateBadge } from '../../../features/programs/components/state-badge';
import { ApiError } from '../../../lib/api-client';
import { dateTime } from '../../../lib/format';

const latest = (p: ProgramDto) => p.revisions[p.revisions.length - 1];

const columns: ColumnDef<ProgramDto, any>[] = [
  { accessorKey: 'name', header: 'Program', cell: ({ row }) => <Link className="font-medium text-copper-700 hover:underline" to={`/programs/${row.original.id}`}>{row.original.name}</Link> },
  { accessorKey: 'product', header: 'Product' },
  { accessorKey: 'board', header: 'Board' },
  { id: 'revision', header: 'Latest revision', accessorFn: (p) => latest(p)?.label ?? '', cell: ({ row }) => { const r = latest(row.original); return r ? <span className="flex items-center gap-2"><span className="num">{r.label}</span><StateBadge state={r.state} /></span> : null; } },
  { id: 'findings', header: 'Findings', accessorFn: (p) => latest(p)?.errors ?? -1, cell: ({ row }) => { const r = latest(row.original); if (!r || r.errors === null) return <span className="text-xs text-ink-400">not checked</span>; const waived = (r.errors ?? 0) - (r.openErrors ?? 0); return <span className="num text-xs"><span className={r.openErrors ? 'text-sev-error' : ''}>{r.errors} errors{waived > 0 ? ` (${waived} waived)` : ''}</span> · {r.warnings} warnings</span>; } },
  { id: 'owner', header: 'Owner', accessorFn: (p) => p.owner?.name ?? '' },
  { accessorKey: 'updatedAt', header: 'Changed', cell: ({ getValue }) => <span className="num text-xs">{dateTime(getValue() as string)}</span> },
];

function NewProgramForm({ onDone }: { onDone: () => void }) {
  const create = useCreateProgram();
  const navigate = useNavigate();
  const form = useForm<CreateProgramInput>({ resolver: zodResolver(createProgramInputSchema), defaultValues: { name: '', product: '', board: '' } });
  const e = form.formState.errors;
  const onSubmit = form.handleSubmit((v) =>
    create.mutate(v, {
      onSuccess: (p) => {
        toast.success(`Created ${p.name}; revision A is a draft.`);
        navigate(`/programs/revisions/${p.revisions[0].id}/import`);
      },
      onError: (err) => {
        if (err instanceof ApiError && err.problem.errors.length) for (const x of err.problem.errors) form.setError(x.path as keyof CreateProgramInput, { message: x.message });
        else toast.error(err.message);
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="New program" className="mb-6 grid grid-cols-3 gap-3 rounded border border-ink-200 bg-white p-4">
      <TextField label="Program name" placeholder="weather-ctl" hint="Short and unique; used in file names." error={e.name?.message} {...form.register('name')} />
      <TextField label="Product" placeholder="Weather-station controller" error={e.product?.message} {...form.register('product')} />
      <TextField label="Board and design revision" placeholder="WSC-200 rev 3" error={e.board?.message} {...form.register('board')} />
      <div className="col-span-3 flex justify-end gap-2">
        <Button variant="secondary" onClick={onDone}>Cancel</Button>
        <Button type="submit" disabled={create.isPending}>{create.isPending ? 'Creating…' : 'Create program'}</Button>
      </div>
    </form>
  );
}

export default function ProgramsRoute() {
  const programs = usePrograms();
  const [creating, setCreating] = useState(false);
  return (
    <div className="max-w-6xl">
      <PageHeader title="Programs" subtitle="Placement programs: one board on one panel, revision by revision" actions={!creating && <Button onClick={() => setCreating(true)}>New program</Button>} />
      {creating && <NewProgramForm onDone={() => setCreating(false)} />}
      {programs.isPending ? <ProgressBar label="Loading programs" /> : programs.isError ? <ErrorPanel error={programs.error} /> : programs.data.length === 0 ? (
        <EmptyState title="No programs yet" action={<Button onClick={() => setCreating(true)}>New program</Button>}>
          Create a program, then import the board's centroid file; Placewright walks you through panel, fiducials, packages and checks to a released run file.
        </EmptyState>
      ) : (
        <DataTable label="Programs" data={programs.data} columns={columns} getRowId={(p) => p.id} initialSorting={[{ id: 'updatedAt', desc: true }]} />
      )}
    </div>
  );
}
