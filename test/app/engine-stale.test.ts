import { describe, expect, it } from 'vitest';
import { portWorker } from '../fake-worker';
import { startEngine } from '../../src/app/engine';
import { setConditions, store } from '../../src/app/store';
import { staleReason } from '../../src/app/store/freshness';

// Defect: after the time was set past the coefficients' span (IGRF-14 covers 1900–2030, references §1), the sites
// table kept the old results and exports carried them under the new time. The engine client must clear a
// channel's result when the worker refuses the inputs, and the freshness rule must then refuse the export.
async function until(ok: () => boolean, ms = 60_000): Promise<void> {
  const t0 = Date.now();
  while (!ok()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out: ${JSON.stringify({ e: store.get().errors, p: store.get().pending, s: store.get().siteResults !== null })}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

describe('engine client and refused inputs', () => {
  it('clears the results of a channel the worker refuses, and fills them again for good inputs', async () => {
    const fake = portWorker();
    store.set({ sites: [{ name: 'Low', latDeg: 50, lonDeg: 10 }] });
    const engine = startEngine(() => fake);
    try {
      await until(() => store.get().siteResults !== null && staleReason(store.get(), 'sites') === null, 20_000);
      setConditions({ time: '2031-06-01T00:00:00Z' });
      await until(() => store.get().errors.sites !== undefined);
      expect(store.get().siteResults).toBeNull();
      expect(store.get().errors.sites).toMatch(/^time: /);
      expect(staleReason(store.get(), 'sites')).toMatch(/no site results for the current inputs: time: /);
      setConditions({ time: '2025-03-20T22:00:00Z' });
      await until(() => store.get().siteResults !== null && staleReason(store.get(), 'sites') === null, 20_000);
      expect(store.get().errors.sites).toBeUndefined();
      expect(store.get().siteResults!.used!.dstSource).toBe('estimated');
    } finally {
      engine.dispose();
    }
  }, 120_000);
});
