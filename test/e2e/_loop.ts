import { launch, serveApp, waitForEngine } from './harness';
import { setNumber, waitFresh } from './pageHelpers';
const served = await serveApp();
const b = await launch();
await b.page.goto(served.url);
await waitForEngine(b.page);
await waitFresh(b.page, ['scene', 'oval', 'sites', 'sweep']);
if (process.env.HIDE) await b.page.addStyleTag({ content: process.env.HIDE + ' { display: none !important; }' });
await b.page.evaluate(() => { (window as any).__lt = []; new PerformanceObserver((l) => l.getEntries().forEach((e) => (window as any).__lt.push(Math.round(e.duration)))).observe({ type: 'longtask' }); });
const t0 = Date.now();
for (let i = 0; i < 12; i++) {
  await setNumber(b.page, 'Dynamic pressure (nPa)', [1.5, 4, 9, 2.5, 6][i % 5]);
  await waitFresh(b.page, ['scene']);
}
console.log('12 changes', Date.now() - t0, 'ms; long tasks', await b.page.evaluate(() => (window as any).__lt.join(',')));
console.log(JSON.stringify(await b.page.evaluate(() => (window as any).__atlas.renderStats().slice(-12).map((r: any) => `${r.ms.toFixed(0)}ms/${r.calls}/${r.prims}`))));
await b.close(); await served.close();
