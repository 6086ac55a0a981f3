import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useParams } from 'react-router';
import { setPasswordSchema, type SetPasswordInput } from '@shared/schemas/auth';
import { useLinkInfo, useSetPassword } from '@/features/auth/api/set-password';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Card, Loading, Notice } from '@/components/ui/card';

export default function SetPasswordPage() {
  const { token = '' } = useParams();
  const info = useLinkInfo(token);
  const setPassword = useSetPassword();
  const form = useForm<SetPasswordInput>({ resolver: zodResolver(setPasswordSchema), defaultValues: { password: '' } });

  return (
    <div className="flex min-h-screen items-center justify-center bg-brand px-4">
      <Card className="w-full max-w-md">
        <h1 className="text-2xl font-semibold">Choose your password</h1>
        {info.isPending && <Loading />}
        {info.isError && (
          <div className="mt-4">
            <Notice tone="error">{info.error.message}</Notice>
          </div>
        )}
        {setPassword.isSuccess ? (
          <div className="mt-4 flex flex-col gap-4">
            <Notice tone="success">Your password is set. You can sign in now.</Notice>
            <Link
              to="/sign-in"
              className="inline-flex min-h-touch items-center justify-center rounded-lg bg-brand px-4 font-medium text-white"
            >
              Go to sign-in
            </Link>
          </div>
        ) : (
          info.data && (
            <form
              className="mt-4 flex flex-col gap-4"
              noValidate
              onSubmit={form.handleSubmit((v) => setPassword.mutateAsync({ token, ...v }).catch(() => undefined))}
            >
              <p className="text-sm text-ink-soft">
                For {info.data.name} ({info.data.email}).
              </p>
              <TextField
                label="New password"
                type="password"
                autoComplete="new-password"
                hint="At least 8 characters. A short sentence is easier to remember."
                {...form.register('password')}
                error={form.formState.errors.password?.message}
              />
              {setPassword.isError && <Notice tone="error">{setPassword.error.message}</Notice>}
              <Button type="submit" disabled={form.formState.isSubmitting}>
                Set password
              </Button>
            </form>
          )
        )}
      </Card>
    </div>
  );
}
