/**
 * Browser benchmark, timeline scrubbing (headless Debian Chromium, production
 * build, through the e2e harness): the invented demo storm (72 hourly steps)
 * with 8 sites; per cursor move (window.__atlasTimeline.moveCursor, as the
 * slider does) the time to the first frame after
 *  - table: the sites table holds the step's answer (filled from the site timelines, or the sites channel's);
 *  - maps: the oval for the step is in the store (kept, or the oval channel's);
 *  - own: the sites channel's own answer (field lines, CGM) replaced a filled table.
 * Each move waits for all three before the next, so the figures are per isolated move.
 *  1. cold: moves right after the series is loaded (site timelines and ovals ahead not in yet);
 *  2. warm: once the site timelines and the ovals ahead are in, `--rounds` rounds of `--scrubs`
 *     moves each to steps in a fixed shuffled order; medians per round, and their range.
 * Run: npx tsx bench/timeline-browser.ts [--json] [--rounds 3] [--scrubs 24] [--cold 5]
 * Not a section of `npm run bench` (several minutes on a loaded machine).
 */
import { launch, serveApp, waitForEngine } from '../test/e2e/harness';
import { waitFresh } from '../test/e2e/pageHelpers';
import type { Page } from 'playwright-core';

const argv = process.argv.slice(2);
const json = argv.includes('--json');
const num = (flag: string, dflt: number) => { const i = argv.indexOf(flag); return i >= 0 ? Math.max(1, Number(argv[i + 1]) || dflt) : dflt; };
const rounds = num('--rounds', 3);
const scrubs = num('--scrubs', 24);
const coldMoves = num('--cold', 5);

const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  return s.length === 0 ? NaN : s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

interface Move { step: number; table: number; maps: number; own: number }

/** One cursor move, timed in the page (performance.now()), to the frame after each answer. */
function move(page: Page, step: number): Promise<Move> {
  return page.evaluate((k) => new Promise<Move>((res, rej) => {
    type S = { conditions: unknown; products: unknown; sites: unknown; siteResults: { fromTimeline?: boolean } | null; answeredFor: Record<string, { conditions: unknown; products: unknown; sites: unknown } | undefined> };
    const w = window as unknown as { __atlas: { store: { get(): S; subscribe(f: (s: S) => void): () => void } }; __atlasTimeline: { moveCursor(i: number): void } };
    const t0 = performance.now();
    const out = { step: k, table: -1, maps: -1, own: -1 };
    const fresh = (s: S, ch: 'sites' | 'oval') => {
      const a = s.answeredFor[ch];
      return !!a && a.conditions === s.conditions && a.products === s.products && (ch !== 'sites' || a.sites === s.sites);
    };
    const mark = (key: 'table' | 'maps' | 'own') => {
      if (out[key] !== -2 && out[key] < 0) {
        out[key] = -2; // waiting for the frame
        requestAnimationFrame(() => {
          out[key] = performance.now() - t0;
          if (out.table >= 0 && out.maps >= 0 && out.own >= 0) { unsub(); clearTimeout(guard); res(out); }
        });
      }
    };
    const check = (s: S) => {
      if (fresh(s, 'sites')) mark('table');
      if (fresh(s, 'oval')) mark('maps');
      if (fresh(s, 'sites') && s.siteResults?.fromTimeline !== true) mark('own');
    };
    const unsub = w.__atlas.store.subscribe(check);
    const guard = setTimeout(() => { unsub(); rej(new Error(`step ${k}: no answer within 120 s`)); }, 120_000);
    w.__atlasTimeline.moveCursor(k);
  }), step);
}

