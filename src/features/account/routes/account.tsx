import { useState } from 'react';
import { useNavigate } from 'react-router';
import { z } from 'zod';
import { changePasswordSchema, nameSchema } from '@shared/schemas/auth';
import { createTeamSchema } from '@shared/schemas/team';
import { Button, FormMessage, SelectField, TextField } from '@/components/form';
import { PageTitle } from '@/components/page-title';
import { useZodForm } from '@/hooks/use-zod-form';
import { useChangePassword, useMe, useSignOut, useUpdateAccount } from '@/features/auth/api/me';
import { useCreateTeam } from '@/features/auth/api/me';
import { teamPath } from '@/app/paths';

const profileSchema = z.object({ name: nameSchema, unit: z.enum(['in', 'mm']) });

export function AccountRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  return (
    <>
      <PageTitle title="Account" />
      <div className="grid max-w-4xl gap-6 md:grid-cols-2">
        <ProfileForm name={me.user.name} unit={me.user.unit} email={me.user.email} />
        <PasswordForm />
        <NewTeamForm />
        <SessionsPanel limits={me.sessionLimits} />
      </div>
    </>
  );
}

function ProfileForm({ name, unit, email }: { name: string; unit: 'in' | 'mm'; email: string }) {
  const update = useUpdateAccount();
  const form = useZodForm(profileSchema, { name, unit });
  const [saved, setSaved] = useState(false);
  const onSubmit = form.handleSubmit(async (data) => {
    setSaved(false);
    await update.mutateAsync(data);
    setSaved(true);
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 className="text-lg font-extrabold">Profile</h2>
      <p className="text-sm text-ink-soft">Signed in as {email}</p>
      <FormMessage>{form.formError}</FormMessage>
      {saved && <FormMessage tone="ok">Saved.</FormMessage>}
      <TextField label="Name" autoComplete="name" {...form.bind('name')} />
      <SelectField
        label="Show sizes in"
        options={[
          { value: 'in', label: 'Inches (in)' },
          { value: 'mm', label: 'Millimetres (mm)' },
        ]}
        {...form.bind('unit')}
      />
      <Button type="submit" busy={update.isPending}>
        Save profile
      </Button>
    </form>
  );
}

function PasswordForm() {
  const change = useChangePassword();
  const form = useZodForm(changePasswordSchema, { currentPassword: '', newPassword: '' });
  const onSubmit = form.handleSubmit(async (data) => {
    await change.mutateAsync(data);
    form.setValues({ currentPassword: '', newPassword: '' });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 className="text-lg font-extrabold">Password</h2>
      <FormMessage>{form.formError}</FormMessage>
      {change.isSuccess && (
        <FormMessage tone="ok">Password changed. You stay signed in here; every other device is signed out.</FormMessage>
      )}
      <TextField label="Current password" type="password" autoComplete="current-password" {...form.bind('currentPassword')} />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        {...form.bind('newPassword')}
      />
      <Button type="submit" variant="quiet" busy={change.isPending}>
        Change password
      </Button>
    </form>
  );
}

function NewTeamForm() {
  const create = useCreateTeam();
  const navigate = useNavigate();
  const form = useZodForm(createTeamSchema, { name: '' });
  const onSubmit = form.handleSubmit(async (data) => {
    const me = await create.mutateAsync(data.name);
    navigate(teamPath(me.activeTeamId!, 'team'));
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 className="text-lg font-extrabold">Start a shared team</h2>
      <p className="text-sm text-ink-soft">For a shop of two or three: one shared library, shared sheets, roles for each person.</p>
      <FormMessage>{form.formError}</FormMessage>
      <TextField label="Team name" {...form.bind('name')} />
      <Button type="submit" variant="quiet" busy={create.isPending}>
        Create team
      </Button>
    </form>
  );
}

const days = (seconds: number) => {
  const d = Math.round(seconds / 86400);
  return d >= 1 ? `${d} day${d === 1 ? '' : 's'}` : `${Math.max(1, Math.round(seconds / 3600))} hours`;
};

function SessionsPanel({ limits }: { limits: { idleSeconds: number; absoluteSeconds: number } }) {
  const signOut = useSignOut(true);
  const navigate = useNavigate();
  return (
    <section aria-labelledby="sessions-heading" className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 id="sessions-heading" className="text-lg font-extrabold">
        Where you are signed in
      </h2>
      <p className="text-sm text-ink-soft">
        A session ends after {days(limits.idleSeconds)} without use and {days(limits.absoluteSeconds)} after signing in. Left signed in on a
        shop or market computer? End every session, this one included.
      </p>
      <FormMessage>{signOut.error?.message}</FormMessage>
      <Button
        type="button"
        variant="quiet"
        busy={signOut.isPending}
        onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in') })}
      >
        Sign out everywhere
      </Button>
    </section>
  );
}
