import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import { waivedKeys } from '../../../../../shared/review';
import type { RevisionDetail } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { ConfirmDialog } from '../../../../components/ui/confirm-dialog';
import { Badge } from '../../../../components/ui/misc';
import { useApprove, useNewRevision, useReject, useSubmit, useWithdraw } from '../../../../features/programs/api/programs';
import { ReviewSummaryPanel } from '../../../../features/programs/components/review-summary-panel';
import { RevisionCanvas } from '../../../../features/programs/components/revision-canvas';
import { dateTime, fileSize, fixed } from '../../../../lib/format';
import { useWorkspace } from '../workspace';

/** What each recorded change is called on the page (the server records these words). */
const CONTRIBUTION_WORDS: Record<string, string> = { create: 'created', import: 'imported the file', settings: 'set up', overrides: 'overrode parts', waiver: 'waived findings', submit: 'submitted' };

function Comments() {
  const { revision: r } = useWorkspace();
  const notes = r.comments.filter((c) => c.kind === 'comment');
  return (
    <section aria-label="Review comments" className="rounded border border-ink-200 bg-white p-4">
      <h2 className="mb-2 font-semibold">Review comments</h2>
      {notes.length === 0 ? (
        <p className="text-sm text-ink-500">No comments. Pin one on the canvas with the note tool.</p>
      ) : (
        <ol className="flex flex-col gap-2 text-sm">
          {notes.map((c) => (
            <li key={c.id}>
              <span className="text-xs text-ink-500">{c.userEmail}, {dateTime(c.at)}{c.x !== null && c.y !== null && <span className="num"> · {c.side} at {fixed(c.x)}, {fixed(c.y)} mm</span>}</span>
              <p>{c.text}</p>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

/** Error findings no waiver covers (a waiver on every board covers each board's finding). */
function openErrorFindings(r: RevisionDetail) {
  const waived = waivedKeys(r.findings ?? [], r.waivers);
  return (r.findings ?? []).filter((f) => f.severity === 'error' && !waived.has(f.key));
}

function Decision() {
  const { revision: r } = useWorkspace();
  const approve = useApprove(r.id);
  const reject = useReject(r.id);
  const [comment, setComment] = useState('');
  const [confirming, setConfirming] = useState(false);
  const open = openErrorFindings(r);
  const waived = waivedKeys(r.findings ?? [], r.waivers).size;
  const checkedKeys = new Set(r.comments.filter((c) => c.kind === 'checked' && c.findingKey).map((c) => c.findingKey!));
  const overrides = Object.keys(r.overrides).length;
  const release = () =>
    approve.mutate(comment, {
      onSuccess: () => {
        setConfirming(false);
        toast.success('Released. Operators were told by e-mail.');
      },
      onError: (e) => {
        setConfirming(false);
        toast.error(e.message);
      },
    });
  return (
    <section aria-label="Decision" className="flex flex-col gap-3 rounded border border-copper-300 bg-white p-4">
      <h2 className="font-semibold">Your review</h2>
      <p className="text-sm text-ink-600">
        Read the summary above, then look at both sides on the canvas: polarity marks, the bottom side's rotations, crowded corners, fiducials. {r.findings?.length ?? 0} findings ({waived} waived, {checkedKeys.size} marked checked).
      </p>
      {open.length > 0 && <p role="alert" className="rounded bg-sev-error/10 px-2 py-1 text-sm text-sev-error">{open.length} error finding{open.length === 1 ? '' : 's'} neither fixed nor waived: approval is not possible. Reject it back to the author.</p>}
      <label htmlFor="review-comment" className="text-xs font-medium text-ink-700">Comment (required to reject; sent to the author)</label>
      <textarea id="review-comment" rows={3} value={comment} onChange={(e) => setComment(e.target.value)} className="rounded border border-ink-300 p-2 text-sm" />
      <div className="flex gap-2">
        <Button disabled={open.length > 0 || approve.isPending} aria-haspopup="dialog" onClick={() => setConfirming(true)}>
          {approve.isPending ? 'Releasing…' : 'Approve and release'}
        </Button>
        <Button variant="danger" disabled={comment.trim().length < 3 || reject.isPending} onClick={() => reject.mutate(comment, { onSuccess: () => toast.success('Sent back to the author.'), onError: (e) => toast.error(e.message) })}>
          Reject with comment
        </Button>
      </div>
      <ConfirmDialog
        open={confirming}
        title={`Release ${r.program.name} revision ${r.label}?`}
        confirmLabel={approve.isPending ? 'Releasing…' : `Release ${r.program.name} ${r.label}`}
        busy={approve.isPending}
        onConfirm={release}
        onCancel={() => setConfirming(false)}
      >
        <p>
          The checks run once more with today’s library, then the placement lists of <strong>{r.program.name}</strong> revision <strong className="num">{r.label}</strong> are written and
          fixed: released revisions cannot be changed. Operators are told by e-mail.
        </p>
        <p className="num">
          {r.findings?.length ?? 0} findings, {waived} of them waived · {overrides} override{overrides === 1 ? '' : 's'}
        </p>
        {comment.trim() && <p>Your comment goes to the author: “{comment.trim()}”</p>}
      </ConfirmDialog>
    </section>
  );
}

export default function ReleaseStage() {
  const { revision: r } = useWorkspace();
  const submit = useSubmit(r.id);
  const withdraw = useWithdraw(r.id);
  const [withdrawing, setWithdrawing] = useState(false);
  const newRev = useNewRevision(r.programId);
  const navigate = useNavigate();
  const openErrors = openErrorFindings(r).length;
  const missing = [!r.imported && 'import a centroid file', !(r.settings.board && r.settings.panel) && 'set the panel', !r.findingsSummary && 'run the checks', openErrors > 0 && `fix or waive ${openErrors} error finding${openErrors === 1 ? '' : 's'}`].filter(Boolean) as string[];

  return (
    <div className="flex flex-col gap-5">
      <ol aria-label="Release steps" className="flex flex-wrap items-center gap-2 text-sm">
        {(['draft', 'in-review', 'released'] as const).map((s, i) => (
          <li key={s} className={`rounded px-3 py-1 ${r.state === s ? 'bg-ink-800 text-white' : 'bg-white ring-1 ring-ink-200 text-ink-600'}`}>
            <span className="num mr-1 text-xs">{i + 1}</span>{s === 'draft' ? 'Draft' : s === 'in-review' ? 'In review' : 'Released'}
          </li>
        ))}
      </ol>

      {r.reviewComment && r.state === 'draft' && (
        <div role="note" className="rounded border border-sev-warning/60 bg-sev-warning/10 p-3 text-sm">
          <p className="font-medium">Changes requested by {r.reviewer?.name ?? 'the reviewer'} ({dateTime(r.reviewedAt)})</p>
          <p className="mt-1 whitespace-pre-wrap">{r.reviewComment}</p>
        </div>
      )}

      {r.state === 'draft' && r.can.submit && (
        <section aria-label="Submit" className="flex flex-col gap-2 rounded border border-ink-200 bg-white p-4">
          <h2 className="font-semibold">Submit for review</h2>
          {missing.length ? <p className="text-sm text-ink-600">Before submitting: {missing.join('; ')}.</p> : <p className="text-sm text-ink-600">Another engineer reviews the panel on the canvas and releases it. Engineers are told by e-mail. The reviewer sees the summary below.</p>}
          <div className="flex gap-2">
            <Button disabled={missing.length > 0 || submit.isPending} onClick={() => submit.mutate(undefined, { onSuccess: () => toast.success('Submitted for review.'), onError: (e) => toast.error(e.message) })}>Submit for review</Button>
            <Button variant="ghost" aria-haspopup="dialog" onClick={() => setWithdrawing(true)}>Withdraw</Button>
          </div>
        </section>
      )}

      {r.state === 'in-review' && !r.can.review && (
        <section className="rounded border border-ink-200 bg-white p-4 text-sm">
          <p>Submitted {dateTime(r.submittedAt)}. Waiting for review by another engineer: no one who changed this revision (created, imported, set up, overrode, waived or submitted it) may approve it.</p>
          {r.can.withdraw && <Button variant="ghost" className="mt-2" aria-haspopup="dialog" onClick={() => setWithdrawing(true)}>Withdraw</Button>}
        </section>
      )}
      {r.state === 'in-review' && r.contributors.length > 0 && (
        <p className="text-sm text-ink-600" aria-label="Changed by">
          Changed by {r.contributors.map((c, i) => (
            <span key={c.email}>{i > 0 && '; '}<span className="font-medium text-ink-800">{c.name}</span> ({c.actions.map((a) => CONTRIBUTION_WORDS[a] ?? a).join(', ')})</span>
          ))}: they may not approve it.
        </p>
      )}
      {(r.state === 'draft' || r.state === 'in-review') && r.imported && <ReviewSummaryPanel revisionId={r.id} title={r.state === 'draft' ? 'What you submit' : 'What is approved'} />}
      {r.state === 'in-review' && r.can.review && <Decision />}

      {(r.state === 'released' || r.state === 'superseded') && (
        <section aria-label="Released files" className="flex flex-col gap-3 rounded border border-mask-400/60 bg-white p-4">
          <h2 className="font-semibold">{r.state === 'released' ? 'Released' : 'Superseded'} {dateTime(r.releasedAt)} · reviewed by {r.reviewer?.name ?? '—'}</h2>
          {r.reviewComment && <p className="text-sm text-ink-700">“{r.reviewComment}”</p>}
          <ul className="flex flex-col gap-2">
            {r.releaseFiles.map((f) => (
              <li key={f.url} className="flex flex-wrap items-center gap-3 text-sm">
                <Badge tone="mask">{f.side}</Badge>
                <a href={f.url} className="font-medium text-copper-700 underline" download>{f.format.toUpperCase()}</a>
                <span className="num text-xs text-ink-500">{f.placements} placements · {fileSize(f.bytes)}</span>
                <span className="num break-all text-xs">SHA-256 {f.sha256}</span>
              </li>
            ))}
          </ul>
          {r.can.newRevision && (
            <Button className="self-start" disabled={newRev.isPending} onClick={() => newRev.mutate(undefined, { onSuccess: (n) => navigate(`/programs/revisions/${n.id}/import`), onError: (e) => toast.error(e.message) })}>
              Start revision from {r.label}
            </Button>
          )}
        </section>
      )}
      {(r.state === 'released' || r.state === 'superseded') && r.imported && <ReviewSummaryPanel revisionId={r.id} title="What was released" />}

      {r.state !== 'withdrawn' && (r.state === 'in-review' || r.state === 'released' || r.state === 'superseded') && (
        <section aria-label="Canvas" className="flex flex-col gap-2">
          <h2 className="font-semibold">Panel review</h2>
          <RevisionCanvas r={r} />
        </section>
      )}
      <Comments />
      <ConfirmDialog
        open={withdrawing}
        title={`Withdraw ${r.program.name} revision ${r.label}?`}
        confirmLabel={`Withdraw ${r.label}`}
        tone="danger"
        busy={withdraw.isPending}
        onConfirm={() => withdraw.mutate(undefined, { onSettled: () => setWithdrawing(false), onError: (e) => toast.error(e.message) })}
        onCancel={() => setWithdrawing(false)}
      >
        <p>A withdrawn revision cannot be reopened or released; its files and notes stay readable.</p>
      </ConfirmDialog>
    </div>
  );
}
