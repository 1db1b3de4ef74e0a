import type { UsersRepository } from '../auth/users-repository';

/** A student as a teacher's lists show them. */
export interface StudentSummary {
  readonly id: number;
  readonly name: string;
  readonly email: string;
}

/**
 * Names sort as people read them, whatever the database's collation: case and accents do not
 * push "de Vries" after "Zola" (SQLite's default BINARY collation would).
 */
const byName = new Intl.Collator('en', { sensitivity: 'base' });

/** The students a teacher (or an admin) can pick from, e.g. when assigning drills. */
export class StudentsService {
  constructor(private readonly users: Pick<UsersRepository, 'listActiveByRole'>) {}

  /**
   * Every active student, sorted by name (then id, so equal names keep a stable order).
   * For now the whole school; once the studio links students to teachers this will narrow to
   * the signed-in teacher's own students (admins keep seeing everyone).
   */
  async listStudents(): Promise<StudentSummary[]> {
    const students = await this.users.listActiveByRole('student');
    return students
      .map(({ id, name, email }) => ({ id, name, email }))
      .sort((a, b) => byName.compare(a.name, b.name) || a.id - b.id);
  }
}
