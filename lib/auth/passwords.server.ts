import 'server-only';
import bcrypt from 'bcryptjs';

/** bcrypt cost: about 50–100 ms per hash on a small server, slow enough to resist guessing. */
const COST = 11;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

export function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  // Compare against a fixed hash when there is none, so a missing account takes as long as a wrong password.
  return bcrypt.compare(password, hash ?? '$2b$11$0000000000000000000000000000000000000000000000000000.');
}
