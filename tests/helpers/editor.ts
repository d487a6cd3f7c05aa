import type { Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { svgArt } from './art';
import { Client, makeTeamWithRoles } from './app';
import { uploadFile } from './library';

/** A team whose member uploaded three shapes (circle, rounded square, triangle), signed in through the API. */
export async function teamWithShapes(db: DataSource, url: string) {
  const { team, users } = await makeTeamWithRoles(db);
  const client = new Client(url);
  await client.signIn(users.member.email);
  const shapes = [
    '<circle cx="300" cy="300" r="270" fill="#1f618d"/>',
    '<rect x="45" y="45" width="510" height="510" rx="90" fill="#b9770e"/>',
    '<path d="M300 30 L570 570 L30 570 Z" fill="#7d3c98"/>',
  ];
  const art = [];
  for (const [i, shape] of shapes.entries())
    art.push(
      (await uploadFile(client, team.id, await svgArt(1200, 1200, `<g transform="scale(2)">${shape}</g>`), `shape-${i + 1}.png`)).body
        .results[0].item,
    );
  return { team, users, client, art };
}

/**
 * Screen position (page px) of a point given in sheet millimetres. The canvas re-fits itself when
 * its box changes (a full-page screenshot resizes the page for a moment, panels grow as data
 * arrives), so the position is read until two readings 150 ms apart agree.
 */
export async function screenOf(page: Page, mm: { x: number; y: number }) {
  const canvas = page.getByTestId('sheet-canvas');
  const read = async () => {
    const box = (await canvas.boundingBox())!;
    const [ox, oy] = (await canvas.getAttribute('data-origin'))!.split(',').map(Number);
    const scale = Number(await canvas.getAttribute('data-px-per-mm'));
    return { x: box.x + ox + mm.x * scale, y: box.y + oy + mm.y * scale };
  };
  let last = await read();
  for (let i = 0; i < 20; i++) {
    await page.waitForTimeout(150);
    const next = await read();
    if (next.x === last.x && next.y === last.y) return next;
    last = next;
  }
  throw new Error('The sheet canvas kept moving');
}

export const sheetOf = async (client: Client, teamId: string, id: string) => (await client.get(`/api/teams/${teamId}/sheets/${id}`)).body;
