// The programs module's bridge to the engine: maps a revision's database rows to a job file and
// hands it to the engine's one entry (shared/engine, runRevision). No engine rule lives here.
// Pure (no database), so the check worker thread imports it too.
import { importCentroid, importCentroidCollecting, type CollectedImport } from '../../../shared/centroid';
import { runRevision, type RevisionRun, type SideSelection } from '../../../shared/engine';
import { ENGINE_VERSION, type ImportResult } from '../../../shared/core';
import { writePlacementListCsv, writePlacementListJson } from '../../../shared/placement-list';
import type { VerifyResult } from '../../../shared/verify';
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

/** The job file equivalent of a revision (overrides included); says which stage is missing what. */
export function buildJob(settings: RevisionSettings, program: string, revision: string, centroidName: string, overrides: Record<string, Override> = {}): Job {
  if (!settings.board) throw new BadRequestError('The board outline is not set: enter its origin and size in the Panelize stage.', [{ path: 'settings.board', message: 'Required' }]);
  if (!settings.panel) throw new BadRequestError('The panel is not set: describe the grid or the board instances in the Panelize stage.', [{ path: 'settings.panel', message: 'Required' }]);
  const parsed = jobSchema.safeParse({ ...settings, centroid: centroidName, program, revision, overrides });
  if (!parsed.success) {
    throw new BadRequestError('The revision settings are not valid.', parsed.error.issues.map((i) => ({ path: i.path[0] === 'overrides' ? i.path.join('.') : `settings.${i.path.join('.')}`, message: i.message })));
  }
  return parsed.data;
}

function importOptions(settings: Pick<RevisionSettings, 'import'>, fileName: string) {
  return { file: fileName, units: settings.import.units, unitsSource: settings.import.units ? ('job' as const) : undefined, bottomRotation: settings.import.bottomRotation, map: settings.import.map };
}

/** A derived import as stored: stamped with the engine version that made it. */
export type StampedImport = ImportResult & { engineVersion: string };

/**
 * Reads a centroid file with the revision's import options, stamped with the engine version (a
 * stored import of another version is read again from the file, see stored-import.ts). Throws
 * EngineInputError.
 */
export function importFile(text: string, settings: Pick<RevisionSettings, 'import'>, fileName: string): StampedImport {
  const imported = importCentroid(text, importOptions(settings, fileName)) as StampedImport;
  imported.engineVersion = ENGINE_VERSION;
  return imported;
}

/** Reads a centroid file in one pass, listing every bad row (at most `limit`). */
export function previewFile(text: string, settings: Pick<RevisionSettings, 'import'>, fileName: string, limit: number): CollectedImport {
  return importCentroidCollecting(text, importOptions(settings, fileName), limit);
}

/** The revision through the engine: the sides asked for, and their findings when `check`. */
export function runEngine(input: EngineInput, opts: { sides?: SideSelection; check?: boolean } = {}): RevisionRun {
  const job = buildJob(input.settings, input.program, input.revision, input.centroidName, input.overrides);
  return runRevision({ job, imported: input.imported, library: input.library, sides: opts.sides ?? 'with-parts', check: opts.check ?? true });
}

/** Every side with parts, checked together (what the check worker runs). */
export function checkRevision(input: EngineInput): VerifyResult {
  return runEngine(input).check!;
}

export interface ReleaseFileText {
  side: 'top' | 'bottom';
  format: 'csv' | 'json';
  text: string;
  sha256: string;
  placements: number;
}

export interface ReleaseOutput {
  check: VerifyResult;
  /** the placement lists of every side with parts (CSV and JSON), written from the run checked */
  files: ReleaseFileText[];
  /** sides with parts that have no package: the lists must not be released */
  withoutPackage: { side: 'top' | 'bottom'; count: number }[];
}

/** One run for a release: the findings and the lists come from the same placements. */
export async function releaseRevision(input: EngineInput, generated: string): Promise<ReleaseOutput> {
  const { runs, check } = runEngine(input);
  const files: ReleaseFileText[] = [];
  const withoutPackage: ReleaseOutput['withoutPackage'] = [];
  for (const run of runs) {
    if (run.placements.count === 0 && run.side === 'bottom') continue;
    let count = 0;
    for (const p of run.placements.packageName) if (p === null) count++;
    if (count) {
      withoutPackage.push({ side: run.side, count });
      continue;
    }
    const csv = await writePlacementListCsv(run, { generated });
    const json = await writePlacementListJson(run, { generated });
    files.push({ side: run.side, format: 'csv', text: csv.text, sha256: csv.sha256, placements: run.placements.count });
    files.push({ side: run.side, format: 'json', text: json.text, sha256: json.sha256, placements: run.placements.count });
  }
  return { check: check!, files, withoutPackage };
}
