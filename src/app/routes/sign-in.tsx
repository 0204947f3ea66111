import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { signInInputSchema, type SignInInput } from '../../../shared/schemas/auth.schema';
import { Button } from '../../components/ui/button';
import { TextField } from '../../components/ui/field';
import { useMe } from '../../features/auth/api/get-me';
import { useSignIn } from '../../features/auth/api/sign-in';
import { ApiError } from '../../lib/api-client';

export function SignInRoute() {
  const me = useMe();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useForm<SignInInput>({ resolver: zodResolver(signInInputSchema), defaultValues: { email: '', password: '' } });
  const next = params.get('next');
  const target = next && next.startsWith('/') && !next.startsWith('//') ? next : '/';

  if (me.data) return <Navigate to={target} replace />;

  const onSubmit = form.handleSubmit((values) =>
    signIn.mutate(values, {
      onSuccess: () => navigate(target, { replace: true }),
      onError: (err) => {
        if (err instanceof ApiError) {
          for (const e of err.problem.errors) form.setError(e.path as keyof SignInInput, { message: e.message });
        }
      },
    }),
  );

  return (
    <div className="flex min-h-screen items-center justify-center bg-ink-900 px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center justify-center gap-2 text-white">
          <img src="/favicon.svg" alt="" className="h-9 w-9" />
          <span className="text-2xl font-semibold tracking-tight">Placewright</span>
        </div>
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded bg-white p-6 shadow-lg" aria-labelledby="sign-in-title">
          <h1 id="sign-in-title" className="text-lg font-semibold">Sign in</h1>
          <TextField label="E-mail" type="email" autoComplete="username" autoFocus error={form.formState.errors.email?.message} {...form.register('email')} />
          <TextField label="Password" type="password" autoComplete="current-password" error={form.formState.errors.password?.message} {...form.register('password')} />
          {signIn.error && !(signIn.error instanceof ApiError && signIn.error.problem.errors.length) && (
            <p role="alert" className="rounded bg-sev-error/10 px-3 py-2 text-sm text-sev-error">
              {signIn.error.message}
            </p>
          )}
          <Button type="submit" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
          <p className="text-xs text-ink-500">Accounts are created by an admin. Forgot your password? Ask an admin to reset it.</p>
        </form>
      </div>
    </div>
  );
}
