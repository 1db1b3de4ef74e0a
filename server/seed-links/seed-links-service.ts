import { randomBytes } from 'node:crypto';
import type { Drill } from '../../shared/generator/index';
import type { DrillsRepository } from '../drills/drills-repository';
import { HttpError, notFound } from '../http-error';
import type { SeedLink, SeedLinksRepository } from './seed-links-repository';

/** Random bytes in a link code: 128 bits, well over the 96 the product asks for. */
export const CODE_BYTES = 16;

/** A new link code: base64url, 22 characters. */
export function newCode(): string {
  return randomBytes(CODE_BYTES).toString('base64url');
}

/** What an anonymous visitor sees of a shared drill: nothing else of the teacher's. */
export interface SharedDrill {
  readonly title: string;
  readonly snapshot: Drill;
  readonly card: unknown;
  readonly teacherName: string;
}

const MISSING_DRILL = 'There is no saved drill with that id among yours.';

function withdrawn(): HttpError {
  return new HttpError(410, 'withdrawn', 'The teacher has withdrawn this drill.');
}

/** Share links: create (one live link per drill), revoke, and open by code. */
export class SeedLinksService {
  constructor(
    private readonly links: SeedLinksRepository,
    private readonly drills: Pick<DrillsRepository, 'find' | 'findShared'>,
    private readonly makeCode: () => string = newCode,
  ) {}

  /** The drill's live link, made now when there is none; `created` says which. */
  async share(ownerId: number, drillId: number): Promise<{ link: SeedLink; created: boolean }> {
    if (!(await this.drills.find(ownerId, drillId))) throw notFound(MISSING_DRILL);
    const live = await this.links.liveFor(drillId);
    if (live) return { link: live, created: false };
    await this.links.insert(drillId, this.makeCode());
    return { link: (await this.links.liveFor(drillId))!, created: true };
  }

  async revoke(ownerId: number, drillId: number): Promise<void> {
    if (!(await this.drills.find(ownerId, drillId))) throw notFound(MISSING_DRILL);
    await this.links.revokeAll(drillId);
  }

  /** Opens a link: counts the view and returns the drill as saved. 410 once revoked. */
  async open(code: string): Promise<SharedDrill> {
    const link = await this.links.findByCode(code);
    if (!link) {
      if (await this.links.wasWithdrawn(code)) throw withdrawn();
      throw notFound('There is no shared drill at this address.');
    }
    if (link.revokedAt !== null) throw withdrawn();
    const drill = await this.drills.findShared(link.drillId);
    if (!drill) throw notFound('There is no shared drill at this address.');
    await this.links.countView(code);
    return {
      title: drill.title,
      snapshot: drill.snapshot,
      card: drill.card,
      teacherName: drill.ownerName,
    };
  }
}
