import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Knex } from 'knex';

/** The project's `migrations/` folder. */
export const MIGRATIONS_DIR = fileURLToPath(new URL('../migrations', import.meta.url));

/** File endings loaded as migrations (the server runs TypeScript directly under tsx). */
export const MIGRATION_EXTENSIONS: readonly string[] = ['.ts'];

const MIGRATION_FILE = /^\d{14}_[a-z0-9_-]+\.ts$/;

/**
 * Lists and loads migrations from {@link MIGRATIONS_DIR} with this module's own `import()`.
 *
 * Knex's built-in directory source imports files from inside node_modules, where only Node's
 * native loader applies: that works under `tsx` but not under Vitest, which transforms
 * TypeScript only for imports made from project code. Loading here works under both, and the
 * names recorded in `knex_migrations` are the plain file names, the same as the knex CLI's
 * directory source (see knexfile.ts) records.
 */
export class ProjectMigrationSource implements Knex.MigrationSource<string> {
  constructor(private readonly directory: string = MIGRATIONS_DIR) {}

  async getMigrations(): Promise<string[]> {
    const files = await readdir(this.directory);
    return files.filter((file) => MIGRATION_FILE.test(file)).sort();
  }

  getMigrationName(file: string): string {
    return file;
  }

  async getMigration(file: string): Promise<Knex.Migration> {
    const module = (await import(
      pathToFileURL(path.join(this.directory, file)).href
    )) as Knex.Migration;
    if (typeof module.up !== 'function' || typeof module.down !== 'function') {
      throw new Error(`Migration ${file} must export both up() and down().`);
    }
    return module;
  }
}
