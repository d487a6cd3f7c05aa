import { z } from 'zod';
import './messages';
import { ROLES } from '../permissions';
import { emailSchema } from './auth';

const roleSchema = z.enum(ROLES, { error: 'Pick a role: owner, admin, member or viewer' });

export const idSchema = z.string().regex(/^\d{1,18}$/, 'Not a valid id');
export const teamParamsSchema = z.object({ teamId: idSchema });
export const memberParamsSchema = z.object({ teamId: idSchema, userId: idSchema });
export const inviteParamsSchema = z.object({ teamId: idSchema, inviteId: idSchema });

const teamNameSchema = z
  .string({ error: 'Enter a team name' })
  .trim()
  .min(2, 'Use at least 2 characters')
  .max(80, 'Use at most 80 characters');

export const createTeamSchema = z.object({ name: teamNameSchema });
export const updateTeamSchema = z.object({ name: teamNameSchema });

export const createInviteSchema = z.object({ email: emailSchema, role: roleSchema });
export type CreateInviteInput = z.infer<typeof createInviteSchema>;

export const updateMemberSchema = z.object({ role: roleSchema });
export type UpdateMemberInput = z.infer<typeof updateMemberSchema>;

export const switchTeamSchema = z.object({ teamId: idSchema });

export const teamDetailSchema = z.object({
  id: z.string(),
  name: z.string(),
  personal: z.boolean(),
  role: roleSchema,
  members: z.array(z.object({ userId: z.string(), name: z.string(), email: z.string(), role: roleSchema, joinedAt: z.string() })),
  invites: z.array(z.object({ id: z.string(), email: z.string(), role: roleSchema, expiresAt: z.string(), createdAt: z.string() })),
});
export type TeamDetail = z.infer<typeof teamDetailSchema>;

export const invitePreviewSchema = z.object({
  teamName: z.string(),
  email: z.string(),
  role: roleSchema,
  invitedBy: z.string(),
  accountExists: z.boolean(),
  expiresAt: z.string(),
});
export type InvitePreview = z.infer<typeof invitePreviewSchema>;
