import type { DataSource } from 'typeorm';
import type { Role } from '@shared/permissions';
import { Team } from '../../modules/accounts/team.entity';

// The invented demo shop: a two-table studio that sells watercolour critter stickers at weekend
// markets. Names, shop and art are made up for Sheetsmith's demo.
export const DEMO_SHOP = 'Puddlejump Paper Co.';
/** The stable marker on the demo team (teams.seed_key); the display name can be anyone's. */
export const DEMO_TEAM_KEY = 'demo:shop';
/** The marker on each demo account (users.seed_key): demo:owner, demo:admin, … */
export const demoUserKey = (email: string) => `demo:${email.split('@')[0]}`;
export const DEMO_PASSWORD = 'sheetsmith-demo';

export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; role: Role }> = [
  { email: 'owner@demo.test', name: 'Wren Abernathy', role: 'owner' },
  { email: 'admin@demo.test', name: 'Teodor Quill', role: 'admin' },
  { email: 'member@demo.test', name: 'Marisol Fenwick', role: 'member' },
  { email: 'viewer@demo.test', name: 'Ossian Pike', role: 'viewer' },
];

/** The team the seeder made, found by its marker; never a team that merely has the demo's name. */
export function demoTeam(dataSource: DataSource): Promise<Team> {
  return dataSource.getRepository(Team).findOneByOrFail({ seedKey: DEMO_TEAM_KEY });
}
