/**
 * The engine worker's contract (comlink). Coarse calls; bulk data as typed
 * arrays that the worker transfers. Every call carries a request id; the
 * worker answers `{ stale: true }` for a request superseded by a newer one on
 * the same channel, and the client drops it. Errors arrive as `{ error }`.
 * Types only: the implementation is workers/engine.worker.ts.
 */
import type { FieldConditions, ProductOptions } from '../src/physics/field/conditions';

export interface FrameInfo {
  /** Row-major 3×3, GSM → GEO. */
  geoFromGsm: Float64Array;
  /** Unit vectors in GEO. */
  sunGeo: Float64Array;
  axisGeo: Float64Array;
  tiltDeg: number;
  /** Centred-dipole pole (geocentric) and B0 for the instant. */
  poleLatDeg: number;
  poleLonDeg: number;
  b0Nt: number;
  /** Decimal year used for the IGRF coefficients. */
  igrfEpoch: number;
}

interface MagnetopauseInfo {
  enabled: boolean;
  r0Re: number;
  alpha: number;
}

export interface LineBundle {
  /** All points, GEO Cartesian, RE, concatenated xyz. */
  pointsGeo: Float64Array;
  /** Start index (in points, not floats) of each line; length nLines + 1. */
  offsets: Int32Array;
  /** Line type of each line as the tracer's code (LINE_CLOSED, LINE_OPEN, LINE_UNRESOLVED of src/physics/trace/tracer.ts; names in LINE_TYPE_NAMES). */
  types: Uint8Array;
}

export interface FanSpec {
  /** MLT meridians, hours. */
  mltHours: number[];
  /** Magnetic latitudes of the seeds (both hemispheres are traced from the north seeds), deg. */
  magLatDeg: number[];
}

export interface SceneResult {
  requestId: number;
  stale?: boolean;
  error?: string;
  warnings: string[];
  frames: FrameInfo;
  magnetopause: MagnetopauseInfo;
  lines: LineBundle;
  /** The worker's compute time for this answer, ms (set by engine.worker.ts; for the timing marks). */
  workerMs?: number;
}

/** One boundary curve per hemisphere, sampled per MLT; NaN where absent. */
export interface BoundaryCurve {
  hemisphere: 'north' | 'south';
  mltHours: Float64Array;
  openClosedMagLatDeg: Float64Array;
  openClosedGeoLatDeg: Float64Array;
  openClosedGeoLonDeg: Float64Array;
  equatorwardMagLatDeg: Float64Array;
  equatorwardGeoLatDeg: Float64Array;
  equatorwardGeoLonDeg: Float64Array;
  /** Why each sector's boundary is missing (the engine search's reason; null where it was found). */
  openClosedReason: (string | null)[];
  equatorwardReason: (string | null)[];
}

/** What the model used for a result (the storm state it resolved, the source distance): every export's metadata. */
export interface ModelUsed {
  dstNt: number;
  dstStarNt: number;
  dstSource: 'given' | 'estimated';
  speedKms: number;
  speedSource: 'given' | 'nominal';
  /** Equatorial source distance of the equatorward edge, RE (the request's, or the model's storm-following value). */
  sourceRe: number;
  /** Set by the request (true) or by the model from the conditions (false). */
  sourceReSet: boolean;
  ringCurrentEnergyJ: number;
  tiltDeg: number;
  standoffRe: number | null;
  igrfEpoch: number;
}

export interface OvalResult {
  requestId: number;
  stale?: boolean;
  error?: string;
  warnings: string[];
  curves: BoundaryCurve[];
  /** Absent on a stale or failed answer. */
  used?: ModelUsed;
  /** The worker's compute time for this answer, ms (set by engine.worker.ts; for the timing marks). */
  workerMs?: number;
}

export type { SiteInput, SiteResult } from '../src/physics/mapping';
export type { Footpoint } from '../src/physics/trace/footpoint';
import type { CgmResult, SiteInput, SiteResult } from '../src/physics/mapping';
import type { Footpoint } from '../src/physics/trace/footpoint';
export type { CgmResult } from '../src/physics/mapping';

/**
 * A site's answer in the app: the engine's SiteResult and the site's corrected
 * geomagnetic (CGM) position at its own height (cgmPair of src/physics/mapping;
 * CGM is constant along the main-field line, so it is the footpoint's too).
 * Absent when the row was filled from a timeline answer, which carries no CGM.
 */
export type AppSiteResult = SiteResult & { cgm?: CgmResult };

export interface SitesResult {
  requestId: number;
  stale?: boolean;
  error?: string;
  warnings: string[];
  sites: AppSiteResult[];
  /** Filled from the site timelines at the cursor's step (no field lines or CGM yet); the sites channel's own answer follows. */
  fromTimeline?: boolean;
  /** Absent on a stale or failed answer. */
  used?: ModelUsed;
}

export interface SweepResult {
  requestId: number;
  stale?: boolean;
  error?: string;
  warnings: string[];
  vary: 'pdyn' | 'bz';
  mltHours: number;
  values: Float64Array;
  northOpenClosedMagLatDeg: Float64Array;
  northEquatorwardMagLatDeg: Float64Array;
  southOpenClosedMagLatDeg: Float64Array;
  southEquatorwardMagLatDeg: Float64Array;
}

