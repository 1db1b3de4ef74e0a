import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { HttpError } from '../http-error';
import type { Mailer } from '../mail/mail-service';
import {
  AccountTokensRepository,
  type StoredToken,
  type TokenTable,
} from './account-tokens-repository';
import type { PasswordHasher } from './passwords';
import type { PublicUser, Role } from './roles';
import { INVITATION_TTL_MS, PASSWORD_RESET_TTL_MS, hashLinkToken, newLinkToken } from './tokens';
import { UsersRepository, normaliseEmail, toPublicUser } from './users-repository';

/** Someone to invite. */
export interface Invitee {
  readonly name: string;
  readonly email: string;
  readonly role: Exclude<Role, 'admin'>;
}

/** What an invitation page shows before the password is chosen. */
export interface InvitationView {
  readonly name: string;
  readonly email: string;
  readonly role: Role;
}

const ROLE_WORD: Record<Role, string> = {
  admin: 'an admin',
  teacher: 'a teacher',
  student: 'a student',
};

/**
 * Invitations and password resets: single-use links whose tokens are stored hashed. Invited
 * accounts exist from the start but stay disabled until the link is used.
 */
export class AccountLinksService {
  constructor(
    private readonly db: Knex,
    private readonly passwords: PasswordHasher,
    private readonly mailer: Mailer,
    private readonly publicUrl: string,
    private readonly now: () => Date = () => new Date(),
  ) {}

  /**
   * Creates the (disabled) account and its invitation, in `trx` when given so the caller can
   * link it (e.g. to a teacher's studio) atomically, and returns the account; the e-mail goes
   * out through {@link sendInvitation} once the transaction is committed.
   */
  async createInvitation(
    trx: Knex,
    invitee: Invitee,
    invitedBy: number,
  ): Promise<{ user: PublicUser; token: string }> {
    const users = new UsersRepository(trx);
    if (await users.findByEmail(invitee.email)) {
      throw new HttpError(
        409,
        'email_taken',
        'An account with this e-mail address already exists.',
        [{ path: 'body.email', message: 'An account with this e-mail address already exists.' }],
      );
    }
    // Nobody knows this password: the account opens only through the link.
    const unusable = await this.passwords.hash(randomBytes(32).toString('base64url'));
    const id = await users.insertOne({
      email: invitee.email,
      name: invitee.name,
      role: invitee.role,
      passwordHash: unusable,
      disabled: true,
    });
    const { token, hash } = newLinkToken();
    await new AccountTokensRepository(trx, 'invitations').insert({
      userId: id,
      hash,
      expiresAt: new Date(this.now().getTime() + INVITATION_TTL_MS),
      invitedBy,
    });
    return {
      user: toPublicUser({
        id,
        email: normaliseEmail(invitee.email),
        name: invitee.name,
        role: invitee.role,
      }),
      token,
    };
  }

  /**
   * A fresh invitation for an existing (invited or removed) account, replacing its unused ones;
   * returns the new token, to e-mail through {@link sendInvitation}.
   */
  async reissueInvitation(trx: Knex, userId: number, invitedBy: number): Promise<string> {
    const tokens = new AccountTokensRepository(trx, 'invitations');
    await tokens.retireAll(userId);
    const { token, hash } = newLinkToken();
    await tokens.insert({
      userId,
      hash,
      expiresAt: new Date(this.now().getTime() + INVITATION_TTL_MS),
      invitedBy,
    });
    return token;
  }

  /** E-mails the invitation link; a failure is the caller's 502. */
  async sendInvitation(user: PublicUser, token: string, inviterName: string): Promise<void> {
    try {
      await this.mailer.send(user.email, {
        subject: `${inviterName} invited you to Tensile`,
        greeting: `Hello ${user.name},`,
        blocks: [
          {
            text: `${inviterName} has invited you to Tensile as ${ROLE_WORD[user.role]}. Choose a password to open your account.`,
          },
          { link: `${this.publicUrl}/invitations/${token}`, label: 'Choose your password' },
          { text: 'The link works once and expires in 7 days.' },
        ],
      });
    } catch {
      throw new HttpError(
        502,
        'mail_not_sent',
        'The invitation was saved, but its e-mail could not be sent. Check the mail server and try again.',
      );
    }
  }

