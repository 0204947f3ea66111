// Aliases, nozzles, vision presets and machine profiles: a table each, and a small form to add or edit.
import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';
import { useForm, type FieldValues, type Path, type Resolver } from 'react-hook-form';
import { toast } from 'sonner';
import {
  LIGHTINGS,
  machineInputSchema,
  nozzleInputSchema,
  VISION_METHOD_LABELS,
  VISION_METHODS,
  visionPresetInputSchema,
  type AliasDto,
  type MachineDto,
  type MachineInput,
  type MatchResult,
  type NozzleDto,
  type NozzleInput,
  type VisionPresetDto,
  type VisionPresetInput,
} from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { SelectField, TextField } from '../../../components/ui/field';
import { Badge, EmptyState } from '../../../components/ui/misc';
import { useAliases, useCreateAlias, useDeleteAlias } from '../../../features/library/api/aliases';
import { useCreateMachine, useDeleteMachine, useMachines, useUpdateMachine } from '../../../features/library/api/machines';
import { useCreateNozzle, useDeleteNozzle, useNozzles, useUpdateNozzle } from '../../../features/library/api/nozzles';
import { usePackages } from '../../../features/library/api/packages';
import { useCreateProposal } from '../../../features/library/api/proposals';
import { matchFootprint } from '../../../features/library/api/transfer';
import { useCreateVisionPreset, useDeleteVisionPreset, useUpdateVisionPreset, useVisionPresets } from '../../../features/library/api/vision-presets';
import { splitList } from '../../../features/library/components/package-form';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { ApiError } from '../../../lib/api-client';
import { Link } from 'react-router-dom';
import { Loaded, Mm } from './shared';
import { fixed } from '../../../lib/format';

// ---------------------------------------------------------------- aliases

function MatchTester() {
  const [fp, setFp] = useState('');
  const [res, setRes] = useState<MatchResult | null>(null);
  const [err, setErr] = useState<string | null>(null);
  return (
    <form
      aria-label="Test a footprint"
      className="flex flex-wrap items-end gap-2 rounded border border-ink-200 bg-white p-3"
      onSubmit={(e) => {
        e.preventDefault();
        matchFootprint(fp.trim()).then((r) => { setRes(r); setErr(null); }, (x: Error) => setErr(x.message));
      }}
    >
      <TextField label="Test a footprint" value={fp} onChange={(e) => setFp(e.target.value)} hint="Name first, then an exact alias, then the longest pattern." />
      <Button type="submit" variant="secondary" disabled={!fp.trim()}>Match</Button>
      {err && <p className="text-sm text-sev-error">{err}</p>}
      {res && (
        <p role="status" className="pb-2 text-sm">
          <span className="num">{res.footprint}</span> →{' '}
          {res.packageName ? (
            <>
              <Link className="font-medium text-copper-700 underline" to={`/library/packages/${res.packageId}`}>{res.packageName}</Link> <Badge>{res.matchedBy}</Badge>
            </>
          ) : (
            <span className="text-sev-error">no package</span>
          )}
        </p>
      )}
    </form>
  );
}

