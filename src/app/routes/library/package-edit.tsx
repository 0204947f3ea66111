import { useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { toast } from 'sonner';
import { blankPackage, type CreatePackageInput, type PackageDto } from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Badge, EmptyState, ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { useCreateAlias, useDeleteAlias } from '../../../features/library/api/aliases';
import { useNozzles } from '../../../features/library/api/nozzles';
import { usePackageUsage } from '../../../features/library/api/package-usage';
import { useCreatePackage, useDeletePackage, usePackage, useUpdatePackage } from '../../../features/library/api/packages';
import { useCreateProposal } from '../../../features/library/api/proposals';
import { useRevisions } from '../../../features/library/api/transfer';
import { useCreatePackageFromUnmatched } from '../../../features/library/api/unmatched';
import { useVisionPresets } from '../../../features/library/api/vision-presets';
import { PackageForm } from '../../../features/library/components/package-form';
import { PackageUsagePanel, usePackageChangeSafeguard } from '../../../features/library/components/package-usage';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { dateTime } from '../../../lib/format';
import { toInput } from './shared';

function useRefs() {
  const nozzles = useNozzles();
  const presets = useVisionPresets();
  return { nozzles: nozzles.data ?? [], presets: presets.data ?? [], pending: nozzles.isPending || presets.isPending };
}

/** New package (librarians), or a proposal of one (engineers); from an unmatched footprint when ?unmatched= is given. */
export function NewPackageRoute() {
  const [params] = useSearchParams();
  const footprint = params.get('footprint') ?? '';
  const unmatchedId = params.get('unmatched');
  const access = useLibraryAccess();
  const refs = useRefs();
  const navigate = useNavigate();
  const create = useCreatePackage();
  const fromUnmatched = useCreatePackageFromUnmatched();
  const propose = useCreateProposal();
  const [note, setNote] = useState('');
  if (refs.pending) return <ProgressBar label="Loading nozzles and presets" />;
  if (access.readOnly) return <EmptyState title="Read only">Your role reads the library; ask a librarian or an engineer to add packages.</EmptyState>;
  const initial: CreatePackageInput = { ...blankPackage(footprint), notes: '' };
  const onSubmit = async (v: CreatePackageInput) => {
    if (access.canEdit) {
      const p = unmatchedId ? await fromUnmatched.mutateAsync({ id: unmatchedId, input: v }) : await create.mutateAsync(v);
      toast.success(`Package ${p.name} added${unmatchedId ? `; ${footprint} now matches it` : ''}.`);
      navigate(`/library/packages/${p.id}`);
    } else {
      await propose.mutateAsync({ kind: 'new-package', package: v, footprint: footprint || null, note });
      toast.success('Proposal sent to the librarians.');
      navigate('/library/proposals');
    }
  };
  return (
    <div className="flex flex-col gap-3">
      <h2 className="text-lg font-semibold">
        {access.canEdit ? 'New package' : 'Propose a package'}
        {footprint && <span className="ml-2 text-sm font-normal text-ink-500">for the unmatched footprint <span className="num text-ink-800">{footprint}</span></span>}
      </h2>
      {footprint && (
        <p className="text-sm text-ink-600">
          Name it as your library names packages; if the name differs from <span className="num">{footprint}</span>, the footprint is added as an alias so it matches.
        </p>
      )}
      <PackageForm label={access.canEdit ? 'New package' : 'Proposed package'} initial={initial} nozzles={refs.nozzles} presets={refs.presets} withAliases submitLabel={access.canEdit ? 'Add package' : 'Send proposal'} onSubmit={onSubmit} actions={<Link to="/library/packages" className="text-sm text-ink-600 underline">Cancel</Link>}>
        {access.canPropose && <TextField label="Note to the librarian" value={note} onChange={(e) => setNote(e.target.value)} hint="Where the numbers come from (a datasheet, a measurement)." />}
      </PackageForm>
    </div>
  );
}

function Aliases({ pkg, canEdit }: { pkg: PackageDto; canEdit: boolean }) {
  const add = useCreateAlias();
  const del = useDeleteAlias();
  const [pattern, setPattern] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <section aria-label="Aliases of this package" className="rounded border border-ink-200 bg-white p-3">
      <h3 className="mb-2 text-sm font-semibold">Aliases</h3>
      {pkg.aliases.length === 0 ? (
        <p className="text-xs text-ink-500">No aliases: only footprints named exactly {pkg.name} match.</p>
      ) : (
        <ul className="flex flex-wrap gap-1.5">
          {pkg.aliases.map((a) => (
            <li key={a.id} className="flex items-center gap-1 rounded border border-ink-300 bg-ink-50 px-1.5 py-0.5 text-xs">
              <span className="num">{a.pattern}</span>
              {/[*?]/.test(a.pattern) && <Badge>pattern</Badge>}
              {canEdit && (
                <button type="button" aria-label={`Remove alias ${a.pattern}`} className="px-0.5 text-ink-500 hover:text-sev-error" onClick={() => del.mutate({ id: a.id, version: a.version }, { onError: (e) => toast.error(e.message) })}>×</button>
              )}
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <form
          className="mt-2 flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            add.mutate({ pattern, packageId: pkg.id }, { onSuccess: () => { setPattern(''); setError(null); }, onError: (err) => setError(err.message) });
          }}
        >
          <TextField label="Add an alias" value={pattern} onChange={(e) => setPattern(e.target.value)} error={error ?? undefined} hint="A footprint name, or a pattern with * and ?" />
          <Button type="submit" variant="secondary" disabled={!pattern.trim() || add.isPending}>Add alias</Button>
        </form>
      )}
    </section>
  );
}

function History({ id }: { id: string }) {
  const q = useRevisions({ entity: 'package', entityId: id });
  if (!q.data?.length) return null;
  return (
    <section aria-label="History" className="rounded border border-ink-200 bg-white p-3">
      <h3 className="mb-2 text-sm font-semibold">History</h3>
      <ol className="flex flex-col gap-1 text-xs">
        {q.data.map((r) => {
          const before = (r.before ?? {}) as Record<string, unknown>;
          const after = (r.after ?? {}) as Record<string, unknown>;
          const changed = Object.keys(after).filter((k) => k !== 'version' && JSON.stringify(before[k]) !== JSON.stringify(after[k]));
          return (
            <li key={r.id}>
              <span className="num text-ink-500">{dateTime(r.at)}</span> · {r.actorEmail ?? 'system'} · <span className="font-medium">{r.action}</span>
              {r.action === 'update' && changed.length > 0 && (
                <span className="text-ink-600"> — {changed.map((k) => `${k}: ${JSON.stringify(before[k])} → ${JSON.stringify(after[k])}`).join('; ')}</span>
              )}
            </li>
          );
        })}
      </ol>
    </section>
  );
}

/** Stable JSON (keys sorted): two packages' values compare equal whatever their key order. */
function stable(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stable).join(',')}]`;
  if (v && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    return `{${Object.keys(o).filter((k) => o[k] !== undefined).sort().map((k) => `${JSON.stringify(k)}:${stable(o[k])}`).join(',')}}`;
  }
  return JSON.stringify(v ?? null);
}

/** True when an edit changes more than the notes: what placing the parts reads. */
export function changesPlacement(before: CreatePackageInput, after: Omit<CreatePackageInput, 'aliases'>): boolean {
  const { aliases: _a, notes: _n, ...b } = before;
  const { notes: _m, ...a } = after;
  return stable(b) !== stable(a);
}

/** One package: librarians edit it; engineers read it and may propose a change; operators read. */
export function EditPackageRoute() {
  const { id } = useParams();
  const access = useLibraryAccess();
  const refs = useRefs();
  const q = usePackage(id);
  const update = useUpdatePackage();
  const remove = useDeletePackage();
  const propose = useCreateProposal();
  const navigate = useNavigate();
  const [proposing, setProposing] = useState(false);
  const [note, setNote] = useState('');
  const [base, setBase] = useState<PackageDto | null>(null);
  const usage = usePackageUsage(id, !access.readOnly);
  const safeguard = usePackageChangeSafeguard(id, q.data?.name ?? 'this package');
  if (q.isPending || refs.pending) return <ProgressBar label="Loading the package" />;
  if (q.isError) return <ErrorPanel error={q.error} />;
  const pkg = base && base.version >= q.data.version ? base : q.data;
  const editable = access.canEdit || (access.canPropose && proposing);
  const onSubmit = async (v: CreatePackageInput) => {
    const { aliases: _a, ...fields } = v;
    if (access.canEdit) {
      // a shared package: say which programs in work the change reaches, and ask first
      if (changesPlacement(toInput(pkg), fields) && !(await safeguard.confirm())) return;
      const saved = await update.mutateAsync({ id: pkg.id, ...fields, version: pkg.version });
      setBase(saved);
      toast.success(`Saved ${saved.name} (version ${saved.version}).`);
    } else {
      await propose.mutateAsync({ kind: 'change', packageId: pkg.id, package: fields, note });
      toast.success('Change proposed to the librarians.');
      setProposing(false);
    }
  };
  return (
    <div className="flex flex-col gap-3">
      <div className="flex items-center gap-3">
        <Link to="/library/packages" className="text-sm text-ink-500 hover:text-ink-800">← Packages</Link>
        <h2 className="text-lg font-semibold">{pkg.name}</h2>
        <span className="num text-xs text-ink-500">version {pkg.version} · {pkg.updatedBy ?? '—'} · {dateTime(pkg.updatedAt)}</span>
      </div>
      <PackageForm
        key={`${pkg.id}:${pkg.version}:${proposing}`}
        label={access.canEdit ? `Edit ${pkg.name}` : `Package ${pkg.name}`}
        initial={toInput(pkg)}
        nozzles={refs.nozzles}
        presets={refs.presets}
        readOnly={!editable}
        submitLabel={access.canEdit ? 'Save package' : 'Send proposal'}
        onSubmit={editable ? onSubmit : undefined}
        onReload={async () => {
          const fresh = await q.refetch();
          if (fresh.data) setBase(fresh.data);
        }}
        actions={
          <>
            {access.canPropose && !proposing && <Button variant="secondary" onClick={() => setProposing(true)}>Propose a change</Button>}
            {access.canPropose && proposing && <Button variant="ghost" onClick={() => setProposing(false)}>Cancel proposal</Button>}
            {access.canEdit && (
              <Button
                variant="ghost"
                className="ml-auto text-sev-error"
                onClick={() => {
                  if (!window.confirm(`Delete ${pkg.name} and its ${pkg.aliases.length} aliases? Programs using it lose their match at the next check.`)) return;
                  remove.mutate({ id: pkg.id, version: pkg.version }, { onSuccess: () => { toast.success(`Deleted ${pkg.name}.`); navigate('/library/packages'); }, onError: (e) => toast.error(e.message) });
                }}
              >
                Delete package
              </Button>
            )}
          </>
        }
      >
        {access.canPropose && proposing && <TextField label="Note to the librarian" value={note} onChange={(e) => setNote(e.target.value)} hint="Why the change: a datasheet, a measurement, a placement problem." />}
      </PackageForm>
      {!access.readOnly && <PackageUsagePanel q={usage} />}
      <div className="grid grid-cols-1 gap-3 lg:grid-cols-2">
        <Aliases pkg={pkg} canEdit={access.canEdit} />
        <History id={pkg.id} />
      </div>
      {safeguard.dialog}
    </div>
  );
}
