import { useState } from 'react';
import { EmptyState, ErrorPanel, PageHeader, ProgressBar, Badge } from '../../../components/ui/misc';
import { useOutbox } from '../../../features/outbox/api/outbox';
import { dateTime } from '../../../lib/format';

export default function OutboxRoute() {
  const outbox = useOutbox();
  const [openId, setOpenId] = useState<string | null>(null);
  return (
    <div className="max-w-6xl">
      <PageHeader title="Outbox" subtitle="Every e-mail Placewright sent. Without a relay configured (SMTP_URL), mail stays here and goes nowhere else." />
      {outbox.isPending ? <ProgressBar label="Loading the outbox" /> : outbox.isError ? <ErrorPanel error={outbox.error} /> : outbox.data.length === 0 ? (
        <EmptyState title="No mail yet">Mail appears here when a review is requested, a program is released or a library proposal is decided.</EmptyState>
      ) : (
        <div className="grid grid-cols-[minmax(0,2fr)_minmax(0,3fr)] gap-4">
          <ul aria-label="Messages" className="divide-y divide-ink-100 overflow-auto rounded border border-ink-200 bg-white" style={{ maxHeight: 600 }}>
            {outbox.data.map((m) => (
              <li key={m.id}>
                <button type="button" onClick={() => setOpenId(m.id)} aria-current={openId === m.id || undefined} className={`block w-full px-3 py-2 text-left text-sm hover:bg-copper-50 ${openId === m.id ? 'bg-copper-100' : ''}`}>
                  <span className="block font-medium">{m.subject}</span>
                  <span className="block truncate text-xs text-ink-500">to {m.to.join(', ')}</span>
                  <span className="num block text-2xs text-ink-400">{dateTime(m.at)}</span>
                </button>
              </li>
            ))}
          </ul>
          <article aria-label="Message" className="rounded border border-ink-200 bg-white p-4">
            {(() => {
              const m = outbox.data.find((x) => x.id === openId);
              if (!m) return <p className="text-sm text-ink-500">Choose a message to read it.</p>;
              return (
                <>
                  <h2 className="font-semibold">{m.subject}</h2>
                  <dl className="mt-2 grid grid-cols-[5rem_1fr] gap-1 text-xs">
                    <dt className="text-ink-500">From</dt><dd>{m.from}</dd>
                    <dt className="text-ink-500">To</dt><dd>{m.to.join(', ')}</dd>
                    <dt className="text-ink-500">Sent</dt><dd className="num">{dateTime(m.at)}</dd>
                    <dt className="text-ink-500">Transport</dt><dd><Badge>{m.transport}</Badge></dd>
                  </dl>
                  <pre className="mt-4 whitespace-pre-wrap font-sans text-sm">{m.text}</pre>
                </>
              );
            })()}
          </article>
        </div>
      )}
    </div>
  );
}
