import { useState } from 'react';
import { toast } from 'sonner';
import { FIELDS } from '../../../../../shared/centroid';
import type { RevisionSettingsInput } from '../../../../../shared/schemas/program.schema';
import { Button } from '../../../../components/ui/button';
import { SelectField } from '../../../../components/ui/field';
import { Badge, ProgressBar } from '../../../../components/ui/misc';
import { useCommitImport, usePreviewImport, type ImportPreview } from '../../../../features/programs/api/programs';
import { deg, fileSize, mm } from '../../../../lib/format';
import { describeImportProblem, isUnitsMessage, UNITS_HELP, withoutFlags } from './import-problems';
import { useWorkspace } from '../workspace';

type ImportOptions = NonNullable<RevisionSettingsInput['import']>;

const FIELD_LABELS: Record<string, string> = {
  ref: 'Reference', x: 'X', y: 'Y', rotation: 'Rotation', side: 'Side', footprint: 'Footprint', value: 'Value', partNumber: 'Part number', dnp: 'Do not place',
};

const BOTTOM_HELP: Record<string, string> = {
  'bottom-view': 'The file already gives bottom rotations as seen looking at the bottom side.',
  negate: 'The file gives top-view angles; bottom rotation = −θ.',
  'mirror-180': 'The file gives mirrored angles; bottom rotation = 180° − θ.',
};

function ProblemBox({ error, fileName }: { error: unknown; fileName?: string | null }) {
  if (!error) return null;
  const d = describeImportProblem(error, fileName);
  return (
    <div role="alert" aria-label={d.title} className="rounded border border-sev-error/40 bg-sev-error/5 p-3 text-sm">
      <p className="font-medium text-sev-error">{d.title}</p>
      <p className="mt-1 text-ink-800">{d.message}</p>
      {d.details.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-xs text-ink-700">
          {d.details.map((e, i) => (
            <li key={i}>
              <span className="num">{e.path}</span>: {e.message}
            </li>
          ))}
        </ul>
      )}
      {!d.needsUnits && <p className="mt-2 text-xs text-ink-500">Fix the file or the options on the left and preview again. Nothing was saved.</p>}
    </div>
  );
}

