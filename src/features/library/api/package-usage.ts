import { queryOptions, useQuery } from '@tanstack/react-query';
import { packageUsageSchema } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';

/** The program revisions (in work and released) whose parts a package places. */
export const getPackageUsage = (id: string) => api(`/library/packages/${id}/usage`, { schema: packageUsageSchema });
// under ['library']: a library edit refreshes it with the rest
export const packageUsageQueryOptions = (id: string) => queryOptions({ queryKey: ['library', 'packages', id, 'usage'], queryFn: () => getPackageUsage(id) });
export const usePackageUsage = (id: string | undefined, enabled = true) => useQuery({ ...packageUsageQueryOptions(id ?? ''), enabled: enabled && !!id });
