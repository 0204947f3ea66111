import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { csvCommitResultSchema, csvPreviewSchema, importResultSchema, matchResultSchema, revisionSchema, type LibraryEntityKind } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';
import { useInvalidateLibrary } from './packages';

/** The export URL: the browser downloads it (Content-Disposition: attachment). */
export const LIBRARY_EXPORT_URL = '/api/library/export';

export function useImportLibrary() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (input: { mode: 'replace' | 'merge'; file: unknown }) => api('/library/import', { method: 'POST', body: input, schema: importResultSchema }),
    onSuccess: invalidate,
  });
}

export function useCsvPreview() {
  return useMutation({ mutationFn: (csv: string) => api('/library/packages/csv/preview', { method: 'POST', body: { csv }, schema: csvPreviewSchema }) });
}

export function useCsvCommit() {
  const invalidate = useInvalidateLibrary();
  return useMutation({ mutationFn: (csv: string) => api('/library/packages/csv', { method: 'POST', body: { csv }, schema: csvCommitResultSchema }), onSuccess: invalidate });
}

export const getRevisions = (q: { entity?: LibraryEntityKind; entityId?: string } = {}) => {
  const qs = new URLSearchParams(Object.entries(q).filter(([, v]) => v) as [string, string][]).toString();
  return api(`/library/revisions${qs ? `?${qs}` : ''}`, { schema: z.object({ items: z.array(revisionSchema) }) }).then((r) => r.items);
};
export const revisionsQueryOptions = (q: { entity?: LibraryEntityKind; entityId?: string } = {}) =>
  queryOptions({ queryKey: ['library', 'revisions', q], queryFn: () => getRevisions(q) });
export const useRevisions = (q: { entity?: LibraryEntityKind; entityId?: string } = {}) => useQuery(revisionsQueryOptions(q));

export const matchFootprint = (footprint: string) => api(`/library/match?footprint=${encodeURIComponent(footprint)}`, { schema: matchResultSchema });
