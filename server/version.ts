import { readFileSync } from 'node:fs';

/** The app's version, from package.json. */
export const APP_VERSION: string = (
  JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as {
    version: string;
  }
).version;
