import type { DataSource } from 'typeorm';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP } from '../../scripts/demo-accounts';
import { hashPassword } from '../modules/auth/passwords';
import { User } from '../modules/auth/user.entity';
import { Membership } from '../modules/teams/membership.entity';
import { Team } from '../modules/teams/team.entity';
import { createUserWithTeam } from '../modules/auth/auth.service';

/** Adds whatever part of the demo shop is missing; returns how many rows it added. */
export async function seedDemo(dataSource: DataSource): Promise<number> {
  return dataSource.transaction(async (manager) => {
    let added = 0;
    let team = await manager.findOneBy(Team, { name: DEMO_SHOP, personal: false });
    if (!team) {
      team = await manager.save(manager.create(Team, { name: DEMO_SHOP, personal: false }));
      added++;
    }
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    for (const account of DEMO_ACCOUNTS) {
      let user = await manager.findOneBy(User, { email: account.email });
      if (!user) {
        user = await createUserWithTeam(manager, account, passwordHash);
        added += 3;
      }
      const membership = await manager.findOneBy(Membership, { teamId: team.id, userId: user.id });
      if (!membership) {
        await manager.save(manager.create(Membership, { teamId: team.id, userId: user.id, role: account.role }));
        added++;
      }
    }
    return added;
  });
}
