// Where a package is used: shown on its page and again before a change is saved.
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { PackageUsage } from '../../../../shared/schemas/library.schema';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';
import { Badge, ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { packageUsageQueryOptions } from '../api/package-usage';

const STATE: Record<PackageUsage['revisions'][number]['state'], string> = { draft: 'draft', 'in-review': 'in review', released: 'released' };

/** The revisions that place the package, those a change reaches first. */
export function PackageUsageList({ usage, only }: { usage: PackageUsage; only?: 'in-work' | 'released' }) {
  const rows = usage.revisions.filter((u) => (only === 'in-work' ? u.affected : only === 'released' ? !u.affected : true));
  if (rows.length === 0) return null;
  return (
    <ul className="flex flex-col gap-1 text-sm">
      {rows.map((u) => (
        <li key={u.revisionId} className="flex flex-wrap items-baseline gap-2" data-testid="package-usage-row">
          <Link to={`/programs/revisions/${u.revisionId}/assign`} className="font-medium text-copper-700 underline">
            {u.programName} rev {u.label}
          </Link>
          <Badge tone={u.affected ? 'warning' : 'neutral'}>{STATE[u.state]}</Badge>
          <span className="num text-xs text-ink-600">
            {u.parts} part{u.parts === 1 ? '' : 's'} per board{u.viaOverride ? ` (${u.viaOverride} by override)` : ''}: {u.refs.join(', ')}
            {u.parts > u.refs.length ? ', …' : ''}
          </span>
          {!u.affected && <span className="text-xs text-ink-500">not affected: its released lists stay as they are</span>}
        </li>
      ))}
    </ul>
  );
}

export function PackageUsagePanel({ q }: { q: { isPending: boolean; isError: boolean; error: unknown; data: PackageUsage | undefined } }) {
  return (
    <section aria-label="Where this package is used" className="rounded border border-ink-200 bg-white p-3">
      <h3 className="mb-2 text-sm font-semibold">Where this package is used</h3>
      {q.isPending ? (
        <ProgressBar label="Looking for programs that use it" />
      ) : q.isError ? (
        <ErrorPanel error={q.error} />
      ) : q.data!.revisions.length === 0 ? (
        <p className="text-xs text-ink-500">No program revision in work or released places this package: a change reaches no program now.</p>
      ) : (
        <div className="flex flex-col gap-2">
          <p className="text-xs text-ink-600">
            <span className="num">{q.data!.inWork}</span> revision{q.data!.inWork === 1 ? '' : 's'} in work change with this package at their next check (a revision in review is checked again before it is released).{' '}
            <span className="num">{q.data!.released}</span> released revision{q.data!.released === 1 ? ' is' : 's are'} not affected: released lists never change.
          </p>
          <PackageUsageList usage={q.data!} />
        </div>
      )}
    </section>
  );
}

/**
 * The safeguard before a shared package changes: `confirm()` reads where the package is used now
 * and, when a revision in work would change, asks in a dialog (render `dialog`); it resolves true
 * to go on saving. Released revisions are listed as not affected.
 */
export function usePackageChangeSafeguard(packageId: string | null | undefined, packageName: string) {
  const qc = useQueryClient();
  const [ask, setAsk] = useState<{ usage: PackageUsage; answer: (save: boolean) => void } | null>(null);
  const confirm = async (): Promise<boolean> => {
    if (!packageId) return true;
    const now = await qc.fetchQuery({ ...packageUsageQueryOptions(packageId), staleTime: 0 });
    if (now.inWork === 0) return true;
    return new Promise<boolean>((answer) => setAsk({ usage: now, answer }));
  };
  const close = (save: boolean) => {
    ask?.answer(save);
    setAsk(null);
  };
  const n = ask?.usage.inWork ?? 0;
  const released = ask?.usage.released ?? 0;
  const dialog = (
    <ConfirmDialog
      open={ask !== null}
      title={`Change ${packageName} for ${n} program revision${n === 1 ? '' : 's'} in work?`}
      confirmLabel="Save the change"
      cancelLabel="Keep editing"
      onConfirm={() => close(true)}
      onCancel={() => close(false)}
    >
      {ask && (
        <>
          <p>This package is shared. These revisions in work place their parts with it, and change at their next check:</p>
          <PackageUsageList usage={ask.usage} only="in-work" />
          {released > 0 && (
            <p className="text-ink-600">
              <span className="num">{released}</span> released revision{released === 1 ? ' also uses' : 's also use'} it and {released === 1 ? 'is' : 'are'} not affected: released lists never change.
            </p>
          )}
        </>
      )}
    </ConfirmDialog>
  );
  return { confirm, dialog };
}
