import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

const require = createRequire(import.meta.url);

function packageDir(name: string): string {
  return dirname(require.resolve(`${name}/package.json`));
}

/** Absolute paths of the music fonts that server-side notation rendering registers. */
export const MUSIC_FONT_FILES = {
  bravura: join(packageDir('@vexflow-fonts/bravura'), 'bravura.otf'),
  academico: join(packageDir('@vexflow-fonts/academico'), 'academico.otf'),
} as const;