export function AliasesRoute() {
  const q = useAliases();
  const pkgs = usePackages();
  const access = useLibraryAccess();
  const add = useCreateAlias();
  const propose = useCreateProposal();
  const del = useDeleteAlias();
  const [pattern, setPattern] = useState('');
  const [packageId, setPackageId] = useState('');
  const [error, setError] = useState<string | null>(null);
  const columns: ColumnDef<AliasDto, any>[] = [
    { accessorKey: 'pattern', header: 'Footprint or pattern', cell: ({ getValue }) => <span className="num">{getValue() as string}</span> },
    { id: 'kind', header: 'Kind', accessorFn: (a) => (a.isPattern ? 'pattern' : 'exact'), cell: ({ getValue }) => <Badge tone={getValue() === 'pattern' ? 'copper' : 'neutral'}>{getValue() as string}</Badge> },
    { id: 'len', header: 'Length', accessorFn: (a) => a.pattern.length, cell: ({ getValue }) => <span className="num text-xs">{getValue() as number}</span> },
    { accessorKey: 'packageName', header: 'Package', cell: ({ row }) => <Link className="text-copper-700 hover:underline" to={`/library/packages/${row.original.packageId}`}>{row.original.packageName}</Link> },
    ...(access.canEdit
      ? [{ id: 'actions', header: '', enableSorting: false, cell: ({ row }: { row: { original: AliasDto } }) => (
          <Button variant="ghost" aria-label={`Remove alias ${row.original.pattern}`} onClick={() => del.mutate({ id: row.original.id, version: row.original.version }, { onError: (e) => toast.error(e.message) })}>Remove</Button>
        ) } as ColumnDef<AliasDto, any>]
      : []),
  ];
  return (
    <div className="flex flex-col gap-4">
      <MatchTester />
      {(access.canEdit || access.canPropose) && (
        <form
          aria-label={access.canEdit ? 'New alias' : 'Propose an alias'}
          className="flex flex-wrap items-end gap-2 rounded border border-ink-200 bg-white p-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (access.canEdit) add.mutate({ pattern, packageId }, { onSuccess: (a) => { toast.success(`${a.pattern} → ${a.packageName}`); setPattern(''); setError(null); }, onError: (x) => setError(x.message) });
            else propose.mutate({ kind: 'alias', pattern, packageId, footprint: null, note: '' }, { onSuccess: () => { toast.success('Alias proposed to the librarians.'); setPattern(''); setError(null); }, onError: (x) => setError(x.message) });
          }}
        >
          <TextField label="Footprint or pattern" value={pattern} onChange={(e) => setPattern(e.target.value)} error={error ?? undefined} />
          <SelectField label="Package" value={packageId} onChange={(e) => setPackageId(e.target.value)}>
            <option value="">Choose…</option>
            {(pkgs.data ?? []).map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
          </SelectField>
          <Button type="submit" disabled={!pattern.trim() || !packageId || add.isPending || propose.isPending}>{access.canEdit ? 'Add alias' : 'Propose alias'}</Button>
        </form>
      )}
      <Loaded q={q} label="aliases">
        {(items) => (
          <DataTable<AliasDto> label="Aliases" data={items} columns={columns} getRowId={(a) => a.id} initialSorting={[{ id: 'pattern', desc: false }]} empty="No aliases yet. Add one above, or from a package's page." />
        )}
      </Loaded>
    </div>
  );
}

// ---------------------------------------------------------------- a small editor for named things

interface EditorProps<I extends FieldValues, D extends { id: string; version: number; name: string }> {
  title: string;
  schema: Parameters<typeof zodResolver>[0];
  blank: I;
  toInput: (d: D) => I;
  fields: (f: ReturnType<typeof useForm<I>>, errors: Record<string, string | undefined>) => ReactNode;
  create: { mutateAsync: (i: I) => Promise<unknown> };
  update: { mutateAsync: (i: I & { id: string; version: number }) => Promise<unknown> };
  editing: D | null;
  onDone: () => void;
}

