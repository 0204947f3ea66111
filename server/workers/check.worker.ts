// Worker thread (piscina): checks a revision off the main thread, so the API stays responsive
// while a large panel is verified. The engine's one entry does the work (engine.ts → runRevision).
import { checkRevision, releaseRevision, type EngineInput } from '../modules/programs/engine';
import { previewTask, readImportTask, type PreviewInput, type ReadImportInput } from '../modules/programs/import-task';
import { setPriority } from 'node:os';

// This thread yields to the server's event loop when the processor is busy: on Linux the nice
// value is per thread, and setpriority(2) with pid 0 changes the calling thread only (its man
// page, "BUGS"), so health and every other request are served first while a file is read or a
// panel checked. Elsewhere it would lower the whole process, so it is left alone there.
if (process.platform === 'linux') {
  try {
    setPriority(10);
  } catch {
    /* not permitted: run at the normal priority */
  }
}

export default function check(input: EngineInput) {
  return checkRevision(input);
}

/** Nothing: loading this module (and the engine with it) is the work (piscina task `warm`). */
export function warm() {
  return true;
}

/** The checks and the placement lists of a release from one run (piscina task `release`). */
export function release({ input, generated }: { input: EngineInput; generated: string }) {
  return releaseRevision(input, generated);
}

/** An upload's import preview, every bad row up to a cap (piscina task `preview`). */
export function preview(input: PreviewInput) {
  return previewTask(input);
}

/** An upload read for saving, its import already as JSON text (piscina task `readImport`). */
export function readImport(input: ReadImportInput) {
  return readImportTask(input);
}
