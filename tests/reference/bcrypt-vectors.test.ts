import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '../../server/modules/auth/passwords';

// Published bcrypt test vectors from Openwall's crypt_blowfish (Solar Designer), wrapper.c test
// table, used by OpenBSD and most bcrypt ports to check compatibility (recalled from memory; the
// test fails loudly if any digit is off). Cost 5 ("$2a$05$").
const VECTORS: Array<[password: string, hash: string]> = [
  ['U*U', '$2a$05$CCCCCCCCCCCCCCCCCCCCC.E5YPO9kmyuRGyh0XouQYb4YMJKvyOeW'],
  ['U*U*', '$2a$05$CCCCCCCCCCCCCCCCCCCCC.VGOzA784oUp/Z0DY336zx7pLYAy0lwK'],
  ['U*U*U', '$2a$05$XXXXXXXXXXXXXXXXXXXXXOAcXxm9kjPGEMsLznoKqmqw7tc8WCx4a'],
  ['', '$2a$05$CCCCCCCCCCCCCCCCCCCCC.7uG0VCzI2bS7j6ymqJi9CdcdxiRTWNy'],
];

describe('bcrypt against published vectors', () => {
  it.each(VECTORS)('hashes %j with the vector salt to exactly the published hash', (password, hash) => {
    const salt = hash.slice(0, 29);
    expect(bcrypt.hashSync(password, salt)).toBe(hash);
  });

  it.each(VECTORS)('verifies %j against its published hash through the product code', async (password, hash) => {
    expect(await verifyPassword(password, hash)).toBe(true);
    expect(await verifyPassword(`${password}x`, hash)).toBe(false);
  });

  it('hashes new passwords at cost 12', async () => {
    const hash = await hashPassword('a-password-to-hash');
    expect(bcrypt.getRounds(hash)).toBe(12);
    expect(await verifyPassword('a-password-to-hash', hash)).toBe(true);
  });
});
