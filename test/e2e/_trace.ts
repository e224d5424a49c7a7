import { launch, serveApp, waitForEngine } from './harness';
import { setNumber, waitFresh } from './pageHelpers';
const served = await serveApp();
const b = await launch();
await b.page.goto(served.url);
await waitForEngine(b.page);
await waitFresh(b.page, ['scene', 'oval', 'sites', 'sweep']);
const cdp = await b.context.newCDPSession(b.page);
const events: any[] = [];
cdp.on('Tracing.dataCollected', (d: any) => events.push(...d.value));
const done = new Promise((r) => cdp.once('Tracing.tracingComplete', r));
await cdp.send('Tracing.start', { traceConfig: { includedCategories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'blink', 'gpu', 'cc', 'v8'] }, transferMode: 'ReportEvents' } as any);
for (let i = 0; i < 6; i++) {
  await setNumber(b.page, 'Dynamic pressure (nPa)', [1.5, 4, 9, 2.5, 6][i % 5]);
  await waitFresh(b.page, ['scene']);
}
await cdp.send('Tracing.end');
await done;
// main thread of the renderer: find tid with most 'RunTask'
const names = new Map<string, number>();
const byThread = new Map<string, number>();
for (const e of events) if (e.ph === 'X' && e.dur) { const k = `${e.pid}:${e.tid}`; byThread.set(k, (byThread.get(k) ?? 0) + (e.name === 'RunTask' ? e.dur : 0)); }
const threadNames = new Map<string, string>();
for (const e of events) if (e.ph === 'M' && e.name === 'thread_name') threadNames.set(`${e.pid}:${e.tid}`, e.args.name);
console.log([...byThread.entries()].sort((a, b) => b[1] - a[1]).slice(0, 6).map(([k, v]) => `${threadNames.get(k)} ${k} ${(v / 1000).toFixed(0)}ms`).join('\n'));
const main = [...threadNames.entries()].find(([, n]) => n === 'CrRendererMain')?.[0];
for (const e of events) if (e.ph === 'X' && e.dur && `${e.pid}:${e.tid}` === main && e.name !== 'RunTask' && e.name !== 'ThreadControllerImpl::RunTask') names.set(e.name, (names.get(e.name) ?? 0) + e.dur);
console.log([...names.entries()].sort((a, b) => b[1] - a[1]).slice(0, 25).map(([k, v]) => `${(v / 1000).toFixed(0)}ms ${k}`).join('\n'));
await b.close(); await served.close();
