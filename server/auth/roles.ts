/** The roles an account can hold. */
export const ROLES = ['admin', 'teacher', 'student'] as const;

export type Role = (typeof ROLES)[number];

/** What the API shows of an account, and what a signed-in request carries as `req.user`. */
export interface PublicUser {
  readonly id: number;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport types req.user as Express.User; this gives it the account's shape.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends PublicUser {}
  }
}
