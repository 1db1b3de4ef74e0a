import type { Knex } from 'knex';
import type { AccountLinksService } from '../auth/account-links-service';
import { AccountTokensRepository } from '../auth/account-tokens-repository';
import type { PublicUser, Role } from '../auth/roles';
import { UsersRepository, toPublicUser } from '../auth/users-repository';
import { HttpError, notFound } from '../http-error';

/** An account as the admin's table shows it. */
export interface AdminUserView extends PublicUser {
  /** `invited`: no password chosen yet; `deactivated`: cannot sign in. */
  readonly status: 'active' | 'invited' | 'deactivated';
}

/** The admin's user management; the last active admin is always kept. */
export class UsersService {
  constructor(
    private readonly db: Knex,
    private readonly links: AccountLinksService,
  ) {}

  async list(): Promise<AdminUserView[]> {
    const rows = (await this.db('users as u')
      .select(
        'u.id',
        'u.email',
        'u.name',
        'u.role',
        'u.disabled_at',
        this.db.raw(
          '(select count(*) from invitations i where i.user_id = u.id and i.used_at is null) as open_invitations',
        ),
      )
      .orderByRaw("case u.role when 'admin' then 0 when 'teacher' then 1 else 2 end")
      .orderBy('u.name')
      .orderBy('u.id')) as {
      id: number;
      email: string;
      name: string;
      role: Role;
      disabled_at: unknown;
      open_invitations: number | string;
    }[];
    return rows.map((row) => ({
      ...toPublicUser(row),
      status:
        row.disabled_at === null
          ? 'active'
          : Number(row.open_invitations) > 0
            ? 'invited'
            : 'deactivated',
    }));
  }

  /** Creates a teacher's account and e-mails the invitation. */
  async inviteTeacher(
    admin: PublicUser,
    invitee: { name: string; email: string },
  ): Promise<AdminUserView> {
    const { user, token } = await this.db.transaction((trx) =>
      this.links.createInvitation(trx, { ...invitee, role: 'teacher' }, admin.id),
    );
    await this.links.sendInvitation(user, token, admin.name);
    return this.view(user.id);
  }

  /**
   * Changes the role and/or deactivates or reactivates. Refused (409 `last_admin`) when it would
   * leave no active admin; checked inside the transaction that writes.
   */
  async update(
    id: number,
    changes: { role?: Role | undefined; active?: boolean | undefined },
  ): Promise<AdminUserView> {
    await this.db.transaction(async (trx) => {
      const users = new UsersRepository(trx);
      const user = await users.findById(id);
      if (!user) throw notFound('No user with this id.');
      const losesAdmin =
        user.role === 'admin' &&
        user.disabled_at === null &&
        ((changes.role !== undefined && changes.role !== 'admin') || changes.active === false);
      if (losesAdmin && (await users.countActiveAdmins()) <= 1) {
        throw new HttpError(
          409,
          'last_admin',
          'This is the last active admin: make another admin first.',
        );
      }
      if (changes.role !== undefined) await users.setRole(id, changes.role);
      if (changes.active !== undefined) await users.setDisabled(id, !changes.active);
      // A deactivated account's open links must not reopen it.
      if (changes.active === false) {
        await new AccountTokensRepository(trx, 'invitations').retireAll(id);
        await new AccountTokensRepository(trx, 'password_resets').retireAll(id);
      }
    });
    return this.view(id);
  }

  /** E-mails a password reset link to an active account; `limit` may refuse it (429). */
  async sendReset(id: number, limit: (email: string) => void = () => undefined): Promise<void> {
    const user = await new UsersRepository(this.db).findById(id);
    if (!user) throw notFound('No user with this id.');
    if (user.disabled_at !== null) {
      throw new HttpError(409, 'user_inactive', 'This account is not active: reactivate it first.');
    }
    limit(user.email);
    await this.links.sendReset(toPublicUser(user));
  }

  private async view(id: number): Promise<AdminUserView> {
    const found = (await this.list()).find((u) => u.id === id);
    if (!found) throw notFound('No user with this id.');
    return found;
  }
}
