/** What a prepared model used (storm state, source distance, geometry): the `used` block of oval and sites answers. */
import { DEG_PER_RAD } from '../../src/physics/constants';
import type { PreparedModel } from '../../src/physics/field/model';
import type { ModelUsed } from '../protocol';

export function modelUsed(m: PreparedModel, sourceRe: number | undefined): ModelUsed {
  return {
    dstNt: m.storm.dstNt,
    dstStarNt: m.storm.dstStarNt,
    dstSource: m.storm.dstSource,
    speedKms: m.storm.speedKms,
    speedSource: m.storm.speedSource,
    sourceRe: sourceRe ?? m.sourceRe,
    sourceReSet: sourceRe !== undefined,
    ringCurrentEnergyJ: m.ringEnergyJ,
    tiltDeg: m.frames.tiltRad * DEG_PER_RAD,
    standoffRe: m.magnetopause ? m.magnetopause.r0Re : null,
    igrfEpoch: m.decimalYear,
  };
}
