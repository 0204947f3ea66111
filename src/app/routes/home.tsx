import { ROLE_LABELS, type Role } from '../../../shared/schemas/auth.schema';
import { Badge, EmptyState, ErrorPanel, PageHeader, ProgressBar } from '../../components/ui/misc';
import { useMyActivity } from '../../features/audit/api/audit';
import { useMe } from '../../features/auth/api/get-me';
import { describeAction } from '../../features/audit/components/describe-action';
import { relativeTime } from '../../lib/format';

const ROLE_DUTIES: Record<Role, string> = {
  admin: 'Manage users and roles; read the audit log and the mail outbox.',
  engineer: 'Import centroid files, panelize, align fiducials, assign nozzles and presets, run checks, submit and review programs.',
  librarian: 'Curate the shared package library: packages, footprint aliases, nozzles, vision presets and machine profiles.',
  operator: 'Download released run files and set-up sheets; report problems back to the program’s author.',
};

export default function HomeRoute() {
  const me = useMe();
  const activity = useMyActivity();
  const user = me.data!.user;
  return (
    <div className="max-w-4xl">
      <PageHeader title={`Welcome, ${user.name.split(' ')[0]}`} subtitle={user.email} />
      <section aria-labelledby="roles-h" className="mb-8">
        <h2 id="roles-h" className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Your roles</h2>
        <ul className="grid gap-3 sm:grid-cols-2">
          {user.roles.map((r) => (
            <li key={r} className="rounded border border-ink-200 bg-white p-4">
              <Badge tone="copper">{ROLE_LABELS[r]}</Badge>
              <p className="mt-2 text-sm text-ink-700">{ROLE_DUTIES[r]}</p>
            </li>
          ))}
        </ul>
      </section>
      <section aria-labelledby="activity-h">
        <h2 id="activity-h" className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Your recent activity</h2>
        {activity.isPending ? (
          <ProgressBar label="Loading activity" />
        ) : activity.isError ? (
          <ErrorPanel error={activity.error} />
        ) : activity.data.items.length === 0 ? (
          <EmptyState title="No activity yet">What you do in Placewright — sign-ins, imports, reviews — is listed here.</EmptyState>
        ) : (
          <ol className="divide-y divide-ink-100 rounded border border-ink-200 bg-white">
            {activity.data.items.map((e) => (
              <li key={e.id} className="flex items-baseline justify-between gap-4 px-4 py-2 text-sm">
                <span>{describeAction(e)}</span>
                <time dateTime={e.at} className="num shrink-0 text-xs text-ink-500">{relativeTime(e.at)}</time>
              </li>
            ))}
          </ol>
        )}
      </section>
    </div>
  );
}
