import { AuditEvent } from './audit-event.entity';
import { MailMessage } from './mail-message.entity';
import { User } from './user.entity';

export { AuditEvent, MailMessage, User };

/** Every entity, listed explicitly (no globs: vitest and tsx load .ts files differently). */
export const entities = [User, AuditEvent, MailMessage];
