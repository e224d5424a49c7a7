/**
 * One unit of batch work: a condition × every site. The model is prepared once
 * for the condition and its two tracers (conjugate altitude, footpoint
 * altitude) serve all sites. Rows come back already formatted, so the worker
 * threads share the formatting work. Runs the same in a worker or in-process.
 */
import { prepareModel, type PreparedModel } from '../../physics/field/model';
import { makeTracer, siteGsm, boundaryFinder } from '../../physics/mapping';
import { splitFootpoints, type Footpoint } from '../../physics/mapping';
import { siteReport, type SiteInput, type SiteResult, type BoundaryProvider, type SectorBoundaries, type Hemisphere } from '../../physics/mapping';
import { cgmOf, type CgmResult } from '../../physics/mapping';
import { sunElevationDegUnchecked, twilightClass, skyDarkness } from '../../physics/mapping/darkness';
import { sectorReasons } from '../reasons';
import { gridBoundaries } from './grid-boundaries';
import { DEG_PER_RAD } from '../../physics/constants';
import { parseUtc } from '../../physics/frames/time';
import type { FieldConditions } from '../../physics/field/conditions';
import { csvField, type CsvCell } from '../../io/csv';
import { writeJson } from '../../io/json';
import type { RowOutcome, SeriesCondition } from './inputs';
import { errorText } from '../args';

export type BatchFormat = 'csv' | 'json' | 'geojson';

/** Everything a row needs besides its condition and site (the same for the whole run). */
export interface BatchSettings {
  /** The model switches of the common flags (tilt, main field, magnetopause, IMF efficiency, tail…): all but the series' own inputs. */
  model: Omit<FieldConditions, 'time' | 'pdynNpa' | 'bzNt' | 'byNt' | 'dstNt' | 'speedKms'>;
  altKm: number;
  conjugateAltKm: number;
  /** Equatorial source distance set by the user, RE; null: the model's, following the conditions. */
  sourceRe: number | null;
  minElevationDeg: number;
  /** The sky counts as dark (sky_visible) with the Sun's centre below this geometric elevation, deg (−30..0). */
  sunLimitDeg: number;
  /** Add the Moon's columns (moon_elevation_deg, moon_illuminated_fraction). */
  moon: boolean;
  /** Add the corrected geomagnetic (CGM) columns (three extra main-field traces per row). */
  cgm: boolean;
  /** null: the engine's boundary search at each site's exact MLT; else an MLT grid step (h), interpolated (approximation). */
  boundaryMltStep: number | null;
  format: BatchFormat;
  /** Decimals of numbers in CSV cells (JSON and GeoJSON are lossless). */
  csvDecimals: number;
}

/**
 * Sites per job at most: a condition with more sites is split into several
 * jobs, so the rows in flight (jobs in flight × this) bound the memory.
 */
export const SITES_PER_JOB = 2000;

export interface ConditionJob {
  seq: number;
  /** The sites of this job: indices [siteFrom, siteTo) of the sites list. */
  siteFrom: number;
  siteTo: number;
  /** True for the shard's first condition (site problems are listed once, there). */
  firstCondition: boolean;
  /** Line in the conditions file, or null for the condition given by the flags. */
  line: number | null;
  cond: RowOutcome<SeriesCondition>;
}

export interface JobResult {
  seq: number;
  /** The job holds the condition's first sites (count the condition once). */
  firstChunk: boolean;
  /** Formatted rows (CSV records / JSON lines / GeoJSON features joined by ",\n"); '' when none. */
  text: string;
  rows: number;
  ok: number;
  skipped: number;
  failed: number;
  /** Problem texts of the job's skipped and failed rows, first few only. */
  problems: string[];
}

/**
 * Every output column, units in the names; the JSON and GeoJSON records use the
 * same keys. The optional groups (CGM_COLUMNS with --cgm, MOON_COLUMNS with
 * --moon) are left out of a run without them: `batchColumns(settings)`.
 */
