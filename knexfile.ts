import type { Knex } from 'knex';
import { loadConfig } from './server/config';
import { knexConfig } from './server/db';

/**
 * For the knex CLI, run under tsx so it can read TypeScript:
 * `npx tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest`.
 * The server itself migrates on start; this shares its configuration.
 */
const config: Knex.Config = knexConfig(loadConfig());

export default config;
