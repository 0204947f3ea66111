import { NavLink, Outlet, useOutletContext, useParams } from 'react-router-dom';
import type { RevisionDetail } from '../../../../shared/schemas/program.schema';
import { ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { useRevision } from '../../../features/programs/api/programs';
import { StateBadge } from '../../../features/programs/components/state-badge';
import { STAGES, stageMarks, type StageState } from './stage-marks';
import { Link } from 'react-router-dom';

export { STAGES };

export interface WorkspaceContext {
  revision: RevisionDetail;
}

export function useWorkspace() {
  return useOutletContext<WorkspaceContext>();
}

const MARK: Record<StageState, string> = { done: '✓', todo: '○', attention: '!', waiting: '…' };
const MARK_WORD: Record<StageState, string> = { done: 'done', todo: 'to do', attention: 'needs attention', waiting: 'waiting' };
const MARK_CLASS: Record<StageState, string> = { done: 'text-mask-500', todo: 'text-ink-400', attention: 'text-sev-error', waiting: 'text-copper-600' };

export default function WorkspaceRoute() {
  const { revisionId = '' } = useParams();
  const rev = useRevision(revisionId);
  if (rev.isPending) return <ProgressBar label="Loading the revision" />;
  if (rev.isError) return <ErrorPanel error={rev.error} />;
  const r = rev.data;
  const marks = stageMarks(r);
  return (
    <div className="max-w-7xl">
      <div className="mb-4 flex flex-wrap items-baseline gap-3 border-b border-ink-200 pb-3">
        <Link to={`/programs/${r.program.id}`} className="text-xl font-semibold text-ink-900 hover:underline">{r.program.name}</Link>
        <span className="num text-xl text-ink-500">rev {r.label}</span>
        <StateBadge state={r.state} />
        <span className="text-sm text-ink-500">{r.program.product} · {r.program.board}</span>
        {!r.can.edit && r.state !== 'draft' && (
          <span className="ml-auto rounded bg-ink-100 px-2 py-1 text-xs text-ink-600">
            {r.state === 'released' || r.state === 'superseded' ? 'Released revisions are read-only.' : r.state === 'in-review' ? 'In review: read-only until a reviewer decides.' : 'Read-only.'}
          </span>
        )}
      </div>
      <nav aria-label="Stages" className="mb-5">
        <ol className="flex flex-wrap gap-1">
          {STAGES.map((s, i) => (
            <li key={s.path}>
              <NavLink
                to={s.path}
                className={({ isActive }) =>
                  `flex items-center gap-2 rounded px-3 py-1.5 text-sm ${isActive ? 'bg-ink-800 text-white' : 'bg-white text-ink-700 ring-1 ring-ink-200 hover:bg-copper-50'}`
                }
              >
                <span className="num text-xs text-ink-400">{i + 1}</span>
                {s.label}
                <span aria-label={`${MARK_WORD[marks[s.path].state]}: ${marks[s.path].why}`} title={marks[s.path].why} data-mark={marks[s.path].state} className={`text-xs ${MARK_CLASS[marks[s.path].state]}`}>{MARK[marks[s.path].state]}</span>
              </NavLink>
            </li>
          ))}
        </ol>
      </nav>
      <Outlet context={{ revision: r } satisfies WorkspaceContext} />
    </div>
  );
}
