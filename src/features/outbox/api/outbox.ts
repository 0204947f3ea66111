import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { mailMessageSchema } from '../../../../shared/schemas/audit.schema';
import { api } from '../../../lib/api-client';

export const getOutbox = () => api('/outbox', { schema: z.object({ items: z.array(mailMessageSchema) }) }).then((r) => r.items);
export const outboxQueryOptions = () => queryOptions({ queryKey: ['outbox'], queryFn: getOutbox, refetchInterval: 10_000 });
export const useOutbox = () => useQuery(outboxQueryOptions());
