import { describe, expect, it } from 'vitest';
import { setConditions, setProducts, store, type AppState } from '../../src/app/store';
import { staleReason } from '../../src/app/store/freshness';
import { exportRefusal } from '../../src/app/exports';
import type { SitesResult } from '../../workers/protocol';

// Source: the app's contract (src/app/store/freshness.ts): a result is current only for exactly the inputs it
// was computed for and while its channel has no error; exports refuse otherwise and say why.
function answerSites(s: AppState): SitesResult {
  const r: SitesResult = { requestId: 1, warnings: [], sites: [{ name: 'A' } as SitesResult['sites'][number]] };
  store.set({ siteResults: r, answeredFor: { ...s.answeredFor, sites: { conditions: s.conditions, products: s.products, sites: s.sites, view: s.view } } });
  return r;
}

describe('stale results', () => {
  it('a sites table filled from the timeline is shown as current but not exported until the sites channel\'s own answer (field lines, CGM) replaces it', () => {
    const r = answerSites(store.get());
    store.set({ siteResults: { ...r, fromTimeline: true } });
    expect(staleReason(store.get(), 'sites')).toBeNull();
    expect(exportRefusal(store.get(), 'sites-csv')).toBe('the sites table is still being completed (field lines and CGM): try again in a moment');
    answerSites(store.get());
    expect(exportRefusal(store.get(), 'sites-csv')).toBeNull();
  });

  it('a result is current for its own inputs and stale after any change of them', () => {
    answerSites(store.get());
    expect(staleReason(store.get(), 'sites')).toBeNull();
    expect(exportRefusal(store.get(), 'sites-csv')).toBeNull();
    setConditions({ time: '2031-06-01T00:00:00Z' });
    expect(staleReason(store.get(), 'sites')).toMatch(/for earlier inputs/);
    expect(exportRefusal(store.get(), 'sites-geojson')).toMatch(/for earlier inputs/);
    answerSites(store.get());
    setProducts({ altKm: 250 });
    expect(staleReason(store.get(), 'sites')).toMatch(/for earlier inputs/);
  });

  it('an engine error for the inputs refuses the export with the error (e.g. a time past the coefficients)', () => {
    answerSites(store.get());
    store.set({ siteResults: null, errors: { sites: 'time: IGRF-14 covers 1900.0–2030.0; got 2031.4' } });
    expect(exportRefusal(store.get(), 'sites-csv')).toBe('no site results for the current inputs: time: IGRF-14 covers 1900.0–2030.0; got 2031.4');
    expect(exportRefusal(store.get(), 'all-json')).toMatch(/IGRF-14 covers/);
  });

  it('nothing computed yet: refused as "being computed"', () => {
    store.set({ oval: null, answeredFor: {}, errors: {} });
    expect(exportRefusal(store.get(), 'boundaries-csv')).toBe('no boundaries yet: they are being computed');
  });
});
