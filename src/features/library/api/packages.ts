import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { packageSchema, type CreatePackageInput, type UpdatePackageInput } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';

const listSchema = z.object({ items: z.array(packageSchema) });

export const getPackages = () => api('/library/packages', { schema: listSchema }).then((r) => r.items);
export const packagesQueryOptions = () => queryOptions({ queryKey: ['library', 'packages'], queryFn: getPackages });
export const usePackages = () => useQuery(packagesQueryOptions());

export const getPackage = (id: string) => api(`/library/packages/${id}`, { schema: packageSchema });
export const packageQueryOptions = (id: string) => queryOptions({ queryKey: ['library', 'packages', id], queryFn: () => getPackage(id) });
export const usePackage = (id: string | undefined) => useQuery({ ...packageQueryOptions(id ?? ''), enabled: !!id });

/** Everything the library screens show depends on packages: refresh the lot after an edit. */
export function useInvalidateLibrary() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ['library'] });
}

export function useCreatePackage() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (input: CreatePackageInput) => api('/library/packages', { method: 'POST', body: input, schema: packageSchema }),
    onSuccess: invalidate,
  });
}

export function useUpdatePackage() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdatePackageInput & { id: string }) => api(`/library/packages/${id}`, { method: 'PUT', body: input, schema: packageSchema }),
    onSuccess: invalidate,
  });
}

export function useDeletePackage() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => api(`/library/packages/${id}`, { method: 'DELETE', body: { version } }),
    onSuccess: invalidate,
  });
}
