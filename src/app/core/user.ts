/** The three kinds of account in a Tensile studio. */
export type Role = 'admin' | 'teacher' | 'student';

/** The signed-in person as the server reports it from `/api/auth/me` and sign-in. */
export interface SessionUser {
  readonly id: number | string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
}

/** Where each role lands after signing in, and when opening `/`. */
export const ROLE_HOME: Readonly<Record<Role, string>> = {
  teacher: '/rule-cards',
  student: '/assignments',
  admin: '/presets',
};

/** Words for a role as shown to people (user menu, tables, snackbars). */
export const ROLE_LABEL: Readonly<Record<Role, string>> = {
  teacher: 'Teacher',
  student: 'Student',
  admin: 'Admin',
};

/** Narrows an unknown value from the server to a role. */
export function isRole(value: unknown): value is Role {
  return value === 'admin' || value === 'teacher' || value === 'student';
}
