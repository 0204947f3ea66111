import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiTokenSchema, createTokenInputSchema } from '../../../../shared/schemas/program.schema';
import { api } from '../../../lib/api-client';

const tokenListSchema = z.object({ items: z.array(apiTokenSchema) });
const createdTokenSchema = z.object({ token: z.string(), item: apiTokenSchema });
export type CreateTokenInput = z.infer<typeof createTokenInputSchema>;
export type CreatedToken = z.infer<typeof createdTokenSchema>;

export const getTokens = () => api('/tokens', { schema: tokenListSchema }).then((r) => r.items);
export const tokensQueryOptions = () => queryOptions({ queryKey: ['tokens'], queryFn: getTokens });
export const useTokens = () => useQuery(tokensQueryOptions());

export function useCreateToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTokenInput) => api('/tokens', { method: 'POST', body: input, schema: createdTokenSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: tokensQueryOptions().queryKey }),
  });
}

export function useRevokeToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api(`/tokens/${id}`, { method: 'DELETE' }),
    onSettled: () => qc.invalidateQueries({ queryKey: tokensQueryOptions().queryKey }),
  });
}
