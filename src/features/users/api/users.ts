import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type CreateUserInput, type UpdateUserInput } from '../../../../shared/schemas/auth.schema';
import { api } from '../../../lib/api-client';

const userListSchema = z.object({ items: z.array(userSchema) });

export const getUsers = () => api('/users', { schema: userListSchema }).then((r) => r.items);
export const usersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });
export const useUsers = () => useQuery(usersQueryOptions());

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateUserInput) => api('/users', { method: 'POST', body: input, schema: userSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateUserInput & { id: string }) => api(`/users/${id}`, { method: 'PATCH', body: input, schema: userSchema }),
    onSettled: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
}

export function useResetPassword() {
  return useMutation({
    mutationFn: ({ id, password }: { id: string; password: string }) => api(`/users/${id}/password`, { method: 'POST', body: { password } }),
  });
}
