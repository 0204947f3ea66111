// The review's state for the release stage: which errors still stand (neither gone on a re-run nor
// waived), how many findings the reviewer has checked, and the comments. The lead decides whether
// approval is allowed; `unresolvedErrors` is the rule the summary shows.
import type { Finding } from '../../../../shared/schemas/finding.schema';
import { Badge } from '../../../components/ui/misc';
import type { CanvasNote } from '../types';
import { fixed } from '../../../lib/format';

/** Error findings that are not waived: approval needs this list empty. */
export function unresolvedErrors(findings: readonly Finding[], waivedKeys: ReadonlySet<string> = new Set()): Finding[] {
  return findings.filter((f) => f.severity === 'error' && !waivedKeys.has(f.key));
}

export interface ReviewSummaryProps {
  findings: readonly Finding[];
  checkedFindingKeys?: ReadonlySet<string>;
  waivedFindingKeys?: ReadonlySet<string>;
  comments?: readonly CanvasNote[];
  /** a finding or comment was clicked (e.g. to open the canvas on it) */
  onShowFinding?: (f: Finding) => void;
  onShowComment?: (c: CanvasNote) => void;
}

export function ReviewSummary({ findings, checkedFindingKeys = new Set(), waivedFindingKeys = new Set(), comments = [], onShowFinding, onShowComment }: ReviewSummaryProps) {
  const open = unresolvedErrors(findings, waivedFindingKeys);
  const checked = findings.filter((f) => checkedFindingKeys.has(f.key)).length;
  return (
    <section aria-label="Review summary" className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-4 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        {open.length === 0 ? <Badge tone="mask">no open errors</Badge> : <Badge tone="error">{open.length} open error{open.length === 1 ? '' : 's'}</Badge>}
        <span className="num text-xs text-ink-600">
          {checked} of {findings.length} findings checked · {comments.length} comment{comments.length === 1 ? '' : 's'}
        </span>
      </div>
      {open.length > 0 && (
        <div>
          <p className="mb-1 text-xs text-ink-600">Every error must be fixed (gone on a re-run) or waived with a reason before approval:</p>
          <ul className="flex flex-col gap-0.5">
            {open.map((f) => (
              <li key={f.key}>
                <button type="button" className="text-left text-xs text-sev-error hover:underline disabled:no-underline" disabled={!onShowFinding} onClick={() => onShowFinding?.(f)}>
                  {f.kind} · {f.refs.length ? f.refs.join(', ') : f.boards.length ? `boards ${f.boards.join(', ')}` : 'panel'} ({f.side})
                </button>
              </li>
            ))}
          </ul>
        </div>
      )}
      <div>
        <p className="mb-1 text-xs font-medium text-ink-700">Review comments</p>
        {comments.length === 0 ? (
          <p className="text-xs text-ink-500">No comments.</p>
        ) : (
          <ol className="flex flex-col gap-1">
            {comments.map((c, k) => (
              <li key={c.id} className="text-xs">
                <button type="button" className="text-left hover:underline disabled:no-underline" disabled={!onShowComment} onClick={() => onShowComment?.(c)}>
                  <span className="num mr-1 text-ink-500">{k + 1}.</span>
                  {c.text}
                </button>
                <span className="num ml-1 text-ink-500">
                  ({c.author ? `${c.author}, ` : ''}{c.side}, {fixed(c.x)}, {fixed(c.y)} mm)
                </span>
              </li>
            ))}
          </ol>
        )}
      </div>
    </section>
  );
}
