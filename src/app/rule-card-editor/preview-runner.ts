import { Observable } from 'rxjs';
import type { DrillBar } from '../../../shared/generator/index';
import type { CardDraft } from './card-draft';
import { previewOutcome, type PreviewOutcome } from './card-preview-outcome';
import type { PreviewRequest } from './preview-worker';

export interface PreviewInput {
  readonly card: CardDraft;
  readonly seed: string;
  readonly keep: readonly DrillBar[];
}

/** Runs previews; `dispose` ends its worker. */
export interface PreviewRunner {
  run(input: PreviewInput): Observable<PreviewOutcome>;
  dispose(): void;
}

/**
 * Previews in a Web Worker (one at a time): unsubscribing from a preview still being worked on
 * ends that worker, so the newest edit never queues behind an outdated one. Where there are no
 * workers (unit tests under jsdom) the engine runs in place.
 */
export function previewRunner(): PreviewRunner {
  if (typeof Worker === 'undefined') {
    return {
      run: ({ card, seed, keep }) =>
        new Observable((out) => {
          out.next(previewOutcome(card, seed, keep));
          out.complete();
        }),
      dispose: () => undefined,
    };
  }
  let worker: Worker | null = null;
  let nextId = 0;
  return {
    run: (input) =>
      new Observable<PreviewOutcome>((out) => {
        const current = (worker ??= new Worker(new URL('./preview-worker', import.meta.url), {
          type: 'module',
        }));
        const id = ++nextId;
        let done = false;
        const onMessage = (event: MessageEvent<{ id: number; outcome: PreviewOutcome }>) => {
          if (event.data.id !== id) return;
          done = true;
          out.next(event.data.outcome);
          out.complete();
        };
        const onError = (event: ErrorEvent) => {
          done = true;
          out.next({
            status: 'failed',
            message: `The preview could not be generated: ${event.message || 'the engine stopped.'}`,
          });
          out.complete();
          worker?.terminate();
          worker = null;
        };
        current.addEventListener('message', onMessage);
        current.addEventListener('error', onError);
        const request: PreviewRequest = { id, ...input };
        current.postMessage(request);
        return () => {
          current.removeEventListener('message', onMessage);
          current.removeEventListener('error', onError);
          if (!done && worker === current) {
            worker.terminate();
            worker = null;
          }
        };
      }),
    dispose: () => {
      worker?.terminate();
      worker = null;
    },
  };
}
