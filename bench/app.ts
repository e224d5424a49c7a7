/**
 * Section "app": the browser figures of the speed targets, from
 * bench/browser.ts (headless Chromium through the e2e harness) run as a child process:
 * median time from a control change to the lines drawn and to the refined oval drawn.
 * Needs the e2e browser (Debian Chromium, CHROMIUM_PATH or /usr/bin/chromium): without it the
 * section is skipped with a notice (no figures, not an error), so `npm run bench` still passes.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { BenchSection, Figure, RunOptions } from './lib';

interface BrowserReport {
  runs: number;
  firstLoadToAllAnswersMs: number;
  pressureChangeToLinesDrawnMs: { median: number; p90: number };
  pressureChangeToRefinedOvalDrawnMs: { median: number; p90: number };
}

export const appSection: BenchSection = {
  name: 'app',
  title: 'app in headless Chromium: control change → lines, refined oval',
  run(o: RunOptions) {
    const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'; // the e2e harness's browser
    if (!existsSync(chromium)) {
      o.log(`app: skipped, no Chromium at ${chromium} (install Debian's chromium or set CHROMIUM_PATH)`);
      return { figures: [], detail: { skipped: `no Chromium at ${chromium}` } };
    }
    const script = fileURLToPath(new URL('./browser.ts', import.meta.url));
    const runs = o.quick ? 3 : 20;
    const r = spawnSync(process.execPath, [...process.execArgv, script, '--json', '--runs', String(runs)], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], timeout: 15 * 60_000 });
    const line = (r.stdout ?? '').trim().split('\n').filter((l) => l.startsWith('{')).pop();
    if (r.status !== 0 || !line) throw new Error(`browser bench failed (exit ${String(r.status ?? r.signal)}): ${(r.stderr ?? '').trim().split('\n').slice(-3).join(' | ')}`);
    const b = JSON.parse(line) as BrowserReport;
    const figures: Figure[] = [
      { key: 'appRefinedOvalMs', value: b.pressureChangeToRefinedOvalDrawnMs.median, unit: 'ms', target: { op: '<=', value: 250, issue: 14 }, note: `median of ${b.runs} pressure changes (p90 ${b.pressureChangeToRefinedOvalDrawnMs.p90} ms)` },
      { key: 'appLinesDrawnMs', value: b.pressureChangeToLinesDrawnMs.median, unit: 'ms', target: { op: '<=', value: 40, issue: 14 }, note: `median (p90 ${b.pressureChangeToLinesDrawnMs.p90} ms)` },
      { key: 'appFirstLoadMs', value: b.firstLoadToAllAnswersMs, unit: 'ms', note: 'first load → all answers (context)' },
    ];
    return { figures, detail: { browser: b } };
  },
};
