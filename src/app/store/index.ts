/**
 * The app's one store: its state, the instance (a framework-free core,
 * ./core.ts), the setters the panels call, and a thin React hook.
 * Components read slices; the frame loop never touches React state.
 */
import { useSyncExternalStore } from 'react';
import type { FieldConditions } from '../../physics/field/conditions';
import type { OvalResult, SceneResult, SiteInput, SitesResult, SweepResult } from '../../../workers/protocol';
import { DEMO_SCENARIO } from '../scenario';
import { noteChange } from '../perf';
import { createStore, type Store } from './core';

export { conjugateAltOf, type AltPreset, type ProductSettings } from './products';
import type { ProductSettings } from './products';

interface ViewSettings {
  magGraticule: boolean;
  /** Polar maps: draw the corrected geomagnetic (CGM) latitude circles and MLT meridians (shared through the URL, cgm=1). */
  cgmGraticule: boolean;
  fan: boolean;
  magnetopauseSurface: boolean;
  playing: boolean;
  sweepVary: 'pdyn' | 'bz';
  sweepMlt: number;
}

interface PerfMark {
  /** Sequence number of the latest condition change and when it happened (performance.now()). */
  seq: number;
  changedAt: number;
}

export interface AppState {
  scenarioName: string;
  conditions: FieldConditions;
  products: ProductSettings;
  sites: SiteInput[];
  view: ViewSettings;
  scene: SceneResult | null;
  oval: OvalResult | null;
  siteResults: SitesResult | null;
  sweep: SweepResult | null;
  /** Engine errors (messages), by channel. */
  errors: Partial<Record<'scene' | 'oval' | 'sites' | 'sweep' | 'engine', string>>;
  pending: { scene: boolean; oval: boolean; sites: boolean; sweep: boolean };
  perf: PerfMark;
  /** Change sequence that the current scene / oval answers belong to. */
  sceneSeq: number;
  ovalSeq: number;
  /** The inputs (by reference) each current answer was computed for: lets tests and the UI tell fresh from lagging. */
  answeredFor: Partial<Record<'scene' | 'oval' | 'sites' | 'sweep', AnsweredFor>>;
  /** What a shared link asked for that was refused or read in a particular way (shown until dismissed). */
  notices: string[];
}

export interface AnsweredFor {
  conditions: FieldConditions;
  products: ProductSettings;
  sites: SiteInput[];
  view: ViewSettings;
}

function initialState(): AppState {
  return {
    scenarioName: DEMO_SCENARIO.name,
    conditions: { ...DEMO_SCENARIO.conditions },
    products: { ...DEMO_SCENARIO.products },
    sites: DEMO_SCENARIO.sites.map((s) => ({ ...s })),
    view: { magGraticule: false, cgmGraticule: false, fan: true, magnetopauseSurface: true, playing: false, sweepVary: 'pdyn', sweepMlt: 0 },
    scene: null,
    oval: null,
    siteResults: null,
    sweep: null,
    errors: {},
    pending: { scene: false, oval: false, sites: false, sweep: false },
    perf: { seq: 0, changedAt: 0 },
    sceneSeq: -1,
    ovalSeq: -1,
    answeredFor: {},
    notices: [],
  };
}

export const store: Store<AppState> = createStore(initialState());

/** Subscribe a component to one slice; the selector must return a stable reference or a primitive. */
export function useStore<U>(selector: (s: AppState) => U): U {
  return useSyncExternalStore(store.subscribe, () => selector(store.get()), () => selector(store.get()));
}

/** Change conditions (marks a new perf sequence; the engine client reacts). */
export function setConditions(patch: Partial<FieldConditions>): void {
  noteChange(store.get().perf.seq + 1);
  store.set((s) => ({
    conditions: { ...s.conditions, ...patch },
    scenarioName: s.scenarioName.endsWith('(edited)') ? s.scenarioName : `${s.scenarioName} (edited)`,
    perf: { seq: s.perf.seq + 1, changedAt: performance.now() },
  }));
}

export function setProducts(patch: Partial<ProductSettings>): void {
  noteChange(store.get().perf.seq + 1);
  store.set((s) => ({ products: { ...s.products, ...patch }, perf: { seq: s.perf.seq + 1, changedAt: performance.now() } }));
}

export function setView(patch: Partial<ViewSettings>): void {
  store.set((s) => ({ view: { ...s.view, ...patch } }));
}

export function setSites(sites: SiteInput[]): void {
  store.set({ sites });
}
