import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router';
import { requestResetSchema } from '@shared/schemas/auth';
import { useRequestReset } from '@/features/auth/api/request-reset';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Card, Notice } from '@/components/ui/card';
import { paths } from '@/config/paths';

export default function ResetPasswordPage() {
  const reset = useRequestReset();
  const form = useForm<{ email: string }>({ resolver: zodResolver(requestResetSchema), defaultValues: { email: '' } });
  return (
    <div className="flex min-h-screen items-center justify-center bg-brand px-4">
      <Card className="w-full max-w-md">
        <h1 className="text-2xl font-semibold">Forgotten password</h1>
        <p className="mt-1 text-sm text-ink-soft">We send a one-time link to choose a new password.</p>
        {reset.isSuccess ? (
          <div className="mt-4">
            <Notice tone="success">{reset.data.detail}</Notice>
          </div>
        ) : (
          <form
            className="mt-4 flex flex-col gap-4"
            noValidate
            onSubmit={form.handleSubmit((v) => reset.mutateAsync(v).catch(() => undefined))}
          >
            <TextField
              label="E-mail"
              type="email"
              autoComplete="username"
              {...form.register('email')}
              error={form.formState.errors.email?.message}
            />
            {reset.isError && <Notice tone="error">{reset.error.message}</Notice>}
            <Button type="submit" disabled={form.formState.isSubmitting}>
              Send the link
            </Button>
          </form>
        )}
        <Link to={paths.signIn} className="mt-4 inline-flex min-h-touch items-center text-sm font-medium text-brand underline">
          Back to sign-in
        </Link>
      </Card>
    </div>
  );
}
