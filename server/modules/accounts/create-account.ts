import type { EntityManager } from 'typeorm';
import { Membership } from './membership.entity';
import { Team } from './team.entity';
import { User } from './user.entity';

/** A new account always comes with a personal studio it owns. */
export async function createUserWithTeam(
  manager: EntityManager,
  input: { name: string; email: string },
  passwordHash: string,
): Promise<User> {
  const user = await manager.save(manager.create(User, { name: input.name, email: input.email, passwordHash }));
  const team = await manager.save(manager.create(Team, { name: `${input.name}'s studio`.slice(0, 80), personal: true }));
  await manager.save(manager.create(Membership, { teamId: team.id, userId: user.id, role: 'owner' }));
  return user;
}
