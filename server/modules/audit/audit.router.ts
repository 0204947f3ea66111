import { auditQuerySchema } from '../../../shared/schemas/audit.schema';
import type { ApiRoutes } from '../../lib/routes';
import { validate } from '../../middleware/validate';
import type { AuditService } from './audit.service';

export function registerAuditRoutes(api: ApiRoutes, audit: AuditService) {
  /** The whole log, filtered (admin). */
  api.get('/audit', ['admin'], validate(auditQuerySchema, 'query'), async (req, res) => {
    res.json(await audit.list(req.query as never));
  });

  /** The signed-in user's own recent activity, for the home page. */
  api.get('/audit/mine', 'signed-in', async (req, res) => {
    res.json(await audit.list(auditQuerySchema.parse({ limit: 15 }), req.user!.id));
  });
}
