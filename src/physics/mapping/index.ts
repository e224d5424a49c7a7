/**
 * Mapping products over a prepared model, the public face of this folder:
 * callers outside src/physics/mapping import from here, so files inside may move.
 *   lines.ts       a traced line described (type, footpoints, equator)
 *   sites.ts       a site's line, its near and far (conjugate) footpoints
 *   boundaries.ts  open–closed boundary and equatorward edge at one MLT
 *   hints.ts       starting guesses for those searches
 *   oval.ts        boundaries around the clock; a footpoint against the oval
 *   flux.ts        open flux through the polar cap
 *   sweep.ts       boundaries as Pdyn or Bz varies
 *   sky.ts         where a point at altitude stands in a site's sky
 *   site-report.ts everything about one site
 *   cgm-model.ts   corrected geomagnetic coordinates for a prepared model
 *   cgm-graticule.ts  CGM latitude circles and MLT meridians for maps
 */
export type { Footpoint, EquatorCrossing, Hemisphere } from '../trace/footpoint';
export { makeTracer, traceGsm, type LineResult } from './lines';
export { siteGsm, splitFootpoints, traceSite, type NearFarFootpoints, type SiteLine } from './sites';
export {
  sectorBoundaries, boundaryPoint, classificationReturnRe, DEFAULT_SOURCE_RE, DEFAULT_BOUNDARY_OPTIONS,
  type BoundaryPoint, type SectorBoundaries, type MissingBoundaryReason, type BoundaryOptions, type BoundaryHint,
} from './boundaries';
export { predictHint, boundaryFinder } from './hints';
export { mltGrid, ovalSectors, ovalBoundaries, ovalRelation, ovalRelationReason, type HemisphereBoundaries, type OvalRelation } from './oval';
export { openFluxWb, type OpenFluxOptions } from './flux';
export { sweepBoundaries, type SweepOptions, type SweepRows } from './sweep';
export { skyPosition, horizonCentralAngleDeg, elevationAtCentralAngleDeg, type SkyPosition } from './sky';
export { siteReport, type SiteInput, type SiteResult, type SiteReportOptions, type BoundaryProvider } from './site-report';
export { cgmOf, cgmPair, MLT_LABEL_CGM, MLT_LABEL_MAG, type CgmPair, type CgmResult, type CgmConverter } from './cgm-model';
export { cgmGraticuleOf, buildCgmGraticule, type CgmGraticule, type CgmGraticuleOptions, type GraticuleLine } from './cgm-graticule';
