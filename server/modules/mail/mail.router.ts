import type { DataSource } from 'typeorm';
import { uuidParamSchema } from '../../../shared/schemas/auth.schema';
import type { MailMessageDto } from '../../../shared/schemas/audit.schema';
import { MailMessage } from '../../db/entities/mail-message.entity';
import { NotFoundError } from '../../lib/errors';
import type { ApiRoutes } from '../../lib/routes';
import { validate } from '../../middleware/validate';

function toDto(m: MailMessage): MailMessageDto {
  return { id: m.id, at: m.at.toISOString(), from: m.from, to: m.to, subject: m.subject, text: m.text, html: m.html, transport: m.transport };
}

export function registerMailRoutes(api: ApiRoutes, ds: DataSource) {
  api.get('/outbox', ['admin'], async (_req, res) => {
    const rows = await ds.getRepository(MailMessage).find({ order: { at: 'DESC' }, take: 200 });
    res.json({ items: rows.map(toDto) });
  });

  api.get('/outbox/:id', ['admin'], validate(uuidParamSchema, 'params'), async (req, res) => {
    const m = await ds.getRepository(MailMessage).findOneBy({ id: String(req.params.id) });
    if (!m) throw new NotFoundError('The message');
    res.json(toDto(m));
  });
}
