import { Piscina } from 'piscina';
import { fileURLToPath } from 'node:url';
import type { VerifyResult } from '../../../shared/verify';
import { DomainError } from '../../lib/errors';
import type { EngineInput, ReleaseOutput } from './engine';

const WORKER = fileURLToPath(new URL('../../workers/check.worker.ts', import.meta.url));

/** Worker threads for checks; TypeScript is loaded there through tsx as in the main thread. */
export class CheckPool {
  private pool: Piscina | null = null;

  /** A check that takes longer than this is abandoned with a clear error (ms). */
  constructor(private readonly timeoutMs = 5 * 60_000) {}

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
