import { queryOptions, useQuery } from '@tanstack/react-query';
import { meSchema, type Me } from '../../../../shared/schemas/auth.schema';
import { api, ApiError } from '../../../lib/api-client';

/** The signed-in user, or null when nobody is signed in. */
export async function getMe(): Promise<Me | null> {
  try {
    return await api('/me', { schema: meSchema });
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
