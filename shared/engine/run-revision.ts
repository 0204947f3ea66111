// The engine's front door: one revision (a job, its centroid file or import, a library) → the
// runs of its sides and their findings. The server's check worker, the HTTP routes, the command
// line and the browser preview all come through here, so a revision gives the same placements
// and the same findings wherever it runs. Pure and synchronous (no I/O): see ../README.md.
import { importCentroid } from '../centroid';
import { EngineInputError, type EngineWarning, type ImportResult, type RunResult, type Side, type Units } from '../core';
import { runJob } from '../pipeline';
import type { Job } from '../schemas/job.schema';
import type { LibraryFile } from '../schemas/library-file.schema';
import { verify, verifyInputFromRuns, VerifyInputError, type VerifyResult } from '../verify';

/** Which sides to run: a list, both, or the sides that have parts (top always: an empty board
 * still shows its panel; bottom when a fitted part is on it). */
export type SideSelection = readonly Side[] | 'both' | 'with-parts';

export interface RunRevisionInput {
  /** the parsed job (jobSchema output), overrides included */
  job: Job;
  /** an import already done (the server stores one per revision) … */
  imported?: ImportResult;
  /** … or the centroid file's text, imported here with the job's import options */
  centroidText?: string;
  /** the parsed library file, or null (then no part has a package) */
  library: LibraryFile | null;
  /** default 'with-parts' */
  sides?: SideSelection;
  /** run the checks too (default true); `limit` caps the findings returned as objects */
  check?: boolean | { limit?: number };
  /** names for error messages */
  jobFile?: string;
  centroidFile?: string;
  /** units given on the command line: beat the job's import.units */
  unitsOverride?: Units;
}

export interface RevisionRun {
  imported: ImportResult;
  /** one per side run, in the order asked (top before bottom for 'both' and 'with-parts') */
  runs: RunResult[];
  /** the findings over every side run together; null when not asked for */
  check: VerifyResult | null;
  /** every side's warnings, each distinct warning once (the import's are shared by the sides) */
  warnings: EngineWarning[];
  /** footprints no package matches, over the sides run, counted per centroid row */
  unmatched: { footprint: string; count: number }[];
}

/** The job's centroid text read with the job's import options (or the command line's units). */
export function importForJob(text: string, job: Job, opts: { file?: string; unitsOverride?: Units } = {}): ImportResult {
  return importCentroid(text, {
    file: opts.file ?? job.centroid,
    units: opts.unitsOverride ?? job.import.units,
    unitsSource: opts.unitsOverride ? 'option' : job.import.units ? 'job' : undefined,
    bottomRotation: job.import.bottomRotation,
    map: job.import.map,
  });
}

/** The sides of `selection` for this import. */
export function selectSides(selection: SideSelection, imported: ImportResult): Side[] {
  if (selection === 'both') return ['top', 'bottom'];
  if (selection !== 'with-parts') {
    const out: Side[] = [];
    for (const s of ['top', 'bottom'] as const) if (selection.includes(s)) out.push(s);
    return out;
  }
  const t = imported.table;
  let bottom = false;
  if (t) {
    for (let i = 0; i < t.count && !bottom; i++) bottom = t.bottom[i] === 1 && t.dnp[i] === 0;
  } else bottom = imported.placements.some((p) => p.side === 'bottom' && !p.dnp);
  return bottom ? ['top', 'bottom'] : ['top'];
}

/** Run a revision: import (unless given), each selected side, and the checks over all of them. */
export function runRevision(input: RunRevisionInput): RevisionRun {
  const { job, library } = input;
  const imported = input.imported ?? importForJob(input.centroidText ?? '', job, { file: input.centroidFile, unitsOverride: input.unitsOverride });
  const sides = selectSides(input.sides ?? 'with-parts', imported);
  const runs = sides.map((side) => runJob({ job, imported, library, side, jobFile: input.jobFile, centroidFile: input.centroidFile }));

  let check: VerifyResult | null = null;
  if (input.check !== false) {
    const limit = typeof input.check === 'object' ? input.check.limit : undefined;
    const choice = sides.length === 2 ? 'both' : sides[0] ?? 'both';
    try {
      check = verify(verifyInputFromRuns(runs), { sides: choice, ...(limit !== undefined ? { limit } : {}) });
    } catch (e) {
      if (e instanceof VerifyInputError) throw new EngineInputError(e.message, { file: input.jobFile, code: 'bad-geometry' });
      throw e;
    }
  }

  const seen = new Set<string>();
  const warnings: EngineWarning[] = [];
  for (const r of runs) {
    for (const w of r.warnings) {
      const k = `${w.line}|${w.code ?? ''}|${w.message}`;
      if (seen.has(k)) continue;
      seen.add(k);
      warnings.push(w);
    }
  }
  const counts = new Map<string, number>();
  for (const r of runs) for (const u of r.unmatched) counts.set(u.footprint, (counts.get(u.footprint) ?? 0) + u.count);
  const unmatched = [...counts].map(([footprint, count]) => ({ footprint, count }));
  return { imported, runs, check, warnings, unmatched };
}
