// Nozzles, vision presets, machine profiles and aliases share one shape of API: list, create,
// update with the version seen, delete with the version seen.
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { useInvalidateLibrary } from './packages';

export function namedResource<D extends z.ZodType, I>(path: string, key: string, schema: D) {
  const listSchema = z.object({ items: z.array(schema) });
  const fetchAll = () => api(path, { schema: listSchema }).then((r) => r.items as z.infer<D>[]);
  const queryOpts = () => queryOptions({ queryKey: ['library', key], queryFn: fetchAll });
  return {
    fetchAll,
    queryOptions: queryOpts,
    useList: () => useQuery(queryOpts()),
    useCreate() {
      const invalidate = useInvalidateLibrary();
      return useMutation({ mutationFn: (input: I) => api(path, { method: 'POST', body: input, schema }), onSuccess: invalidate });
    },
    useUpdate() {
      const invalidate = useInvalidateLibrary();
      return useMutation({ mutationFn: ({ id, ...input }: I & { id: string; version: number }) => api(`${path}/${id}`, { method: 'PUT', body: input, schema }), onSuccess: invalidate });
    },
    useDelete() {
      const invalidate = useInvalidateLibrary();
      return useMutation({ mutationFn: ({ id, version }: { id: string; version: number }) => api(`${path}/${id}`, { method: 'DELETE', body: { version } }), onSuccess: invalidate });
    },
  };
}
