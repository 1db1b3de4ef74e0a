import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { BUILT_IN_CURATION } from './built-in-curation';

const SEEDS = Array.from({ length: 20 }, (_, i) => `s${i}`);

describe('built-in curation', () => {
  it('curates every built-in preset', () => {
    expect(Object.keys(BUILT_IN_CURATION).sort()).toEqual(BUILT_IN_PRESETS.map((p) => p.id).sort());
  });

  // The level a preset is listed under is the one its drills are rated at: a teacher filtering
  // for beginners finds drills the difficulty rating also calls beginner.
  it('rates every preset at its declared level at 20 seeds', () => {
    const off: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      const declared = BUILT_IN_CURATION[preset.id]?.level;
      const card = parseRuleCard(preset.card);
      for (const seed of SEEDS) {
        const { level, score } = generateDrill(card, seed).difficulty;
        if (level !== declared)
          off.push(`${preset.id} ${seed}: ${level} ${score}, declared ${declared}`);
      }
    }
    expect(off).toEqual([]);
  });
});
