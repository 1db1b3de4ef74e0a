import type { DrillBar } from '../../../shared/generator/index';
import type { CardDraft } from './card-draft';
import { previewOutcome } from './card-preview-outcome';

/** One preview asked of the worker; the answer carries the same id. */
export interface PreviewRequest {
  readonly id: number;
  readonly card: CardDraft;
  readonly seed: string;
  readonly keep: readonly DrillBar[];
}

// The engine runs here, off the page's main thread, so typing never waits for a generation.
addEventListener('message', (event: MessageEvent<PreviewRequest>) => {
  const { id, card, seed, keep } = event.data;
  postMessage({ id, outcome: previewOutcome(card, seed, keep) });
});
