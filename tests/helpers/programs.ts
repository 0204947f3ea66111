import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { RevisionSettingsInput } from '../../shared/schemas/program.schema';

export const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

export function sampleFile(rel: string): Buffer {
  return readFileSync(join(SAMPLES, rel));
}

/** A sample job file as revision settings (the job without its file names). */
export function sampleSettings(jobRel: string): RevisionSettingsInput {
  const job = JSON.parse(readFileSync(join(SAMPLES, jobRel), 'utf8'));
  const { centroid: _c, library: _l, program: _p, revision: _r, ...settings } = job;
  return settings;
}

export function sampleLibrary(): unknown {
  return JSON.parse(readFileSync(join(SAMPLES, 'library.json'), 'utf8'));
}
