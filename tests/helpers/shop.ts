// A print-shop fixture shared by the shop's API tests: a team with a signed-in owner, member and
// viewer, one sheet of circles, and (withCutter) a stock and a cutter with a fitted blade.
import { expect } from 'vitest';
import { svgArt } from './art';
import type { useTestApp } from './app';
import { Client, makeTeamWithRoles } from './app';
import { uploadFile } from './library';
import { placePieces, testPiece } from './sheets';

type TestApp = ReturnType<typeof useTestApp>;

export const STOCK = {
  name: 'Glossy inkjet sticker paper',
  finish: 'glossy',
  paper: 'letter',
  packPrice: 18,
  sheetsPerPack: 100,
  onHand: 10,
  cutterSettings: { material: 'Sticker paper, glossy', pressure: '3', passes: 1, blade: 'standard, depth 2' },
};

/** A team whose sheet holds `pieces` circles 44.35 mm across (38 mm art + 1/8 in border) on a 50 mm grid. */
export async function makeShop(t: TestApp, pieces = 3, spacing = 50) {
  const { team, users } = await makeTeamWithRoles(t.db);
  const clients = {} as Record<'owner' | 'member' | 'viewer', Client>;
  for (const role of ['owner', 'member', 'viewer'] as const) {
    clients[role] = new Client(t.sheetsmith.app);
    await clients[role].signIn(users[role].email);
  }
  const art = (
    await uploadFile(clients.member, team.id, await svgArt(600, 600, '<circle cx="300" cy="300" r="300" fill="#1b4f72"/>'), 'moon.png')
  ).body.results[0].item;
  const { body: sheet } = await clients.member.post(`/api/teams/${team.id}/sheets`, { name: 'Moons' });
  const saved = await placePieces(
    clients.member,
    team.id,
    sheet,
    Array.from({ length: pieces }, (_, i) => testPiece(`m${i}`, art.id, 40 + i * spacing, 40)),
  );
  expect(saved.status).toBe(200);
  return { team, users, ...clients, art, sheet: saved.body, base: `/api/teams/${team.id}` };
}
export type Shop = Awaited<ReturnType<typeof makeShop>>;

export async function withCutter(s: Shop, blade: Record<string, unknown> = {}) {
  const stock = (await s.owner.post(`${s.base}/stock`, STOCK)).body;
  const cutter = (await s.owner.post(`${s.base}/machines`, { kind: 'cutter', name: 'Desk cutter' })).body;
  const fitted = await s.member.post(`${s.base}/machines/${cutter.id}/blades`, {
    label: 'Standard blade #1',
    fittedOn: '2026-11-01',
    lifeM: 600,
    price: 9,
    ...blade,
  });
  expect(fitted.status).toBe(201);
  return { stock, cutter, blade: fitted.body.blade };
}
