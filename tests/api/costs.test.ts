// Honest costs (issue 18): no price without a stock, choices that default to the last run, the
// shop's waste allowance in the formula (README's worked example is in tests/reference), a
// running-low mark per stock and blade reminders by length and by date. Against the real MariaDB.
import { describe, expect, it } from 'vitest';
import { useTestApp } from '../helpers/app';
import { STOCK, makeShop, withCutter } from '../helpers/shop';

const t = useTestApp({ pool: true });
const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

describe('costs', () => {
  it('are "not priced" without a stock, in the cost view and the sheets list, instead of 0.00', async () => {
    const s = await makeShop(t, 2);
    const cost = await s.member.get(`${s.base}/sheets/${s.sheet.id}/cost`);
    expect(cost.status).toBe(200);
    expect(cost.body).toMatchObject({ priced: false, defaultsFrom: null, missing: ['stock', 'printer', 'cutter blade'] });
    const listed = (await s.member.get(`${s.base}/sheets`)).body.sheets.find((x: { id: string }) => x.id === s.sheet.id);
    expect(listed.cost).toMatchObject({ priced: false });
  });

  it('default to what the sheet’s last run used, else the shop’s usual stock, else the team’s last run; the sheet’s own choice wins', async () => {
    const s = await makeShop(t, 2);
    const { stock, cutter } = await withCutter(s);
    const other = (await s.member.post(`${s.base}/sheets`, { name: 'Second sheet' })).body;
    const run = await s.member.post(`${s.base}/print-runs`, {
      sheetId: s.sheet.id,
      copies: 1,
      stockId: stock.id,
      cutterId: cutter.id,
      result: 'good',
    });
    expect(run.status).toBe(201);
    const own = (await s.member.get(`${s.base}/sheets/${s.sheet.id}/cost`)).body;
    expect(own).toMatchObject({ priced: true, defaultsFrom: 'sheet-run', costing: { stockId: stock.id, cutterId: cutter.id } });
    expect(own.cost.stock).toBeCloseTo(0.18, 10);
    const team = (await s.member.get(`${s.base}/sheets/${other.id}/cost`)).body;
    expect(team).toMatchObject({ defaultsFrom: 'team-run', costing: { stockId: stock.id } });
    const cheaper = (await s.owner.post(`${s.base}/stock`, { ...STOCK, name: 'Matte', finish: 'matte', packPrice: 9 })).body;
    // The shop's usual stock comes before the team's last run (a sheet's own last run comes first).
    const rates = { currency: '$', labourRatePerHour: 0, markupPercent: 100, wastePercent: 0 };
    expect((await s.owner.send('put', `${s.base}/shop-settings`, { ...rates, defaultStockId: cheaper.id })).status).toBe(200);
    expect((await s.member.get(`${s.base}/sheets/${other.id}/cost`)).body).toMatchObject({
      defaultsFrom: 'team-default',
      costing: { stockId: cheaper.id },
    });
    expect((await s.member.get(`${s.base}/sheets/${s.sheet.id}/cost`)).body).toMatchObject({
      defaultsFrom: 'sheet-run',
      costing: { stockId: stock.id },
    });
    const elsewhere = await makeShop(t, 1);
    const theirs = (await elsewhere.owner.post(`${elsewhere.base}/stock`, STOCK)).body;
    expect((await s.owner.send('put', `${s.base}/shop-settings`, { ...rates, defaultStockId: theirs.id })).status).toBe(404);
    const chosen = await s.member.send('put', `${s.base}/sheets/${other.id}/costing`, {
      stockId: cheaper.id,
      printerId: null,
      cutterId: null,
      labourMinutes: 0,
    });
    expect(chosen.body).toMatchObject({ defaultsFrom: null, costing: { stockId: cheaper.id } });
    expect(chosen.body.cost.stock).toBeCloseTo(0.09, 10);
  });

  it('add the shop’s waste allowance to the materials, not the labour; a bad percentage changes nothing', async () => {
    const s = await makeShop(t, 2);
    const { stock, cutter } = await withCutter(s);
    const rates = await s.owner.send('put', `${s.base}/shop-settings`, {
      currency: '£',
      labourRatePerHour: 12,
      markupPercent: 100,
      wastePercent: 10,
    });
    expect(rates.status).toBe(200);
    const { body } = await s.member.send('put', `${s.base}/sheets/${s.sheet.id}/costing`, {
      stockId: stock.id,
      printerId: null,
      cutterId: cutter.id,
      labourMinutes: 5,
    });
    const c = body.cost;
    expect(c.waste).toBeCloseTo((c.stock + c.ink + c.blade) * 0.1, 10);
    expect(c.labour).toBeCloseTo(1, 10);
    expect(c.sheet).toBeCloseTo(c.stock + c.ink + c.blade + c.waste + c.labour, 10);
    const bad = await s.owner.send('put', `${s.base}/shop-settings`, {
      currency: '£',
      labourRatePerHour: 12,
      markupPercent: 100,
      wastePercent: 'lots',
    });
    expect(bad.status).toBe(400);
    expect(Object.values(bad.body.error.fields)).toContain('Waste allowance: give a percentage');
    expect((await s.member.get(`${s.base}/shop-settings`)).body.wastePercent).toBe(10);
  });

  it('say when a stock runs low and when a blade is near or due, by length or by date', async () => {
    const s = await makeShop(t, 1);
    const stock = (await s.owner.post(`${s.base}/stock`, { ...STOCK, onHand: 25, lowAt: 20 })).body;
    expect(stock).toMatchObject({ lowAt: 20, low: false });
    await s.member.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 5, stockId: stock.id, result: 'good' });
    const after = (await s.member.get(`${s.base}/stock`)).body.stock.find((x: { id: string }) => x.id === stock.id);
    expect(after).toMatchObject({ onHand: 20, low: true });
    const badMark = await s.owner.send('put', `${s.base}/stock/${stock.id}`, { ...STOCK, lowAt: -3 });
    expect(Object.values(badMark.body.error.fields)).toContain('Running low at: not below 0');

    const { cutter } = await withCutter(s, { replaceBy: day(3) });
    const near = (await s.member.get(`${s.base}/machines`)).body.machines.find((m: { id: string }) => m.id === cutter.id).blade;
    expect(near).toMatchObject({ replaceBy: day(3), wear: 'near', wearReason: `replace by ${day(3)}` });
    const fitted = await s.member.post(`${s.base}/machines/${cutter.id}/blades`, {
      label: 'Old stock blade',
      fittedOn: day(-60),
      lifeM: 600,
      replaceBy: day(-1),
    });
    expect(fitted.body.blade).toMatchObject({ wear: 'due', wearReason: `replace-by date ${day(-1)} reached` });
    const noDate = await s.member.post(`${s.base}/machines/${cutter.id}/blades`, {
      label: 'Fresh',
      fittedOn: day(0),
      lifeM: 600,
      replaceBy: '',
    });
    expect(noDate.body.blade).toMatchObject({ replaceBy: null, wear: 'ok', wearReason: null });
  });
});
