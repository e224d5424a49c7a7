/** `field`: the model field at one point, given in GSM or geodetic coordinates. */
import { geoFromGeodetic } from '../../physics/frames/geodesy';
import { gsmFromGeo, geoFromGsm } from '../../physics/frames/rotations';
import { describePoint } from '../../physics/trace/footpoint';
import { writeCsv } from '../../io/csv';
import { pointFeature } from '../../io/geojson';
import { UsageError, requireFlagItem } from '../args';
import { INPUT_RANGES } from '../common';
import { CSV_DECIMALS, type CommandDef } from '../command';

/** Heights --geo accepts, km: from below the surface to 1000 RE. */
const GEO_HEIGHT_RANGE_KM = { min: -1000, max: 6_371_200 };

export const fieldCommand: CommandDef = {
  name: 'field',
  summary: 'the model field at one point',
  usage: 'field (--gsm <x,y,z> | --geo <lat,lon,altKm>) [common options]',
  notes: [
    'Give exactly one of --gsm (GSM position in Earth radii, RE = 6371.2 km) or --geo',
    '(geodetic WGS84 latitude and longitude in degrees, height above the ellipsoid in km).',
    'The result holds bGsmNt [x,y,z], bNt (magnitude), bGeoNt [x,y,z] (the same vector in',
    'GEO axes) and "inside": whether the point lies inside the magnetopause. The model',
    'describes the field inside only; outside it a warning is given.',
  ].join('\n'),
  flags: [
    { name: 'gsm', kind: 'triple', meta: '<x,y,z>', unit: 'RE', help: 'GSM position, RE' },
    { name: 'geo', kind: 'triple', meta: '<lat,lon,altKm>', help: 'geodetic latitude (deg), longitude (deg), height (km)' },
  ],
  formats: ['json', 'csv', 'geojson'],
  examples: ['field --gsm 6.6,0,0 --time 2025-03-20T22:00:00Z', 'field --geo 64.2,-21.5,110 --pdyn 4 --bz -6'],
  run(ctx) {
    const gsmIn = ctx.flags.gsm as number[] | undefined;
    const geoIn = ctx.flags.geo as number[] | undefined;
    if ((gsmIn === undefined) === (geoIn === undefined)) {
      throw new UsageError(gsmIn ? '--geo' : '--gsm', 'give exactly one of --gsm <x,y,z> or --geo <lat,lon,altKm>');
    }
    const f = ctx.model.frames;
    const p = new Float64Array(3);
    if (gsmIn) {
      p.set(gsmIn);
      const r = Math.hypot(p[0], p[1], p[2]);
      if (!(r >= 0.01)) throw new UsageError('--gsm', `expected a point at least 0.01 RE from Earth's centre, got r = ${r} RE`);
      if (r > 1000) throw new UsageError('--gsm', `expected a point within 1000 RE, got r = ${r} RE`);
    } else {
      const [lat, lon, alt] = geoIn!;
      requireFlagItem('--geo', 'latitude', lat, INPUT_RANGES.latDeg, 'deg');
      requireFlagItem('--geo', 'longitude', lon, INPUT_RANGES.lonDeg, 'deg');
      requireFlagItem('--geo', 'height', alt, GEO_HEIGHT_RANGE_KM, 'km');
      gsmFromGeo(p, geoFromGeodetic(new Float64Array(3), lat, lon, alt), f);
    }
    const b = new Float64Array(3);
    ctx.model.evaluate(b, p[0], p[1], p[2]);
    const bGeo = geoFromGsm(new Float64Array(3), b, f);
    const bNt = Math.hypot(b[0], b[1], b[2]);
    const inside = ctx.model.isInside(p[0], p[1], p[2]);
    const rRe = Math.hypot(p[0], p[1], p[2]);
    const d = describePoint(f, p[0], p[1], p[2]);
    if (!inside) ctx.warn('the point lies outside the magnetopause: the model describes the field inside only');
    // Below the ground, not below the 6371.2 km reference sphere: the WGS84 ellipsoid lies inside that sphere poleward of ~35°, and the main field holds down to the ground.
    if (d.altKm < -1e-6) ctx.warn(`the point lies ${(-d.altKm).toFixed(3)} km below the ground (the WGS84 ellipsoid): the model is a source-free field outside Earth`);
    const position = {
      gsmRe: [p[0], p[1], p[2]],
      rRe,
      geoLatDeg: d.geoLatDeg,
      geoLonDeg: d.geoLonDeg,
      altKm: d.altKm,
      magLatDeg: d.magLatDeg,
      magLonDeg: d.magLonDeg,
      mltHours: d.mltHours,
    };
    return {
      json: { position, bGsmNt: [b[0], b[1], b[2]], bNt, bGeoNt: [bGeo[0], bGeo[1], bGeo[2]], inside },
      csv: () =>
        writeCsv(
          ['x_gsm_re', 'y_gsm_re', 'z_gsm_re', 'r_re', 'geo_lat_deg', 'geo_lon_deg', 'alt_km', 'mag_lat_deg', 'mag_lon_deg', 'mlt_h',
            'bx_gsm_nt', 'by_gsm_nt', 'bz_gsm_nt', 'b_nt', 'bx_geo_nt', 'by_geo_nt', 'bz_geo_nt', 'inside'],
          [[p[0], p[1], p[2], rRe, d.geoLatDeg, d.geoLonDeg, d.altKm, d.magLatDeg, d.magLonDeg, d.mltHours,
            b[0], b[1], b[2], bNt, bGeo[0], bGeo[1], bGeo[2], inside]],
          { maxDecimals: CSV_DECIMALS },
        ),
      geojson: () => [
        pointFeature(d.geoLonDeg, d.geoLatDeg, { kind: 'fieldPoint', altKm: d.altKm, rRe, bGsmNt: [b[0], b[1], b[2]], bNt, bGeoNt: [bGeo[0], bGeo[1], bGeo[2]], inside }, d.altKm),
      ],
    };
  },
};