/** A fixed shuffle of 0..n-1 (LCG; invented order, the same every run). */
function shuffled(n: number, seed: number): number[] {
  const a = Array.from({ length: n }, (_, i) => i);
  let x = seed >>> 0;
  for (let i = n - 1; i > 0; i--) {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    const j = x % (i + 1);
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

const served = await serveApp();
const b = await launch();
try {
  const page = b.page;
  await page.goto(served.url);
  // tsx keeps function names with a __name helper that the page does not have (the timed function below has inner ones).
  await page.evaluate('window.__name = (f) => f');
  await waitForEngine(page);
  await waitFresh(page, ['scene', 'oval', 'sites']);
  await page.getByText('Timeline: replay a series, plan a night', { exact: true }).click();
  // 8 sites: the demo's 5 and three more (invented).
  await page.evaluate(() => {
    const st = (window as unknown as { __atlas: { store: { get(): { sites: unknown[] }; set(p: object): void } } }).__atlas.store;
    st.set({ sites: [...st.get().sites, { name: 'Tarn Vey', latDeg: 69.3, lonDeg: 19.0 }, { name: 'Corrow Point', latDeg: 61.4, lonDeg: -149.7 }, { name: 'Mossbank', latDeg: 55.9, lonDeg: -3.2 }].slice(0, 8) });
  });
  const tLoad = Date.now();
  await page.getByRole('button', { name: 'Load the demo storm', exact: true }).click();
  await page.waitForFunction(() => (window as unknown as { __atlasTimeline: { timelineStore: { get(): { series: { steps: unknown[] } | null } } } }).__atlasTimeline.timelineStore.get().series?.steps.length === 72, undefined, { timeout: 60_000 });
  await waitFresh(page, ['sites', 'oval']);

  const cold: Move[] = [];
  for (const k of [12, 30, 47, 61, 5, 22, 39].slice(0, coldMoves)) cold.push(await move(page, k));

  await page.waitForFunction(() => {
    const t = (window as unknown as { __atlasTimeline: { timelineStore: { get(): { result: { sites: unknown[]; stepsMs: number[] } | null; pending: boolean } } } }).__atlasTimeline.timelineStore.get();
    return !t.pending && t.result?.sites.length === 8 && t.result.stepsMs.length === 72;
  }, undefined, { timeout: 600_000, polling: 250 });
  const timelinesInS = (Date.now() - tLoad) / 1000;
  // Every step's oval kept (those ahead of the cursor, and the cursor's own from the engine client).
  await page.waitForFunction(() => (window as unknown as { __atlasTimelineClient?: { ovalsMissing(): number } }).__atlasTimelineClient?.ovalsMissing() === 0, undefined, { timeout: 900_000, polling: 500 });
  const ovalsInS = (Date.now() - tLoad) / 1000;

  const warm: Move[][] = [];
  for (let r = 0; r < rounds; r++) {
    const order = shuffled(72, 7 + r).slice(0, scrubs);
    const ms: Move[] = [];
    for (const k of order) ms.push(await move(page, k));
    warm.push(ms);
  }
  const per = (ms: Move[], key: 'table' | 'maps' | 'own') => +median(ms.map((m) => m[key])).toFixed(1);
  const range = (key: 'table' | 'maps' | 'own') => { const v = warm.map((ms) => per(ms, key)); return [Math.min(...v), Math.max(...v)]; };
  const out = {
    sites: 8, steps: 72, rounds, scrubsPerRound: scrubs,
    coldMedianMs: { table: per(cold, 'table'), maps: per(cold, 'maps'), own: per(cold, 'own') },
    siteTimelinesInS: +timelinesInS.toFixed(1), ovalsAheadInS: +ovalsInS.toFixed(1),
    warmMedianMsPerRound: warm.map((ms) => ({ table: per(ms, 'table'), maps: per(ms, 'maps'), own: per(ms, 'own') })),
    warmMedianRangeMs: { table: range('table'), maps: range('maps'), own: range('own') },
    cold,
  };
  if (json) console.log(JSON.stringify(out));
  else {
    console.log(`timeline scrubbing, demo storm (72 steps), 8 sites, headless Chromium`);
    console.log(`  cold (${cold.length} moves before the site timelines): median table ${out.coldMedianMs.table} ms, maps ${out.coldMedianMs.maps} ms, own sites answer ${out.coldMedianMs.own} ms`);
    console.log(`  site timelines in after ${out.siteTimelinesInS} s, every step's oval kept after ${out.ovalsAheadInS} s`);
    out.warmMedianMsPerRound.forEach((r, i) => console.log(`  warm round ${i + 1} (${scrubs} moves): median table ${r.table} ms, maps ${r.maps} ms, own sites answer ${r.own} ms`));
    console.log(`  warm medians over ${rounds} rounds: table ${out.warmMedianRangeMs.table.join('–')} ms, maps ${out.warmMedianRangeMs.maps.join('–')} ms, own ${out.warmMedianRangeMs.own.join('–')} ms`);
  }
} finally {
  await b.close();
  await served.close();
}
