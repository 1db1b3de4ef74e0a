import type { Knex } from 'knex';
import { UsersRepository } from '../auth/users-repository';
import { DrillsRepository } from '../drills/drills-repository';
import { PresetsRepository } from '../presets/presets-repository';
import type { ItemInput } from '../worksheets/worksheet-schemas';
import { WorksheetsRepository } from '../worksheets/worksheets-repository';
import { WorksheetsService } from '../worksheets/worksheets-service';

/** A demo worksheet: its owner, and its drills by saved-drill title or preset at a seed. */
interface DemoWorksheet {
  readonly owner: string;
  readonly title: string;
  readonly notes: string;
  readonly items: readonly (
    | { readonly savedTitle: string; readonly ladder: ItemInput['ladder'] }
    | { readonly presetId: string; readonly seed: string; readonly ladder: ItemInput['ladder'] }
  )[];
}

const DEMO_WORKSHEETS: readonly DemoWorksheet[] = [
  {
    owner: 'tomasz.reyes@larkspur.test',
    title: 'Juno, week 3: leaning on the backbeat',
    notes: 'Ten minutes a drill. Tick a box only when two clean passes in a row feel easy.',
    items: [
      { savedTitle: 'Pushed backbeat for Juno', ladder: { start: 64, target: 84, step: 4 } },
      {
        presetId: 'kick-off-the-one',
        seed: 'juno-week-3',
        ladder: { start: 60, target: 80, step: 5 },
      },
      { savedTitle: '7/8 warm-up', ladder: { start: 96, target: 132, step: 6 } },
    ],
  },
  {
    owner: 'hana.lindqvist@larkspur.test',
    title: 'Felix: linear and four over three',
    notes: '',
    items: [
      { savedTitle: 'Linear study for Felix', ladder: { start: 60, target: 76, step: 4 } },
      {
        presetId: 'four-over-three',
        seed: 'felix-4-3',
        ladder: { start: 60, target: 72, step: 4 },
      },
    ],
  },
];

/**
 * Gives the demo teachers a worksheet each, built from their demo drills through the same service
 * the API uses. Runs only while no worksheet exists, so a restart adds nothing; a demo drill or
 * preset that is missing (removed since) is left out rather than failing the start.
 */
export async function seedDemoWorksheets(db: Knex): Promise<number> {
  return db.transaction(async (trx) => {
    const rows = new WorksheetsRepository(trx);
    if ((await rows.countAll()) > 0) return 0;
    const users = new UsersRepository(trx);
    const drills = new DrillsRepository(trx);
    const presets = new PresetsRepository(trx);
    const service = new WorksheetsService(rows, drills, presets);
    let added = 0;
    for (const demo of DEMO_WORKSHEETS) {
      const owner = await users.findByEmail(demo.owner);
      if (!owner) continue;
      const ownerId = Number(owner.id);
      const items: ItemInput[] = [];
      for (const item of demo.items) {
        const aids = { sticking: true, counts: true, tension: true };
        if ('presetId' in item) {
          const preset = await presets.find(item.presetId);
          if (!preset?.published) continue;
          items.push({
            source: { kind: 'preset', presetId: item.presetId, seed: item.seed },
            ladder: item.ladder,
            aids,
          });
          continue;
        }
        const found = await drills.list(ownerId, {
          page: 0,
          pageSize: 100,
          sort: 'createdAt',
          direction: 'asc',
          q: item.savedTitle,
        });
        const drill = found.items.find((d) => d.title === item.savedTitle);
        if (!drill) continue;
        items.push({ source: { kind: 'saved', drillId: drill.id }, ladder: item.ladder, aids });
      }
      if (items.length === 0) continue;
      await service.create(ownerId, { title: demo.title, notes: demo.notes, paper: 'a4', items });
      added += 1;
    }
    return added;
  });
}
