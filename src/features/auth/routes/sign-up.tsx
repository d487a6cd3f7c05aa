import { Link, useNavigate } from 'react-router';
import { signUpSchema } from '@shared/schemas/auth';
import { Button, FormMessage, TextField } from '@/components/form';
import { useZodForm } from '@/hooks/use-zod-form';
import { useSignUp } from '../api/me';
import { AuthLayout } from './auth-layout';
import { homePath } from '@/app/paths';

export function SignUpRoute() {
  const navigate = useNavigate();
  const signUp = useSignUp();
  const form = useZodForm(signUpSchema, { name: '', email: '', password: '' });

  const onSubmit = form.handleSubmit(async (data) => {
    const me = await signUp.mutateAsync(data);
    navigate(homePath(me), { replace: true });
  });

  return (
    <AuthLayout
      title="Open your sticker studio"
      footer={
        <>
          Already have an account?{' '}
          <Link className="font-bold text-peel-deep underline" to="/sign-in">
            Sign in
          </Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <FormMessage>{form.formError}</FormMessage>
        <TextField label="Your name" autoComplete="name" autoFocus {...form.bind('name')} />
        <TextField label="E-mail" type="email" autoComplete="email" {...form.bind('email')} />
        <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." {...form.bind('password')} />
        <Button type="submit" busy={signUp.isPending}>
          Create my studio
        </Button>
        <p className="text-xs text-ink-faint">You get a personal studio of your own; teammates can invite you to theirs.</p>
      </form>
    </AuthLayout>
  );
}