export const BATCH_COLUMNS = [
  'conditions_line', 'sites_line', 'site', 'site_lat_deg', 'site_lon_deg', 'site_height_km',
  'time', 'pdyn_npa', 'bz_nt', 'by_nt', 'speed_kms', 'dst_nt', 'dst_source', 'dst_star_nt', 'tilt_deg', 'source_re',
  'line_type',
  'conj_geo_lat_deg', 'conj_geo_lon_deg', 'conj_mag_lat_deg', 'conj_mag_lon_deg', 'conj_mlt_h',
  'foot_geo_lat_deg', 'foot_geo_lon_deg', 'far_foot_geo_lat_deg', 'far_foot_geo_lon_deg',
  'equator_r_re', 'l_shell', 'mlt_h', 'mag_lat_deg',
  'cgm_lat_deg', 'cgm_lon_deg', 'cgm_mlt_h', 'foot_cgm_lat_deg', 'foot_cgm_lon_deg', 'foot_cgm_mlt_h', 'conj_cgm_lat_deg', 'conj_cgm_lon_deg', 'cgm_reason',
  'open_closed_mag_lat_deg', 'equatorward_mag_lat_deg', 'boundary_reason', 'oval_relation', 'inside_oval',
  'sky_elevation_deg', 'sky_azimuth_deg', 'sky_distance_km', 'oval_above_horizon', 'sun_elevation_deg', 'twilight', 'sky_visible',
  'moon_elevation_deg', 'moon_illuminated_fraction',
  'warnings', 'error', 'skipped',
] as const;

export type BatchColumn = (typeof BATCH_COLUMNS)[number];

/** The CGM columns (--cgm): the site at its height, the site-side footpoint at --alt-km, the conjugate at --conjugate-alt-km. */
export const CGM_COLUMNS: readonly BatchColumn[] = ['cgm_lat_deg', 'cgm_lon_deg', 'cgm_mlt_h', 'foot_cgm_lat_deg', 'foot_cgm_lon_deg', 'foot_cgm_mlt_h', 'conj_cgm_lat_deg', 'conj_cgm_lon_deg', 'cgm_reason'];
/** The Moon's columns (--moon). */
export const MOON_COLUMNS: readonly BatchColumn[] = ['moon_elevation_deg', 'moon_illuminated_fraction'];

/** The columns of a run, in output order. */
export function batchColumns(st: Pick<BatchSettings, 'cgm' | 'moon'>): BatchColumn[] {
  return BATCH_COLUMNS.filter((c) => (st.cgm || !CGM_COLUMNS.includes(c)) && (st.moon || !MOON_COLUMNS.includes(c)));
}

type Row = CsvCell[];

const MAX_PROBLEMS = 20;

function emptyRow(): Row {
  return new Array<CsvCell>(BATCH_COLUMNS.length).fill(null);
}

const C = Object.fromEntries(BATCH_COLUMNS.map((c, i) => [c, i])) as Record<BatchColumn, number>;

function fillSite(r: Row, site: RowOutcome<SiteInput>): void {
  r[C.sites_line] = site.line;
  if (site.kind === 'ok') {
    r[C.site] = site.value.name;
    r[C.site_lat_deg] = site.value.latDeg;
    r[C.site_lon_deg] = site.value.lonDeg;
    r[C.site_height_km] = site.value.heightKm ?? 0;
  }
}

function fillCondition(r: Row, line: number | null, c: SeriesCondition | null, m: PreparedModel | null, rawTime: string | undefined): void {
  r[C.conditions_line] = line;
  if (rawTime !== undefined) {
    // A bad row's time, normalised like the others when it can be read, else as given.
    try { r[C.time] = new Date(parseUtc(rawTime)).toISOString(); } catch { r[C.time] = rawTime; }
  }
  if (c) {
    r[C.time] = c.time;
    r[C.pdyn_npa] = c.pdynNpa;
    r[C.bz_nt] = c.bzNt;
    r[C.by_nt] = c.byNt;
  }
  if (m) {
    r[C.time] = new Date(m.ms).toISOString();
    r[C.tilt_deg] = m.frames.tiltRad * DEG_PER_RAD;
    r[C.speed_kms] = m.storm.speedKms;
    r[C.dst_nt] = m.storm.dstNt;
    r[C.dst_star_nt] = m.storm.dstStarNt;
    // The series' own index or its integration; else the model's: --dst, or its steady-state estimate.
    r[C.dst_source] = c?.dstSource ?? (m.storm.dstSource === 'given' ? 'flag' : 'steady_state');
  }
}

