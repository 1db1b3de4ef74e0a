import type { PublicUser } from '../auth/roles';
import { resolveDrillSource, type DrillSourceDeps } from '../exports/drill-source';
import { HttpError, notFound } from '../http-error';
import type { PrintLogo, WorksheetPrint, WorksheetPrintDrill } from '../pdf/worksheet-print';
import type { SeedLinksRepository } from '../seed-links/seed-links-repository';
import type { Paper } from './worksheet-schemas';
import type { WorksheetsRepository } from './worksheets-repository';

/** The name (and logo) a teacher's printed worksheets carry. */
export interface StudioBranding {
  readonly studioName: string;
  readonly logo?: PrintLogo;
}

/** Finds a teacher's branding; until a studio has its own, the teacher's name heads the page. */
export type BrandingLookup = (user: PublicUser) => Promise<StudioBranding>;

export const teacherNameBranding: BrandingLookup = (user) =>
  Promise.resolve({ studioName: user.name });

export interface WorksheetPdfDeps {
  readonly worksheets: Pick<WorksheetsRepository, 'find'>;
  readonly sources: DrillSourceDeps;
  readonly links: Pick<SeedLinksRepository, 'liveFor'>;
  /** Absolute base of the links printed on paper (no trailing slash). */
  readonly publicUrl: string;
  readonly branding?: BrandingLookup;
  /** Today as an ISO day; injectable so tests can fix it. */
  readonly today?: () => string;
}

/**
 * Gathers what a printed worksheet shows: each item's drill (a saved drill's snapshot, a preset
 * regenerated at its seed), its ladder and aids, and a link a student can open. A saved drill
 * with a live share link prints that link, which anyone can open; otherwise the teacher's own
 * page for it.
 */
export async function worksheetPrint(
  deps: WorksheetPdfDeps,
  user: PublicUser,
  id: number,
  paper?: Paper,
): Promise<WorksheetPrint> {
  const sheet = await deps.worksheets.find(user.id, id);
  if (!sheet) throw notFound('There is no worksheet with that id among yours.');
  if (sheet.items.length === 0) {
    throw new HttpError(409, 'empty_worksheet', 'This worksheet has no drills to print yet.');
  }
  const drills: WorksheetPrintDrill[] = [];
  for (const [index, item] of sheet.items.entries()) {
    const resolved = await resolveDrillSource(deps.sources, user, item.source).catch(
      (error: unknown) => {
        if (!(error instanceof HttpError) || error.status !== 404) throw error;
        throw new HttpError(
          409,
          'not_printable',
          `Drill ${index + 1} can no longer be printed: its preset has been withdrawn. Take it off the worksheet or choose another.`,
        );
      },
    );
    const shared =
      item.source.kind === 'saved' ? await deps.links.liveFor(item.source.drillId) : undefined;
    const title =
      item.source.kind === 'preset'
        ? `${resolved.title} (seed ${item.source.seed})`
        : resolved.title;
    drills.push({
      title,
      card: resolved.card,
      drill: resolved.drill,
      seedLink: `${deps.publicUrl}${shared ? shared.url : resolved.link}`,
      ladder: item.ladder,
      aids: item.aids,
    });
  }
  const branding = await (deps.branding ?? teacherNameBranding)(user);
  return {
    title: sheet.title,
    ...(sheet.notes.trim() ? { notes: sheet.notes } : {}),
    studioName: branding.studioName,
    ...(branding.logo ? { logo: branding.logo } : {}),
    date: (deps.today ?? isoToday)(),
    paper: paper ?? sheet.paper,
    drills,
  };
}

function isoToday(): string {
  return new Date().toISOString().slice(0, 10);
}
