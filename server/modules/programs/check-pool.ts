import { Piscina } from 'piscina';
import { fileURLToPath } from 'node:url';
import type { VerifyResult } from '../../../shared/verify/types';
import type { EngineInput } from './engine';

const WORKER = fileURLToPath(new URL('../../workers/check.worker.ts', import.meta.url));

/** Worker threads for checks; TypeScript is loaded there through tsx as in the main thread. */
export class CheckPool {
  private pool: Piscina | null = null;

  private get instance(): Piscina {
    if (!this.pool) {
      const execArgv = process.execArgv.some((a) => a.includes('tsx')) ? process.execArgv : [...process.execArgv, '--import', 'tsx'];
      this.pool = new Piscina({ filename: WORKER, execArgv, maxThreads: 2, idleTimeout: 60_000 });
    }
    return this.pool;
  }

  run(input: EngineInput): Promise<VerifyResult> {
    return this.instance.run(input);
  }

  async close() {
    await this.pool?.destroy();
    this.pool = null;
  }
}
