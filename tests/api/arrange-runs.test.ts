// Auto-arrange on the shop's server: queued on BullMQ (the real Redis), done by the app's embedded
// worker on its threads, read back while it runs; shapes from ESICUP jakobs1 (../shared/nesting/).
import { describe, expect, it } from 'vitest';
import type { ArrangeResult } from '@shared/arrange/nester';
import { checkLayout, esicupItems } from '../helpers/arrange-check';
import { Client, makeTeamWithRoles, useTestApp } from '../helpers/app';

const t = useTestApp({ overrides: { ARRANGE_THREADS: 2 } });

async function sheetFor() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const member = new Client(t.sheetsmith.app);
  await member.signIn(users.member.email);
  const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Server arrange' });
  return { team, users, member, sheet, base: `/api/teams/${team.id}/sheets/${sheet.id}/arrange-runs` };
}

// jakobs1's shapes at sticker size: a 171.45 × 234.95 mm print area, 3.175 mm gap and margin.
const items = esicupItems('jakobs1', { stripHeight: 200 }).map((i) => ({
  ...i,
  count: 1,
  outline: {
    ...i.outline,
    points: i.outline.points.map((p) => ({ x: p.x / 4, y: p.y / 4 })),
    widthMm: i.outline.widthMm / 4,
    heightMm: i.outline.heightMm / 4,
  },
}));
const request = (timeMs: number) => ({
  items,
  options: { width: 171.45, height: 234.95, gap: 3.175, margin: 3.175, rotate: '90', fill: true, timeMs, seed: 2, maxSheets: 1 },
  locked: [],
});

async function until(client: Client, url: string, done: (body: { state: string }) => boolean) {
  for (let i = 0; i < 240; i++) {
    const res = await client.get(url);
    expect(res.status).toBe(200);
    if (done(res.body)) return res.body;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the arrange run did not get there');
}

describe('arrange runs on the server', () => {
  it('are queued, show the best so far while they run, and end with a valid layout', async () => {
    const { member, base } = await sheetFor();
    const started = await member.post(base, request(3000));
    expect(started.status).toBe(202);
    expect(started.body).toMatchObject({ state: 'waiting' });
    const done = await until(member, `${base}/${started.body.id}`, (b) => b.state === 'done');
    const result = done.result as ArrangeResult;
    expect(result.placed).toBeGreaterThan(items.length); // filled with more copies
    expect(done.progress.placed).toBeGreaterThan(0);
    checkLayout(items, result, { gap: 3.175, margin: 3.175 });
  }, 60_000);

  it('stop ends a long run at once with the best layout so far', async () => {
    const { member, base } = await sheetFor();
    const started = await member.post(base, request(120_000));
    await until(member, `${base}/${started.body.id}`, (b) => b.state === 'running' && Boolean((b as { progress?: unknown }).progress));
    const stoppedAt = Date.now();
    expect((await member.post(`${base}/${started.body.id}/stop`, {})).status).toBe(200);
    const done = await until(member, `${base}/${started.body.id}`, (b) => b.state === 'done');
    expect(Date.now() - stoppedAt).toBeLessThan(10_000);
    checkLayout(items, done.result, { gap: 3.175, margin: 3.175 });
    expect((await member.post(`${base}/${started.body.id}/stop`, {})).body.error.message).toBe('This arrange run has already finished.');
  }, 60_000);

  it('refuses bad requests in a maker’s words, answers 404 for another team, and viewers may not start one', async () => {
    const { member, base, users } = await sheetFor();
    const bad = await member.post(base, { ...request(1000), items: [{ ...items[0], count: 0 }] });
    expect(bad.status).toBe(400);
    expect(Object.values(bad.body.error.fields)).toContain('How many: at least 1');
    const long = await member.post(base, request(3_600_000));
    expect(long.status).toBe(400);
    expect(Object.values(long.body.error.fields)).toContain('At most 300 s on the server');
    const started = await member.post(base, request(500));
    const other = await sheetFor();
    expect((await other.member.get(`${base}/${started.body.id}`)).status).toBe(404);
    expect((await other.member.get(`${other.base}/${started.body.id}`)).status).toBe(404);
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(users.viewer.email);
    expect((await viewer.post(base, request(500))).status).toBe(403);
    expect((await viewer.get(`${base}/${started.body.id}`)).status).toBe(200);
  }, 60_000);

  // Seen in CI: a read at the moment the run ended answered "done" with no layout.
  it('never reads as done without its layout, however often it is asked as it ends', async () => {
    const { member, base } = await sheetFor();
    const started = await member.post(base, request(800));
    const url = `${base}/${started.body.id}`;
    const seen: { state: string; result: unknown }[] = [];
    const poll = async () => {
      for (;;) {
        const { body } = await member.get(url);
        seen.push(body);
        if (body.state === 'done' || body.state === 'failed' || seen.length > 20_000) return;
      }
    };
    await Promise.all(Array.from({ length: 6 }, poll));
    const done = seen.filter((b) => b.state === 'done');
    expect(done.length).toBeGreaterThan(0);
    expect(done.filter((b) => !b.result)).toHaveLength(0);
  }, 60_000);
});
