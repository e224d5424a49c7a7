import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers';
import {
  pressureCorrectedDst, steadyDstStar, integrateDstStar, DstStarStepper, injectionDecay, vbsMvPerM,
  BURTON_CORRECTION, OBRIEN_MCPHERRON_CORRECTION, requireDst, requireSpeed,
} from '../../../src/physics/field/storm-index';
import { InputError } from '../../../src/physics/errors';

describe('pressure-corrected storm index Dst* = Dst − b√Pdyn + c (references §10)', () => {
  it('O\'Brien & McPherron (2000) worked values (derived in references §10)', () => {
    expectClose(pressureCorrectedDst(-150, 5), -155.234, 5e-4, 'Dst −150, Pdyn 5 (O\'Brien–McPherron)');
    expectClose(pressureCorrectedDst(-80, 2), -79.267, 5e-4, 'Dst −80, Pdyn 2 (O\'Brien–McPherron)');
  });
  it('Burton et al. (1975) worked values (derived in references §10; constants from memory)', () => {
    expectClose(pressureCorrectedDst(-150, 5, BURTON_CORRECTION), -165.330, 5e-4, 'Dst −150, Pdyn 5 (Burton)');
    expectClose(pressureCorrectedDst(-80, 2, BURTON_CORRECTION), -82.345, 5e-4, 'Dst −80, Pdyn 2 (Burton)');
    expect(OBRIEN_MCPHERRON_CORRECTION.bNtPerSqrtNpa).toBe(7.26);
  });
  it('refuses non-physical input naming the field and the range', () => {
    expect(() => requireDst('dstNt', -2500)).toThrow(/dstNt.*-2000\.\.2000 nT/);
    expect(() => requireSpeed('speedKms', 0)).toThrow(InputError);
    expect(() => requireSpeed('speedKms', 3500)).toThrow(/speedKms.*3000 km\/s/);
    expect(() => requireSpeed('speedKms', Number.NaN)).toThrow(/speedKms/);
  });
});

describe('O\'Brien–McPherron injection–decay (references §10)', () => {
  it('steady state Q·τ: worked values of references §10', () => {
    const qt = injectionDecay(new Float64Array(2), vbsMvPerM(500, -20));
    expectClose(qt[0], -41.844, 5e-4, 'Q at V 500, Bz −20 (nT/h)');
    expectClose(qt[1], 4.6576, 5e-4, 'τ at VBs 10 mV/m (h)');
    expectClose(steadyDstStar(500, -20), -194.89, 0.01, 'steady Dst* V 500, Bz −20');
    expectClose(steadyDstStar(400, -5), -68.38, 0.01, 'steady Dst* V 400, Bz −5');
    expectClose(steadyDstStar(700, -40), -391.34, 0.01, 'steady Dst* V 700, Bz −40');
    expect(steadyDstStar(400, 5)).toBe(0);
    expect(steadyDstStar(400, -1)).toBe(0); // VBs 0.4 < 0.49 mV/m: no injection
  });
  it('Burton option: Q = −5.4 (VBs − 0.5) nT/h, τ 7.7 h (Burton et al. 1975, from memory)', () => {
    // V 500, Bz −20: VBs 10, Q = −51.3 nT/h, steady −395.01 nT (derived).
    expectClose(steadyDstStar(500, -20, 'burton'), -51.3 * 7.7, 1e-9, 'Burton steady state');
  });
  it('time-stepped estimate reaches the steady state after ~5 decay times (derived: residual e^−5 of the start)', () => {
    const tau = injectionDecay(new Float64Array(2), vbsMvPerM(500, -20))[1];
    const n = 200;
    const times = new Float64Array(n), v = new Float64Array(n).fill(500), bz = new Float64Array(n).fill(-20);
    const dtH = (6 * tau) / (n - 1);
    for (let i = 0; i < n; i++) times[i] = i * dtH * 3.6e6;
    const d = integrateDstStar(times, v, bz, 0);
    const steady = steadyDstStar(500, -20);
    expectClose(d[n - 1], steady, Math.abs(steady) * Math.exp(-6) * 1.0001, 'Dst* after 6τ (residual ≤ e^−6 of the start)');
    // Exact solution of the linear equation with constant drivers: D(t) = Qτ(1 − e^{−t/τ}) (derived).
    const mid = 50;
    expectClose(d[mid], steady * (1 - Math.exp(-(mid * dtH) / tau)), 1e-9, 'Dst* at an intermediate time vs the exact solution');
  });
  it('recovery after the driver stops decays with τ(VBs = 0) = 2.4·e^(9.74/4.69) h (O\'Brien–McPherron)', () => {
    const s = new DstStarStepper(-200);
    const tau0 = 2.4 * Math.exp(9.74 / 4.69);
    s.step(tau0, 400, 3);
    expectClose(s.dstStarNt, -200 / Math.E, 1e-9, 'one decay time of recovery');
  });
  it('refuses a decreasing series', () => {
    expect(() => integrateDstStar([0, -1], [400, 400], [0, 0])).toThrow(/time/);
  });
});
