import type { DataSource } from 'typeorm';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP } from '../../scripts/demo-accounts';
import { DEMO_PACKS, renderDemoArt } from '../../scripts/demo-art';
import type { Storage } from '../storage/storage';
import { ArtService } from '../modules/art/art.service';
import { ArtItem } from '../modules/art/art-item.entity';
import { Collection } from '../modules/collections/collection.entity';
import { CollectionsService } from '../modules/collections/collections.service';
import { hashPassword } from '../modules/auth/passwords';
import { User } from '../modules/auth/user.entity';
import { Membership } from '../modules/teams/membership.entity';
import { Team } from '../modules/teams/team.entity';
import { createUserWithTeam } from '../modules/auth/auth.service';

/** Adds whatever part of the demo shop is missing; returns how many rows it added. */
export async function seedDemo(dataSource: DataSource, storage?: Storage): Promise<number> {
  const added = await seedPeople(dataSource);
  return added + (storage ? await seedArt(dataSource, storage) : 0);
}

/** The two invented clip-art packs, each in its own shared collection, uploaded by the admin. */
async function seedArt(dataSource: DataSource, storage: Storage): Promise<number> {
  const team = await dataSource.getRepository(Team).findOneByOrFail({ name: DEMO_SHOP, personal: false });
  const admin = await dataSource.getRepository(User).findOneByOrFail({ email: 'admin@demo.test' });
  const art = new ArtService(dataSource, storage, 50_000_000);
  const collections = new CollectionsService(dataSource, storage);
  let added = 0;
  for (const pack of DEMO_PACKS) {
    let collection = await dataSource.getRepository(Collection).findOneBy({ teamId: team.id, name: pack.collection });
    if (!collection) {
      const created = await collections.create(team.id, { name: pack.collection, membersCanAdd: true, licence: { ...pack.licence, unitLimit: null } });
      collection = await dataSource.getRepository(Collection).findOneByOrFail({ id: created.id });
      added++;
    }
    // Skip rendering when the pack is already there (uploads are idempotent by content anyway).
    const present = await dataSource.getRepository(ArtItem).countBy({ teamId: team.id, collectionId: collection.id });
    if (present >= pack.items.length) continue;
    for (const item of pack.items) {
      const results = await art.upload(
        { userId: admin.id, teamId: team.id, role: 'admin' },
        { originalname: item.file, buffer: await renderDemoArt(item) },
        { keywords: item.keywords, collectionId: collection.id },
      );
      added += results.filter((r) => r.status === 'stored').length;
    }
  }
  return added;
}

async function seedPeople(dataSource: DataSource): Promise<number> {
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
