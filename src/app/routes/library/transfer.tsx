import { useState } from 'react';
import { toast } from 'sonner';
import { CSV_COLUMNS, type CsvPreview, type ImportResult } from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { Badge } from '../../../components/ui/misc';
import { LIBRARY_EXPORT_URL, useCsvCommit, useCsvPreview, useImportLibrary } from '../../../features/library/api/transfer';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { ApiError } from '../../../lib/api-client';

function Problems({ error }: { error: unknown }) {
  if (!error) return null;
  const list = error instanceof ApiError ? error.problem.errors : [];
  return (
    <div role="alert" className="rounded border border-sev-error/40 bg-sev-error/5 px-3 py-2 text-sm text-sev-error">
      <p>{(error as Error).message}</p>
      {list.length > 0 && (
        <ul className="mt-1 max-h-60 overflow-auto text-xs">
          {list.map((e, i) => <li key={i}><span className="num">{e.path}</span>: {e.message}</li>)}
        </ul>
      )}
    </div>
  );
}

function ImportLibrary() {
  const imp = useImportLibrary();
  const [mode, setMode] = useState<'merge' | 'replace'>('merge');
  const [file, setFile] = useState<{ name: string; json: unknown } | null>(null);
  const [parseError, setParseError] = useState<string | null>(null);
  const [result, setResult] = useState<ImportResult | null>(null);
  return (
    <section aria-label="Import a library file" className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-4">
      <h3 className="font-semibold">Import a library file</h3>
      <p className="text-sm text-ink-600">A file in the library format (<span className="num">placewright-library/1</span>), as the export writes it. Everything is checked first; one problem and nothing changes.</p>
      <input
        type="file"
        accept=".json,application/json"
        aria-label="Library file"
        className="text-sm text-ink-600 file:mr-3 file:rounded file:border file:border-ink-300 file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-800 hover:file:bg-ink-100"
        onChange={async (e) => {
          const f = e.target.files?.[0];
          setResult(null);
          if (!f) return setFile(null);
          try {
            setFile({ name: f.name, json: JSON.parse(await f.text()) });
            setParseError(null);
          } catch (err) {
            setParseError(`${f.name} is not valid JSON: ${(err as Error).message}`);
            setFile(null);
          }
        }}
      />
      <fieldset className="flex gap-4 text-sm">
        <legend className="sr-only">Import mode</legend>
        <label className="flex items-center gap-1.5"><input type="radio" name="mode" checked={mode === 'merge'} onChange={() => setMode('merge')} /> Merge: add and update by name, keep the rest</label>
        <label className="flex items-center gap-1.5"><input type="radio" name="mode" checked={mode === 'replace'} onChange={() => setMode('replace')} /> Replace the whole library</label>
      </fieldset>
      {parseError && <p role="alert" className="text-sm text-sev-error">{parseError}</p>}
      <Problems error={imp.error} />
      {result && <p role="status" className="text-sm text-mask-700">Imported ({result.mode}): {result.packages} packages, {result.aliases} aliases, {result.nozzles} nozzles, {result.visionPresets} vision presets, {result.machines} machines.</p>}
      <div>
        <Button
          disabled={!file || imp.isPending}
          onClick={() => {
            if (mode === 'replace' && !window.confirm('Replace the whole library with this file? Packages not in the file are removed.')) return;
            imp.mutate({ mode, file: file!.json }, { onSuccess: (r) => { setResult(r); toast.success('Library imported.'); } });
          }}
        >
          {imp.isPending ? 'Importing…' : `Import ${file?.name ?? ''}`}
        </Button>
      </div>
    </section>
  );
}

function CsvImport() {
  const preview = useCsvPreview();
  const commit = useCsvCommit();
  const [csv, setCsv] = useState('');
  const [data, setData] = useState<CsvPreview | null>(null);
  const run = (text: string) => {
    setCsv(text);
    commit.reset();
    preview.mutate(text, { onSuccess: setData, onError: () => setData(null) });
  };
  return (
    <section aria-label="CSV of packages" className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-4">
      <h3 className="font-semibold">Packages from a CSV file</h3>
      <p className="text-sm text-ink-600">
        A header row, then one package per row. Columns: <span className="num text-xs">{CSV_COLUMNS.join(', ')}</span> (name, length, width and height are required; sizes in mm; nozzles and aliases separated by spaces or |). Rows with a name already in the library update it.
      </p>
      <input type="file" accept=".csv,text/csv" aria-label="CSV file" className="text-sm text-ink-600 file:mr-3 file:rounded file:border file:border-ink-300 file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-800 hover:file:bg-ink-100" onChange={async (e) => { const f = e.target.files?.[0]; if (f) run(await f.text()); }} />
      <Problems error={preview.error} />
      {data && (
        <>
          <p className="text-sm">
            {data.rows.length} row{data.rows.length === 1 ? '' : 's'} ·{' '}
            {data.errorCount === 0 ? <span className="text-mask-700">no problems</span> : <span className="text-sev-error">{data.errorCount} problem{data.errorCount === 1 ? '' : 's'}: fix the file and choose it again</span>}
          </p>
          <div className="max-h-96 overflow-auto rounded border border-ink-200">
            <table aria-label="CSV preview" className="w-full text-sm">
              <thead className="sticky top-0 bg-ink-100 text-left text-xs text-ink-600">
                <tr><th className="px-3 py-1.5">Line</th><th className="px-3 py-1.5">Package</th><th className="px-3 py-1.5">Action</th><th className="px-3 py-1.5">Problems</th></tr>
              </thead>
              <tbody>
                {data.rows.map((r) => (
                  <tr key={r.line} className={`border-t border-ink-100 ${r.errors.length ? 'bg-sev-error/5' : ''}`}>
                    <td className="num px-3 py-1">{r.line}</td>
                    <td className="px-3 py-1 font-medium">{r.name || '—'}</td>
                    <td className="px-3 py-1"><Badge tone={r.action === 'update' ? 'copper' : 'neutral'}>{r.action}</Badge></td>
                    <td className="px-3 py-1 text-xs text-sev-error">{r.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Problems error={commit.error} />
          {commit.data && <p role="status" className="text-sm text-mask-700">Done: {commit.data.created} created, {commit.data.updated} updated.</p>}
          <div>
            <Button disabled={data.errorCount > 0 || commit.isPending || !!commit.data} onClick={() => commit.mutate(csv, { onSuccess: (r) => toast.success(`${r.created} created, ${r.updated} updated.`) })}>
              Import all {data.rows.length} rows
            </Button>
          </div>
        </>
      )}
    </section>
  );
}

export default function TransferRoute() {
  const access = useLibraryAccess();
  return (
    <div className="grid grid-cols-1 gap-4 xl:grid-cols-2">
      <section aria-label="Export" className="flex flex-col gap-2 rounded border border-ink-200 bg-white p-4 xl:col-span-2">
        <h3 className="font-semibold">Export the library</h3>
        <p className="text-sm text-ink-600">The whole library as one file in the library format the command line reads (<span className="num">npm run cli -- check job.json</span> with <span className="num">"library"</span> in the job). Stable order: exporting, importing and exporting again gives the same bytes.</p>
        <div><a href={LIBRARY_EXPORT_URL} download className="inline-flex rounded bg-copper-500 px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-600">Download library file</a></div>
      </section>
      {access.canEdit ? (
        <>
          <ImportLibrary />
          <CsvImport />
        </>
      ) : (
        <p className="text-sm text-ink-500">Importing is for librarians.</p>
      )}
    </div>
  );
}
