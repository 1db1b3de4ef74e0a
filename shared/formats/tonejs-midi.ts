import * as tonejsMidi from '@tonejs/midi';

/**
 * `@tonejs/midi`'s `Midi` class. The package is CommonJS: Node's ESM loader hands its exports
 * over as the default export, a bundler as named ones.
 */
export const { Midi } =
  (tonejsMidi as unknown as { default?: typeof tonejsMidi }).default ?? tonejsMidi;
export type Midi = InstanceType<typeof Midi>;
