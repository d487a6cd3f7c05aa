import type { Piece, SheetDocument } from '@shared/sheet/document';
import type { Client } from './app';

/** A piece as the editor places it: upright, 38 mm wide, a 1/8 in white border, unlocked. */
export const testPiece = (id: string, artId: string, x: number, y: number, extra: Partial<Piece> = {}): Piece => ({
  id,
  artId,
  x,
  y,
  rotation: 0,
  width: 38,
  border: 3.175,
  borderColour: '#ffffff',
  locked: false,
  ...extra,
});

/** Saves `pieces` onto a sheet just created (version 1) through the API. */
export const placePieces = (client: Client, teamId: string, sheet: { id: string; document: SheetDocument }, pieces: Piece[]) =>
  client.send('put', `/api/teams/${teamId}/sheets/${sheet.id}`, { version: 1, document: { ...sheet.document, pieces } });

/** A cutter named "Bench cutter" with a 600 m blade fitted. */
export async function benchCutter(client: Client, teamId: string) {
  const cutter = (await client.post(`/api/teams/${teamId}/machines`, { kind: 'cutter', name: 'Bench cutter' })).body;
  await client.post(`/api/teams/${teamId}/machines/${cutter.id}/blades`, {
    label: 'Fine blade',
    fittedOn: '2026-11-20',
    lifeM: 600,
    price: 9,
  });
  return cutter;
}
