/**
 * Browser benchmark (the app's responsiveness): in headless Debian Chromium, the median time
 * from a pressure change (typing into "Dynamic pressure (nPa)") to the frame
 * that first draws the new field lines, and to the frame that draws the
 * refined oval. Each change waits for every answer before the next one, so
 * the figures are per isolated change. With --json it also gives the median of each step
 * (src/app/perf.ts: request sent, answer back on the main thread, stored, geometry built,
 * React commit, drawn; the worker's compute time and the drawing frame's gl.render cost), ms
 * after the change, so the figures say where the time goes.
 * Run: npx tsx bench/browser.ts [--json] [--runs N]
 */
import { launch, serveApp, waitForEngine } from '../test/e2e/harness';
import { setNumber, waitFresh } from '../test/e2e/pageHelpers';

const argv = process.argv.slice(2);
const json = argv.includes('--json');
/** --raw: print every change's steps too (one JSON line each, before the summary). */
const raw = argv.includes('--raw');
const runsAt = argv.indexOf('--runs');
const runs = runsAt >= 0 ? Math.max(3, Number(argv[runsAt + 1]) || 20) : 20;

const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const pct = (v: number[], p: number) => [...v].sort((a, b) => a - b)[Math.min(v.length - 1, Math.floor(p * v.length))];

/** The median of every step over the changes that recorded it (ms). */
function stepMedians(rows: Record<string, number | undefined>[]): Record<string, number> {
  const keys = ['sent', 'answered', 'stored', 'built', 'committed', 'drawn', 'workerMs', 'renderMs'];
  const out: Record<string, number> = {};
  for (const k of keys) {
    const v = rows.map((r) => r[k]).filter((x): x is number => typeof x === 'number');
    if (v.length > 0) out[k] = +median(v).toFixed(1);
  }
  return out;
}

const served = await serveApp();
const b = await launch();
try {
  const t0 = Date.now();
  await b.page.goto(served.url);
  await waitForEngine(b.page);
  await waitFresh(b.page, ['scene', 'oval', 'sites', 'sweep']);
  const firstLoadMs = Date.now() - t0;
  const pressures = [2, 5, 3.5, 8, 1.5, 6, 2.5, 10, 4, 1.2, 7, 3, 9, 2.2, 5.5];
  const scene: number[] = [];
  const oval: number[] = [];
  type Steps = Record<string, number | undefined>;
  const steps: { scene: Steps[]; oval: Steps[] } = { scene: [], oval: [] };
  for (let i = 0; i < runs + 2; i++) {
    await setNumber(b.page, 'Dynamic pressure (nPa)', pressures[i % pressures.length]);
    const seq = await b.page.evaluate(() => (window as unknown as { __atlas: { store: { get(): { perf: { seq: number } } } } }).__atlas.store.get().perf.seq);
    const rec = await b.page.waitForFunction(
      (q) => {
        const r = (window as unknown as { __atlas: { perfRecords(): { seq: number; changedAt: number; sceneDrawnAt?: number; ovalDrawnAt?: number; scene?: object; oval?: object }[] } }).__atlas.perfRecords().find((x) => x.seq === q);
        return r && r.sceneDrawnAt !== undefined && r.ovalDrawnAt !== undefined ? r : null;
      },
      seq,
      { timeout: 120_000, polling: 10 },
    );
    const r = (await rec.jsonValue()) as { changedAt: number; sceneDrawnAt: number; ovalDrawnAt: number; scene?: Steps; oval?: Steps };
    await waitFresh(b.page, ['scene', 'oval', 'sites', 'sweep']);
    if (i < 2) continue; // warm-up
    scene.push(r.sceneDrawnAt - r.changedAt);
    oval.push(r.ovalDrawnAt - r.changedAt);
    steps.scene.push({ ...r.scene, drawn: r.sceneDrawnAt - r.changedAt });
    steps.oval.push({ ...r.oval, drawn: r.ovalDrawnAt - r.changedAt });
    if (raw) console.log(JSON.stringify({ pdynNpa: pressures[i % pressures.length], scene: steps.scene.at(-1), oval: steps.oval.at(-1) }));
  }
  const out = {
    runs,
    firstLoadToAllAnswersMs: firstLoadMs,
    pressureChangeToLinesDrawnMs: { median: +median(scene).toFixed(1), p90: +pct(scene, 0.9).toFixed(1), min: +Math.min(...scene).toFixed(1) },
    pressureChangeToRefinedOvalDrawnMs: { median: +median(oval).toFixed(1), p90: +pct(oval, 0.9).toFixed(1), min: +Math.min(...oval).toFixed(1) },
    stepsMedianMs: { scene: stepMedians(steps.scene), oval: stepMedians(steps.oval) },
    browser: (await b.context.browser()?.version()) ?? 'chromium (persistent context)',
  };
  if (json) console.log(JSON.stringify(out));
  else {
    console.log(`browser benchmark, ${runs} pressure changes (headless Chromium, software WebGL)`);
    console.log(`  first load → all answers        ${firstLoadMs} ms`);
    console.log(`  change → lines drawn            median ${out.pressureChangeToLinesDrawnMs.median} ms  p90 ${out.pressureChangeToLinesDrawnMs.p90} ms`);
    console.log(`  change → refined oval drawn     median ${out.pressureChangeToRefinedOvalDrawnMs.median} ms  p90 ${out.pressureChangeToRefinedOvalDrawnMs.p90} ms`);
    for (const w of ['scene', 'oval'] as const) console.log(`  ${w} steps (median ms after the change): ${Object.entries(out.stepsMedianMs[w]).map(([k, v]) => `${k} ${v}`).join(', ')}`);
  }
} finally {
  await b.close();
  await served.close();
}