function NamedEditor<I extends FieldValues, D extends { id: string; version: number; name: string }>({ title, schema, blank, toInput, fields, create, update, editing, onDone }: EditorProps<I, D>) {
  const form = useForm<I>({ resolver: zodResolver(schema) as unknown as Resolver<I>, defaultValues: (editing ? toInput(editing) : blank) as never });
  const [banner, setBanner] = useState<string | null>(null);
  const errors = Object.fromEntries(Object.entries(form.formState.errors).map(([k, v]) => [k, (v as { message?: string })?.message]));
  const submit = form.handleSubmit(async (v) => {
    try {
      if (editing) await update.mutateAsync({ ...v, id: editing.id, version: editing.version });
      else await create.mutateAsync(v);
      toast.success(`${editing ? 'Saved' : 'Added'} ${String(v.name)}.`);
      onDone();
    } catch (err) {
      if (err instanceof ApiError) for (const x of err.problem.errors) form.setError(x.path.replace(/\.\d+$/, '') as Path<I>, { message: x.message });
      setBanner((err as Error).message);
    }
  });
  return (
    <form aria-label={editing ? `Edit ${editing.name}` : title} noValidate onSubmit={submit} className="flex flex-col gap-3 rounded border border-copper-300 bg-white p-4">
      <h3 className="font-semibold">{editing ? `Edit ${editing.name}` : title}</h3>
      {banner && <p role="alert" className="rounded border border-sev-error/40 bg-sev-error/5 px-3 py-2 text-sm text-sev-error">{banner}</p>}
      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">{fields(form, errors)}</div>
      <div className="flex gap-2">
        <Button type="submit" disabled={form.formState.isSubmitting}>{editing ? 'Save' : 'Add'}</Button>
        <Button variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

function NamedPage<D extends { id: string; version: number; name: string }>({
  label, q, columns, editor, canEdit, onEdit, onNew, emptyText, newLabel, del,
}: {
  label: string; q: Parameters<typeof Loaded<D[]>>[0]['q']; columns: ColumnDef<D, any>[]; editor: ReactNode; canEdit: boolean;
  onEdit: (d: D) => void; onNew: () => void; emptyText: string; newLabel: string; del: { mutate: (v: { id: string; version: number }, o: { onError: (e: Error) => void; onSuccess: () => void }) => void };
}) {
  const cols: ColumnDef<D, any>[] = canEdit
    ? [...columns, { id: 'actions', header: '', enableSorting: false, cell: ({ row }) => (
        <span className="flex gap-1">
          <Button variant="ghost" onClick={(e) => { e.stopPropagation(); onEdit(row.original); }}>Edit</Button>
          <Button variant="ghost" className="text-sev-error" onClick={(e) => { e.stopPropagation(); if (window.confirm(`Delete ${row.original.name}?`)) del.mutate({ id: row.original.id, version: row.original.version }, { onError: (x) => toast.error(x.message), onSuccess: () => toast.success(`Deleted ${row.original.name}.`) }); }}>Delete</Button>
        </span>
      ) }]
    : columns;
  return (
    <div className="flex flex-col gap-4">
      {editor}
      <Loaded q={q} label={label.toLowerCase()}>
        {(items) =>
          items.length === 0 ? (
            <EmptyState title={`No ${label.toLowerCase()} yet`} action={canEdit ? <Button onClick={onNew}>{newLabel}</Button> : undefined}>{emptyText}</EmptyState>
          ) : (
            <DataTable<D> label={label} data={items} columns={cols} getRowId={(d) => d.id} initialSorting={[{ id: 'name', desc: false }]} toolbar={canEdit ? <Button onClick={onNew}>{newLabel}</Button> : undefined} />
          )
        }
      </Loaded>
    </div>
  );
}

const numOpt = { valueAsNumber: true } as const;
const optNum = { setValueAs: (v: unknown) => (v === '' || v == null ? null : Number(v)) };

// ---------------------------------------------------------------- nozzles

export function NozzlesRoute() {
  const q = useNozzles();
  const access = useLibraryAccess();
  const create = useCreateNozzle();
  const update = useUpdateNozzle();
  const del = useDeleteNozzle();
  const [editing, setEditing] = useState<NozzleDto | 'new' | null>(null);
  const columns: ColumnDef<NozzleDto, any>[] = [
    { accessorKey: 'name', header: 'Name', cell: ({ getValue }) => <span className="font-medium">{getValue() as string}</span> },
    { accessorKey: 'tipOuter', header: 'Tip outer ⌀', cell: ({ getValue }) => <Mm v={getValue() as number} /> },
    { accessorKey: 'tipInner', header: 'Tip inner ⌀', cell: ({ getValue }) => <Mm v={getValue() as number | null} /> },
    { accessorKey: 'holderRadius', header: 'Holder radius', cell: ({ getValue }) => <Mm v={getValue() as number} /> },
    { accessorKey: 'notes', header: 'Notes', cell: ({ getValue }) => <span className="text-xs text-ink-600">{getValue() as string}</span> },
  ];
  return (
    <NamedPage<NozzleDto>
      label="Nozzles" q={q} columns={columns} canEdit={access.canEdit} del={del} onEdit={setEditing} onNew={() => setEditing('new')} newLabel="New nozzle"
      emptyText="Add the nozzles your machines carry: packages list the ones that may lift them."
      editor={editing && (
        <NamedEditor<NozzleInput, NozzleDto>
          key={editing === 'new' ? 'new' : editing.id} title="New nozzle" schema={nozzleInputSchema} blank={{ name: '', tipOuter: 1, tipInner: null, holderRadius: 3, notes: '' }}
          toInput={(n) => ({ name: n.name, tipOuter: n.tipOuter, tipInner: n.tipInner, holderRadius: n.holderRadius, notes: n.notes })}
          create={create} update={update} editing={editing === 'new' ? null : editing} onDone={() => setEditing(null)}
          fields={(f, e) => (
            <>
              <TextField label="Name" error={e.name} {...f.register('name')} />
              <TextField label="Tip outer diameter" unit="mm" type="number" step="any" error={e.tipOuter} {...f.register('tipOuter', numOpt)} />
              <TextField label="Tip inner diameter" unit="mm" type="number" step="any" error={e.tipInner} {...f.register('tipInner', optNum)} />
              <TextField label="Holder radius" unit="mm" type="number" step="any" hint="Reach of the holder around the part: the shadow check uses it." error={e.holderRadius} {...f.register('holderRadius', numOpt)} />
              <TextField label="Notes" className="col-span-2 md:col-span-4" error={e.notes} {...f.register('notes')} />
            </>
          )}
        />
      )}
    />
  );
}

// ---------------------------------------------------------------- vision presets

export function VisionPresetsRoute() {
  const q = useVisionPresets();
  const access = useLibraryAccess();
  const create = useCreateVisionPreset();
  const update = useUpdateVisionPreset();
  const del = useDeleteVisionPreset();
  const [editing, setEditing] = useState<VisionPresetDto | 'new' | null>(null);
  const columns: ColumnDef<VisionPresetDto, any>[] = [
    { accessorKey: 'name', header: 'Name', cell: ({ getValue }) => <span className="font-medium">{getValue() as string}</span> },
    { accessorKey: 'method', header: 'Method', cell: ({ getValue }) => VISION_METHOD_LABELS[getValue() as keyof typeof VISION_METHOD_LABELS] },
    { accessorKey: 'lighting', header: 'Lighting' },
    { accessorKey: 'sizeTolerancePct', header: 'Size tolerance', cell: ({ getValue }) => <span className="num">{(getValue() as number).toFixed(1)} %</span> },
    { accessorKey: 'maxCentringOffset', header: 'Max centring offset', cell: ({ getValue }) => <Mm v={getValue() as number} /> },
    { accessorKey: 'maxAngleCorrection', header: 'Max angle correction', cell: ({ getValue }) => <span className="num">{(getValue() as number).toFixed(1)}°</span> },
  ];
  return (
    <NamedPage<VisionPresetDto>
      label="Vision presets" q={q} columns={columns} canEdit={access.canEdit} del={del} onEdit={setEditing} onNew={() => setEditing('new')} newLabel="New preset"
      emptyText="A preset tells the up-looking camera how to centre a part. Add one, then choose it on packages."
      editor={editing && (
        <NamedEditor<VisionPresetInput, VisionPresetDto>
          key={editing === 'new' ? 'new' : editing.id} title="New vision preset" schema={visionPresetInputSchema}
          blank={{ name: '', method: 'body-outline', lighting: 'top', sizeTolerancePct: 10, maxCentringOffset: 0.5, maxAngleCorrection: 5, notes: '' }}
          toInput={(v) => ({ name: v.name, method: v.method, lighting: v.lighting, sizeTolerancePct: v.sizeTolerancePct, maxCentringOffset: v.maxCentringOffset, maxAngleCorrection: v.maxAngleCorrection, notes: v.notes })}
          create={create} update={update} editing={editing === 'new' ? null : editing} onDone={() => setEditing(null)}
          fields={(f, e) => (
            <>
              <TextField label="Name" error={e.name} {...f.register('name')} />
              <SelectField label="Method" error={e.method} {...f.register('method')}>
                {VISION_METHODS.map((m) => <option key={m} value={m}>{VISION_METHOD_LABELS[m]}</option>)}
              </SelectField>
              <SelectField label="Lighting" error={e.lighting} {...f.register('lighting')}>
                {LIGHTINGS.map((l) => <option key={l} value={l}>{l}</option>)}
              </SelectField>
              <TextField label="Size tolerance" unit="%" type="number" step="any" error={e.sizeTolerancePct} {...f.register('sizeTolerancePct', numOpt)} />
              <TextField label="Max centring offset" unit="mm" type="number" step="any" error={e.maxCentringOffset} {...f.register('maxCentringOffset', numOpt)} />
              <TextField label="Max angle correction" unit="°" type="number" step="any" error={e.maxAngleCorrection} {...f.register('maxAngleCorrection', numOpt)} />
              <TextField label="Notes" className="col-span-2" error={e.notes} {...f.register('notes')} />
            </>
          )}
        />
      )}
    />
  );
}

// ---------------------------------------------------------------- machines

export function MachinesRoute() {
  const q = useMachines();
  const access = useLibraryAccess();
  const create = useCreateMachine();
  const update = useUpdateMachine();
  const del = useDeleteMachine();
  const [editing, setEditing] = useState<MachineDto | 'new' | null>(null);
  const columns: ColumnDef<MachineDto, any>[] = [
    { accessorKey: 'name', header: 'Name', cell: ({ getValue }) => <span className="font-medium">{getValue() as string}</span> },
    { id: 'reach', header: 'Reach X × Y', accessorFn: (m) => m.reachX * m.reachY, cell: ({ row }) => <span className="num">{fixed(row.original.reachX)} × {fixed(row.original.reachY)} mm</span> },
    { accessorKey: 'maxPartHeight', header: 'Max part height', cell: ({ getValue }) => <Mm v={getValue() as number} /> },
    { id: 'nozzles', header: 'Nozzles installed', accessorFn: (m) => m.nozzles.join(' '), cell: ({ getValue }) => <span className="num text-xs">{getValue() as string}</span> },
    { accessorKey: 'notes', header: 'Notes', cell: ({ getValue }) => <span className="text-xs text-ink-600">{getValue() as string}</span> },
  ];
  return (
    <NamedPage<MachineDto>
      label="Machines" q={q} columns={columns} canEdit={access.canEdit} del={del} onEdit={setEditing} onNew={() => setEditing('new')} newLabel="New machine"
      emptyText="Describe each placement machine: its reach and the nozzles it carries. Programs are checked against one."
      editor={editing && (
        <NamedEditor<MachineInput & { nozzlesText?: string }, MachineDto>
          key={editing === 'new' ? 'new' : editing.id} title="New machine profile"
          schema={machineInputSchema}
          blank={{ name: '', reachX: 400, reachY: 400, nozzles: [], maxPartHeight: 12, notes: '' }}
          toInput={(m) => ({ name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: m.nozzles, maxPartHeight: m.maxPartHeight, notes: m.notes })}
          create={create as never} update={update as never} editing={editing === 'new' ? null : editing} onDone={() => setEditing(null)}
          fields={(f, e) => (
            <>
              <TextField label="Name" error={e.name} {...f.register('name')} />
              <TextField label="Reach X" unit="mm" type="number" step="any" error={e.reachX} {...f.register('reachX', numOpt)} />
              <TextField label="Reach Y" unit="mm" type="number" step="any" error={e.reachY} {...f.register('reachY', numOpt)} />
              <TextField label="Max part height" unit="mm" type="number" step="any" error={e.maxPartHeight} {...f.register('maxPartHeight', numOpt)} />
              <TextField label="Nozzles installed" className="col-span-2" hint="Names separated by spaces or commas." error={e.nozzles} {...f.register('nozzles', { setValueAs: (v: unknown) => (Array.isArray(v) ? v : splitList(String(v ?? ''))) })} />
              <TextField label="Notes" className="col-span-2" error={e.notes} {...f.register('notes')} />
            </>
          )}
        />
      )}
    />
  );
}
