import { Link, useParams } from 'react-router';
import { resetPasswordSchema } from '@shared/schemas/auth';
import { Button, FormMessage, TextField } from '@/components/form';
import { useZodForm } from '@/hooks/use-zod-form';
import { useResetCheck, useResetPassword } from '../api/password-reset';
import { AuthLayout } from './auth-layout';

export function ResetPasswordRoute() {
  const { token = '' } = useParams();
  const check = useResetCheck(token);
  const reset = useResetPassword(token);
  const form = useZodForm(resetPasswordSchema, { password: '' });
  const onSubmit = form.handleSubmit(async (data) => {
    await reset.mutateAsync(data);
  });
  const back = (
    <Link className="font-bold text-peel-deep underline" to="/sign-in">
      Go to sign-in
    </Link>
  );

  if (check.isPending)
    return (
      <AuthLayout title="Choose a new password">
        <p>Checking your link…</p>
      </AuthLayout>
    );
  if (check.isError)
    return (
      <AuthLayout title="This link no longer works" footer={back}>
        <FormMessage>{check.error.message}</FormMessage>
        <Link className="mt-4 inline-block font-bold text-peel-deep underline" to="/forgot-password">
          Ask for a new link
        </Link>
      </AuthLayout>
    );
  if (reset.isSuccess)
    return (
      <AuthLayout title="Password changed" footer={back}>
        <FormMessage tone="ok">Your new password is set for {reset.data.email}. Sign in with it.</FormMessage>
      </AuthLayout>
    );
  return (
    <AuthLayout title="Choose a new password" footer={back}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <p className="text-sm text-ink-soft">For {check.data.email}</p>
        <FormMessage>{form.formError}</FormMessage>
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          autoFocus
          hint="At least 10 characters."
          {...form.bind('password')}
        />
        <Button type="submit" busy={reset.isPending}>
          Save new password
        </Button>
      </form>
    </AuthLayout>
  );
}
