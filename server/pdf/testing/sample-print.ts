/** Worksheets built from the built-in presets, for the PDF specs and the benchmark. */
import { generateDrill, parseRuleCard } from '../../../shared/generator/index';
import { findBuiltInPreset } from '../../../shared/generator/presets/index';
import type { PrintAids, WorksheetPrint, WorksheetPrintDrill } from '../worksheet-print';

export const ALL_AIDS: PrintAids = { sticking: true, counts: true, tension: true };

/** A preset's drill at `bars` bars, linked as the drill page would link it. */
export function presetDrill(
  presetId: string,
  bars: number,
  seed: string,
  aids: PrintAids = ALL_AIDS,
): WorksheetPrintDrill {
  const preset = findBuiltInPreset(presetId);
  if (!preset) throw new Error(`No built-in preset ${presetId}`);
  const card = parseRuleCard({ ...(preset.card as object), bars });
  return {
    title: preset.title,
    card,
    drill: generateDrill(card, seed),
    seedLink: `https://larkspur.test/drills/${presetId}?seed=${encodeURIComponent(seed)}`,
    ladder: { start: 60, target: 92, step: 4 },
    aids,
  };
}

export function samplePrint(
  drills: readonly WorksheetPrintDrill[],
  paper: WorksheetPrint['paper'] = 'a4',
): WorksheetPrint {
  return {
    title: 'Week 12: placing the backbeat',
    notes: 'Play each drill twice at every tempo before ticking it.',
    studioName: 'Larkspur Rhythm School',
    date: '2026-12-02',
    paper,
    drills,
  };
}

/** Eight presets that generate 16-bar drills (the benchmark's worksheet). */
export const BENCH_PRESETS = [
  'kick-off-the-one',
  'three-off-land-on-four',
  'early-backbeat',
  'late-backbeat-over-the-bar-line',
  'ride-with-foot-on-2-and-4',
  'linear-sixteenths',
  'cuban-style-bass',
  'quintuplets-hihat-1-3-5',
] as const;
