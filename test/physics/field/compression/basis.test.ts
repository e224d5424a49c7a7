import { describe, it } from 'vitest';
import { sinSmall, cosSmall } from '../../../../src/physics/field/compression/small-trig';
import { expectAtMost } from '../../../helpers';

describe('fast sin/cos of the compression basis against Math.* (reference: the platform libm)', () => {
  it('sinSmall/cosSmall within 1e-13 of Math.sin/Math.cos on |u| ≤ 1.6 and equal beyond', () => {
    let worst = 0;
    for (let u = -3; u <= 3; u += 1e-4) worst = Math.max(worst, Math.abs(sinSmall(u) - Math.sin(u)), Math.abs(cosSmall(u) - Math.cos(u)));
    expectAtMost(worst, 1e-13, 'max error');
  });
});
