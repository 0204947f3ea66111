import { z } from 'zod';

export const auditEventSchema = z.object({
  id: z.string(),
  at: z.string(),
  actorId: z.string().nullable(),
  actorEmail: z.string().nullable(),
  action: z.string(),
  target: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()),
  ip: z.string().nullable(),
});
export type AuditEventDto = z.infer<typeof auditEventSchema>;

export const auditQuerySchema = z.object({
  action: z.string().trim().max(64).optional(),
  actor: z.string().trim().max(254).optional(),
  from: z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time, like 2026-12-01T00:00:00Z' }).optional(),
  to: z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time, like 2026-12-01T00:00:00Z' }).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditPageSchema = z.object({
  items: z.array(auditEventSchema),
  total: z.number().int(),
  actions: z.array(z.string()),
});
export type AuditPage = z.infer<typeof auditPageSchema>;

export const mailMessageSchema = z.object({
  id: z.string(),
  at: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  transport: z.string(),
});
export type MailMessageDto = z.infer<typeof mailMessageSchema>;

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.object({ ok: z.boolean(), roundTripMs: z.number() }),
  version: z.string(),
  uptimeSeconds: z.number(),
});
export type Health = z.infer<typeof healthSchema>;
