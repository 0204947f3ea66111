import { Link, useNavigate, useParams } from 'react-router-dom';
import { toast } from 'sonner';
import { Button } from '../../../components/ui/button';
import { ErrorPanel, PageHeader, ProgressBar } from '../../../components/ui/misc';
import { useNewRevision, useProgram } from '../../../features/programs/api/programs';
import { StateBadge } from '../../../features/programs/components/state-badge';
import { dateTime } from '../../../lib/format';

export default function ProgramRoute() {
  const { programId = '' } = useParams();
  const program = useProgram(programId);
  const newRev = useNewRevision(programId);
  const navigate = useNavigate();
  if (program.isPending) return <ProgressBar label="Loading the program" />;
  if (program.isError) return <ErrorPanel error={program.error} />;
  const p = program.data;
  const open = p.revisions.find((r) => r.state === 'draft' || r.state === 'in-review');
  const released = [...p.revisions].reverse().find((r) => r.state === 'released');
  return (
    <div className="max-w-5xl">
      <PageHeader
        title={p.name}
        subtitle={`${p.product} · ${p.board} · owner ${p.owner?.name ?? '—'}`}
        actions={
          released && !open ? (
            <Button disabled={newRev.isPending} onClick={() => newRev.mutate(undefined, { onSuccess: (r) => navigate(`/programs/revisions/${r.id}/import`), onError: (e) => toast.error(e.message) })}>
              New revision from {released.label}
            </Button>
          ) : null
        }
      />
      <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Revisions</h2>
      <ol className="divide-y divide-ink-100 rounded border border-ink-200 bg-white">
        {[...p.revisions].reverse().map((r) => (
          <li key={r.id} className="flex items-center gap-4 px-4 py-3">
            <span className="num w-8 text-lg font-semibold">{r.label}</span>
            <StateBadge state={r.state} />
            <span className="text-sm text-ink-600">{r.centroidName ?? 'no centroid file yet'}</span>
            <span className="num text-xs text-ink-500">{r.placements} parts</span>
            <span className="num text-xs text-ink-500">{r.errors === null ? 'not checked' : `${r.errors} errors${(r.errors ?? 0) - (r.openErrors ?? 0) > 0 ? ` (${(r.errors ?? 0) - (r.openErrors ?? 0)} waived)` : ''} · ${r.warnings} warnings`}</span>
            <span className="ml-auto text-xs text-ink-500">by {r.author?.name ?? '—'}{r.releasedAt ? ` · released ${dateTime(r.releasedAt)}` : ` · ${dateTime(r.updatedAt)}`}</span>
            <Link className="text-sm font-medium text-copper-700 hover:underline" to={`/programs/revisions/${r.id}/${r.state === 'draft' ? 'import' : 'release'}`}>Open</Link>
          </li>
        ))}
      </ol>
    </div>
  );
}
