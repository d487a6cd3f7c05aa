import type { Role } from '../shared/permissions';

// The invented demo shop: a two-table studio that sells watercolour critter stickers at weekend
// markets. Names, shop and art are made up for Sheetsmith's demo.
export const DEMO_SHOP = 'Puddlejump Paper Co.';
export const DEMO_PASSWORD = 'sheetsmith-demo';

export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; role: Role }> = [
  { email: 'owner@demo.test', name: 'Wren Abernathy', role: 'owner' },
  { email: 'admin@demo.test', name: 'Teodor Quill', role: 'admin' },
  { email: 'member@demo.test', name: 'Marisol Fenwick', role: 'member' },
  { email: 'viewer@demo.test', name: 'Ossian Pike', role: 'viewer' },
];
