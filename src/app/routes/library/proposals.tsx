import { useState } from 'react';
import { toast } from 'sonner';
import { blankPackage, type CreatePackageInput, type ProposalDto } from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Badge, EmptyState } from '../../../components/ui/misc';
import { useNozzles } from '../../../features/library/api/nozzles';
import { usePackageUsage } from '../../../features/library/api/package-usage';
import { useDecideProposal, useProposals } from '../../../features/library/api/proposals';
import { useVisionPresets } from '../../../features/library/api/vision-presets';
import { PackageForm } from '../../../features/library/components/package-form';
import { PackageUsagePanel, usePackageChangeSafeguard } from '../../../features/library/components/package-usage';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { dateTime } from '../../../lib/format';
import { Loaded } from './shared';

const KIND: Record<ProposalDto['kind'], string> = { 'new-package': 'New package', alias: 'Alias', change: 'Change' };

function title(p: ProposalDto) {
  const pkg = p.payload.package as { name?: string } | undefined;
  if (p.kind === 'new-package') return `${pkg?.name ?? '?'}${p.footprint ? ` for ${p.footprint}` : ''}`;
  if (p.kind === 'alias') return `${String(p.payload.pattern)} → ${p.packageName ?? '?'}`;
  return p.packageName ?? pkg?.name ?? '?';
}

function Detail({ p, canEdit }: { p: ProposalDto; canEdit: boolean }) {
  const decide = useDecideProposal();
  const nozzles = useNozzles();
  const presets = useVisionPresets();
  const [comment, setComment] = useState('');
  const [pattern, setPattern] = useState(String(p.payload.pattern ?? ''));
  const open = p.status === 'open';
  // approving a change edits a shared package: say where it is used, and ask as the package page does
  const guarded = p.kind === 'change' && !!p.packageId && open && canEdit;
  const usage = usePackageUsage(p.packageId ?? undefined, guarded);
  const safeguard = usePackageChangeSafeguard(guarded ? p.packageId : null, p.packageName ?? 'the package');
  const proposedPkg = p.payload.package ? ({ ...blankPackage(), aliases: [], ...(p.payload.package as object) } as CreatePackageInput) : null;
  const reject = () =>
    decide.mutate({ id: p.id, decision: 'reject', comment }, { onSuccess: () => toast.success('Rejected; the proposer was told.'), onError: (e) => toast.error(e.message) });
  return (
    <section aria-label={`Proposal ${title(p)}`} className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-4">
      <div className="flex flex-wrap items-center gap-2">
        <Badge tone="copper">{KIND[p.kind]}</Badge>
        <h3 className="font-semibold">{title(p)}</h3>
        <Badge tone={p.status === 'open' ? 'warning' : p.status === 'approved' ? 'mask' : 'error'}>{p.status}</Badge>
      </div>
      <p className="text-xs text-ink-500">Proposed by {p.proposerEmail} · <span className="num">{dateTime(p.createdAt)}</span></p>
      {p.note && <blockquote className="border-l-2 border-copper-300 pl-3 text-sm text-ink-700">{p.note}</blockquote>}
      {!open && (
        <p className="text-sm">
          {p.status === 'approved' ? 'Approved' : 'Rejected'} by {p.decidedByEmail} <span className="num text-ink-500">{dateTime(p.decidedAt)}</span>
          {p.decisionComment && <span className="block text-ink-700">“{p.decisionComment}”</span>}
        </p>
      )}
      {p.kind === 'alias' && (
        <div className="flex flex-wrap items-end gap-2">
          <TextField label="Alias pattern" value={pattern} onChange={(e) => setPattern(e.target.value)} readOnly={!open || !canEdit} />
          <span className="pb-2 text-sm">→ {p.packageName}</span>
        </div>
      )}
      {open && canEdit && <TextField label="Comment to the proposer" value={comment} onChange={(e) => setComment(e.target.value)} hint="Needed to reject; optional when approving." />}
      {proposedPkg ? (
        <PackageForm
          key={p.id + p.status}
          label={`Proposed package ${proposedPkg.name}`}
          initial={proposedPkg}
          nozzles={nozzles.data ?? []}
          presets={presets.data ?? []}
          withAliases={p.kind === 'new-package'}
          readOnly={!open || !canEdit}
          submitLabel="Approve with these values"
          onSubmit={
            open && canEdit
              ? async (v) => {
                  if (!(await safeguard.confirm())) return;
                  await decide.mutateAsync({ id: p.id, decision: 'approve', package: v, comment });
                  toast.success(`Approved: ${v.name} is in the library; the proposer was told.`);
                }
              : undefined
          }
          actions={open && canEdit ? <Button variant="danger" disabled={!comment.trim() || decide.isPending} onClick={reject}>Reject</Button> : undefined}
        />
      ) : (
        open && canEdit && (
          <div className="flex gap-2">
            <Button onClick={() => decide.mutate({ id: p.id, decision: 'approve', pattern, comment }, { onSuccess: () => toast.success('Approved; the proposer was told.'), onError: (e) => toast.error(e.message) })}>Approve</Button>
            <Button variant="danger" disabled={!comment.trim()} onClick={reject}>Reject</Button>
          </div>
        )
      )}
      {guarded && <PackageUsagePanel q={usage} />}
      {safeguard.dialog}
    </section>
  );
}

export default function ProposalsRoute() {
  const q = useProposals();
  const access = useLibraryAccess();
  const [openId, setOpenId] = useState<string | null>(null);
  return (
    <Loaded q={q} label="proposals">
      {(items) =>
        items.length === 0 ? (
          <EmptyState title="No proposals">
            {access.canPropose ? 'Propose a package from the Packages or Unmatched tab, or a change from a package’s page.' : 'Engineers propose new packages, aliases and changes here; you approve or reject them.'}
          </EmptyState>
        ) : (
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-[320px_minmax(0,1fr)]">
            <ul aria-label="Proposals" className="divide-y divide-ink-100 self-start rounded border border-ink-200 bg-white">
              {items.map((p) => (
                <li key={p.id}>
                  <button type="button" onClick={() => setOpenId(p.id)} aria-current={openId === p.id || undefined} className={`block w-full px-3 py-2 text-left text-sm hover:bg-copper-50 ${openId === p.id ? 'bg-copper-100' : ''}`}>
                    <span className="flex items-center gap-2">
                      <span className="font-medium">{title(p)}</span>
                      <Badge tone={p.status === 'open' ? 'warning' : p.status === 'approved' ? 'mask' : 'error'}>{p.status}</Badge>
                    </span>
                    <span className="block text-xs text-ink-500">{KIND[p.kind]} · {p.proposerEmail}</span>
                  </button>
                </li>
              ))}
            </ul>
            {(() => {
              const p = items.find((x) => x.id === openId);
              return p ? <Detail key={p.id} p={p} canEdit={access.canEdit} /> : <p className="text-sm text-ink-500">Choose a proposal to read it{access.canEdit ? ', edit it and decide' : ''}.</p>;
            })()}
          </div>
        )
      }
    </Loaded>
  );
}
