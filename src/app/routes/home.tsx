import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '../../../shared/schemas/auth.schema';
import { Badge, EmptyState, ErrorPanel, PageHeader, ProgressBar } from '../../components/ui/misc';
import { useMyActivity } from '../../features/audit/api/audit';
import { useMe } from '../../features/auth/api/get-me';
import { describeAction } from '../../features/audit/components/describe-action';
import { relativeTime } from '../../lib/format';
import { proposalsQueryOptions } from '../../features/library/api/proposals';
import { unmatchedQueryOptions } from '../../features/library/api/unmatched';
import { programsQueryOptions } from '../../features/programs/api/programs';
import { runFilesQueryOptions } from '../../features/run-files/api/run-files';
import { usersQueryOptions } from '../../features/users/api/users';
import { homeTasks } from './home-tasks';

/** "Next for you": what waits for each of the user's roles, with the page where it is done. */
function NextTasks({ user }: { user: { id: string; roles: Role[] } }) {
  const has = (r: Role) => user.roles.includes(r);
  const programs = useQuery({ ...programsQueryOptions(), enabled: has('engineer') });
  const proposals = useQuery({ ...proposalsQueryOptions(), enabled: has('librarian') });
  const unmatched = useQuery({ ...unmatchedQueryOptions(), enabled: has('librarian') });
  const runFiles = useQuery({ ...runFilesQueryOptions(), enabled: has('operator') });
  const users = useQuery({ ...usersQueryOptions(), enabled: has('admin') });
  const queries = [programs, proposals, unmatched, runFiles, users].filter((q, i) => [has('engineer'), has('librarian'), has('librarian'), has('operator'), has('admin')][i]);
  const failed = queries.find((q) => q.isError);
  const tasks = homeTasks(user, { programs: programs.data, proposals: proposals.data, unmatched: unmatched.data, runFiles: runFiles.data, users: users.data });
  return (
    <section aria-labelledby="next-h" className="mb-8">
      <h2 id="next-h" className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Next for you</h2>
      {failed ? (
        <ErrorPanel error={failed.error} />
      ) : queries.some((q) => q.isPending) ? (
        <ProgressBar label="Looking for your next tasks" />
      ) : (
        <ul className="divide-y divide-ink-100 rounded border border-ink-200 bg-white" aria-label="Next tasks">
          {tasks.slice(0, 8).map((t, i) => (
            <li key={i} className="flex items-center gap-4 px-4 py-2.5 text-sm">
              <Badge tone="copper">{ROLE_LABELS[t.role]}</Badge>
              <span className="min-w-0 flex-1">
                <span className="font-medium text-ink-900">{t.title}</span>
                <span className="ml-2 text-xs text-ink-500">{t.detail}</span>
              </span>
              <Link to={t.to} className="shrink-0 text-sm font-medium text-copper-700 hover:underline">{t.action} →</Link>
            </li>
          ))}
          {tasks.length > 8 && <li className="px-4 py-2 text-xs text-ink-500">…and {tasks.length - 8} more.</li>}
        </ul>
      )}
    </section>
  );
}

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
      <NextTasks user={user} />
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
