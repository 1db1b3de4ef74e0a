/**
 * The demo school's accounts, seeded on a fresh server's first start. The passwords are
 * local-only demo values, never used outside a demo database.
 */
export type DemoRole = 'admin' | 'teacher' | 'student';

export interface DemoAccount {
  readonly role: DemoRole;
  readonly email: string;
  readonly password: string;
}

export const DEMO_ADMIN: DemoAccount = {
  role: 'admin',
  email: 'imogen.vale@larkspur.test',
  password: 'larkspur-admin',
};

export const DEMO_TEACHERS: readonly DemoAccount[] = [
  { role: 'teacher', email: 'tomasz.reyes@larkspur.test', password: 'larkspur-teacher' },
  { role: 'teacher', email: 'hana.lindqvist@larkspur.test', password: 'larkspur-teacher' },
];

export const DEMO_STUDENTS: readonly DemoAccount[] = [
  { role: 'student', email: 'juno.marsh@larkspur.test', password: 'larkspur-student' },
  { role: 'student', email: 'felix.abara@larkspur.test', password: 'larkspur-student' },
  { role: 'student', email: 'noor.castellan@larkspur.test', password: 'larkspur-student' },
  { role: 'student', email: 'wren.okoye@larkspur.test', password: 'larkspur-student' },
];
