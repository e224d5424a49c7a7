/**
 * The timeline export: the sites table for every step (one row per site per
 * step) with the step's time and conditions, as CSV with `#` metadata lines
 * or as JSON with a metadata object; file names carry the timeline's first
 * and last instants. Pure (no DOM): the panel hands the text to the browser.
 */
import { writeCsv, type CsvCell } from '../../io/csv';
import type { TimelineResult, TimelineStepInput } from '../../../workers/protocol';

export interface TimelineExportMeta {
  generator: string;
  version: string;
  createdUtc: string;
  /** The series file name, or "night plan". */
  source: string;
  /** Where each step's storm index came from ('given', 'estimated' through the series, or the model's own estimate). */
  model: { internal: string; magnetopause: boolean; imfEfficiency: number; tail: boolean | undefined; tiltDeg: number | null | undefined };
  products: { altKm: number; sourceRe: number | string; minLatDeg: number; minElevationDeg: number; conjugateAltKm: number };
  sunLimitDeg: number;
}

export const TIMELINE_COLUMNS = [
  'time', 'pdyn_npa', 'bz_nt', 'by_nt', 'dst_nt', 'dst_source', 'speed_kms',
  'site', 'lat_deg', 'lon_deg', 'line_type', 'conj_lat_deg', 'conj_lon_deg', 'l_shell', 'mlt_h', 'mag_lat_deg',
  'ocb_mag_lat_deg', 'eq_edge_mag_lat_deg', 'oval_relation', 'oval_margin_deg', 'oval_elevation_deg', 'oval_azimuth_deg', 'oval_visible',
  'sun_elevation_deg', 'twilight', 'dark', 'moon_elevation_deg', 'moon_illuminated_fraction', 'error',
] as const;

/** Where each step's storm index came from: the app's series source, else the model's (given or its steady-state estimate). */
function dstSourceOf(i: number, r: TimelineResult, stepSources?: readonly ('given' | 'estimated')[]): string {
  if (stepSources) return stepSources[i] === 'estimated' ? 'estimated_through_series' : 'given';
  return r.dstSource[i] === 'estimated' ? 'estimated_steady_state' : 'given';
}

/** Rows in step order, sites in table order within a step. */
function timelineRows(steps: readonly TimelineStepInput[], r: TimelineResult, stepSources?: readonly ('given' | 'estimated')[]): CsvCell[][] {
  const rows: CsvCell[][] = [];
  steps.forEach((st, i) => {
    for (const s of r.sites) {
      const c = s.cells[i];
      rows.push([
        st.time, st.pdynNpa, st.bzNt, st.byNt, r.dstNt[i], dstSourceOf(i, r, stepSources), st.speedKms,
        s.name, s.latDeg, s.lonDeg, c.type, c.conjugateLatDeg, c.conjugateLonDeg, c.lShell, c.mltHours, c.magLatDeg,
        c.openClosedMagLatDeg, c.equatorwardMagLatDeg, c.ovalRelation, c.ovalMarginDeg, c.ovalElevationDeg, c.ovalAzimuthDeg, c.ovalVisible,
        c.sunElevationDeg, c.twilight, c.dark, c.moonElevationDeg, c.moonIlluminatedFraction, c.error ?? '',
      ]);
    }
  });
  return rows;
}

function metaLines(meta: TimelineExportMeta, steps: readonly TimelineStepInput[], r: TimelineResult): string[] {
  return [
    `# generator: ${meta.generator} ${meta.version}`,
    `# created_utc: ${meta.createdUtc}`,
    `# source: ${meta.source}`,
    `# steps: ${steps.length}, sites: ${r.sites.length}, from ${steps[0]?.time ?? '–'} to ${steps[steps.length - 1]?.time ?? '–'}`,
    `# model: internal=${meta.model.internal} magnetopause=${meta.model.magnetopause} imf_efficiency=${meta.model.imfEfficiency} tail=${meta.model.tail ?? true} tilt_deg=${meta.model.tiltDeg ?? 'from time'}`,
    `# products: alt_km=${meta.products.altKm} source_re=${meta.products.sourceRe} min_elevation_deg=${meta.products.minElevationDeg} conjugate_alt_km=${meta.products.conjugateAltKm}`,
    `# dark_sky: sun_elevation_below_deg=${meta.sunLimitDeg}`,
    ...r.warnings.map((w) => `# warning: ${w.replace(/[\r\n]+/g, ' ')}`),
    ...r.sites.map((s) => `# best_hours ${s.name.replace(/[\r\n]+/g, ' ')}: ${s.bestHours}`),
  ];
}

export function timelineCsv(meta: TimelineExportMeta, steps: readonly TimelineStepInput[], r: TimelineResult, stepSources?: readonly ('given' | 'estimated')[]): string {
  return metaLines(meta, steps, r).join('\r\n') + '\r\n' + writeCsv(TIMELINE_COLUMNS, timelineRows(steps, r, stepSources), { maxDecimals: 4 });
}

export function timelineJson(meta: TimelineExportMeta, steps: readonly TimelineStepInput[], r: TimelineResult, stepSources?: readonly ('given' | 'estimated')[]): object {
  const rows = timelineRows(steps, r, stepSources).map((row) => Object.fromEntries(TIMELINE_COLUMNS.map((k, j) => [k, row[j] === '' && k === 'error' ? null : row[j]])));
  return {
    meta: { ...meta, steps: steps.length, sites: r.sites.length, warnings: r.warnings },
    bestHours: r.sites.map((s) => ({ site: s.name, sentence: s.bestHours, intervals: s.bestIntervals.map((iv) => ({ start: new Date(iv.startMs).toISOString(), end: new Date(iv.endMs).toISOString() })) })),
    rows,
  };
}

/** "fieldline-atlas-timeline-20271014T0000Z-20271016T2300Z.csv". */
export function timelineFileName(steps: readonly TimelineStepInput[], ext: 'csv' | 'json'): string {
  const stamp = (iso: string) => iso.replace(/[-:]/g, '').slice(0, 13) + 'Z';
  const a = steps[0]?.time, b = steps[steps.length - 1]?.time;
  return `fieldline-atlas-timeline-${a ? stamp(a) : 'empty'}${b && b !== a ? `-${stamp(b)}` : ''}.${ext}`;
}