const v3 = new Float64Array(3);

/** CGM of a geodetic point, or its reason when undefined or not computable (never throws). */
function cgmAt(model: PreparedModel, latDeg: number, lonDeg: number, heightKm: number): CgmResult {
  try {
    return cgmOf(model).fromGeodetic(latDeg, lonDeg, heightKm);
  } catch (e) {
    return { defined: false, reason: `not computed: ${errorText(e)}` };
  }
}

/** CGM cells of the site (its height), its footpoint (--alt-km) and the conjugate (--conjugate-alt-km); cgm_reason names each point left empty. */
function fillCgm(r: Row, model: PreparedModel, site: SiteInput, near: Footpoint | null, conj: Footpoint | null): void {
  const reasons: string[] = [];
  const siteC = cgmAt(model, site.latDeg, site.lonDeg, site.heightKm ?? 0);
  if (siteC.defined) { r[C.cgm_lat_deg] = siteC.latDeg; r[C.cgm_lon_deg] = siteC.lonDeg; r[C.cgm_mlt_h] = siteC.mltH; } else reasons.push(`site: ${siteC.reason}`);
  if (near) {
    const f = cgmAt(model, near.geoLatDeg, near.geoLonDeg, near.altKm);
    if (f.defined) { r[C.foot_cgm_lat_deg] = f.latDeg; r[C.foot_cgm_lon_deg] = f.lonDeg; r[C.foot_cgm_mlt_h] = f.mltH; } else reasons.push(`footpoint: ${f.reason}`);
  } else reasons.push('footpoint: none on the site\'s side');
  if (conj) {
    const c = cgmAt(model, conj.geoLatDeg, conj.geoLonDeg, conj.altKm);
    if (c.defined) { r[C.conj_cgm_lat_deg] = c.latDeg; r[C.conj_cgm_lon_deg] = c.lonDeg; } else reasons.push(`conjugate: ${c.reason}`);
  }
  r[C.cgm_reason] = reasons.length ? reasons.join('; ') : null;
}

/**
 * Sky darkness at the site (Sun after Hapgood, references §6; twilight −6/−12/−18°, common practice): the Sun's elevation and twilight
 * class, sky_visible = the oval point above the minimum elevation AND the Sun
 * below the limit; with --moon the Moon's elevation and illuminated fraction.
 */
function fillDarkness(r: Row, ms: number, site: SiteInput, st: BatchSettings, ovalAboveHorizon: boolean | null): void {
  let sunEl: number;
  if (st.moon) {
    const d = skyDarkness(site.latDeg, site.lonDeg, site.heightKm ?? 0, ms, { sunLimitDeg: st.sunLimitDeg });
    sunEl = d.sunElevationDeg;
    r[C.moon_elevation_deg] = d.moonElevationDeg;
    r[C.moon_illuminated_fraction] = d.moonIlluminatedFraction;
  } else {
    sunEl = sunElevationDegUnchecked(site.latDeg, site.lonDeg, ms);
  }
  r[C.sun_elevation_deg] = sunEl;
  r[C.twilight] = twilightClass(sunEl);
  r[C.sky_visible] = ovalAboveHorizon === null ? null : ovalAboveHorizon && sunEl < st.sunLimitDeg;
}

