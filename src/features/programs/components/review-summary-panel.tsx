// The review summary, as the author submits it and as the reviewer approves it: findings by kind
// with every waiver (reason, who, when, how many findings it covers), every override with its
// reason, and what changed since the last release.
import type { ReactNode } from 'react';
import type { ReviewSummaryDto, ReviewWaiver } from '../../../../shared/schemas/program.schema';
import { Badge, ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { dateTime } from '../../../lib/format';
import { useReviewSummary } from '../api/review-summary';
import { findingKindLabel, waivedWhat } from '../lib/finding-labels';

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function WaiverLine({ w }: { w: ReviewWaiver }) {
  return (
    <li className="flex flex-col gap-0.5 border-l-2 border-copper-300 pl-2" data-testid="summary-waiver">
      <span className="text-xs text-ink-600">
        {w.scope === 'every-board' ? (
          <>
            <Badge tone="copper">every board</Badge> <span className="num font-medium text-ink-800">{w.refs.join(', ')}</span> · covers <span className="num">{plural(w.covers, 'finding')}</span>
          </>
        ) : (
          <>
            <span className="num font-medium text-ink-800">{waivedWhat(w.refs)}</span>
            {w.covers === 0 && <span className="ml-1 text-ink-500">(not found by the last check)</span>}
          </>
        )}
      </span>
      <span className="text-sm">“{w.reason}”</span>
      <span className="text-xs text-ink-500">
        waived by {w.userName ? `${w.userName} (${w.userEmail})` : w.userEmail}, {dateTime(w.at)}
      </span>
    </li>
  );
}

function RefList({ label, refs }: { label: string; refs: string[] }) {
  if (refs.length === 0) return null;
  return (
    <li>
      <details>
        <summary className="cursor-pointer">
          {label}: <span className="num">{refs.length}</span>
        </summary>
        <p className="num mt-1 break-words text-xs text-ink-600">{refs.join(', ')}</p>
      </details>
    </li>
  );
}

function Changes({ c }: { c: ReviewSummaryDto['changes'] }) {
  if (!c.since) return <p className="text-sm text-ink-600">First release: no earlier revision of this program was released, so there is nothing to compare with.</p>;
  const none = !c.added.length && !c.removed.length && !c.moved.length && !c.changed.length && !c.settings.length && !c.overrides.length;
  return (
    <div className="flex flex-col gap-1 text-sm">
      <p className="text-ink-600">
        Compared with revision <span className="num">{c.since.label}</span>, released {dateTime(c.since.releasedAt)}:
      </p>
      <p className="num" data-testid="change-counts">
        {c.added.length} added · {c.removed.length} removed · {c.moved.length} moved · {c.changed.length} with a new footprint or value
      </p>
      {none ? (
        <p className="text-ink-600">No part, setting or override changed.</p>
      ) : (
        <ul className="flex flex-col gap-0.5 text-xs">
          <RefList label="Added" refs={c.added} />
          <RefList label="Removed" refs={c.removed} />
          <RefList label="Moved or turned" refs={c.moved} />
          <RefList label="New footprint or value" refs={c.changed} />
          <RefList label="Overrides added, removed or changed" refs={c.overrides} />
          {c.settings.length > 0 && <li>Settings changed: {c.settings.join(', ')}</li>}
        </ul>
      )}
    </div>
  );
}

/** An overridden value with what the library gives without it; unset: the library's choice stands. */
function Choice({ value, instead, unset }: { value: string | null; instead: string | null; unset: string }) {
  if (value === null) return <span className="text-ink-400">{unset}{instead ? ` (${instead})` : ''}</span>;
  return (
    <>
      <span className="font-medium">{value}</span>
      <span className="block text-xs text-ink-500">instead of {instead ?? 'none'}</span>
    </>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section aria-label={title} className="flex flex-col gap-2 border-t border-ink-100 pt-3">
      <h3 className="text-sm font-semibold text-ink-800">{title}</h3>
      {children}
    </section>
  );
}

export function ReviewSummaryView({ s }: { s: ReviewSummaryDto }) {
  const f = s.findings;
  return (
    <div className="flex flex-col gap-3">
      <p className="num text-sm" data-testid="summary-totals">
        {plural(s.placements, 'part')} per board ·{' '}
        {f ? (
          <>
            {plural(f.total, 'finding')} ({plural(f.errors, 'error')}, {plural(f.warnings, 'warning')}) · {f.waived} waived ·{' '}
            <span className={f.openErrors ? 'text-sev-error' : 'text-mask-600'}>{f.openErrors ? `${plural(f.openErrors, 'error')} neither fixed nor waived` : 'no open errors'}</span> · checked {dateTime(s.checkedAt)}
          </>
        ) : (
          <span className="text-sev-warning">not checked since the last change</span>
        )}
      </p>

      <Section title="Findings by kind">
        {!f ? (
          <p className="text-sm text-ink-500">Run the checks to see the findings.</p>
        ) : s.byKind.length === 0 ? (
          <p className="text-sm text-mask-600">No findings: the panel is clean.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {s.byKind.map((k) => (
              <li key={k.kind} className="flex flex-col gap-1" data-testid={`summary-kind-${k.kind}`}>
                <span className="flex flex-wrap items-center gap-2 text-sm">
                  <Badge tone={k.severity === 'error' ? 'error' : 'warning'}>{k.severity}</Badge>
                  <span className="font-medium">{findingKindLabel(k.kind)}</span>
                  <span className="num text-xs text-ink-500">
                    {k.count} · {k.waived} waived{k.severity === 'error' && k.count > k.waived ? ` · ${k.count - k.waived} open` : ''}
                  </span>
                </span>
                {k.waivers.length > 0 && <ul className="ml-4 flex flex-col gap-1.5">{k.waivers.map((w) => <WaiverLine key={w.id} w={w} />)}</ul>}
              </li>
            ))}
          </ul>
        )}
        {s.unusedWaivers.length > 0 && (
          <details className="text-xs">
            <summary className="cursor-pointer text-ink-600">{plural(s.unusedWaivers.length, 'waiver')} whose finding the last check did not report</summary>
            <ul className="ml-4 mt-1 flex flex-col gap-1.5">{s.unusedWaivers.map((w) => <WaiverLine key={w.id} w={w} />)}</ul>
          </details>
        )}
      </Section>

      <Section title="Overrides">
        {s.overrides.length === 0 ? (
          <p className="text-sm text-ink-500">None: every part has the package, nozzle and vision preset the library gives it.</p>
        ) : (
          <table className="w-full text-left text-sm" aria-label="Overrides">
            <thead className="text-xs text-ink-500">
              <tr>
                <th className="py-1 pr-2 font-medium">Ref (every board)</th>
                <th className="py-1 pr-2 font-medium">Package</th>
                <th className="py-1 pr-2 font-medium">Nozzle</th>
                <th className="py-1 pr-2 font-medium">Vision preset</th>
                <th className="py-1 font-medium">Reason</th>
              </tr>
            </thead>
            <tbody>
              {s.overrides.map((o) => (
                <tr key={o.ref} className="border-t border-ink-100 align-top">
                  <td className="num py-1 pr-2 font-medium">
                    {o.ref}
                    {o.footprint === null ? <span className="block text-xs font-normal text-sev-warning">no placed part has this reference</span> : <span className="block text-xs font-normal text-ink-500">{o.footprint}</span>}
                  </td>
                  <td className="num py-1 pr-2"><Choice value={o.package} instead={o.instead.package} unset="as matched" /></td>
                  <td className="num py-1 pr-2"><Choice value={o.nozzle} instead={o.instead.nozzle} unset="as chosen" /></td>
                  <td className="num py-1 pr-2"><Choice value={o.vision} instead={o.instead.vision} unset="the package’s" /></td>
                  <td className="py-1">“{o.reason}”</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Section>

      <Section title="Changes since the last release">
        <Changes c={s.changes} />
      </Section>
    </div>
  );
}

/** The summary of one revision, loaded from the server. */
export function ReviewSummaryPanel({ revisionId, title = 'Review summary' }: { revisionId: string; title?: string }) {
  const q = useReviewSummary(revisionId);
  return (
    <section aria-label={title} className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-4">
      <h2 className="font-semibold">{title}</h2>
      {q.isPending ? <ProgressBar label="Loading the summary" /> : q.isError ? <ErrorPanel error={q.error} /> : <ReviewSummaryView s={q.data} />}
    </section>
  );
}
