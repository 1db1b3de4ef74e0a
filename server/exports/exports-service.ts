import { drillToMidi } from '../../shared/formats/midi-export';
import { drillToMusicXml } from '../../shared/formats/musicxml-export';
import type { PublicUser } from '../auth/roles';
import { fileSlug } from '../rule-cards/card-fields';
import { resolveDrillSource, type DrillSource, type DrillSourceDeps } from './drill-source';

/** A file to send: its name, media type and bytes. */
export interface ExportFile {
  readonly filename: string;
  readonly type: string;
  readonly body: Buffer;
}

/** Registered media types: IANA audio/midi and MusicXML's own (W3C MusicXML 4.0, "Files"). */
const MIDI_TYPE = 'audio/midi';
const MUSICXML_TYPE = 'application/vnd.recordare.musicxml+xml';

/** Drills as open-format files: Standard MIDI File and uncompressed MusicXML. */
export class ExportsService {
  constructor(private readonly deps: DrillSourceDeps) {}

  async midi(user: PublicUser, source: DrillSource): Promise<ExportFile> {
    const resolved = await resolveDrillSource(this.deps, user, source);
    return {
      filename: `${exportName(resolved.title, source)}.mid`,
      type: MIDI_TYPE,
      body: Buffer.from(drillToMidi(resolved.drill, resolved.title)),
    };
  }

  async musicXml(user: PublicUser, source: DrillSource): Promise<ExportFile> {
    const resolved = await resolveDrillSource(this.deps, user, source);
    return {
      filename: `${exportName(resolved.title, source)}.musicxml`,
      type: MUSICXML_TYPE,
      body: Buffer.from(drillToMusicXml(resolved.drill, resolved.title), 'utf8'),
    };
  }
}

/**
 * The file's name without extension: the title in plain letters, and for a preset its seed too
 * (one preset gives a different drill at every seed).
 */
export function exportName(title: string, source: DrillSource): string {
  const plain = (text: string) => {
    const ascii = text.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
    return /[a-z0-9]/i.test(ascii) ? fileSlug(ascii) : 'drill';
  };
  const name = plain(title);
  return source.kind === 'preset' ? `${name}-${plain(source.seed)}`.slice(0, 100) : name;
}
