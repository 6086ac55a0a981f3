import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router';
import { signInSchema, type SignInInput } from '@shared/schemas/auth';
import { useSignIn } from '@/features/auth/api/sign-in';
import { useMe } from '@/features/auth/api/get-me';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Card, Notice } from '@/components/ui/card';

export default function SignInPage() {
  const me = useMe();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });
  const next = params.get('next');
  const target = next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
  if (me.data) return <Navigate to={target} replace />;

  return (
    <div className="flex min-h-screen items-center justify-center bg-brand px-4">
      <Card className="w-full max-w-md">
        <h1 className="text-2xl font-semibold">Stripwarden</h1>
        <p className="mt-1 text-sm text-ink-soft">Venue checks for fencing competitions. Sign in to continue.</p>
        <form
          className="mt-6 flex flex-col gap-4"
          noValidate
          onSubmit={form.handleSubmit(async (values) => {
            await signIn.mutateAsync(values).then(
              () => navigate(target, { replace: true }),
              () => undefined,
            );
          })}
        >
          <TextField
            label="E-mail"
            type="email"
            autoComplete="username"
            {...form.register('email')}
            error={form.formState.errors.email?.message}
          />
          <TextField
            label="Password"
            type="password"
            autoComplete="current-password"
            {...form.register('password')}
            error={form.formState.errors.password?.message}
          />
          {signIn.isError && <Notice tone="error">{signIn.error.message}</Notice>}
          <Button type="submit" disabled={form.formState.isSubmitting}>
            {form.formState.isSubmitting ? 'Signing in…' : 'Sign in'}
          </Button>
        </form>
        <Link to="/reset-password" className="mt-3 inline-flex min-h-touch items-center text-sm font-medium text-brand underline">
          Forgotten password?
        </Link>
      </Card>
    </div>
  );
}
