import type { PublicUser } from '../auth/roles';
import type { UsersRepository } from '../auth/users-repository';
import type { StudioRepository } from '../studio/studio-repository';

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
  constructor(
    private readonly users: Pick<UsersRepository, 'listActiveByRole'>,
    private readonly studio: Pick<StudioRepository, 'activeStudents'>,
  ) {}

  /**
   * A teacher's own active students (their studio); an admin sees every active student. Sorted
   * by name, then id, so equal names keep a stable order.
   */
  async listStudents(viewer: PublicUser): Promise<StudentSummary[]> {
    const students =
      viewer.role === 'admin'
        ? await this.users.listActiveByRole('student')
        : await this.studio.activeStudents(viewer.id);
    return students
      .map(({ id, name, email }) => ({ id, name, email }))
      .sort((a, b) => byName.compare(a.name, b.name) || a.id - b.id);
  }
}
