import type { DataSource } from 'typeorm';
import type { Health } from '../../../shared/schemas/audit.schema';
import { DATABASE_RETRY_AFTER_SECONDS } from '../../lib/errors';
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
    // Retry-After (RFC 9110, section 10.2.3): how long a load balancer or client should wait.
    if (!ok) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    res.status(ok ? 200 : 503).json(body);
  });
}
