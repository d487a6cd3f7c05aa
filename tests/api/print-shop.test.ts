import { describe, expect, it } from 'vitest';
import { useTestApp } from '../helpers/app';
import { STOCK, makeShop, withCutter } from '../helpers/shop';

const t = useTestApp({ pool: true });
const shop = (pieces?: number, spacing?: number) => makeShop(t, pieces, spacing);

describe('stock and machines', () => {
  it('keeps stock with its cost per sheet (18.00 for 100 sheets = 0.18) and settings; bad fields change nothing', async () => {
    const s = await shop(1);
    const created = await s.owner.post(`${s.base}/stock`, STOCK);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      name: STOCK.name,
      paperWidthMm: 215.9,
      paperHeightMm: 279.4,
      onHand: 10,
      rating: null,
      foodSafe: false,
    });
    expect(created.body.costPerSheet).toBeCloseTo(0.18, 10);
    expect(created.body.cutterSettings).toEqual(STOCK.cutterSettings);
    const bad = await s.owner.post(`${s.base}/stock`, { ...STOCK, sheetsPerPack: 0, packPrice: -1, finish: 'velvet' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['finish', 'packPrice', 'sheetsPerPack']);
    expect((await s.owner.get(`${s.base}/stock`)).body.stock).toHaveLength(1);
  });

  it('logs blade changes: the old blade is kept with its removal date and length, the new one starts at zero', async () => {
    const s = await shop(1);
    const { cutter } = await withCutter(s);
    const changed = await s.member.post(`${s.base}/machines/${cutter.id}/blades`, {
      label: 'Standard blade #2',
      fittedOn: '2026-12-01',
      lifeM: 600,
      price: 9,
    });
    expect(changed.body.blade).toMatchObject({ label: 'Standard blade #2', cutLengthM: 0, removedOn: null, wear: 'ok' });
    expect(changed.body.blades.map((b: { label: string; removedOn: string | null }) => [b.label, b.removedOn])).toEqual([
      ['Standard blade #2', null],
      ['Standard blade #1', '2026-12-01'],
    ]);
  });

  it('follows the role table: viewers read only, members count stock and log runs, only owners and admins set up', async () => {
    const s = await shop(1);
    const { stock, cutter } = await withCutter(s);
    expect((await s.viewer.get(`${s.base}/stock`)).status).toBe(200);
    expect((await s.viewer.post(`${s.base}/stock/${stock.id}/adjust`, { change: 5 })).status).toBe(403);
    expect(
      (await s.viewer.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 1, stockId: stock.id, result: 'good' })).status,
    ).toBe(403);
    expect((await s.member.post(`${s.base}/stock`, STOCK)).status).toBe(403);
    expect((await s.member.post(`${s.base}/machines`, { kind: 'printer', name: 'X', inkFullPage: 1 })).status).toBe(403);
    expect(
      (await s.member.send('put', `${s.base}/shop-settings`, { currency: '€', labourRatePerHour: 10, markupPercent: 50 })).status,
    ).toBe(403);
    expect((await s.member.post(`${s.base}/stock/${stock.id}/adjust`, { change: 5 })).body.onHand).toBe(15);
    expect((await s.member.post(`${s.base}/machines/${cutter.id}/blades`, { label: 'b', fittedOn: '2026-12-02', lifeM: 500 })).status).toBe(
      201,
    );
    expect(
      (await s.owner.send('put', `${s.base}/shop-settings`, { currency: '€', labourRatePerHour: 10, markupPercent: 50 })).body,
    ).toEqual({
      currency: '€',
      labourRatePerHour: 10,
      markupPercent: 50,
      wastePercent: 0,
      defaultStockId: null,
      defaultPrinterId: null,
      defaultCutterId: null,
      currencyCode: 'USD',
      viewersSeePrices: true,
    }); // no allowance or usual stock unless set; buyers pay in dollars and viewers see prices until the owner says otherwise
  });

  it('answers 404 for another team’s stock, machines, runs and sheets, the same as for ones that do not exist', async () => {
    const a = await shop(1);
    const b = await shop(1);
    const { stock, cutter } = await withCutter(b);
    const run = (
      await b.member.post(`${b.base}/print-runs`, {
        sheetId: b.sheet.id,
        copies: 1,
        stockId: stock.id,
        cutterId: cutter.id,
        result: 'good',
      })
    ).body;
    expect((await a.owner.send('put', `${a.base}/stock/${stock.id}`, STOCK)).status).toBe(404);
    expect((await a.member.post(`${a.base}/stock/${stock.id}/adjust`, { change: 1 })).status).toBe(404);
    expect((await a.member.post(`${a.base}/machines/${cutter.id}/blades`, { label: 'x', fittedOn: '2026-12-02', lifeM: 5 })).status).toBe(
      404,
    );
    expect((await a.member.get(`${a.base}/print-runs/${run.id}/photo`)).status).toBe(404);
    expect(
      (await a.member.post(`${a.base}/print-runs`, { sheetId: b.sheet.id, copies: 1, stockId: stock.id, result: 'good' })).status,
    ).toBe(404);
    // Our own sheet on their stock is as unknown as their sheet.
    expect(
      (await a.member.post(`${a.base}/print-runs`, { sheetId: a.sheet.id, copies: 1, stockId: stock.id, result: 'good' })).status,
    ).toBe(404);
    expect(
      (
        await a.member.send('put', `${a.base}/sheets/${a.sheet.id}/costing`, {
          stockId: stock.id,
          printerId: null,
          cutterId: null,
          labourMinutes: 0,
        })
      ).status,
    ).toBe(404);
    expect((await a.member.get(`${b.base}/stock`)).status).toBe(404);
    expect((await a.member.get(`${a.base}/print-runs`)).body.runs).toEqual([]);
  });
  it('edits stock without touching the count on hand; retired stock and machines leave the lists, logged runs keep their names', async () => {
    const s = await shop(1);
    const other = await shop(1);
    const { stock, cutter } = await withCutter(s);
    await s.member.post(`${s.base}/stock/${stock.id}/adjust`, { change: -3 });
    const edited = await s.owner.send('put', `${s.base}/stock/${stock.id}`, {
      ...STOCK,
      name: 'Glossy sticker paper (new pack)',
      packPrice: 20,
      onHand: 999,
      paper: 'custom',
      paperWidthMm: 101.6,
      paperHeightMm: 152.4,
      printerSettings: { paperSetting: 'Photo glossy', quality: 'Best', colour: '', other: '' },
      skinSafe: true,
    });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({
      name: 'Glossy sticker paper (new pack)',
      onHand: 7,
      paper: 'custom',
      paperWidthMm: 101.6,
      paperHeightMm: 152.4,
      skinSafe: true,
      printerSettings: { paperSetting: 'Photo glossy', quality: 'Best' },
    });
    expect(edited.body.costPerSheet).toBeCloseTo(0.2, 10);
    const tooSmall = await s.owner.send('put', `${s.base}/stock/${stock.id}`, {
      ...STOCK,
      paper: 'custom',
      paperWidthMm: 5,
      paperHeightMm: 152.4,
    });
    expect(tooSmall.status).toBe(400);
    expect(tooSmall.body.error.fields.paperWidthMm).toMatch(/at least 20 mm/);
    expect((await s.owner.get(`${s.base}/stock`)).body.stock[0].name).toBe('Glossy sticker paper (new pack)');

    await s.member.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 1, stockId: stock.id, cutterId: cutter.id, result: 'good' });
    expect((await other.owner.send('delete', `${other.base}/stock/${stock.id}`)).status).toBe(404);
    expect((await other.owner.send('delete', `${other.base}/machines/${cutter.id}`)).status).toBe(404);
    expect((await s.member.send('delete', `${s.base}/stock/${stock.id}`)).status).toBe(403);
    expect((await s.owner.send('delete', `${s.base}/stock/${stock.id}`)).status).toBe(204);
    expect((await s.owner.send('delete', `${s.base}/machines/${cutter.id}`)).status).toBe(204);
    expect((await s.owner.get(`${s.base}/stock`)).body.stock).toEqual([]);
    expect((await s.owner.get(`${s.base}/machines`)).body.machines).toEqual([]);
    const onRetired = await s.member.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 1, stockId: stock.id, result: 'good' });
    expect(onRetired.status).toBe(400);
    expect(onRetired.body.error.fields.stockId).toMatch(/retired/);
    const fresh = (await s.owner.post(`${s.base}/stock`, STOCK)).body;
    const withRetiredCutter = await s.member.post(`${s.base}/print-runs`, {
      sheetId: s.sheet.id,
      copies: 1,
      stockId: fresh.id,
      cutterId: cutter.id,
      result: 'good',
    });
    expect(withRetiredCutter.status).toBe(400);
    expect(withRetiredCutter.body.error.fields.cutterId).toMatch(/retired/);
    expect((await s.owner.get(`${s.base}/stock`)).body.stock[0].onHand).toBe(STOCK.onHand); // nothing taken
    const [run] = (await s.owner.get(`${s.base}/print-runs`)).body.runs;
    expect(run).toMatchObject({ stock: { name: 'Glossy sticker paper (new pack)' }, cutter: { name: 'Desk cutter' } });
  });
});
