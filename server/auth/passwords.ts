import bcrypt from 'bcryptjs';

/** Hashes a password with bcrypt at the given cost (log2 rounds). */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

/** True when `password` matches the bcrypt `hash`. */
export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
