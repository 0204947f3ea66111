import { Piscina } from 'piscina';
import { fileURLToPath } from 'node:url';
import type { VerifyResult } from '../../../shared/verify';
import { DomainError } from '../../lib/errors';
import type { EngineInput, ReleaseOutput } from './engine';
import { taskErrorToThrow, type ImportPreview, type PreviewInput, type ReadImport, type ReadImportInput, type TaskOutcome } from './import-task';

/** The longest an import preview or an import's reading may take (ms) before it is stopped. */
export const IMPORT_TIME_LIMIT_MS = 60_000;

/**
 * Uploads read or waiting to be read at once; past that an upload is refused (503) rather than
 * queued, so a flood of 20 MB files cannot pile up in memory.
 */
export const MAX_IMPORTS_IN_FLIGHT = 8;

const WORKER = fileURLToPath(new URL('../../workers/check.worker.ts', import.meta.url));

/** Worker threads for checks; TypeScript is loaded there through tsx as in the main thread. */
export class CheckPool {
  private pool: Piscina | null = null;

  /**
   * A check that takes longer than `timeoutMs` is abandoned with a clear error; reading an upload
   * (preview or import) that takes longer than `importTimeoutMs` is stopped (its thread ends).
   */
  constructor(
    private readonly timeoutMs = 5 * 60_000,
    public importTimeoutMs = IMPORT_TIME_LIMIT_MS,
    public maxImportsInFlight = MAX_IMPORTS_IN_FLIGHT,
  ) {}

  private importsInFlight = 0;

  private get instance(): Piscina {
    if (!this.pool) {
      const execArgv = process.execArgv.some((a) => a.includes('tsx')) ? process.execArgv : [...process.execArgv, '--import', 'tsx'];
      this.pool = new Piscina({ filename: WORKER, execArgv, maxThreads: 2, idleTimeout: 60_000 });
    }
    return this.pool;
  }

  /** The revision's checks (every side with parts). */
  run(input: EngineInput): Promise<VerifyResult> {
    return this.task('default', input);
  }

  /**
   * Starts the worker threads and loads the engine in each (server start calls it), so the first
   * check a user runs does not wait for thread start-up and TypeScript compilation.
   */
  async warm(): Promise<void> {
    await Promise.all([0, 1].map(() => this.task('warm', null)));
  }

  /** The checks and the placement lists of a release, from one run. */
  release(input: EngineInput, generated: string): Promise<ReleaseOutput> {
    return this.task('release', { input, generated });
  }

  /**
   * An upload's import preview, read in a worker thread within the import time limit. `cancel`
   * (the client went away) stops the reading too.
   */
  preview(input: PreviewInput, cancel?: AbortSignal): Promise<ImportPreview> {
    return this.importTask('preview', input, cancel);
  }

  /** An upload read for saving (EngineInputError at its first bad row), within the time limit. */
  readImport(input: ReadImportInput, cancel?: AbortSignal): Promise<ReadImport> {
    return this.importTask('readImport', input, cancel);
  }

  private async importTask<T>(name: string, input: PreviewInput | ReadImportInput, cancel?: AbortSignal): Promise<T> {
    if (this.importsInFlight >= this.maxImportsInFlight) {
      throw new DomainError(503, 'Server busy', `${this.importsInFlight} uploaded files are being read already, the most at once. Try ${input.fileName} again in a few seconds.`, [
        { path: 'file', message: 'Too many uploads at once' },
      ]);
    }
    this.importsInFlight++;
    try {
      return await this.readUpload<T>(name, input, cancel);
    } finally {
      this.importsInFlight--;
    }
  }

  private async readUpload<T>(name: string, input: PreviewInput | ReadImportInput, cancel?: AbortSignal): Promise<T> {
    const limitMs = this.importTimeoutMs;
    const timeout = AbortSignal.timeout(limitMs);
    let out: TaskOutcome<T>;
    try {
      out = await this.instance.run(input, { name, signal: cancel ? AbortSignal.any([timeout, cancel]) : timeout });
    } catch (err) {
      if (cancel?.aborted && !timeout.aborted) {
        throw new DomainError(400, 'Upload abandoned', `Reading ${input.fileName} was stopped: the request was closed before the answer.`);
      }
      if ((err as Error).name === 'AbortError' || (err as Error).name === 'TimeoutError') {
        const limit = `${Number((limitMs / 1000).toFixed(3))} s`;
        throw new DomainError(
          422,
          'File took too long to read',
          `Reading ${input.fileName} did not finish within ${limit}, the limit for reading one upload. Check that it is a centroid file (one row per part); split a very large file, or try again when the server is less busy.`,
          [{ path: 'file', message: `Not read within ${limit}` }],
        );
      }
      throw err;
    }
    if (!out.ok) throw taskErrorToThrow(out.error);
    return out.value;
  }

  private async task<T>(name: string, payload: unknown): Promise<T> {
    try {
      return await this.instance.run(payload, { name, signal: AbortSignal.timeout(this.timeoutMs) });
    } catch (err) {
      if ((err as Error).name === 'AbortError' || (err as Error).name === 'TimeoutError') {
        throw new DomainError(503, 'Check took too long', `The check did not finish within ${Math.round(this.timeoutMs / 1000)} s. Try again; if it keeps happening, tell an admin.`);
      }
      throw err;
    }
  }

  async close() {
    await this.pool?.destroy();
    this.pool = null;
  }
}
