import { hashPassword, verifyPassword } from './passwords';
import type { PublicUser } from './roles';
import { toPublicUser, type UsersRepository } from './users-repository';

/**
 * Checks credentials. Unknown e-mail, wrong password and disabled account all give `undefined`
 * and take about the same time, so a caller cannot tell which accounts exist.
 */
export class AuthService {
  /** Compared against when the e-mail is unknown, so that case costs one bcrypt check too. */
  private readonly dummyHash: Promise<string>;

  constructor(
    private readonly users: UsersRepository,
    bcryptCost: number,
  ) {
    this.dummyHash = hashPassword('not-a-real-password', bcryptCost);
  }

  /** The account for these credentials, or `undefined` when they do not match an active one. */
  async verifyCredentials(email: string, password: string): Promise<PublicUser | undefined> {
    const row = await this.users.findByEmail(email);
    const matches = await verifyPassword(password, row?.password_hash ?? (await this.dummyHash));
    if (!row || !matches || row.disabled_at !== null) return undefined;
    return toPublicUser(row);
  }

  /** The active account for a session's stored id, or `undefined` if it is gone or disabled. */
  findSessionUser(id: number): Promise<PublicUser | undefined> {
    return this.users.findActiveById(id);
  }
}
