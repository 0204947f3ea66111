import { queryOptions, useQuery } from '@tanstack/react-query';
import { meSchema, type Me } from '../../../../shared/schemas/auth.schema';
import { api, ApiError } from '../../../lib/api-client';
import { setSessionHint } from '../../../lib/session-hint';

/** The signed-in user, or null when nobody is signed in. */
export async function getMe(): Promise<Me | null> {
  try {
    const me = await api('/me', { schema: meSchema });
    setSessionHint(true);
    return me;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) {
      setSessionHint(false);
      return null;
    }
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
