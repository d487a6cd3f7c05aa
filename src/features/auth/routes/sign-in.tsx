import { Link, useNavigate, useSearchParams } from 'react-router';
import { signInSchema } from '@shared/schemas/auth';
import { Button, FormMessage, TextField } from '@/components/form';
import { useZodForm } from '@/hooks/use-zod-form';
import { useSignIn } from '../api/me';
import { AuthLayout } from './auth-layout';
import { homePath, safeNext } from '@/app/paths';

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useZodForm(signInSchema, { email: '', password: '' });

  const onSubmit = form.handleSubmit(async (data) => {
    const me = await signIn.mutateAsync(data);
    navigate(safeNext(params.get('next')) ?? homePath(me), { replace: true });
  });

  return (
    <AuthLayout
      title="Welcome back to the workbench"
      footer={
        <>
          New here?{' '}
          <Link className="font-bold text-peel-deep underline" to="/sign-up">
            Make an account
          </Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <FormMessage>{form.formError}</FormMessage>
        <TextField label="E-mail" type="email" autoComplete="email" autoFocus {...form.bind('email')} />
        <TextField label="Password" type="password" autoComplete="current-password" {...form.bind('password')} />
        <Button type="submit" busy={signIn.isPending}>
          Sign in
        </Button>
        <Link to="/forgot-password" className="text-sm font-semibold text-peel-deep underline">
          Forgot your password?
        </Link>
      </form>
    </AuthLayout>
  );
}
