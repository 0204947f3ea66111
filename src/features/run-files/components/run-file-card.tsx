import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Badge } from '../../../components/ui/misc';
import { dateTime } from '../../../lib/format';
import { fileSize, sideLabel } from '../lib/format';
import type { RunFileEntry } from '../lib/order';
import { ProblemForm } from './problem-form';
import { Sha256 } from './copy-button';

/** One released revision: its state, its four files with checksums, the set-up sheet and a problem report. */
export function RunFileCard({ entry }: { entry: RunFileEntry }) {
  const { runFile: r, supersededBy, current } = entry;
  const [reporting, setReporting] = useState(false);
  const what = `${r.programName} ${r.label}`;
  const files = [...r.files].sort((a, b) => (a.side === b.side ? a.format.localeCompare(b.format) : a.side === 'top' ? -1 : 1));
  return (
    <article
      aria-label={`${what}${current ? ' (current)' : ' (superseded)'}`}
      data-state={r.state}
      className={`rounded border p-4 ${current ? 'border-copper-300 bg-white shadow-sm' : 'border-ink-200 bg-ink-50 text-ink-500'}`}
    >
      <header className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <h3 className={`text-base font-semibold ${current ? 'text-ink-900' : 'text-ink-500'}`}>
          Revision <span className="num">{r.label}</span>
        </h3>
        {current ? <Badge tone="mask">Current</Badge> : <Badge>Superseded</Badge>}
        {supersededBy && (
          <span className="text-sm font-medium text-ink-600">
            superseded by <span className="num">{supersededBy}</span> — do not load
          </span>
        )}
        <span className="text-xs text-ink-500">
          released <span className="num">{dateTime(r.releasedAt)}</span>
          {r.author && <> · by {r.author.name}</>}
          {r.reviewer && <> · reviewed by {r.reviewer.name}</>}
        </span>
        <span className="ml-auto flex gap-2">
          <Link to={`/run-files/${r.revisionId}/setup-sheet`} className="rounded border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100">
            Set-up sheet
          </Link>
          <Button variant="ghost" aria-expanded={reporting} onClick={() => setReporting((v) => !v)}>
            Report a problem
          </Button>
        </span>
      </header>
      {files.length === 0 ? (
        <p className="mt-2 text-sm">No files were stored with this release.</p>
      ) : (
        <table aria-label={`Files of ${what}`} className="mt-3 w-full border-collapse text-sm">
          <thead className="text-left text-xs text-ink-500">
            <tr>
              <th scope="col" className="py-1 pr-3 font-medium">List</th>
              <th scope="col" className="py-1 pr-3 text-right font-medium">Placements</th>
              <th scope="col" className="py-1 pr-3 text-right font-medium">Size</th>
              <th scope="col" className="py-1 pr-3 font-medium">SHA-256</th>
              <th scope="col" className="py-1 font-medium"><span className="sr-only">Download</span></th>
            </tr>
          </thead>
          <tbody>
            {files.map((f) => {
              const name = `${sideLabel(f.side)} ${f.format.toUpperCase()}`;
              return (
                <tr key={`${f.side}.${f.format}`} className="border-t border-ink-100 align-top">
                  <td className="whitespace-nowrap py-1.5 pr-3 font-medium">{name}</td>
                  <td className="num whitespace-nowrap py-1.5 pr-3 text-right">{f.placements}</td>
                  <td className="num whitespace-nowrap py-1.5 pr-3 text-right">{fileSize(f.bytes)}</td>
                  <td className="py-1.5 pr-3">
                    <Sha256 value={f.sha256} what={`the ${name} of ${what}`} />
                  </td>
                  <td className="whitespace-nowrap py-1.5 text-right">
                    <a
                      href={f.url}
                      download
                      aria-label={`Download ${name} of ${what}`}
                      className={`inline-flex items-center rounded px-3 py-1 text-sm font-medium ${current ? 'bg-copper-500 text-white hover:bg-copper-600' : 'border border-ink-300 bg-white text-ink-700 hover:bg-ink-100'}`}
                    >
                      Download <span className="num ml-1 text-xs opacity-80">.{f.format}</span>
                    </a>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {files.length > 0 && <ChecksumNote />}
      {reporting && <ProblemForm revisionId={r.revisionId} what={what} onDone={() => setReporting(false)} />}
    </article>
  );
}

/** What each checksum covers (shared/placement-list/README.md): a CSV's is the file's own `# sha256:` line. */
export function ChecksumNote() {
  return (
    <p className="mt-2 text-xs text-ink-500">
      CSV: SHA-256 of everything after the <code className="num">#</code> lines (header row included), the same value as the file’s own{' '}
      <code className="num"># sha256:</code> line. JSON: SHA-256 of the whole file.
    </p>
  );
}
