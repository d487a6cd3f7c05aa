import { refreshTerms } from '../../modules/art/terms';
import type { DataSource } from 'typeorm';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP, DEMO_TEAM_KEY, demoTeam, demoUserKey } from './accounts';
import { DEMO_PACKS, renderDemoArt } from './art';
import type { Storage } from '../../storage/storage';
import { ArtService } from '../../modules/art/art.service';
import { ArtItem } from '../../modules/art/art-item.entity';
import { Collection } from '../../modules/collections/collection.entity';
import { CollectionsService } from '../../modules/collections/collections.service';
import { hashPassword } from '../../modules/auth/passwords';
import { User } from '../../modules/accounts/user.entity';
import { Membership } from '../../modules/accounts/membership.entity';
import { Team } from '../../modules/accounts/team.entity';
import { createUserWithTeam } from '../../modules/accounts/create-account';
import { stockInputSchema } from '@shared/schemas/shop';
import { saveShopSettings } from '../../modules/shop/costing.service';
import { MachinesService } from '../../modules/shop/machines.service';
import { StockItem } from '../../modules/shop/stock-item.entity';
import { StockService } from '../../modules/shop/stock.service';
import { seedSheets } from './sheets';
import { seedOrders } from './orders';
import { inTransaction } from '../transaction';

/** Adds whatever part of the demo shop is missing; returns how many rows it added. */
export async function seedDemo(dataSource: DataSource, storage?: Storage): Promise<number> {
  const added = await seedPeople(dataSource);
  const art = storage ? await seedArt(dataSource, storage) : 0;
  const shop = await seedShop(dataSource);
  // Sheets need the art's pixels for their outlines, so only where there is storage.
  const sheets = storage ? await seedSheets(dataSource, storage) : 0;
  return added + art + shop + sheets + (storage ? await seedOrders(dataSource, storage) : 0);
}

/** The invented shop's shelf and bench: two stocks, a printer, a cutter with its blade, shop rates. */
async function seedShop(dataSource: DataSource): Promise<number> {
  const team = await demoTeam(dataSource);
  if ((await dataSource.getRepository(StockItem).countBy({ teamId: team.id })) > 0) return 0;
  const owner = await dataSource.getRepository(User).findOneByOrFail({ seedKey: demoUserKey('owner@demo.test') });
  const stock = new StockService(dataSource);
  const machines = new MachinesService(dataSource);
  const blank = { colour: '', other: '' };
  const usual = await stock.create(
    team.id,
    stockInputSchema.parse({
      name: 'Puddle glossy sticker paper',
      finish: 'glossy',
      paper: 'letter',
      packPrice: 18,
      sheetsPerPack: 100,
      onHand: 64,
      rating: 4,
      printerSettings: { paperSetting: 'Photo paper glossy', quality: 'High', ...blank },
      cutterSettings: { material: 'Sticker paper glossy', pressure: '3', passes: 1, blade: 'depth 2' },
    }),
  );
  await stock.create(
    team.id,
    stockInputSchema.parse({
      name: 'Frosted clear vinyl',
      finish: 'clear',
      paper: 'letter',
      packPrice: 14.5,
      sheetsPerPack: 20,
      onHand: 6,
      rating: 3,
      notes: 'Needs a white underlay behind pale art.',
      printerSettings: { paperSetting: 'Transparency', quality: 'Standard', ...blank },
      cutterSettings: { material: 'Vinyl clear', pressure: '4', passes: 2, blade: 'depth 3' },
    }),
  );
  const printer = await machines.create(team.id, { kind: 'printer', name: 'Studio inkjet', notes: '', inkFullPage: 2 });
  const cutter = await machines.create(team.id, {
    kind: 'cutter',
    name: 'Bench cutter',
    notes: 'Lives on the back table.',
    inkFullPage: null,
  });
  await machines.fitBlade(team.id, cutter.id, owner.id, {
    label: 'Fine-point blade',
    fittedOn: '2026-10-05',
    lifeM: 600,
    price: 9,
    replaceBy: null,
    note: '',
  });
  await saveShopSettings(dataSource, team.id, {
    currency: '$',
    labourRatePerHour: 18,
    markupPercent: 150,
    wastePercent: 5,
    defaultStockId: usual.id,
    defaultPrinterId: printer.id,
    defaultCutterId: cutter.id,
  });
  return 6;
}

/** The two invented clip-art packs, each in its own shared collection, uploaded by the admin. */
async function seedArt(dataSource: DataSource, storage: Storage): Promise<number> {
  const team = await demoTeam(dataSource);
  const admin = await dataSource.getRepository(User).findOneByOrFail({ seedKey: demoUserKey('admin@demo.test') });
  const art = new ArtService(dataSource, storage, 50_000_000);
  const collections = new CollectionsService(dataSource, storage, refreshTerms);
  let added = 0;
  for (const pack of DEMO_PACKS) {
    let collection = await dataSource.getRepository(Collection).findOneBy({ teamId: team.id, name: pack.collection });
    if (!collection) {
      const created = await collections.create(team.id, {
        name: pack.collection,
        membersCanAdd: true,
        licence: { ...pack.licence, unitLimit: null },
      });
      collection = await dataSource.getRepository(Collection).findOneByOrFail({ id: created.id });
      added++;
    }
    // Skip rendering when the pack is already there (uploads are idempotent by content anyway).
    const present = await dataSource.getRepository(ArtItem).countBy({ teamId: team.id, packId: collection.id });
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

/**
 * The demo team and its four accounts, each marked as the seeder's. An account that exists with a
 * demo e-mail but without the marker belongs to someone else: it is left alone and not added.
 */
async function seedPeople(dataSource: DataSource): Promise<number> {
  return inTransaction(
    dataSource,
    async (manager) => {
      let added = 0;
      let team = await manager.findOneBy(Team, { seedKey: DEMO_TEAM_KEY });
      if (!team) {
        team = await manager.save(manager.create(Team, { name: DEMO_SHOP, personal: false, seedKey: DEMO_TEAM_KEY }));
        added++;
      }
      const passwordHash = await hashPassword(DEMO_PASSWORD);
      for (const account of DEMO_ACCOUNTS) {
        const seedKey = demoUserKey(account.email);
        let user = await manager.findOneBy(User, { email: account.email });
        if (user && user.seedKey !== seedKey) continue;
        if (!user) {
          user = await createUserWithTeam(manager, account, passwordHash);
          await manager.update(User, { id: user.id }, { seedKey });
          added += 3;
        }
        const membership = await manager.findOneBy(Membership, { teamId: team.id, userId: user.id });
        if (!membership) {
          await manager.save(manager.create(Membership, { teamId: team.id, userId: user.id, role: account.role }));
          added++;
        }
      }
      return added;
      // A second seeder running at the same moment (two starts, or a test) made the same rows: look again.
    },
    { retryIf: (error) => (error as { code?: string }).code === 'ER_DUP_ENTRY' },
  );
}
