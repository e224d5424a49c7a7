/**
 * GeoJSON (RFC 7946) builders and a structural validator. Positions are
 * [longitude, latitude] in decimal degrees on WGS84, with an optional third
 * element: height in metres above the ellipsoid (RFC 7946 §4). Longitudes are
 * written in −180..180. Lines that cross the antimeridian are cut there into a
 * MultiLineString (RFC 7946 §3.1.9), the crossing point interpolated.
 *
 * Pure: no Node or DOM APIs; shared by the CLI and the browser app.
 */

export type Position = number[];

interface PointGeometry { type: 'Point'; coordinates: Position }
interface LineStringGeometry { type: 'LineString'; coordinates: Position[] }
interface MultiLineStringGeometry { type: 'MultiLineString'; coordinates: Position[][] }
export type Geometry = PointGeometry | LineStringGeometry | MultiLineStringGeometry;

export interface Feature<G extends Geometry | null = Geometry | null> {
  type: 'Feature';
  geometry: G;
  properties: Record<string, unknown> | null;
}

export interface FeatureCollection {
  type: 'FeatureCollection';
  features: Feature[];
  /** Foreign members (RFC 7946 §6.1), e.g. the conditions block. */
  [member: string]: unknown;
}

/** Longitude folded into −180..180 (180 stays 180, −180 stays −180). */
export function wrapLonDeg(lonDeg: number): number {
  if (lonDeg >= -180 && lonDeg <= 180) return lonDeg;
  const w = ((((lonDeg + 180) % 360) + 360) % 360) - 180;
  return w === -180 && lonDeg > 0 ? 180 : w;
}

/** A position from lon/lat (deg) and an optional height in km (written in metres). */
export function position(lonDeg: number, latDeg: number, heightKm?: number): Position {
  const p = [wrapLonDeg(lonDeg), latDeg];
  if (heightKm !== undefined) p.push(heightKm * 1000);
  return p;
}

export function pointFeature(lonDeg: number, latDeg: number, properties: Record<string, unknown> | null, heightKm?: number): Feature<PointGeometry> {
  return { type: 'Feature', geometry: { type: 'Point', coordinates: position(lonDeg, latDeg, heightKm) }, properties };
}

const finitePos = (p: Position | null | undefined): p is Position => !!p && p.length >= 2 && Number.isFinite(p[0]) && Number.isFinite(p[1]);

/**
 * Split a polyline into parts: at gaps (null or non-finite positions) and at
 * antimeridian crossings (a longitude jump of more than 180° between
 * neighbours is taken as the short way across ±180). Parts of fewer than two
 * positions are dropped. Longitudes are wrapped first.
 */
export function splitPolyline(points: readonly (Position | null)[]): Position[][] {
  const parts: Position[][] = [];
  let cur: Position[] = [];
  const flush = () => { if (cur.length >= 2) parts.push(cur); cur = []; };
  let prev: Position | null = null;
  for (const raw of points) {
    if (!finitePos(raw)) { flush(); prev = null; continue; }
    const p = [wrapLonDeg(raw[0]), ...raw.slice(1)];
    if (prev) {
      const d = p[0] - prev[0];
      if (Math.abs(d) > 180) {
        // Cross at +180 going east (d < −180) or at −180 going west (d > 180).
        const edge = d < 0 ? 180 : -180;
        const lonUnwrapped = d < 0 ? p[0] + 360 : p[0] - 360;
        const f = (edge - prev[0]) / (lonUnwrapped - prev[0]);
        const mid = prev.map((v, k) => (k === 0 ? edge : v + f * ((p[k] ?? v) - v)));
        cur.push(mid);
        flush();
        cur.push([-edge, ...mid.slice(1)]);
      }
    }
    cur.push(p);
    prev = p;
  }
  flush();
  return parts;
}

/** A line feature: a LineString when the line is one piece, else a MultiLineString; null geometry when nothing remains. */
export function lineFeature(points: readonly (Position | null)[], properties: Record<string, unknown> | null): Feature {
  const parts = splitPolyline(points);
  const geometry: Geometry | null =
    parts.length === 0 ? null : parts.length === 1 ? { type: 'LineString', coordinates: parts[0] } : { type: 'MultiLineString', coordinates: parts };
  return { type: 'Feature', geometry, properties };
}

export function featureCollection(features: Feature[], foreign: Record<string, unknown> = {}): FeatureCollection {
  for (const k of ['type', 'features', 'geometry', 'properties', 'coordinates']) {
    if (k in foreign) throw new RangeError(`geojson: "${k}" cannot be a foreign member of a FeatureCollection (RFC 7946 §7.1)`);
  }
  return { type: 'FeatureCollection', ...foreign, features };
}

function checkPosition(p: unknown, where: string, problems: string[]): void {
  if (!Array.isArray(p) || p.length < 2 || p.length > 3 || !p.every((v) => typeof v === 'number' && Number.isFinite(v))) {
    problems.push(`${where}: a position must be 2 or 3 finite numbers`);
    return;
  }
  if (p[0] < -180 || p[0] > 180) problems.push(`${where}: longitude ${p[0]} outside −180..180`);
  if (p[1] < -90 || p[1] > 90) problems.push(`${where}: latitude ${p[1]} outside −90..90`);
}

function checkLine(c: unknown, where: string, problems: string[]): void {
  if (!Array.isArray(c) || c.length < 2) { problems.push(`${where}: a line needs at least two positions`); return; }
  c.forEach((p, i) => checkPosition(p, `${where}[${i}]`, problems));
  for (let i = 1; i < c.length; i++) {
    const a = c[i - 1], b = c[i];
    if (Array.isArray(a) && Array.isArray(b) && Math.abs(b[0] - a[0]) > 180) problems.push(`${where}[${i}]: longitude jumps ${a[0]} → ${b[0]} (cut at the antimeridian, RFC 7946 §3.1.9)`);
  }
}

/**
 * Structural problems of a GeoJSON FeatureCollection limited to the geometry
 * types written here (Point, LineString, MultiLineString); [] when valid.
 */
export function geoJsonProblems(doc: unknown): string[] {
  const problems: string[] = [];
  const o = doc as FeatureCollection;
  if (!o || typeof o !== 'object' || o.type !== 'FeatureCollection') return ['root: type must be "FeatureCollection"'];
  if (!Array.isArray(o.features)) return ['root: features must be an array'];
  o.features.forEach((f: Feature, i) => {
    const w = `features[${i}]`;
    if (!f || f.type !== 'Feature') { problems.push(`${w}: type must be "Feature"`); return; }
    if (!('properties' in f) || (f.properties !== null && typeof f.properties !== 'object')) problems.push(`${w}: properties must be an object or null`);
    if (!('geometry' in f)) { problems.push(`${w}: geometry member missing`); return; }
    const g = f.geometry;
    if (g === null) return;
    if (g.type === 'Point') checkPosition(g.coordinates, `${w}.geometry`, problems);
    else if (g.type === 'LineString') checkLine(g.coordinates, `${w}.geometry`, problems);
    else if (g.type === 'MultiLineString') {
      if (!Array.isArray(g.coordinates)) problems.push(`${w}.geometry: coordinates must be an array of lines`);
      else g.coordinates.forEach((l, k) => checkLine(l, `${w}.geometry[${k}]`, problems));
    } else problems.push(`${w}.geometry: unsupported type "${(g as { type: string }).type}"`);
  });
  return problems;
}
