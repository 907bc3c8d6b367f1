import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  microstrainFromStrain,
  millivoltsPerVoltFromRatio,
  ratioFromMillivoltsPerVolt,
  strainFromMicrostrain,
} from '@bridgework/core';

describe('strain and mV/V helpers', () => {
  it('convert exact decimal values exactly', () => {
    expect(strainFromMicrostrain(1000)).toBe(0.001);
    expect(strainFromMicrostrain(1)).toBe(1e-6);
    expect(microstrainFromStrain(0.001)).toBe(1000);
    expect(ratioFromMillivoltsPerVolt(2)).toBe(0.002);
    expect(millivoltsPerVoltFromRatio(0.002)).toBe(2);
  });

  it('round-trip within one ulp over ±1e6 µε', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }).filter((x) => x === 0 || Math.abs(x) > 1e-290),
        (ue) => {
          expect(microstrainFromStrain(strainFromMicrostrain(ue))).toBeNear(ue, { ulps: 1 });
          expect(millivoltsPerVoltFromRatio(ratioFromMillivoltsPerVolt(ue))).toBeNear(ue, { ulps: 1 });
        },
      ),
    );
  });
});
