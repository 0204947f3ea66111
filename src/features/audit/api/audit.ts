import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { auditPageSchema } from '../../../../shared/schemas/audit.schema';
import { api } from '../../../lib/api-client';

export interface AuditFilters {
  action?: string;
  actor?: string;
  from?: string;
  to?: string;
  limit?: number;
  offset?: number;
}

export function getAudit(f: AuditFilters) {
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(f)) if (v !== undefined && v !== '') qs.set(k, String(v));
  return api(`/audit?${qs}`, { schema: auditPageSchema });
}

export const auditQueryOptions = (f: AuditFilters) =>
  queryOptions({ queryKey: ['audit', f], queryFn: () => getAudit(f), placeholderData: keepPreviousData });
export const useAudit = (f: AuditFilters) => useQuery(auditQueryOptions(f));

export const myActivityQueryOptions = () =>
  queryOptions({ queryKey: ['audit', 'mine'], queryFn: () => api('/audit/mine', { schema: auditPageSchema }) });
export const useMyActivity = () => useQuery(myActivityQueryOptions());