  async describeInvitation(token: string): Promise<InvitationView> {
    const stored = await this.usable('invitations', token);
    const user = await new UsersRepository(this.db).findById(stored.userId);
    if (!user) throw invalidLink();
    return { name: user.name, email: user.email, role: user.role };
  }

  /** Sets the password, opens the account and uses up the link; returns the account. */
  async acceptInvitation(token: string, password: string): Promise<PublicUser> {
    return this.useLink('invitations', token, password);
  }

  /**
   * Sends a reset link to an active account with this e-mail. Answers the same (nothing) when
   * there is none, so the form does not reveal who has an account.
   */
  async requestReset(email: string): Promise<void> {
    const user = await new UsersRepository(this.db).findByEmail(email);
    if (!user || user.disabled_at !== null) return;
    await this.sendReset(toPublicUser(user), false);
  }

  /** Issues a reset link for the account (replacing older ones) and e-mails it. */
  async sendReset(user: PublicUser, strict = true): Promise<void> {
    const tokens = new AccountTokensRepository(this.db, 'password_resets');
    await tokens.retireAll(user.id);
    const { token, hash } = newLinkToken();
    await tokens.insert({
      userId: user.id,
      hash,
      expiresAt: new Date(this.now().getTime() + PASSWORD_RESET_TTL_MS),
    });
    const content = {
      subject: 'Reset your Tensile password',
      greeting: `Hello ${user.name},`,
      blocks: [
        { text: 'Someone asked to reset the password of your Tensile account.' },
        { link: `${this.publicUrl}/reset-password/${token}`, label: 'Choose a new password' },
        {
          text: 'The link works once and expires in 1 hour. If you did not ask for it, ignore this e-mail: your password stays as it is.',
        },
      ],
    };
    if (!strict) {
      await this.mailer.trySend(user.email, content);
      return;
    }
    try {
      await this.mailer.send(user.email, content);
    } catch {
      throw new HttpError(
        502,
        'mail_not_sent',
        'The reset e-mail could not be sent. Check the mail server and try again.',
      );
    }
  }

  async describeReset(token: string): Promise<{ email: string }> {
    const stored = await this.usable('password_resets', token);
    const user = await new UsersRepository(this.db).findById(stored.userId);
    if (!user || user.disabled_at !== null) throw invalidLink();
    return { email: user.email };
  }

  async resetPassword(token: string, password: string): Promise<PublicUser> {
    return this.useLink('password_resets', token, password);
  }

  private async useLink(table: TokenTable, token: string, password: string): Promise<PublicUser> {
    const stored = await this.usable(table, token);
    const hash = await this.passwords.hash(password);
    return this.db.transaction(async (trx) => {
      const users = new UsersRepository(trx);
      const user = await users.findById(stored.userId);
      // A reset never reopens a deactivated account; only an invitation opens one.
      if (!user || (table === 'password_resets' && user.disabled_at !== null)) throw invalidLink();
      if (!(await new AccountTokensRepository(trx, table).markUsed(stored.id))) throw linkUsed();
      await users.updatePasswordHash(user.id, hash);
      if (table === 'invitations') await users.setDisabled(user.id, false);
      await new AccountTokensRepository(trx, 'password_resets').retireAll(user.id);
      return toPublicUser(user);
    });
  }

  private async usable(table: TokenTable, token: string): Promise<StoredToken> {
    const stored = await new AccountTokensRepository(this.db, table).findByHash(
      hashLinkToken(token),
    );
    if (!stored) throw invalidLink();
    if (stored.used) throw linkUsed();
    if (stored.expiresAt.getTime() <= this.now().getTime()) {
      throw new HttpError(410, 'link_expired', 'This link has expired. Ask for a new one.');
    }
    return stored;
  }
}

function invalidLink(): HttpError {
  return new HttpError(
    404,
    'invalid_link',
    'This link is not valid: copy it whole from the e-mail.',
  );
}

function linkUsed(): HttpError {
  return new HttpError(410, 'link_used', 'This link has already been used. Ask for a new one.');
}
