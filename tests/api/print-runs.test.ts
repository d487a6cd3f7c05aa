import JSZip from 'jszip';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { useTestApp } from '../helpers/app';
import { STOCK, makeShop, withCutter } from '../helpers/shop';

const t = useTestApp({ pool: true });
const shop = (pieces?: number, spacing?: number) => makeShop(t, pieces, spacing);

describe('print runs', () => {
  it('take the sheets from stock and add cut length × copies to the fitted blade', async () => {
    const s = await shop(3);
    const { stock, cutter } = await withCutter(s);
    const analysis = (await s.member.get(`${s.base}/sheets/${s.sheet.id}/analysis`)).body;
    // Three circles 38 + 2 × 3.175 = 44.35 mm across: 3 × π × 44.35 mm of cut (circumference).
    expect(Math.abs(analysis.cutLengthMm - 3 * Math.PI * 44.35) / (3 * Math.PI * 44.35)).toBeLessThan(0.005);
    const res = await s.member.post(`${s.base}/print-runs`, {
      sheetId: s.sheet.id,
      copies: 4,
      stockId: stock.id,
      cutterId: cutter.id,
      result: 'misaligned',
      notes: 'Registration off by a hair',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      copies: 4,
      wasted: 4,
      result: 'misaligned',
      stock: { id: stock.id },
      cutter: { id: cutter.id },
      sheet: { id: s.sheet.id, version: 2 },
    });
    expect(res.body.cutterSettings).toEqual(STOCK.cutterSettings); // taken from the stock's settings
    expect(res.body.cutLengthM).toBeCloseTo((4 * analysis.cutLengthMm) / 1000, 6);
    expect((await s.member.get(`${s.base}/stock`)).body.stock[0].onHand).toBe(6);
    const blade = (await s.member.get(`${s.base}/machines`)).body.machines.find((m: { id: string }) => m.id === cutter.id).blade;
    expect(blade.cutLengthM).toBeCloseTo((4 * analysis.cutLengthMm) / 1000, 6);
    const filtered = await s.member.get(`${s.base}/print-runs?result=good`);
    expect(filtered.body.runs).toEqual([]);
    expect((await s.member.get(`${s.base}/print-runs?result=misaligned&cutterId=${cutter.id}`)).body.runs).toHaveLength(1);
  });

  it('will not take stock below zero without a confirmation, and then does', async () => {
    const s = await shop(1);
    const { stock } = await withCutter(s);
    const refused = await s.member.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 11, stockId: stock.id, result: 'good' });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: 'stock_short', message: expect.stringContaining('Only 10 sheets on hand') });
    expect((await s.member.get(`${s.base}/print-runs`)).body.runs).toEqual([]);
    expect((await s.member.post(`${s.base}/stock/${stock.id}/adjust`, { change: -11 })).status).toBe(409);
    expect((await s.member.get(`${s.base}/stock`)).body.stock[0].onHand).toBe(10);
    const confirmed = await s.member.post(`${s.base}/print-runs`, {
      sheetId: s.sheet.id,
      copies: 11,
      stockId: stock.id,
      result: 'good',
      confirmNegativeStock: true,
    });
    expect(confirmed.status).toBe(201);
    expect((await s.member.get(`${s.base}/stock`)).body.stock[0].onHand).toBe(-1);
  });

  it('changes neither stock nor blade when the run fails part-way (one transaction)', async () => {
    const s = await shop(1);
    const { stock, cutter } = await withCutter(s);
    // A trigger makes the database refuse the run's own row, after stock and blade were updated.
    await t.db.query('DROP TRIGGER IF EXISTS refuse_run');
    await t.db.query(
      `CREATE TRIGGER refuse_run BEFORE INSERT ON print_runs FOR EACH ROW BEGIN IF NEW.stock_id = ${Number(stock.id)} THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'refused for the test'; END IF; END`,
    );
    try {
      const res = await s.member.post(`${s.base}/print-runs`, {
        sheetId: s.sheet.id,
        copies: 3,
        stockId: stock.id,
        cutterId: cutter.id,
        result: 'good',
      });
      expect(res.status).toBe(500);
    } finally {
      await t.db.query('DROP TRIGGER IF EXISTS refuse_run');
    }
    expect((await s.member.get(`${s.base}/stock`)).body.stock[0].onHand).toBe(10);
    const machines = (await s.member.get(`${s.base}/machines`)).body.machines;
    expect(machines.find((m: { id: string }) => m.id === cutter.id).blade.cutLengthM).toBe(0);
    expect((await s.member.get(`${s.base}/print-runs`)).body.runs).toEqual([]);
  });

  it('keeps a photo of the run and refuses a file that is not an image', async () => {
    const s = await shop(1);
    const { stock } = await withCutter(s);
    const run = (await s.member.post(`${s.base}/print-runs`, { sheetId: s.sheet.id, copies: 1, stockId: stock.id, result: 'good' })).body;
    const photo = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: { r: 200, g: 120, b: 90 } } })
      .jpeg()
      .toBuffer();
    await s.member.refreshCsrf();
    const bad = await s.member.agent
      .post(`${s.base}/print-runs/${run.id}/photo`)
      .set('x-csrf-token', s.member.csrf)
      .attach('photo', Buffer.from('not a photo'), 'x.jpg');
    expect(bad.status).toBe(422);
    const ok = await s.member.agent
      .post(`${s.base}/print-runs/${run.id}/photo`)
      .set('x-csrf-token', s.member.csrf)
      .attach('photo', photo, 'run.jpg');
    expect(ok.status).toBe(200);
    const back = await s.viewer.get(ok.body.photoUrl).buffer(true);
    expect(back.status).toBe(200);
    expect(await sharp(back.body as Buffer).metadata()).toMatchObject({ format: 'jpeg', width: 1600, height: 1067 });
  });
});

