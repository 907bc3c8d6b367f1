import { describe, expect, it } from 'vitest';
import { rosetteLegAngles } from '@bridgework/core';

describe('rosetteLegAngles', () => {
  it('gives 0°/45°/90° for rectangular and 0°/60°/120° for delta rosettes (common practice)', () => {
    expect(rosetteLegAngles('rectangular')).toBeNear([0, Math.PI / 4, Math.PI / 2], { ulps: 0 });
    expect(rosetteLegAngles('delta')).toBeNear([0, Math.PI / 3, (2 * Math.PI) / 3], { ulps: 0 });
  });

  it('passes any three explicit angles through', () => {
    expect(rosetteLegAngles({ anglesRadians: [0.1, 1, 2] })).toEqual([0.1, 1, 2]);
  });

  it('rejects unknown names, wrong shapes and non-finite angles', () => {
    expect(() => rosetteLegAngles('tee' as never)).toThrowBridgeworkError('invalid-option', {
      param: 'layout',
    });
    expect(() => rosetteLegAngles({ anglesRadians: [0, 1] } as never)).toThrowBridgeworkError(
      'invalid-shape',
      {
        param: 'layout.anglesRadians',
      },
    );
    expect(() => rosetteLegAngles({ anglesRadians: [0, Number.NaN, 1] })).toThrowBridgeworkError(
      'not-finite',
      {
        param: 'layout.anglesRadians[1]',
      },
    );
    expect(() => rosetteLegAngles(null as never)).toThrowBridgeworkError('wrong-type', { param: 'layout' });
  });
});
