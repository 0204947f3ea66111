// "Panel preview": the canvas overlay on the demo samples, run in the browser (runRevision),
// for looking at the canvas without the programs module. Nothing is stored: comments, checked
// marks and the underlay live in this page's state.
import { useMemo, useState } from 'react';
import { runRevision } from '../../../shared/engine';
import type { RunResult, Side } from '../../../shared/core';
import { jobSchema } from '../../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../../shared/schemas/library-file.schema';
import { SelectField } from '../../components/ui/field';
import { ErrorPanel, PageHeader } from '../../components/ui/misc';
import { PanelReview, ReviewSummary, type CanvasNote, type NewNote, type UnderlayState } from '../../features/canvas';
import libraryText from '../../../samples/library.json?raw';
import weatherJob from '../../../samples/weather-station/job.json?raw';
import weatherCsv from '../../../samples/weather-station/weather-ctl.csv?raw';
import ledJob from '../../../samples/led-strip/job.json?raw';
import ledCsv from '../../../samples/led-strip/led-strip.csv?raw';
import faultyJob from '../../../samples/faulty/job.json?raw';
import faultyCsv from '../../../samples/faulty/faulty.csv?raw';

const SAMPLES = {
  'weather-station': { label: 'Weather-station controller (2-up, both sides)', job: weatherJob, csv: weatherCsv },
  'led-strip': { label: 'LED status strip (4 × 5 panel, half turned 180°)', job: ledJob, csv: ledCsv },
  faulty: { label: 'Planted faults (every kind of finding)', job: faultyJob, csv: faultyCsv },
} as const;
type SampleId = keyof typeof SAMPLES;

function runSample(id: SampleId) {
  const s = SAMPLES[id];
  const job = jobSchema.parse(JSON.parse(s.job));
  const library = libraryFileSchema.parse(JSON.parse(libraryText));
  const run = runRevision({ job, centroidText: s.csv, library, sides: 'both' });
  const runs: Partial<Record<Side, RunResult>> = {};
  for (const r of run.runs) runs[r.side] = r;
  return { runs, findings: run.check!.findings, summary: run.check!.summary };
}

export default function CanvasPreviewRoute() {
  const params = new URLSearchParams(typeof location === 'undefined' ? '' : location.search);
  const initial = (params.get('sample') as SampleId) in SAMPLES ? (params.get('sample') as SampleId) : 'weather-station';
  const initialSide = params.get('side') === 'bottom' ? 'bottom' : 'top';
  const [sample, setSample] = useState<SampleId>(initial);
  const data = useMemo(() => {
    try {
      return { ok: true as const, ...runSample(sample) };
    } catch (e) {
      return { ok: false as const, error: e };
    }
  }, [sample]);
  const [checked, setChecked] = useState<ReadonlySet<string>>(new Set());
  const [comments, setComments] = useState<CanvasNote[]>([]);
  const [underlays, setUnderlays] = useState<Partial<Record<Side, UnderlayState | null>>>({});

  return (
    <div>
      <PageHeader
        title="Panel preview"
        subtitle="The demo samples run in your browser and drawn to scale. Nothing here is saved."
        actions={
          <SelectField label="Sample" value={sample} onChange={(e) => { setSample(e.target.value as SampleId); setChecked(new Set()); setComments([]); setUnderlays({}); }}>
            {Object.entries(SAMPLES).map(([id, s]) => (
              <option key={id} value={id}>{s.label}</option>
            ))}
          </SelectField>
        }
      />
      {!data.ok ? (
        <ErrorPanel error={data.error} />
      ) : (
        <>
          <p className="mb-2 text-xs text-ink-500">
            <span className="num">{data.summary.errors}</span> errors, <span className="num">{data.summary.warnings}</span> warnings over both sides.
          </p>
          <PanelReview
            key={sample}
            runs={data.runs}
            findings={data.findings}
            initialSide={initialSide}
            checkedFindingKeys={checked}
            onToggleChecked={(keys, on) =>
              setChecked((prev) => {
                const next = new Set(prev);
                for (const k of keys) if (on) next.add(k); else next.delete(k);
                return next;
              })
            }
            comments={comments}
            onAddComment={(n: NewNote) => setComments((c) => [...c, { ...n, id: `${Date.now()}-${c.length}`, author: 'you' }])}
            underlays={underlays}
            onUnderlayChange={(side, u) => setUnderlays((prev) => ({ ...prev, [side]: u }))}
          />
          <div className="mt-4 max-w-3xl">
            <h2 className="mb-1 text-sm font-semibold text-ink-800">Review (as the release stage shows it)</h2>
            <ReviewSummary findings={data.findings} checkedFindingKeys={checked} comments={comments} />
          </div>
        </>
      )}
    </div>
  );
}
