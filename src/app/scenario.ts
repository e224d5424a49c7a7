/**
 * The demo scenario loaded at start. Invented: the conditions are round
 * numbers chosen for a moderately disturbed night, and the sites are
 * fictional names placed at arbitrary coordinates (not real stations).
 */
import type { FieldConditions } from '../physics/field/conditions';
import { DEFAULT_IMF_EFFICIENCY } from '../physics/field/imf';
import type { SiteInput } from '../../workers/protocol';
import type { ProductSettings } from './store/products';

interface Scenario {
  name: string;
  conditions: FieldConditions;
  products: ProductSettings;
  sites: SiteInput[];
}

/** Lowest magnetic latitude of the boundary searches, deg: low enough for the great storms of the storm-time model (references §10). */
export const DEFAULT_MIN_LAT_DEG = 30;

/** Footpoint-altitude presets, km: ground, green 557.7 nm (~110 km) and red 630.0 nm (~250 km) emission (references §7). */
export const ALT_PRESETS = { ground: 0, green: 110, red: 250 } as const;

export const DEMO_SCENARIO: Scenario = {
  name: 'Demo: moderate storm',
  conditions: {
    time: '2025-03-20T22:00:00Z',
    pdynNpa: 3,
    bzNt: -5,
    byNt: 2,
    tiltDeg: null,
    internal: 'igrf',
    magnetopause: true,
    imfEfficiency: DEFAULT_IMF_EFFICIENCY,
    tail: true,
    dstNt: null,
    speedKms: null,
  },
  products: { altPreset: 'green', altKm: 110, conjugateAltKm: null, sourceRe: null, minElevationDeg: 10, minLatDeg: DEFAULT_MIN_LAT_DEG },
  sites: [
    { name: 'Sollan Moor', latDeg: 66.8, lonDeg: 24.1 },
    { name: 'Quill Lake Camp', latDeg: 58.2, lonDeg: -103.5 },
    { name: 'Harrowmere Fell', latDeg: 64.6, lonDeg: -17.9 },
    { name: 'Aster Bay Hut', latDeg: -67.2, lonDeg: 62.0 },
    { name: 'Kestrel Knoll', latDeg: 63.1, lonDeg: -151.2 },
  ],
};
