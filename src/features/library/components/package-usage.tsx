// Where a package is used: shown on its page and again before a change is saved.
import { Link } from 'react-router-dom';
import type { PackageUsage } from '../../../../shared/schemas/library.schema';
import { Badge, ErrorPanel, ProgressBar } from '../../../components/ui/misc';

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
