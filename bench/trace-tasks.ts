/**
 * Reads a Chromium performance trace (the JSON of `browser.stopTracing()`): for each span the
 * page marked with `performance.mark(`${prefix}${n}-start`)` and `…-end`, the longest top-level
 * task ("RunTask") that ran on the page's main thread ("CrRendererMain") during it, in ms; or,
 * with `thread` set to "DedicatedWorker thread", the longest on a worker (the engine's run).
 */
interface TraceEvent {
  readonly name: string;
  readonly ph: string;
  readonly pid: number;
  readonly tid: number;
  readonly ts: number;
  readonly dur?: number;
  readonly args?: { readonly name?: string };
}

export function longestTasks(
  trace: { readonly traceEvents?: readonly TraceEvent[] } | readonly TraceEvent[],
  prefix: string,
  thread = 'CrRendererMain',
): Map<number, number> {
  const events: readonly TraceEvent[] = Array.isArray(trace)
    ? trace
    : ((trace as { traceEvents?: readonly TraceEvent[] }).traceEvents ?? []);
  const threads = new Set(
    events
      .filter((e) => e.ph === 'M' && e.name === 'thread_name' && e.args?.name === thread)
      .map((e) => `${e.pid}:${e.tid}`),
  );
  const spans = new Map<number, { start?: number; end?: number; thread?: string }>();
  const mark = new RegExp(`^${prefix}(-?\\d+)-(start|end)$`);
  for (const e of events) {
    const found = mark.exec(e.name);
    if (!found) continue;
    const span = spans.get(Number(found[1])) ?? {};
    span[found[2] as 'start' | 'end'] = e.ts;
    span.thread = `${e.pid}:${e.tid}`;
    spans.set(Number(found[1]), span);
  }
  const tasks = events.filter(
    (e) => e.ph === 'X' && e.name === 'RunTask' && threads.has(`${e.pid}:${e.tid}`),
  );
  const longest = new Map<number, number>();
  for (const [run, { start, end, thread: page }] of spans) {
    if (start === undefined || end === undefined) continue;
    let worst = 0;
    for (const task of tasks) {
      const taskEnd = task.ts + (task.dur ?? 0);
      // A task overlapping the span counts (the marks themselves run inside tasks).
      // The page's own thread, or a worker of the page's process.
      const own = thread === 'CrRendererMain' ? `${task.pid}:${task.tid}` === page : true;
      if (own && taskEnd > start && task.ts < end) worst = Math.max(worst, (task.dur ?? 0) / 1000);
    }
    longest.set(run, worst);
  }
  return longest;
}
