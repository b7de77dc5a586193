import bcrypt from 'bcryptjs';

/** bcrypt work factor for stored passwords; tests pass a lower one to stay fast. */
export const DEFAULT_BCRYPT_COST = 10;

export function hashPassword(password: string, cost = DEFAULT_BCRYPT_COST): Promise<string> {
  return bcrypt.hash(password, cost);
}

// Compared against when the e-mail is unknown, so a wrong address costs as long as a wrong
// password and sign-in timing does not reveal which accounts exist.
const DUMMY_HASH = bcrypt.hashSync('no account has this password', 4);

export function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  return bcrypt.compare(password, hash ?? DUMMY_HASH);
}
