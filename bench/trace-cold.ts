/**
 * Where one cold load of the drill page spends its time: a Chromium trace of a few fresh
 * contexts, the renderer main thread's work before the score split by kind, the idle gaps, and
 * the resource waterfall. `TRACE_RUNS=3 TRACE_ROOT=<checkout> tsx bench/trace-cold.ts` (built).
 */
import { launchChromium, signIn, startServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';

const RUNS = Number(process.env['TRACE_RUNS'] ?? 3);
const DRILL = '/drills/early-backbeat?seed=harbor-spark-21';
const SCORE = 'tensile-drill-score svg .tensile-bar';

interface TraceEvent {
  name: string;
  cat: string;
  ph: string;
  pid: number;
  tid: number;
  ts: number;
  dur?: number;
  args?: Record<string, unknown> & { name?: string; data?: Record<string, unknown> };
}

declare global {
  interface Window {
    __scoreDrawnAt?: number;
  }
}

const server = await startServer(
  process.env['TRACE_ROOT'] ? { root: process.env['TRACE_ROOT'] } : {},
);
const browser = await launchChromium();
try {
  const login = await browser.newContext();
  const teacher = DEMO_TEACHERS[0]!;
  await signIn(await login.newPage(), server.url, teacher.email, teacher.password);
  const storageState = await login.storageState();
  await login.close();
  for (let run = 0; run < RUNS; run++) {
    const context = await browser.newContext({
      storageState,
      viewport: { width: 1280, height: 900 },
    });
    const page = await context.newPage();
    await page.addInitScript((selector: string) => {
      const observer = new MutationObserver(() => {
        if (document.querySelector(selector)) {
          window.__scoreDrawnAt = performance.now();
          performance.mark('score-drawn');
          observer.disconnect();
        }
      });
      document.addEventListener('DOMContentLoaded', () =>
        observer.observe(document.body, { childList: true, subtree: true }),
      );
    }, SCORE);
    await browser.startTracing(page, {
      categories: [
        'devtools.timeline',
        'disabled-by-default-devtools.timeline',
        'v8.execute',
        'blink.user_timing',
        'loading',
        'v8',
      ],
    });
    await page.goto(`${server.url}${DRILL}`);
    await page.waitForFunction(() => window.__scoreDrawnAt !== undefined, null, {
      timeout: 30_000,
    });
    await page.waitForTimeout(200);
    const buffer = await browser.stopTracing();
    const res = await page.evaluate(() => {
      const t0 = 0;
      return {
        drawn: window.__scoreDrawnAt!,
        entries: performance
          .getEntriesByType('resource')
          .map((e) => e as PerformanceResourceTiming)
          .filter((e) => e.startTime < window.__scoreDrawnAt!)
          .map((e) => ({
            name: new URL(e.name).pathname + new URL(e.name).search,
            start: e.startTime - t0,
            req: e.requestStart,
            resp: e.responseStart,
            end: e.responseEnd,
            size: e.encodedBodySize,
            init: e.initiatorType,
          })),
        nav: (() => {
          const n = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming;
          return { resp: n.responseStart, end: n.responseEnd, dcl: n.domContentLoadedEventEnd };
        })(),
        fcp: performance.getEntriesByName('first-contentful-paint')[0]?.startTime,
      };
    });
    await context.close();
    const events = (JSON.parse(buffer.toString()) as { traceEvents: TraceEvent[] }).traceEvents;
    const mainThreads = new Set(
      events
        .filter(
          (e) => e.ph === 'M' && e.name === 'thread_name' && e.args?.name === 'CrRendererMain',
        )
        .map((e) => `${e.pid}:${e.tid}`),
    );
    const nav = events.find(
      (e) => e.name === 'navigationStart' && mainThreads.has(`${e.pid}:${e.tid}`),
    );
    const mark = events.find((e) => e.name === 'score-drawn');
    if (!nav || !mark) {
      console.log('no navigationStart / mark');
      continue;
    }
    const thread = `${mark.pid}:${mark.tid}`;
    const t0 = nav.ts;
    const tEnd = mark.ts;
    const onMain = events.filter(
      (e) => `${e.pid}:${e.tid}` === thread && e.ph === 'X' && e.ts >= t0 - 1e5 && e.ts < tEnd,
    );
    const tasks = onMain.filter((e) => e.name === 'RunTask').sort((a, b) => a.ts - b.ts);
    let busy = 0;
    for (const t of tasks) busy += Math.min(t.ts + (t.dur ?? 0), tEnd) - Math.max(t.ts, t0);
    // Self time by event name, nested inside tasks: child time subtracted from parent.
    const kinds = [
      'EvaluateScript',
      'v8.compile',
      'v8.compileModule',
      'v8.evaluateModule',
      'V8.CompileCode',
      'v8.parseOnBackground',
      'FunctionCall',
      'RunMicrotasks',
      'TimerFire',
      'ParseHTML',
      'UpdateLayoutTree',
      'Layout',
      'Paint',
      'PrePaint',
      'Layerize',
      'ParseAuthorStyleSheet',
      'FireAnimationFrame',
      'EventDispatch',
      'XHRReadyStateChange',
      'ResourceReceivedData',
      'HitTest',
      'MajorGC',
      'MinorGC',
      'V8.GC_SCAVENGER',
      'BlinkGC.AtomicPhase',
    ];
    const top = new Map<string, number>();
    // Attribute each top-level task's time to the deepest known kind by self time.
    const sorted = onMain
      .filter((e) => kinds.includes(e.name) || e.name === 'RunTask')
      .sort((a, b) => a.ts - b.ts || (b.dur ?? 0) - (a.dur ?? 0));
    const stack: { e: TraceEvent; child: number }[] = [];
    const flush = (until: number): void => {
      while (
        stack.length &&
        stack[stack.length - 1]!.e.ts + (stack[stack.length - 1]!.e.dur ?? 0) <= until
      ) {
        const { e, child } = stack.pop()!;
        const self = (e.dur ?? 0) - child;
        top.set(e.name, (top.get(e.name) ?? 0) + self);
        if (stack.length) stack[stack.length - 1]!.child += e.dur ?? 0;
      }
    };
    for (const e of sorted) {
      flush(e.ts);
      stack.push({ e, child: 0 });
    }
    flush(Infinity);
    const ms = (us: number): string => (us / 1000).toFixed(0);
    console.log(
      `\nrun ${run}: drawn ${res.drawn.toFixed(0)} ms, html ${res.nav.resp.toFixed(0)}–${res.nav.end.toFixed(0)}, DCL ${res.nav.dcl.toFixed(0)}, FCP ${res.fcp?.toFixed(0)}; main thread busy ${ms(busy)} ms in ${tasks.length} tasks`,
    );
    console.log(
      '  self ms by kind: ' +
        [...top.entries()]
          .sort((a, b) => b[1] - a[1])
          .filter(([, v]) => v > 3000)
          .map(([k, v]) => `${k} ${ms(v)}`)
          .join(', '),
    );
    // Long tasks and idle gaps on the main thread.
    const long = tasks.filter((t) => (t.dur ?? 0) > 20000);
    console.log(
      '  tasks > 20 ms (start+dur): ' +
        long.map((t) => `${ms(t.ts - t0)}+${ms(t.dur ?? 0)}`).join(' '),
    );
    let last = t0;
    const gaps: string[] = [];
    for (const t of tasks) {
      if (t.ts - last > 15000) gaps.push(`${ms(last - t0)}→${ms(t.ts - t0)}`);
      last = Math.max(last, t.ts + (t.dur ?? 0));
    }
    console.log('  idle gaps > 15 ms: ' + gaps.join(' '));
    // Scripts evaluated: url → compile+eval.
    const evals = onMain
      .filter((e) => e.name === 'v8.evaluateModule' || e.name === 'EvaluateScript')
      .map((e) => `${ms(e.ts - t0)}+${ms(e.dur ?? 0)}`);
    console.log('  evaluations: ' + evals.join(' '));
    if (process.env['TRACE_FILES']) {
      for (const e of res.entries.sort((a, b) => a.end - b.end))
        console.log(
          `  ${e.start.toFixed(0).padStart(5)} ${e.req.toFixed(0).padStart(5)} ${e.resp.toFixed(0).padStart(5)} ${e.end.toFixed(0).padStart(5)} ${String(e.size).padStart(7)} ${e.init.padEnd(6)} ${e.name}`,
        );
    }
    const fnCalls = onMain
      .filter(
        (e) =>
          (e.name === 'FunctionCall' || e.name === 'TimerFire' || e.name === 'RunMicrotasks') &&
          (e.dur ?? 0) > 10000,
      )
      .map(
        (e) =>
          `${e.name}@${ms(e.ts - t0)}+${ms(e.dur ?? 0)}${e.args?.data?.['url'] ? ' ' + String(e.args.data['url']).split('/').pop() : ''}${e.args?.data?.['functionName'] ? ' ' + String(e.args.data['functionName']) : ''}`,
      );
    console.log('  calls > 10 ms: ' + fnCalls.join(' | '));
  }
} finally {
  await browser.close();
  await server.stop();
}
