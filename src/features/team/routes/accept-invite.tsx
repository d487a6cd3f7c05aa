import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router';
import { z } from 'zod';
import { ROLE_LABELS } from '@shared/permissions';
import { nameSchema, passwordSchema } from '@shared/schemas/auth';
import { Button, FormMessage, TextField } from '@/components/form';
import { useZodForm } from '@/hooks/use-zod-form';
import { useMe } from '@/features/auth/api/me';
import { AuthLayout } from '@/features/auth/routes/auth-layout';
import { invitePreviewQueryOptions, useAcceptInvite } from '../api/team';
import { teamPath } from '@/app/paths';

const newAccountSchema = z.object({ name: nameSchema, password: passwordSchema });

export function AcceptInviteRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const preview = useQuery(invitePreviewQueryOptions(token));
  const accept = useAcceptInvite(token);
  const form = useZodForm(newAccountSchema, { name: '', password: '' });
  const next = `/invite/${token}`;

  if (preview.isPending)
    return (
      <AuthLayout title="Team invitation">
        <p>Opening your invitation…</p>
      </AuthLayout>
    );
  if (preview.isError)
    return (
      <AuthLayout
        title="This invitation no longer works"
        footer={
          <Link className="font-bold underline" to="/">
            Go to Sheetsmith
          </Link>
        }
      >
        <FormMessage>{preview.error.message}</FormMessage>
      </AuthLayout>
    );
  const invite = preview.data;
  const join = async (input: { name?: string; password?: string }) => {
    const after = await accept.mutateAsync(input);
    navigate(teamPath(after.activeTeamId!), { replace: true });
  };
  const title = `Join ${invite.teamName}`;
  const intro = (
    <p className="mb-4 text-ink-soft">
      {invite.invitedBy} invited <strong>{invite.email}</strong> as {ROLE_LABELS[invite.role].toLowerCase()}.
    </p>
  );

  if (me && me.user.email !== invite.email)
    return (
      <AuthLayout title={title}>
        {intro}
        <FormMessage>
          You are signed in as {me.user.email}. Sign out, then open this link again to accept as {invite.email}.
        </FormMessage>
      </AuthLayout>
    );
  if (me || invite.accountExists)
    return (
      <AuthLayout title={title}>
        {intro}
        <FormMessage>{accept.error?.message}</FormMessage>
        {me ? (
          <Button busy={accept.isPending} onClick={() => join({}).catch(() => undefined)}>
            Accept and join
          </Button>
        ) : (
          <Link className="font-bold text-peel-deep underline" to={`/sign-in?next=${encodeURIComponent(next)}`}>
            Sign in as {invite.email} to accept
          </Link>
        )}
      </AuthLayout>
    );
  return (
    <AuthLayout title={title}>
      {intro}
      <form onSubmit={form.handleSubmit(join)} noValidate className="flex flex-col gap-4">
        <FormMessage>{form.formError}</FormMessage>
        <TextField label="Your name" autoComplete="name" autoFocus {...form.bind('name')} />
        <TextField
          label="Choose a password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          {...form.bind('password')}
        />
        <Button type="submit" busy={accept.isPending}>
          Create account and join
        </Button>
      </form>
    </AuthLayout>
  );
}
