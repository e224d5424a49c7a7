/**
 * Coastlines and land from world-atlas (Natural Earth 1:110m, public domain),
 * bundled by Vite: nothing is fetched at run time.
 */
import { feature, mesh } from 'topojson-client';
import type { Topology, GeometryCollection } from 'topojson-specification';
import land110 from 'world-atlas/land-110m.json';
import type { Feature, FeatureCollection, MultiLineString, Geometry } from 'geojson';
import { sphereXyz } from './sphere';

const topo = land110 as unknown as Topology<{ land: GeometryCollection }>;

let landCache: FeatureCollection<Geometry> | Feature<Geometry> | null = null;
let coastCache: MultiLineString | null = null;

export function landFeature(): FeatureCollection<Geometry> | Feature<Geometry> {
  return (landCache ??= feature(topo, topo.objects.land) as FeatureCollection<Geometry> | Feature<Geometry>);
}

export function coastlines(): MultiLineString {
  return (coastCache ??= mesh(topo, topo.objects.land) as MultiLineString);
}

/** Coastlines as line-segment pairs on a sphere of radius rRe. */
export function coastSegments(rRe: number): Float32Array {
  const out: number[] = [];
  for (const line of coastlines().coordinates)
    for (let i = 0; i + 1 < line.length; i++) out.push(...sphereXyz(line[i][1], line[i][0], rRe), ...sphereXyz(line[i + 1][1], line[i + 1][0], rRe));
  return new Float32Array(out);
}
