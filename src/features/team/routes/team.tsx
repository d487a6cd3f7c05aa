import { useState } from 'react';
import type { FormEvent } from 'react';
import { useNavigate } from 'react-router';
import type { Role } from '@shared/permissions';
import { assignableRoles, PERMISSIONS, ROLE_LABELS, ROLE_PERMISSIONS, ROLES } from '@shared/permissions';
import { createInviteSchema, updateTeamSchema } from '@shared/schemas/team';
import { Button, FormMessage, SelectField, TextField } from '@/components/form';
import { PageTitle } from '@/components/page-title';
import { useZodForm } from '@/hooks/use-zod-form';
import { useAction } from '@/hooks/use-action';
import { useMe } from '@/features/auth/api/me';
import { useTeamRole } from '@/features/auth/use-team-role';
import { useChangeRole, useInvite, useRemoveMember, useRenameTeam, useRevokeInvite, useTeam } from '../api/team';

const roleOptions = (roles: readonly Role[]) => roles.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

export function TeamRoute() {
  const { teamId, role, can } = useTeamRole();
  const { data: me } = useMe();
  const team = useTeam(teamId!);
  const navigate = useNavigate();
  const changeRole = useChangeRole(teamId!);
  const removeMember = useRemoveMember(teamId!);
  const revokeInvite = useRevokeInvite(teamId!);
  const { error: actionError, run } = useAction();

  if (team.isPending) return <p>Loading the team…</p>;
  if (team.isError) return <FormMessage>{team.error.message}</FormMessage>;
  const detail = team.data;
  const manage = can('team.members');
  const assignable = role ? assignableRoles(role) : [];

  return (
    <>
      <PageTitle title={detail.name} />
      <FormMessage>{actionError}</FormMessage>
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <section aria-labelledby="members-title" className="rounded-sticker border-2 border-paper-edge bg-white p-5">
          <h2 id="members-title" className="mb-3 text-lg font-extrabold">
            Members
          </h2>
          <table className="w-full text-left text-sm">
            <thead className="text-ink-faint">
              <tr>
                <th className="py-2">Name</th>
                <th>E-mail</th>
                <th>Role</th>
                <th>
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {detail.members.map((member) => {
                const self = member.userId === me?.user.id;
                const editable = manage && !self && assignable.includes(member.role);
                return (
                  <tr key={member.userId} className="border-t border-paper-deep">
                    <td className="py-2 font-bold">
                      {member.name}
                      {self && ' (you)'}
                    </td>
                    <td>{member.email}</td>
                    <td>
                      {editable ? (
                        <select
                          aria-label={`Role of ${member.name}`}
                          value={member.role}
                          onChange={(event) =>
                            run(() => changeRole.mutateAsync({ userId: member.userId, role: event.target.value as Role }))
                          }
                          className="rounded border-2 border-paper-edge bg-paper px-2 py-1"
                        >
                          {roleOptions(assignable).map((o) => (
                            <option key={o.value} value={o.value}>
                              {o.label}
                            </option>
                          ))}
                        </select>
                      ) : (
                        ROLE_LABELS[member.role]
                      )}
                    </td>
                    <td className="text-right">
                      {(editable || (self && !detail.personal)) && (
                        <button
                          type="button"
                          className="font-bold text-alarm underline"
                          onClick={() =>
                            run(async () => {
                              if (!window.confirm(self ? `Leave ${detail.name}?` : `Remove ${member.name} from ${detail.name}?`)) return;
                              await removeMember.mutateAsync(member.userId);
                              if (self) navigate('/');
                            })
                          }
                        >
                          {self ? 'Leave team' : 'Remove'}
                        </button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          {manage && detail.invites.length > 0 && (
            <>
              <h3 className="mb-2 mt-6 font-extrabold">Waiting invitations</h3>
              <ul className="flex flex-col gap-2 text-sm">
                {detail.invites.map((invite) => (
                  <li key={invite.id} className="flex items-center justify-between rounded-lg bg-paper px-3 py-2">
                    <span>
                      {invite.email} · {ROLE_LABELS[invite.role]} · expires {new Date(invite.expiresAt).toLocaleDateString()}
                    </span>
                    <button
                      type="button"
                      className="font-bold text-alarm underline"
                      onClick={() => run(() => revokeInvite.mutateAsync(invite.id))}
                    >
                      Withdraw
                    </button>
                  </li>
                ))}
              </ul>
            </>
          )}
        </section>
        <div className="flex flex-col gap-6">
          {manage && <InviteForm teamId={teamId!} roles={assignable} />}
          {can('team.settings') && <RenameForm teamId={teamId!} name={detail.name} />}
          <RoleTable />
        </div>
      </div>
    </>
  );
}

function InviteForm({ teamId, roles }: { teamId: string; roles: Role[] }) {
  const invite = useInvite(teamId);
  const form = useZodForm(createInviteSchema, { email: '', role: 'member' });
  const [sent, setSent] = useState<string | null>(null);
  const send = form.handleSubmit(async (data) => {
    await invite.mutateAsync(data);
    setSent(data.email);
    form.setValues({ email: '', role: data.role });
  });
  // A new try replaces the last answer: an earlier "sent" never stands beside a refusal.
  const onSubmit = (event: FormEvent) => {
    setSent(null);
    return send(event);
  };
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 className="text-lg font-extrabold">Invite someone</h2>
      <FormMessage>{form.formError}</FormMessage>
      {sent && <FormMessage tone="ok">Invitation sent to {sent}. The link works once, for 7 days.</FormMessage>}
      <TextField label="Their e-mail" type="email" {...form.bind('email')} />
      <SelectField label="Role" options={roleOptions(roles)} {...form.bind('role')} />
      <Button type="submit" busy={invite.isPending}>
        Send invitation
      </Button>
    </form>
  );
}

function RenameForm({ teamId, name }: { teamId: string; name: string }) {
  const rename = useRenameTeam(teamId);
  const form = useZodForm(updateTeamSchema, { name });
  const onSubmit = form.handleSubmit((data) => rename.mutateAsync(data.name));
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 className="text-lg font-extrabold">Team name</h2>
      <FormMessage>{form.formError}</FormMessage>
      <TextField label="Name" {...form.bind('name')} />
      <Button type="submit" variant="quiet" busy={rename.isPending}>
        Rename
      </Button>
    </form>
  );
}

/** The shared permission table, shown so everyone knows what each role may do. */
function RoleTable() {
  return (
    <section aria-labelledby="roles-title" className="rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm">
      <h2 id="roles-title" className="mb-3 text-lg font-extrabold">
        What each role may do
      </h2>
      <table className="w-full">
        <thead>
          <tr>
            <th className="text-left">
              <span className="sr-only">Permission</span>
            </th>
            {ROLES.map((r) => (
              <th key={r} className="px-1 text-xs">
                {ROLE_LABELS[r]}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {Object.entries(PERMISSIONS).map(([key, label]) => (
            <tr key={key} className="border-t border-paper-deep">
              <td className="py-1 pr-2">{label}</td>
              {ROLES.map((r) => (
                <td key={r} className="text-center" aria-label={ROLE_PERMISSIONS[r].includes(key as never) ? 'yes' : 'no'}>
                  {ROLE_PERMISSIONS[r].includes(key as never) ? '●' : '·'}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
