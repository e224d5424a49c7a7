import { describe, it, expect } from 'vitest';
import { wrapLonDeg, position, pointFeature, lineFeature, splitPolyline, featureCollection, geoJsonProblems } from '../../src/io/geojson';
import { readJson, writeJson } from '../../src/io/json';
import { expectClose } from '../helpers';

// Source: RFC 7946 (GeoJSON): §3.1.1 positions [lon, lat, height m], §3.1.9 antimeridian cutting, §3.3 FeatureCollection, §6.1 foreign members.
describe('geojson builders', () => {
  it('wraps longitudes into −180..180', () => {
    expect(wrapLonDeg(190)).toBe(-170);
    expect(wrapLonDeg(-190)).toBe(170);
    expect(wrapLonDeg(180)).toBe(180);
    expect(wrapLonDeg(540)).toBe(180);
    expect(wrapLonDeg(360)).toBe(0);
    expect(wrapLonDeg(25.5)).toBe(25.5);
  });

  it('orders positions lon, lat and writes the height in metres (RFC 7946 §4)', () => {
    expect(position(25, 62, 110)).toEqual([25, 62, 110000]);
    expect(pointFeature(370, -10, { a: 1 }).geometry.coordinates).toEqual([10, -10]);
  });

  it('cuts a line at the antimeridian, interpolating the crossing (RFC 7946 §3.1.9)', () => {
    const parts = splitPolyline([[170, 60], [-170, 70]]);
    expect(parts.length).toBe(2);
    expect(parts[0][1][0]).toBe(180);
    expect(parts[1][0][0]).toBe(-180);
    expectClose(parts[0][1][1], 65, 1e-12, 'crossing latitude halfway between 60 and 70');
    const west = splitPolyline([[-175, 0, 0], [175, 10, 1000]]);
    expect(west[0][1]).toEqual([-180, 5, 500]);
    expect(west[1][0]).toEqual([180, 5, 500]);
  });

  it('breaks at gaps and drops single-point pieces', () => {
    const parts = splitPolyline([[0, 0], [1, 1], null, [2, 2], [Number.NaN, 3], [4, 4], [5, 5]]);
    expect(parts).toEqual([[[0, 0], [1, 1]], [[4, 4], [5, 5]]]);
  });

  it('gives a LineString for one piece, a MultiLineString for several, null geometry for none', () => {
    expect(lineFeature([[0, 0], [1, 1]], null).geometry?.type).toBe('LineString');
    expect(lineFeature([[170, 0], [-170, 0]], null).geometry?.type).toBe('MultiLineString');
    expect(lineFeature([[0, 0]], null).geometry).toBeNull();
  });

  it('puts foreign members on the collection but refuses reserved names (RFC 7946 §7.1)', () => {
    const fc = featureCollection([], { conditions: { a: 1 } });
    expect(fc.conditions).toEqual({ a: 1 });
    expect(() => featureCollection([], { geometry: 1 })).toThrow(/foreign member/);
  });
});

describe('geojson validator', () => {
  it('accepts what the builders write, after a JSON round trip', () => {
    const fc = featureCollection([pointFeature(10, 20, null, 1), lineFeature([[170, 60], [-170, 70], [-160, 72]], { k: 'x' })]);
    expect(geoJsonProblems(readJson(writeJson(fc)))).toEqual([]);
  });

  it('names each structural fault', () => {
    expect(geoJsonProblems({ type: 'Feature' })).toEqual(['root: type must be "FeatureCollection"']);
    const bad = {
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: null, geometry: { type: 'Point', coordinates: [200, 0] } },
        { type: 'Feature', properties: null, geometry: { type: 'Point', coordinates: [0, 95] } },
        { type: 'Feature', properties: null, geometry: { type: 'LineString', coordinates: [[0, 0]] } },
        { type: 'Feature', properties: null, geometry: { type: 'LineString', coordinates: [[170, 0], [-170, 0]] } },
        { type: 'Feature', properties: 3, geometry: null },
        { type: 'Feature', properties: null },
      ],
    };
    const p = geoJsonProblems(bad).join('\n');
    expect(p).toMatch(/features\[0\].*longitude 200/);
    expect(p).toMatch(/features\[1\].*latitude 95/);
    expect(p).toMatch(/features\[2\].*at least two positions/);
    expect(p).toMatch(/features\[3\].*longitude jumps/);
    expect(p).toMatch(/features\[4\].*properties/);
    expect(p).toMatch(/features\[5\].*geometry member missing/);
  });
});