/** Product options of a request: sourceRe absent = the model's storm-following value; minLatDeg = lowest latitude of the boundary searches. */
export type RequestProducts = Omit<ProductOptions, 'sourceRe'> & { sourceRe?: number; minLatDeg?: number };

/** Options of an oval request. */
export type OvalOptions = RequestProducts & {
  mltStepHours: number;
  latTolDeg?: number;
  /** The hemispheres to search, in this order (default both, north first); each once. */
  hemispheres?: ('north' | 'south')[];
};

/** One step of a timeline: the time and the solar wind (the rest of the conditions come from `base`). */
export interface TimelineStepInput {
  time: string;
  pdynNpa: number;
  bzNt: number;
  byNt: number;
  /** Storm index, nT; null = estimated from the solar wind at that step. */
  dstNt: number | null;
  speedKms: number | null;
}

export type TimelineOptions = RequestProducts & {
  conjugateAltKm?: number;
  minElevationDeg?: number;
  /** The Sun must be below this elevation (deg) for a dark sky: −6, −12 or −18 (twilight limits) or any in −30..0. */
  sunLimitDeg: number;
  /** Best hours: the oval within this zenith distance (deg). */
  maxZenithDeg?: number;
};

/** One site at one step. Angles in degrees; null where unknown (open line, no boundary). */
export interface TimelineCell {
  type: 'closed' | 'open' | 'unresolved';
  ovalRelation: 'poleward' | 'inside' | 'equatorward' | 'unknown';
  /** Distance to the nearest oval edge at the site's MLT, deg of magnetic latitude (≥ 0). */
  ovalMarginDeg: number | null;
  mltHours: number;
  magLatDeg: number;
  lShell: number | null;
  conjugateLatDeg: number | null;
  conjugateLonDeg: number | null;
  openClosedMagLatDeg: number | null;
  equatorwardMagLatDeg: number | null;
  ovalElevationDeg: number | null;
  ovalAzimuthDeg: number | null;
  ovalVisible: boolean;
  sunElevationDeg: number;
  twilight: 'day' | 'civil' | 'nautical' | 'astronomical' | 'night';
  dark: boolean;
  moonElevationDeg: number;
  moonIlluminatedFraction: number;
  /** The rest of the step's siteReport, so the sites table can be filled from the timeline at once (src/app/timeline/fill.ts). */
  equatorRe: number | null;
  conjugate: Footpoint | null;
  ovalDistanceKm: number | null;
  ovalRelationReason?: string | null;
  boundaries: SiteResult['boundaries'];
  error?: string;
}

export interface TimelineSite {
  name: string;
  latDeg: number;
  lonDeg: number;
  /** One cell per step. */
  cells: TimelineCell[];
  /** Plain-language best hours over the timeline. */
  bestHours: string;
  bestIntervals: { startMs: number; endMs: number }[];
}

export interface TimelineResult {
  requestId: number;
  stale?: boolean;
  error?: string;
  warnings: string[];
  /** Unix ms of each step. */
  stepsMs: number[];
  /** Storm index used at each step (nT) and whether it was given or estimated. */
  dstNt: number[];
  dstSource: ('given' | 'estimated')[];
  sites: TimelineSite[];
}

/**
 * Progress of a timeline call: steps done of the total; with the step just done (its index) and its
 * cells (one per site, in the sites' order), so the table can be filled for the steps already done.
 */
export type TimelineProgress = (done: number, total: number, step?: number, cells?: TimelineCell[]) => void;

export interface EngineApi {
  /** Frames, magnetopause and a fan of field lines (fast: the first thing drawn). */
  scene(requestId: number, c: FieldConditions, fan: FanSpec): Promise<SceneResult>;
  /**
   * Boundaries per MLT (slower; refined): both hemispheres, or only those in o.hemispheres
   * (curves in the order asked), so two workers can share one oval (src/app/engine.ts).
   */
  oval(requestId: number, c: FieldConditions, o: OvalOptions): Promise<OvalResult>;
  /** Conjugates and products for sites. Conjugate altitude: o.conjugateAltKm (default 0). */
  sites(requestId: number, c: FieldConditions, o: RequestProducts & { conjugateAltKm?: number; minElevationDeg?: number }, sites: SiteInput[]): Promise<SitesResult>;
  sweep(requestId: number, c: FieldConditions, o: RequestProducts & { vary: 'pdyn' | 'bz'; from: number; to: number; steps: number; mltHours: number }): Promise<SweepResult>;
  /**
   * Every site at every step of a timeline (one call per series; a newer
   * request stops it between steps). `base` supplies the model switches.
   */
  timeline(requestId: number, base: FieldConditions, steps: TimelineStepInput[], o: TimelineOptions, sites: SiteInput[], progress?: TimelineProgress): Promise<TimelineResult>;
  /**
   * Compute step `step` of the timeline request `requestId` next, if it is running and that step is
   * not done yet (the cursor's step, while scrubbing before the site timelines are in); the answer
   * is the same whatever the order the steps are computed in.
   */
  timelineFocus(requestId: number, step: number): Promise<void>;
}
