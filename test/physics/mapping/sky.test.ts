import { describe, it } from 'vitest';
import { horizonCentralAngleDeg, elevationAtCentralAngleDeg, skyPosition } from '../../../src/physics/mapping';
import { expectClose } from '../../helpers';
import { RAD_PER_DEG, RE_KM } from '../../../src/physics/constants';

describe('sky geometry (references §7, derived: γ = acos(RE cos e/(RE+h)) − e)', () => {
  it.each([
    [110, 0, 10.571, 1175.5],
    [110, 10, 4.513, 501.8],
    [250, 0, 15.795, 1756.3],
    [250, 10, 8.626, 959.2],
  ])('h = %s km, e = %s°: γ = %s° (%s km)', (h, e, gamma, km) => {
    const g = horizonCentralAngleDeg(h, e);
    expectClose(g, gamma, 1e-3, 'central angle (references §7 rounds to 1e-3°)');
    expectClose(g * RAD_PER_DEG * RE_KM, km, 0.1, 'ground distance km (references §7 rounds to 0.1 km)');
    expectClose(elevationAtCentralAngleDeg(h, g), e, 1e-9, 'inverse: elevation at γ');
  });

  it('skyPosition: a point straight above is at 90°; a point due north at γ(0°) sits on the horizon (spherical limit)', () => {
    expectClose(skyPosition(0, 10, 0, 0, 10, 110).elevationDeg, 90, 1e-9, 'zenith');
    // On the equator the WGS84 normal is radial, so the spherical formula applies along the meridian to ~0.2°.
    const g = horizonCentralAngleDeg(110, 10);
    const s = skyPosition(0, 0, 0, g * 0.99, 0, 110);
    expectClose(s.azimuthDeg, 0, 1e-9, 'azimuth due north');
    expectClose(s.elevationDeg, 10, 0.3, 'elevation near 10° (ellipsoid vs sphere)');
  });
});
