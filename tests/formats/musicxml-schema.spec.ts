/**
 * Every MusicXML export validated against the official MusicXML 4.0 XSD (W3C Music Notation
 * Community Group, tag v4.0 of the w3c/musicxml repository) with xmllint (libxml2).
 *
 * The schema folder sits beside the checkout in CI (`../shared/musicxml-4.0/`); set
 * MUSICXML_XSD_DIR to use another. Where the folder or xmllint is missing the suite is skipped
 * and says why.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { drillToMusicXml } from '../../shared/formats/musicxml-export';
import { formatDrills } from './drills';

const repo = path.resolve(import.meta.dirname, '../..');
const schemaDir = path.resolve(
  repo,
  process.env['MUSICXML_XSD_DIR'] ?? path.join('..', 'shared', 'musicxml-4.0'),
);
const schema = path.join(schemaDir, 'musicxml.xsd');
const hasXmllint = spawnSync('xmllint', ['--version']).status === 0;
const missing = !existsSync(schema)
  ? `no MusicXML 4.0 schema at ${schemaDir} (set MUSICXML_XSD_DIR)`
  : !hasXmllint
    ? 'xmllint is not installed (Debian: libxml2-utils)'
    : null;
if (missing) console.warn(`Skipping MusicXML schema validation: ${missing}.`);

const dir = mkdtempSync(path.join(os.tmpdir(), 'tensile-musicxml-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** xmllint's verdict on files: exit status and what it printed. */
function validate(files: string[]): { status: number | null; output: string } {
  const run = spawnSync('xmllint', ['--noout', '--nonet', '--schema', schema, ...files], {
    env: { ...process.env, XML_CATALOG_FILES: path.join(schemaDir, 'catalog.xml') },
  });
  return { status: run.status, output: `${run.stdout}${run.stderr}` };
}

describe.skipIf(missing !== null)(
  `MusicXML 4.0 schema validation${missing ? ` (skipped: ${missing})` : ''}`,
  () => {
    it('accepts the export of every format drill', () => {
      const files = formatDrills().map(([name, drill], i) => {
        const file = path.join(dir, `drill-${i}.musicxml`);
        writeFileSync(file, drillToMusicXml(drill, name));
        return file;
      });
      const { status, output } = validate(files);
      expect(output).not.toMatch(/fails to validate|error/i);
      expect(status, output).toBe(0);
      for (const file of files) expect(output).toContain(`${file} validates`);
    });

    it('refuses a document the schema does not allow (the check can fail)', () => {
      const [[name, drill]] = formatDrills() as [[string, Parameters<typeof drillToMusicXml>[0]]];
      // A note without its duration is not MusicXML.
      const broken = drillToMusicXml(drill, name).replace(/<duration>\d+<\/duration>/, '');
      const file = path.join(dir, 'broken.musicxml');
      writeFileSync(file, broken);
      const { status, output } = validate([file]);
      expect(status).not.toBe(0);
      expect(output).toMatch(/fails to validate/);
    });

    it('is well-formed to xmllint alone', () => {
      const [[name, drill]] = formatDrills() as [[string, Parameters<typeof drillToMusicXml>[0]]];
      const file = path.join(dir, 'plain.musicxml');
      writeFileSync(file, drillToMusicXml(drill, name));
      expect(() => execFileSync('xmllint', ['--noout', '--nonet', file])).not.toThrow();
    });
  },
);
