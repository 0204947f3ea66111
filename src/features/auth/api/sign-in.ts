import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type SignInInput } from '../../../../shared/schemas/auth.schema';
import { api, setCsrfToken } from '../../../lib/api-client';
import { setSessionHint } from '../../../lib/session-hint';
import { meQueryOptions } from './get-me';

const signInResultSchema = z.object({ user: userSchema, csrfToken: z.string() });

export async function signIn(input: SignInInput) {
  const result = await api('/auth/sign-in', { method: 'POST', body: input, schema: signInResultSchema });
  setCsrfToken(result.csrfToken);
  setSessionHint(true);
  return result;
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (result) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, () => ({ user: result.user }));
    },
  });
}

export async function signOut() {
  await api('/auth/sign-out', { method: 'POST' });
  setCsrfToken(null);
  setSessionHint(false);
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, () => null);
    },
  });
}
