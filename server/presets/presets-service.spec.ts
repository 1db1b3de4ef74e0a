import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { engraveThumbnail } from './presets-service';

describe('engraveThumbnail', () => {
  it('draws a drill’s bars as a standalone SVG document', async () => {
    const card = parseRuleCard(findBuiltInPreset('early-backbeat')!.card);
    const drill = generateDrill(card, 'early-backbeat');
    const svg = await engraveThumbnail({ ...drill, bars: drill.bars.slice(0, 2) });
    expect(svg).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    // Staff lines, barlines and noteheads are paths: a drawn score has many.
    expect(svg.match(/<path/g)?.length ?? 0).toBeGreaterThan(10);
  });
});
