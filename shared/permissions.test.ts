import { describe, expect, it } from 'vitest';
import { assignableRoles, can, ROLE_PERMISSIONS, ROLES } from './permissions';

describe('permissions', () => {
  it('gives every role team.view and nests roles: each role may do all a lower role may', () => {
    for (let i = 0; i < ROLES.length - 1; i++) {
      const higher = ROLE_PERMISSIONS[ROLES[i]];
      for (const permission of ROLE_PERMISSIONS[ROLES[i + 1]]) expect(higher).toContain(permission);
    }
    for (const role of ROLES) expect(can(role, 'team.view')).toBe(true);
  });

  it('answers false for no role', () => {
    expect(can(null, 'team.view')).toBe(false);
  });

  it('lets only owners hand out the owner role', () => {
    expect(assignableRoles('owner')).toContain('owner');
    expect(assignableRoles('admin')).not.toContain('owner');
    expect(assignableRoles('member')).toEqual([]);
  });
});
