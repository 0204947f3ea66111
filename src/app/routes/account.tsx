import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { toast } from 'sonner';
import { z } from 'zod';
import { newPasswordSchema } from '../../../shared/schemas/auth.schema';
import { Button } from '../../components/ui/button';
import { TextField } from '../../components/ui/field';
import { PageHeader } from '../../components/ui/misc';
import { PasswordStrengthNote, usePasswordStrength } from '../../features/users/components/password-strength';
import { useMe } from '../../features/auth/api/get-me';
import { api, ApiError } from '../../lib/api-client';

const schema = z
  .object({ currentPassword: z.string().min(1, 'Enter your current password'), newPassword: newPasswordSchema, repeat: z.string() })
  .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'The two new passwords differ' });
type Values = z.infer<typeof schema>;

export default function AccountRoute() {
  const form = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { currentPassword: '', newPassword: '', repeat: '' } });
  const change = useMutation({
    mutationFn: (v: Values) => api('/me/password', { method: 'POST', body: { currentPassword: v.currentPassword, newPassword: v.newPassword } }),
  });
  const onSubmit = form.handleSubmit((v) =>
    change.mutate(v, {
      onSuccess: () => {
        toast.success('Password changed.');
        form.reset();
      },
      onError: (err) => {
        if (err instanceof ApiError && err.problem.errors.length) {
          for (const e of err.problem.errors) form.setError(e.path as keyof Values, { message: e.message });
        } else toast.error(err.message);
      },
    }),
  );
  const e = form.formState.errors;
  const me = useMe();
  const strength = usePasswordStrength(form.watch('newPassword'), me.data ? [me.data.user.email, me.data.user.name] : []);
  return (
    <div className="max-w-md">
      <PageHeader title="Account" subtitle="Change your password" />
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded border border-ink-200 bg-white p-5">
        <TextField label="Current password" type="password" autoComplete="current-password" error={e.currentPassword?.message} {...form.register('currentPassword')} />
        <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters and hard to guess: a few unrelated words work well. Your other sessions end when you change it." error={e.newPassword?.message} {...form.register('newPassword')} />
        <PasswordStrengthNote strength={strength} />
        <TextField label="Repeat new password" type="password" autoComplete="new-password" error={e.repeat?.message} {...form.register('repeat')} />
        <Button type="submit" disabled={change.isPending}>{change.isPending ? 'Saving…' : 'Change password'}</Button>
      </form>
    </div>
  );
}
