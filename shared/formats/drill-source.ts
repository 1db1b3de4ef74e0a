import type { DrillBar } from '../generator/drill';

/**
 * Which drill an export, a PDF or a worksheet entry is about: a preset at a seed, one of the
 * teacher's saved drills, or a card as the editor holds it (with its pinned bars). The server
 * validates it with `drillSourceSchema` (server/exports/drill-source.ts); the browser sends it.
 */
export type DrillSource =
  | { readonly kind: 'preset'; readonly presetId: string; readonly seed: string }
  | { readonly kind: 'saved'; readonly drillId: number }
  | {
      readonly kind: 'card';
      readonly card: unknown;
      readonly seed: string;
      readonly keep?: readonly DrillBar[];
    };
