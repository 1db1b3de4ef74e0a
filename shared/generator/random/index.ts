export { createRng } from './rng';
export type { Rng } from './rng';