function fillResult(r: Row, m: PreparedModel, site: SiteInput, s: SiteResult, st: BatchSettings): void {
  r[C.line_type] = s.type;
  if (s.conjugate) {
    r[C.conj_geo_lat_deg] = s.conjugate.geoLatDeg;
    r[C.conj_geo_lon_deg] = s.conjugate.geoLonDeg;
    r[C.conj_mag_lat_deg] = s.conjugate.magLatDeg;
    r[C.conj_mag_lon_deg] = s.conjugate.magLonDeg;
    r[C.conj_mlt_h] = s.conjugate.mltHours;
  }
  // The footpoints at --alt-km on the site's side and the other, split as traceSite splits them.
  const { near, far } = splitFootpoints(m, siteGsm(v3, m, site.latDeg, site.lonDeg, site.heightKm ?? 0, 'geo'), s.footpoints);
  if (near) { r[C.foot_geo_lat_deg] = near.geoLatDeg; r[C.foot_geo_lon_deg] = near.geoLonDeg; }
  if (far) { r[C.far_foot_geo_lat_deg] = far.geoLatDeg; r[C.far_foot_geo_lon_deg] = far.geoLonDeg; }
  r[C.equator_r_re] = s.equatorRe;
  r[C.l_shell] = s.lShell;
  r[C.mlt_h] = Number.isFinite(s.mltHours) ? s.mltHours : null;
  r[C.mag_lat_deg] = Number.isFinite(s.magLatDeg) ? s.magLatDeg : null;
  if (st.cgm) fillCgm(r, m, site, near ?? null, s.conjugate);
  if (s.boundaries) {
    r[C.open_closed_mag_lat_deg] = s.boundaries.openClosedMagLatDeg;
    r[C.equatorward_mag_lat_deg] = s.boundaries.equatorwardMagLatDeg;
  }
  r[C.oval_relation] = s.ovalRelation;
  r[C.inside_oval] = s.ovalRelation === 'unknown' ? null : s.ovalRelation === 'inside';
  if (s.sky) {
    r[C.sky_elevation_deg] = s.sky.elevationDeg;
    r[C.sky_azimuth_deg] = s.sky.azimuthDeg;
    r[C.sky_distance_km] = s.sky.distanceKm;
    r[C.oval_above_horizon] = s.sky.visible;
  }
  fillDarkness(r, m.ms, site, st, s.sky ? s.sky.visible : null);
}

/** Formats rows; for GeoJSON each row is a Point at the conjugate point (null geometry without one). */
class RowFormatter {
  private readonly parts: string[] = [];
  private readonly names: BatchColumn[];
  private readonly index: number[];
  constructor(private readonly settings: BatchSettings) {
    this.names = batchColumns(settings);
    this.index = this.names.map((c) => C[c]);
  }

  add(r: Row): void {
    const f = this.settings.format;
    if (f === 'csv') {
      let s = '';
      const ix = this.index;
      for (let i = 0; i < ix.length; i++) s += (i ? ',' : '') + csvField(r[ix[i]], this.settings.csvDecimals);
      this.parts.push(s + '\r\n');
      return;
    }
    const o: Record<string, CsvCell> = {};
    this.names.forEach((c, i) => { const v = r[this.index[i]]; o[c] = v === undefined ? null : v; });
    if (f === 'json') { this.parts.push(writeJson(o, 0)); return; }
    const lat = r[C.conj_geo_lat_deg], lon = r[C.conj_geo_lon_deg];
    const geometry = typeof lat === 'number' && typeof lon === 'number'
      ? { type: 'Point', coordinates: [lon, lat, this.settings.conjugateAltKm * 1000] } : null;
    this.parts.push(writeJson({ type: 'Feature', geometry, properties: o }, 0).trimEnd());
  }

  take(): string {
    const s = this.settings.format === 'geojson' ? this.parts.join(',\n') : this.parts.join('');
    this.parts.length = 0;
    return s;
  }
}

