import bcrypt from 'bcryptjs';
import { env } from '../../config/env';

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, env.BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

// Compared against when the e-mail is unknown, so a wrong e-mail costs the same time as a wrong
// password and timing does not tell which accounts exist.
const DUMMY_HASH = bcrypt.hashSync('sheetsmith-no-such-account', 12);
export async function burnPasswordCheck(password: string): Promise<false> {
  await bcrypt.compare(password, DUMMY_HASH);
  return false;
}