describe('preflight and cost', () => {
  it('finds errors on the server, refuses to export past them without a confirmation, then exports and lists them', async () => {
    const s = await shop(2, 40); // 40 mm apart, 44.35 mm across: the cut lines cross
    await s.owner.send('patch', `${s.base}/art/${s.art.id}`, { licence: { kind: 'personal' } });
    const forSale = await s.member.send('put', `${s.base}/sheets/${s.sheet.id}`, { version: 2, forSale: true });
    expect(forSale.status).toBe(200);
    const analysis = (await s.member.get(`${s.base}/sheets/${s.sheet.id}/analysis`)).body;
    expect(analysis.findings.map((f: { code: string; severity: string }) => `${f.code}:${f.severity}`).sort()).toEqual([
      'overlap:error',
      'personal-licence:error',
      'personal-licence:error',
    ]);
    const refused = await s.member.post(`${s.base}/sheets/${s.sheet.id}/exports`, { dpi: 150, formats: ['svg'] });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: 'preflight_errors', message: expect.stringContaining('3 errors') });
    const started = await s.member.post(`${s.base}/sheets/${s.sheet.id}/exports`, { dpi: 150, formats: ['svg'], acceptErrors: true });
    expect(started.status).toBe(202);
    let job = started.body;
    for (let i = 0; i < 80 && job.status === 'running'; i++) {
      await new Promise((r) => setTimeout(r, 250));
      job = (await s.member.get(`${s.base}/sheets/${s.sheet.id}/exports/${job.id}`)).body;
    }
    expect(job.status).toBe('done');
    const zip = await s.member
      .get(job.downloadUrl)
      .buffer(true)
      .parse((res, cb) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => cb(null, Buffer.concat(parts)));
      });
    const settings = await (await JSZip.loadAsync(zip.body as Buffer)).file('moons-settings.txt')!.async('string');
    expect(settings).toMatch(/ERROR: moon 1 and moon 2 overlap/);
  });

  it('prices a sheet from its stock, printer ink, blade wear and labour; the sheets list shows it', async () => {
    const s = await shop(3);
    const { stock, cutter } = await withCutter(s);
    const printer = (await s.owner.post(`${s.base}/machines`, { kind: 'printer', name: 'Inkjet', inkFullPage: 2 })).body;
    await s.owner.send('put', `${s.base}/shop-settings`, { currency: '$', labourRatePerHour: 18, markupPercent: 150 });
    const res = await s.member.send('put', `${s.base}/sheets/${s.sheet.id}/costing`, {
      stockId: stock.id,
      printerId: printer.id,
      cutterId: cutter.id,
      labourMinutes: 6,
    });
    expect(res.status).toBe(200);
    const { analysis, cost, missing } = res.body;
    expect(missing).toEqual([]);
    // The art is a solid #1b4f72 disk: per pixel c = 0.894, m = 0.690, y = 0.553 before black is taken out.
    const ink = analysis.coverage.total * analysis.printAreaShare * 2;
    expect(analysis.coverage.total).toBeGreaterThan(0.03);
    expect(cost.stock).toBeCloseTo(0.18, 10);
    expect(cost.ink).toBeCloseTo(ink, 10);
    expect(cost.blade).toBeCloseTo((analysis.cutLengthMm / 1000 / 600) * 9, 10);
    expect(cost.labour).toBeCloseTo(1.8, 10);
    expect(cost.sheet).toBeCloseTo(0.18 + ink + cost.blade + 1.8, 10);
    expect(cost.perSticker).toBeCloseTo(cost.sheet / 3, 10);
    expect(cost.suggestedSheet).toBeCloseTo(cost.sheet * 2.5, 10);
    const list = (await s.viewer.get(`${s.base}/sheets`)).body.sheets;
    expect(list[0].cost).toMatchObject({ currency: '$', current: true, sheet: expect.closeTo(cost.sheet, 6) });
  });
});
