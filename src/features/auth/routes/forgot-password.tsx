import { Link } from 'react-router';
import { resetRequestSchema } from '@shared/schemas/auth';
import { Button, FormMessage, TextField } from '@/components/form';
import { useZodForm } from '@/hooks/use-zod-form';
import { useRequestReset } from '../api/password-reset';
import { AuthLayout } from './auth-layout';

export function ForgotPasswordRoute() {
  const request = useRequestReset();
  const form = useZodForm(resetRequestSchema, { email: '' });
  const onSubmit = form.handleSubmit(async (data) => {
    await request.mutateAsync(data);
  });
  return (
    <AuthLayout
      title="Reset your password"
      footer={
        <Link className="font-bold text-peel-deep underline" to="/sign-in">
          Back to sign-in
        </Link>
      }
    >
      {request.isSuccess ? (
        <FormMessage tone="ok">{request.data.message} The link works once, for one hour.</FormMessage>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          <FormMessage>{form.formError}</FormMessage>
          <TextField label="E-mail of your account" type="email" autoComplete="email" autoFocus {...form.bind('email')} />
          <Button type="submit" busy={request.isPending}>
            E-mail me a reset link
          </Button>
        </form>
      )}
    </AuthLayout>
  );
}
