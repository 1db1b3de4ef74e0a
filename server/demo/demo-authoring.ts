import { findBuiltInPreset } from '../../shared/generator/presets/index';
import type { Level } from '../rule-cards/card-fields';

/** A demo teacher's rule card, with the drills saved from it. */
export interface DemoCard {
  readonly owner: string;
  readonly title: string;
  readonly card: unknown;
  readonly tags: readonly string[];
  readonly level: Level;
  /** The preset it was started from, credited on the card. */
  readonly fromPreset?: string;
  readonly drills: readonly DemoDrill[];
  /** Promote a copy to the presets (published, credited to the teacher). */
  readonly promote?: { readonly summary: string };
}

export interface DemoDrill {
  readonly title: string;
  readonly notes: string;
  readonly seed: string;
  /** Give it a live share link. */
  readonly shared?: boolean;
}

const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

function presetCard(id: string): Record<string, unknown> {
  const preset = findBuiltInPreset(id);
  if (!preset) throw new Error(`The demo data names a missing built-in preset: ${id}`);
  return structuredClone(preset.card) as Record<string, unknown>;
}

/** The invented Larkspur teachers' own material. */
export function demoCards(): DemoCard[] {
  return [
    {
      owner: TOMASZ,
      title: 'Pushed backbeat, eight bars',
      card: { ...presetCard('early-backbeat'), bars: 8, tempo: 84 },
      tags: ['displacement'],
      level: 'beginner',
      fromPreset: 'early-backbeat',
      drills: [
        {
          title: 'Pushed backbeat for Juno',
          notes: 'Keep the hi-hat steady; the snare leans in a sixteenth early.',
          seed: 'juno-week-3',
          shared: true,
        },
        { title: 'Pushed backbeat, second take', notes: '', seed: 'meadow-417' },
      ],
    },
    {
      owner: TOMASZ,
      title: 'Seven-eight with a ghosted snare',
      card: { ...presetCard('seven-eight-two-two-three'), tempo: 132 },
      tags: ['odd meter'],
      level: 'advanced',
      drills: [{ title: '7/8 warm-up', notes: 'Count 1-2, 1-2, 1-2-3.', seed: 'harbour-12' }],
      promote: {
        summary:
          'A slower 7/8 in 2+2+3 with the snare ghosting between the accents. Count the groups aloud before playing.',
      },
    },
    {
      owner: HANA,
      title: 'Linear sixteenths, toms included',
      card: presetCard('linear-sixteenths'),
      tags: ['linear'],
      level: 'intermediate',
      fromPreset: 'linear-sixteenths',
      drills: [
        {
          title: 'Linear study for Felix',
          notes: 'No two limbs together. Start at 60.',
          seed: 'felix-linear-1',
        },
      ],
    },
    {
      owner: HANA,
      title: 'Build up and let go',
      card: { ...presetCard('tension-and-release'), tempo: 92 },
      tags: ['release'],
      level: 'intermediate',
      drills: [],
    },
  ];
}