function RowErrors({ p }: { p: ImportPreview }) {
  // a units problem is the whole file's, answered by the Units control (shown above the table)
  const rows = p.rowErrors.filter((e) => !isUnitsMessage(e.message));
  if (rows.length === 0) return null;
  return (
    <section role="alert" aria-label="Row errors" className="rounded border border-sev-error/40 bg-sev-error/5 p-3 text-sm">
      <p className="font-medium text-sev-error">
        {rows.length}{p.truncated ? '+' : ''} row{rows.length === 1 ? '' : 's'} cannot be read — fix {rows.length === 1 ? 'it' : 'them'} in the file (or the column mapping) and choose it again. Nothing is imported while any remain.
      </p>
      <table className="mt-2 w-full text-xs">
        <thead className="text-left text-ink-500"><tr><th className="py-1 pr-3 font-medium">Line</th><th className="pr-3 font-medium">Column</th><th className="font-medium">Problem</th></tr></thead>
        <tbody>
          {rows.map((e, i) => (
            <tr key={i} className="border-t border-sev-error/20">
              <td className="num py-1 pr-3">{e.line > 0 ? e.line : '—'}</td>
              <td className="num pr-3">{e.column ?? '—'}</td>
              <td>{withoutFlags(e.message)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}

function Dialect({ p }: { p: ImportPreview }) {
  if (!p.dialect) return null;
  const d = p.dialect as { delimiter: string; decimalComma: boolean; headerLine: number; bom: boolean; lineEnding: string; unitsSource: string };
  const delim = d.delimiter === '\t' ? 'tab' : d.delimiter === ',' ? 'comma' : 'semicolon';
  return (
    <dl className="grid grid-cols-[9rem_1fr] gap-x-4 gap-y-1 text-sm">
      <dt className="text-ink-500">File</dt><dd><span className="num">{p.fileName}</span> · <span className="num">{fileSize(p.bytes)}</span></dd>
      <dt className="text-ink-500">SHA-256</dt><dd className="num break-all text-xs">{p.sha256}</dd>
      <dt className="text-ink-500">Delimiter</dt><dd>{delim}{d.decimalComma ? ', decimal comma' : ''}</dd>
      <dt className="text-ink-500">Header row</dt><dd>line <span className="num">{d.headerLine}</span>{d.bom ? ' · UTF-8 BOM' : ''} · {d.lineEnding === '\r\n' ? 'CRLF' : d.lineEnding === '\r' ? 'CR' : 'LF'} line ends</dd>
      <dt className="text-ink-500">Units</dt><dd><span className="num">{p.units ?? '—'}</span> (from the {d.unitsSource === 'option' || d.unitsSource === 'job' ? 'option you chose' : d.unitsSource})</dd>
      <dt className="text-ink-500">Rows</dt><dd className="num">{p.rows}</dd>
    </dl>
  );
}

export default function ImportStage() {
  const { revision: r } = useWorkspace();
  const [file, setFile] = useState<File | null>(null);
  const [options, setOptions] = useState<ImportOptions>(r.settings.import ?? {});
  const [progress, setProgress] = useState<number | undefined>();
  const preview = usePreviewImport(r.id);
  const commit = useCommitImport(r.id);
  const busy = preview.isPending || commit.isPending;
  // the file's units cannot be told: the Units control is where the answer goes
  const needsUnits =
    !options.units &&
    ((!!preview.error && describeImportProblem(preview.error).needsUnits) ||
      (!!commit.error && describeImportProblem(commit.error).needsUnits) ||
      !!preview.data?.rowErrors.some((e) => isUnitsMessage(e.message)));

  const runPreview = (f: File | null = file, o: ImportOptions = options) => {
    if (!f) return;
    setProgress(0);
    preview.mutate({ file: f, options: o, onProgress: setProgress }, { onSettled: () => setProgress(undefined) });
  };
  const setMap = (field: string, header: string) => {
    const map = { ...(options.map ?? {}) } as Record<string, string>;
    if (header) map[field] = header;
    else delete map[field];
    const next = { ...options, map };
    setOptions(next);
    runPreview(file, next);
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[22rem_1fr]">
      <section aria-labelledby="import-h" className="flex flex-col gap-4">
        <h2 id="import-h" className="font-semibold">Centroid file</h2>
        {r.imported && (
          <div className="rounded border border-mask-400/50 bg-mask-400/10 p-3 text-sm">
            <p className="font-medium">Imported: <span className="num">{r.centroidName}</span></p>
            <p className="num text-xs text-ink-600">{r.imported.rows} rows · {r.imported.top} top · {r.imported.bottom} bottom · {r.imported.dnp} do-not-place · {r.imported.units}</p>
            <p className="num mt-1 break-all text-2xs text-ink-500">SHA-256 {r.centroidSha256}</p>
          </div>
        )}
        {r.can.edit ? (
          <>
            <div className="flex flex-col gap-1">
              <label htmlFor="centroid-file" className="text-xs font-medium text-ink-700">{r.imported ? 'Replace with another file' : 'Choose the centroid (pick-and-place) file'}</label>
              <input
                id="centroid-file"
                type="file"
                accept=".csv,.txt,.tsv,.pos,text/csv,text/plain"
                className="text-sm"
                onChange={(e) => {
                  const f = e.target.files?.[0] ?? null;
                  setFile(f);
                  commit.reset();
                  runPreview(f);
                }}
              />
              <p className="text-xs text-ink-500">CSV or text, up to 20 MB. Comma, semicolon or tab; decimal point or comma; mm, mil or inch.</p>
            </div>
            <SelectField label="Units" error={needsUnits ? 'Choose the units of this file: it does not say them.' : undefined} value={options.units ?? ''} onChange={(e) => { const o = { ...options, units: (e.target.value || undefined) as ImportOptions['units'] }; setOptions(o); runPreview(file, o); }}>
              <option value="">From the header or the values</option>
              <option value="mm">Millimetres (mm)</option>
              <option value="mil">Thousandths of an inch (mil)</option>
              <option value="in">Inches (in)</option>
            </SelectField>
            <div>
              <SelectField label="Bottom-side rotations in the file" value={options.bottomRotation ?? 'bottom-view'} onChange={(e) => { const o = { ...options, bottomRotation: e.target.value as ImportOptions['bottomRotation'] }; setOptions(o); runPreview(file, o); }}>
                <option value="bottom-view">As seen from the bottom</option>
                <option value="negate">Top view, negated</option>
                <option value="mirror-180">Mirrored (180° − θ)</option>
              </SelectField>
              <p className="mt-1 text-xs text-ink-500">{BOTTOM_HELP[options.bottomRotation ?? 'bottom-view']} Confirm the choice on the canvas in Verify: polarity marks must match the board.</p>
            </div>
            {progress !== undefined && <ProgressBar value={progress * 100} label="Uploading" />}
            {busy && progress === undefined && <ProgressBar label="Reading the file" />}
            <Button
              disabled={!file || !preview.data || preview.data.rowErrors.length > 0 || busy}
              onClick={() => {
                if (!file) return;
                setProgress(0);
                commit.mutate(
                  { file, options, version: r.version, onProgress: setProgress },
                  {
                    onSuccess: () => toast.success(`Imported ${file.name}. Next: Panelize.`),
                    onSettled: () => setProgress(undefined),
                  },
                );
              }}
            >
              {commit.isPending ? 'Importing…' : r.imported ? 'Replace the import with this file' : 'Import this file'}
            </Button>
            <ProblemBox error={commit.error} fileName={file?.name} />
          </>
        ) : (
          <p className="text-sm text-ink-500">This revision is {r.state}; its import cannot change.</p>
        )}
      </section>

      <section aria-labelledby="preview-h" className="min-w-0">
        <h2 id="preview-h" className="mb-3 font-semibold">Preview</h2>
        {preview.error ? (
          <ProblemBox error={preview.error} fileName={file?.name} />
        ) : !preview.data ? (
          <p className="rounded border border-dashed border-ink-300 bg-white p-6 text-sm text-ink-500">
            Choose a file: Placewright detects its delimiter, header row, columns and units and shows the rows as it read them before anything is saved.
          </p>
        ) : (
          <div className="flex flex-col gap-4">
            {needsUnits && (
              <div role="alert" aria-label="Choose the units" className="rounded border border-sev-error/40 bg-sev-error/5 p-3 text-sm">
                <p className="font-medium text-sev-error">Choose the units</p>
                <p className="mt-1 text-ink-800">{UNITS_HELP}</p>
              </div>
            )}
            <RowErrors p={preview.data} />
            <Dialect p={preview.data} />
            {preview.data.headers.length > 0 && (
            <div>
              <h3 className="mb-2 text-sm font-semibold">Column mapping</h3>
              <div className="grid grid-cols-3 gap-2">
                {FIELDS.map((f) => (
                  <SelectField key={f} label={FIELD_LABELS[f] ?? f} value={(options.map as Record<string, string> | undefined)?.[f] ?? preview.data!.columns[f] ?? ''} onChange={(e) => setMap(f, e.target.value)} disabled={!r.can.edit}>
                    <option value="">(not in the file)</option>
                    {preview.data!.headers.map((h) => <option key={h} value={h}>{h}</option>)}
                  </SelectField>
                ))}
              </div>
            </div>
            )}
            {preview.data.warnings.length > 0 && (
              <ul aria-label="Warnings" className="rounded border border-sev-warning/50 bg-sev-warning/10 p-3 text-sm">
                {preview.data.warnings.map((w, i) => (
                  <li key={i}>{w.line !== null && <span className="num mr-1 text-xs">line {w.line}:</span>}{w.message}</li>
                ))}
              </ul>
            )}
            {preview.data.first.length > 0 && (
            <div className="overflow-auto rounded border border-ink-200 bg-white">
              <table aria-label="First rows as read" className="w-full text-sm">
                <thead className="bg-ink-100 text-left text-xs text-ink-600">
                  <tr>{['Line', 'Ref', 'X', 'Y', 'Rotation', 'Side', 'Footprint', 'Value', 'Part number', ''].map((h) => <th key={h} className="px-2 py-1.5 font-medium">{h}</th>)}</tr>
                </thead>
                <tbody>
                  {preview.data.first.map((p) => (
                    <tr key={p.ref} className={`border-t border-ink-100 ${p.dnp ? 'text-ink-400' : ''}`}>
                      <td className="num px-2 py-1 text-xs text-ink-500">{p.line}</td>
                      <td className="num px-2 py-1">{p.ref}</td>
                      <td className="num px-2 py-1 text-right">{mm(p.x)}</td>
                      <td className="num px-2 py-1 text-right">{mm(p.y)}</td>
                      <td className="num px-2 py-1 text-right">{deg(p.rotation)}</td>
                      <td className="px-2 py-1">{p.side}</td>
                      <td className="px-2 py-1">{p.footprint}</td>
                      <td className="px-2 py-1">{p.value}</td>
                      <td className="num px-2 py-1 text-xs">{p.partNumber}</td>
                      <td className="px-2 py-1">{p.dnp && <Badge>do not place</Badge>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              {preview.data.rows > preview.data.first.length && <p className="px-2 py-1 text-xs text-ink-500">…and {preview.data.rows - preview.data.first.length} more rows.</p>}
            </div>
            )}
          </div>
        )}
      </section>
    </div>
  );
}