/** All rows of one condition, in site order. Never throws: problems become rows. */
export function computeJob(job: ConditionJob, sites: readonly RowOutcome<SiteInput>[], st: BatchSettings): JobResult {
  const out = new RowFormatter(st);
  const res: JobResult = { seq: job.seq, firstChunk: job.siteFrom === 0, text: '', rows: 0, ok: 0, skipped: 0, failed: 0, problems: [] };
  const note = (p: string) => { if (res.problems.length < MAX_PROBLEMS) res.problems.push(p); };
  const where = job.line === null ? 'conditions from the flags' : `conditions line ${job.line}`;
  let model: PreparedModel | null = null;
  let condProblem: { error?: string; skipped?: string } | null = null;
  const cond = job.cond.kind === 'ok' ? job.cond.value : null;
  if (job.cond.kind === 'error') condProblem = { error: job.cond.error };
  else if (job.cond.kind === 'skipped') condProblem = { skipped: job.cond.reason };
  else {
    try {
      model = prepareModel({ ...st.model, time: cond!.time, pdynNpa: cond!.pdynNpa, bzNt: cond!.bzNt, byNt: cond!.byNt, dstNt: cond!.dstNt ?? null, speedKms: cond!.speedKms ?? null });
    } catch (e) {
      condProblem = { error: `${where}: ${errorText(e)}` };
    }
  }
  const tConj = model ? makeTracer(model, { altKm: st.conjugateAltKm, ellipsoid: true }) : null;
  const tAlt = model ? (st.altKm === st.conjugateAltKm ? tConj : makeTracer(model, { altKm: st.altKm, ellipsoid: true })) : null;
  // The engine's search at each site's exact MLT, each started from the nearest MLT already answered; or the opt-in grid approximation.
  const sourceRe = model ? st.sourceRe ?? model.sourceRe : NaN;
  const inner = model ? (st.boundaryMltStep === null ? boundaryFinder(model, tAlt!, { sourceRe }) : gridBoundaries(model, tAlt!, sourceRe, st.boundaryMltStep)) : null;
  // The last boundaries handed out (siteReport asks once per site), for the reason of an empty one.
  let asked: { h: Hemisphere; b: SectorBoundaries } | null = null;
  const bounds: BoundaryProvider | null = inner ? (h, mlt) => { const b = inner(h, mlt); asked = { h, b }; return b; } : null;
  const reasonOf = (): string | null => {
    const a = asked as { h: Hemisphere; b: SectorBoundaries } | null;
    if (!a || (a.b.openClosed && a.b.equatorward)) return null;
    return sectorReasons(a.b);
  };
  const notes = [...(model ? model.warnings : []), ...(cond?.note ? [cond.note] : [])];
  const warnings = notes.length ? notes.join('; ') : null;
  if (condProblem) note(condProblem.error ?? condProblem.skipped!);
  for (let si = job.siteFrom; si < job.siteTo; si++) {
    const site = sites[si];
    const r = emptyRow();
    fillSite(r, site);
    fillCondition(r, job.line, cond, model, job.cond.kind === 'ok' ? undefined : job.cond.time);
    res.rows++;
    if (condProblem) {
      if (condProblem.error) { r[C.error] = condProblem.error; res.failed++; }
      else { r[C.skipped] = condProblem.skipped; res.skipped++; }
    } else if (site.kind === 'error') {
      r[C.error] = site.error; res.failed++;
      if (job.firstCondition) note(site.error);
    } else if (site.kind === 'skipped') {
      r[C.skipped] = site.reason; res.skipped++;
      if (job.firstCondition) note(site.reason);
    } else {
      r[C.warnings] = warnings;
      r[C.source_re] = sourceRe;
      asked = null;
      const s = siteReport(model!, tConj!, tAlt!, site.value, { conjugateAltKm: st.conjugateAltKm, altKm: st.altKm, sourceRe, minElevationDeg: st.minElevationDeg }, bounds!, false);
      if (s.error) {
        const err = `sites line ${site.line} (${site.value.name}), ${where}: ${s.error}`;
        r[C.error] = err; res.failed++; note(err);
      } else {
        fillResult(r, model!, site.value, s, st);
        if (s.boundaries) r[C.boundary_reason] = reasonOf();
        else if (asked === null) r[C.boundary_reason] = 'no boundaries: the site\'s footpoint at --alt-km has no MLT (no footpoint on its side)';
        res.ok++;
      }
    }
    out.add(r);
  }
  res.text = out.take();
  return res;
}
