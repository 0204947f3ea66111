import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { settingsFromJob, type RevisionSettings } from '../../shared/schemas/program.schema';

export const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

export function sampleFile(rel: string): Buffer {
  return readFileSync(join(SAMPLES, rel));
}

/** A sample job file as revision settings (the job without its file names). */
export function sampleSettings(jobRel: string): RevisionSettings {
  return settingsFromJob(JSON.parse(readFileSync(join(SAMPLES, jobRel), 'utf8')));
}

export function sampleLibrary(): unknown {
  return JSON.parse(readFileSync(join(SAMPLES, 'library.json'), 'utf8'));
}
