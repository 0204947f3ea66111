import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { aliasSchema, packageSchema, unmatchedSchema, type CreatePackageInput } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';
import { useInvalidateLibrary } from './packages';

export const getUnmatched = () => api('/library/unmatched', { schema: z.object({ items: z.array(unmatchedSchema) }) }).then((r) => r.items);
export const unmatchedQueryOptions = () => queryOptions({ queryKey: ['library', 'unmatched'], queryFn: getUnmatched });
export const useUnmatched = () => useQuery(unmatchedQueryOptions());

export function useCreatePackageFromUnmatched() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: CreatePackageInput }) => api(`/library/unmatched/${id}/create-package`, { method: 'POST', body: input, schema: packageSchema }),
    onSuccess: invalidate,
  });
}

export function useAddAliasFromUnmatched() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: ({ id, packageId, pattern }: { id: string; packageId: string; pattern?: string }) =>
      api(`/library/unmatched/${id}/add-alias`, { method: 'POST', body: { packageId, pattern }, schema: aliasSchema }),
    onSuccess: invalidate,
  });
}
