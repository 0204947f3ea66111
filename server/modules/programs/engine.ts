// The programs module's bridge to the engine in shared/: builds a job from a revision's settings,
// runs one side with the revision's overrides, and checks both sides. Pure (no database), so the
// check worker thread can import it too.
import { importCentroid } from '../../../shared/centroid';
import { runJob } from '../../../shared/pipeline/run-job';
import type { ImportResult, RunResult, Side } from '../../../shared/pipeline/types';
import { verifyInputFromRuns } from '../../../shared/verify/from-job';
import { verify } from '../../../shared/verify';
import type { VerifyResult } from '../../../shared/verify/types';
import { jobSchema, type Job } from '../../../shared/schemas/job.schema';
import type { LibraryFile } from '../../../shared/schemas/library-file.schema';
import type { Override, RevisionSettings } from '../../../shared/schemas/program.schema';
import { BadRequestError } from '../../lib/errors';

export const CENTROID_NAME_FALLBACK = 'centroid.csv';

export interface EngineInput {
  settings: RevisionSettings;
  imported: ImportResult;
  overrides: Record<string, Override>;
  library: LibraryFile | null;
  program: string;
  revision: string;
  centroidName: string;
}

/** The job file equivalent of a revision; says which stage is missing what. */
export function buildJob(settings: RevisionSettings, program: string, revision: string, centroidName: string): Job {
  if (!settings.board) throw new BadRequestError('The board outline is not set: enter its origin and size in the Panelize stage.', [{ path: 'settings.board', message: 'Required' }]);
  if (!settings.panel) throw new BadRequestError('The panel is not set: describe the grid or the board instances in the Panelize stage.', [{ path: 'settings.panel', message: 'Required' }]);
  const parsed = jobSchema.safeParse({ ...settings, centroid: centroidName, program, revision });
  if (!parsed.success) {
    throw new BadRequestError('The revision settings are not valid.', parsed.error.issues.map((i) => ({ path: `settings.${i.path.join('.')}`, message: i.message })));
  }
  return parsed.data;
}

/** Reads a centroid file with the revision's import options. Throws EngineInputError. */
export function importFile(text: string, settings: Pick<RevisionSettings, 'import'>, fileName: string): ImportResult {
  return importCentroid(text, { file: fileName, units: settings.import.units, unitsSource: settings.import.units ? 'job' : undefined, bottomRotation: settings.import.bottomRotation, map: settings.import.map });
}

/**
 * A package override works through the engine's own matching: the part's footprint becomes the
 * package name (the first match rule), so body, rotation offset, nozzle and preset follow.
 */
function withPackageOverrides(imported: ImportResult, overrides: Record<string, Override>): ImportResult {
  if (!Object.values(overrides).some((o) => o.package)) return imported;
  return {
    ...imported,
    placements: imported.placements.map((p) => (overrides[p.ref]?.package ? { ...p, footprint: overrides[p.ref].package! } : p)),
  };
}

/** Nozzle and preset overrides replace the engine's choice after the run. */
function applyNozzleAndVision(run: RunResult, overrides: Record<string, Override>, library: LibraryFile | null) {
  const p = run.placements;
  const nozzles = new Map((library?.nozzles ?? []).map((n) => [n.name.toLowerCase(), n]));
  for (let i = 0; i < p.count; i++) {
    const o = overrides[p.ref[i]];
    if (!o) continue;
    if (o.nozzle) {
      p.nozzle[i] = o.nozzle;
      const n = nozzles.get(o.nozzle.toLowerCase());
      p.holderRadius[i] = n ? n.holderRadius : NaN;
    }
    if (o.vision) p.vision[i] = o.vision;
  }
}

export function runSide(input: EngineInput, side: Side): RunResult {
  const job = buildJob(input.settings, input.program, input.revision, input.centroidName);
  const run = runJob({ job, imported: withPackageOverrides(input.imported, input.overrides), library: input.library, side });
  applyNozzleAndVision(run, input.overrides, input.library);
  return run;
}

/** Sides that have parts to place (top always, so an empty board still shows its panel). */
export function sidesWithParts(imported: ImportResult): Side[] {
  const bottom = imported.placements.some((p) => p.side === 'bottom' && !p.dnp);
  return bottom ? ['top', 'bottom'] : ['top'];
}

export interface CheckOutput {
  result: VerifyResult;
  runs: RunResult[];
}

/** Runs every side with parts and checks them together. */
export function checkRevision(input: EngineInput): VerifyResult {
  const runs = sidesWithParts(input.imported).map((s) => runSide(input, s));
  return verify(verifyInputFromRuns(runs));
}
