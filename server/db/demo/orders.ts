// The invented shop's buyers: a bakery's quote for die-cut singles of the tulips, and a book club's
// for copies of the market sheet. Prices typed as the shop would quote them.
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { User } from '../../modules/accounts/user.entity';
import { ArtItem } from '../../modules/art/art-item.entity';
import { Customer } from '../../modules/orders/customer.entity';
import { OrdersService } from '../../modules/orders/orders.service';
import { orderLineInputSchema } from '@shared/schemas/orders';
import { ProfilesService } from '../../modules/sheets/profiles.service';
import { Sheet } from '../../modules/sheets/sheet.entity';
import { SheetsService } from '../../modules/sheets/sheets.service';
import { CostingService } from '../../modules/shop/costing.service';
import { SheetAnalysisService } from '../../modules/shop/sheet-analysis.service';
import { OutlineService } from '../../modules/outlines/outline.service';
import { OutlinePool } from '../../engine/outline/pool';
import type { Storage } from '../../storage/storage';
import { demoTeam, demoUserKey } from './accounts';

export async function seedOrders(dataSource: DataSource, storage: Storage): Promise<number> {
  const team = await demoTeam(dataSource);
  if ((await dataSource.getRepository(Customer).countBy({ teamId: team.id })) > 0) return 0;
  const member = await dataSource.getRepository(User).findOneByOrFail({ seedKey: demoUserKey('member@demo.test') });
  const profiles = new ProfilesService(dataSource);
  const sheets = new SheetsService(dataSource, storage, profiles);
  // Prices are typed, so nothing is outlined; the pool is there because costing may need one.
  const pool = new OutlinePool(undefined, 1);
  const outlines = new OutlineService(dataSource, storage, pool);
  const orders = new OrdersService(
    dataSource,
    profiles,
    new CostingService(dataSource, sheets, new SheetAnalysisService(dataSource, storage, outlines)),
  );
  const actor = { userId: member.id, name: member.name, teamId: team.id, role: 'member' as const, unit: 'in' as const };
  const tulips = await dataSource.getRepository(ArtItem).findOneBy({ teamId: team.id, name: 'tulip-trio' });
  const market = await dataSource.getRepository(Sheet).findOneBy({ teamId: team.id, name: In(['Garden party, market sheet']) });
  let added = 0;
  try {
    const bakery = await orders.addCustomer(team.id, {
      name: 'Hazel Brightwater (Marigold Lane Bakery)',
      email: 'hazel@marigold-lane.test',
      notes: 'Stickers for cake boxes; likes the tulips.',
    });
    const first = await orders.create(actor, { customerId: bakery.id, depositPercent: 50, notes: 'For the spring opening.' });
    if (tulips)
      await orders.addLine(
        actor,
        first.id,
        orderLineInputSchema.parse({ kind: 'singles', artId: tulips.id, finishedWidthMm: 50.8, quantity: 60, unitPrice: '0.45' }),
      );
    added += 2;
    const club = await orders.addCustomer(team.id, { name: 'Tidepool Book Club', email: 'club@tidepool.test', notes: '' });
    const second = await orders.create(actor, { customerId: club.id, depositPercent: 0, notes: '' });
    if (market)
      await orders.addLine(
        actor,
        second.id,
        orderLineInputSchema.parse({ kind: 'sheet', sheetId: market.id, quantity: 5, unitPrice: '6.50' }),
      );
    added += 2;
  } finally {
    await pool.close();
  }
  return added;
}
