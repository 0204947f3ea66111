import type { DataSource } from 'typeorm';
import type { Health } from '../../../shared/schemas/audit.schema';
import type { ApiRoutes } from '../../lib/routes';

const started = Date.now();

export function registerHealthRoutes(api: ApiRoutes, ds: DataSource, version: string) {
  api.get('/health', 'public', async (_req, res) => {
    const t0 = performance.now();
    let ok = true;
    try {
      await ds.query('SELECT 1');
    } catch {
      ok = false;
    }
    const body: Health = {
      status: ok ? 'ok' : 'degraded',
      database: { ok, roundTripMs: Math.round((performance.now() - t0) * 1000) / 1000 },
      version,
      uptimeSeconds: Math.round((Date.now() - started) / 1000),
    };
    res.status(ok ? 200 : 503).json(body);
  });
}
