import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { libraryFileSchema } from '../../../../shared/schemas/library-file.schema';
import { machineSchema } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';

/** The library as the engine reads it (packages, nozzles, presets), for choosing overrides. */
export const libraryFileQueryOptions = () => queryOptions({ queryKey: ['library', 'file'], queryFn: () => api('/library/file', { schema: libraryFileSchema }) });
export const useLibraryFile = () => useQuery(libraryFileQueryOptions());

/** Machine profiles, for the Panelize stage's fit check. */
export const machinesQueryOptions = () =>
  queryOptions({ queryKey: ['library', 'machines'], queryFn: () => api('/library/machines', { schema: z.object({ items: z.array(machineSchema) }) }).then((r) => r.items) });
export const useMachines = () => useQuery(machinesQueryOptions());

const packageRefSchema = z.object({ id: z.string(), name: z.string() }).passthrough();
/** Package names and ids, for proposing an alias from an unmatched footprint. */
export const packageRefsQueryOptions = () =>
  queryOptions({ queryKey: ['library', 'packages', 'refs'], queryFn: () => api('/library/packages', { schema: z.object({ items: z.array(packageRefSchema) }) }).then((r) => r.items.map((p) => ({ id: p.id, name: p.name }))) });
export const usePackageRefs = () => useQuery(packageRefsQueryOptions());
