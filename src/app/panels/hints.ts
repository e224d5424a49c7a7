/** The conditions panel's words: one line under every model parameter. */

/** One line under every model parameter: what it is and when to change it. */
export const HINTS = {
  pdyn: 'solar-wind ram pressure; squeezes the magnetosphere (quiet 1–3 nPa, storms 10 or more)',
  stormIndex: 'strength of the ring current; estimated from the solar-wind speed and Bz unless given',
  dst: 'negative in storms: −50 nT moderate, −100 nT intense, −250 nT extreme',
  speed: 'drives the storm-index estimate and the pressure from density',
  bz: 'north–south IMF (GSM); southward (negative) opens more lines and moves the oval equatorward',
  by: 'dawn–dusk IMF (GSM); shifts the open region towards dawn or dusk',
  altPreset: 'height of the glow mapped to the oval, footpoints and sky positions',
  altKm: 'height where field lines are cut for the footpoint, the oval and the sky direction',
  conjugateAltKm: 'height of the conjugate point; the footpoint altitude unless set apart',
  igrf: 'IGRF-14 main field of the date: use for real sites, conjugates and sky directions',
  dipole: 'centred dipole: a symmetric simplification for teaching and checks; conjugates can be hundreds of km off',
  epsilon: 'IMF efficiency ε: share of the IMF that penetrates the magnetosphere (0 none, 1 all)',
  sourceRe: 'equatorial distance (RE) whose footprint is the oval\'s equatorward edge; by default it follows the storm',
  minElevation: 'lowest sky elevation counted as visible (hills, trees, haze)',
  minLat: 'lowest magnetic latitude the boundary searches start from; lower it for great storms',
  magnetopause: 'the magnetopause currents\' field: the dayside compression that grows with the pressure',
  tail: 'the tail current sheet: stretches night-side lines and moves the oval equatorward',
  tilt: 'the dipole tilt follows the time (status line under the 3D view)',
} as const;
