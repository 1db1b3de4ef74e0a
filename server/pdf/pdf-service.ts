import type { Readable } from 'node:stream';
import type { PublicUser } from '../auth/roles';
import type { BrandingService } from '../branding/branding-service';
import {
  resolveDrillSource,
  type DrillSource,
  type DrillSourceDeps,
} from '../exports/drill-source';
import { renderWorksheetPdf } from './render-worksheet';
import type { PrintAids, TempoLadder, WorksheetPrint } from './worksheet-print';

export interface DrillPdfRequest {
  readonly source: DrillSource;
  readonly paper: WorksheetPrint['paper'];
  readonly ladder?: TempoLadder;
  readonly aids?: PrintAids;
}

/** A ladder that climbs to the card's tempo from 20 BPM under it, 5 BPM at a time. */
export function defaultLadder(tempo: number): TempoLadder {
  return { start: Math.max(20, tempo - 20), target: tempo, step: 5 };
}

const ALL_AIDS: PrintAids = { sticking: true, counts: true, tension: true };

/** Single-drill sheets: the drill from its source, the teacher's branding, today's date. */
export class PdfService {
  constructor(
    private readonly sources: DrillSourceDeps,
    private readonly branding: BrandingService,
    private readonly publicUrl: string,
    private readonly today: () => string = () => new Date().toISOString().slice(0, 10),
  ) {}

  async drillPdf(
    user: PublicUser,
    request: DrillPdfRequest,
    signal?: AbortSignal,
  ): Promise<{ title: string; pdf: Readable }> {
    const resolved = await resolveDrillSource(this.sources, user, request.source);
    const brand = await this.branding.forPrint(user.id, user.name);
    const print: WorksheetPrint = {
      title: resolved.title,
      ...brand,
      date: this.today(),
      paper: request.paper,
      drills: [
        {
          title: resolved.title,
          card: resolved.card,
          drill: resolved.drill,
          seedLink: `${this.publicUrl}${resolved.link}`,
          ladder: request.ladder ?? defaultLadder(resolved.card.tempo),
          aids: request.aids ?? ALL_AIDS,
        },
      ],
    };
    return { title: resolved.title, pdf: await renderWorksheetPdf(print, signal) };
  }
}
