// The one table of what each team role may do. The server enforces it with
// `requirePermission`; the client reads it to hide what a role cannot do.

export const ROLES = ['owner', 'admin', 'member', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  'team.view': 'See the team, its members, shared art and sheets',
  'team.settings': 'Rename the team and change its settings',
  'team.members': 'Invite people, change roles and remove members',
  'team.delete': 'Delete the team',
  'library.manage': 'Create, rename, archive and reorder shared collections',
  'library.contribute': 'Upload art and add it to shared collections',
  'sheets.edit': 'Create, edit and print sheets',
  'shop.record': 'Log print runs, change blades and count stock on hand',
  'shop.manage': 'Add and change stock, printers, cutters, prices and shop rates',
  'orders.view': "See buyers' orders (prices too, unless the owner hides them from viewers)",
  'orders.quote': 'Add buyers, write quotes, send proofs and move orders through production',
  'orders.payments': 'Ask buyers for payment, refund, and cancel orders that have payments',
  'orders.money': 'See prices, payments, costs and margins on orders',
} as const;
export type Permission = keyof typeof PERMISSIONS;

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  owner: [
    'team.view',
    'team.settings',
    'team.members',
    'team.delete',
    'library.manage',
    'library.contribute',
    'sheets.edit',
    'shop.record',
    'shop.manage',
    'orders.view',
    'orders.quote',
    'orders.payments',
    'orders.money',
  ],
  admin: [
    'team.view',
    'team.settings',
    'team.members',
    'library.manage',
    'library.contribute',
    'sheets.edit',
    'shop.record',
    'shop.manage',
    'orders.view',
    'orders.quote',
    'orders.payments',
    'orders.money',
  ],
  member: ['team.view', 'library.contribute', 'sheets.edit', 'shop.record', 'orders.view', 'orders.quote', 'orders.money'],
  // A viewer also sees order prices unless the owner turns that off (shop settings: viewersSeePrices).
  viewer: ['team.view', 'orders.view'],
};

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  admin: 'Admin',
  member: 'Member',
  viewer: 'Viewer',
};

export function can(role: Role | null | undefined, permission: Permission): boolean {
  return role != null && ROLE_PERMISSIONS[role].includes(permission);
}

/** Roles a member with `actor` role may hand out or change. Only an owner makes owners. */
export function assignableRoles(actor: Role): Role[] {
  if (actor === 'owner') return [...ROLES];
  if (actor === 'admin') return ['admin', 'member', 'viewer'];
  return [];
}

/** Who acts, in which team, with which role: what services check permissions against. */
export type Actor = { userId: string; teamId: string; role: Role };
