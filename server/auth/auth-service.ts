import { errorFields, type Logger } from '../logger';
import type { PasswordHasher } from './passwords';
import type { PublicUser } from './roles';
import { toPublicUser, type UsersRepository } from './users-repository';

/**
 * Checks credentials. Unknown e-mail, wrong password and disabled account all give `undefined`
 * and take about the same time, so a caller cannot tell which accounts exist.
 */
export class AuthService {
  /** Checked against when the e-mail is unknown, so that case costs one scrypt too. */
  private readonly dummyHash: Promise<string>;

  constructor(
    private readonly users: UsersRepository,
    private readonly passwords: PasswordHasher,
    private readonly logger: Logger,
  ) {
    this.dummyHash = passwords.hash('not-a-real-password');
  }

  /** The account for these credentials, or `undefined` when they do not match an active one. */
  async verifyCredentials(email: string, password: string): Promise<PublicUser | undefined> {
    const row = await this.users.findByEmail(email);
    const stored = row?.password_hash ?? (await this.dummyHash);
    const matches = await this.passwords.verify(password, stored);
    if (!row || !matches || row.disabled_at !== null) return undefined;
    if (this.passwords.needsRehash(stored)) await this.rehash(row.id, password);
    return toPublicUser(row);
  }

  /** The active account for a session's stored id, or `undefined` if it is gone or disabled. */
  findSessionUser(id: number): Promise<PublicUser | undefined> {
    return this.users.findActiveById(id);
  }

  /**
   * Replaces an old hash (bcrypt, or weaker scrypt settings) now that the password is known.
   * A failure only postpones the upgrade to the next sign-in, so it must not refuse this one.
   */
  private async rehash(id: number, password: string): Promise<void> {
    try {
      await this.users.updatePasswordHash(id, await this.passwords.hash(password));
    } catch (error) {
      this.logger.warn('Could not upgrade a password hash', { userId: id, ...errorFields(error) });
    }
  }
}
