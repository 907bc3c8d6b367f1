import { describe, expect, it } from 'vitest';
import { RTD_TOLERANCE_CLASSES, createRtd, rtdToleranceCelsius } from '@bridgework/compensation';

describe('rtdToleranceCelsius', () => {
  it('class A at 100 °C is ±0.35 °C (issue #3 check value; IEC 60751:2008, from memory)', () => {
    expect(rtdToleranceCelsius({ toleranceClass: 'A', temperatureCelsius: 100 })).toBeNear(0.35, { ulps: 1 });
  });

  it('follows ±(a + b·|t|) for every class: values by hand', () => {
    // IEC 60751:2008 tolerance classes (from memory): AA 0.1 + 0.0017|t|, A 0.15 + 0.002|t|,
    // B 0.3 + 0.005|t|, C 0.6 + 0.01|t|.
    expect(rtdToleranceCelsius({ toleranceClass: 'AA', temperatureCelsius: -50 })).toBeNear(0.185, {
      ulps: 1,
    });
    expect(rtdToleranceCelsius({ toleranceClass: 'B', temperatureCelsius: 0 })).toBe(0.3);
    expect(rtdToleranceCelsius({ toleranceClass: 'B', temperatureCelsius: -196 })).toBeNear(1.28, {
      ulps: 1,
    });
    expect(rtdToleranceCelsius({ toleranceClass: 'C', temperatureCelsius: 600 })).toBeNear(6.6, { ulps: 1 });
    expect(rtdToleranceCelsius({ toleranceClass: 'A', temperatureCelsius: 300, element: 'film' })).toBeNear(
      0.75,
      { ulps: 1 },
    );
  });

  it('in ohms via the local slope: class A ±0.13 Ω and class B ±0.30 Ω at 100 °C (IEC 60751 table, from memory)', () => {
    const pt100 = createRtd();
    const a = pt100.toleranceAt({ toleranceClass: 'A', temperatureCelsius: 100 });
    expect(a.celsius).toBeNear(0.35, { ulps: 1 });
    expect(a.ohms).toBeNear(0.13, { abs: 0.005 });
    expect(a.ohms).toBeNear(0.35 * pt100.slopeAt(100), { ulps: 2 });
    expect(pt100.toleranceAt({ toleranceClass: 'B', temperatureCelsius: 100 }).ohms).toBeNear(0.3, {
      abs: 0.005,
    });
    // At −200 °C class B is ±1.3 °C but only ±0.24 Ω: the slope is lower there (0.18 Ω/K).
    expect(createRtd().toleranceAt({ toleranceClass: 'B', temperatureCelsius: -196 }).ohms).toBeNear(
      1.28 * pt100.slopeAt(-196),
      { ulps: 2 },
    );
  });

  it('holds only over the validity range of the class and element', () => {
    expect(rtdToleranceCelsius({ toleranceClass: 'AA', temperatureCelsius: 250 })).toBeNear(0.525, {
      ulps: 1,
    });
    expect(() =>
      rtdToleranceCelsius({ toleranceClass: 'AA', temperatureCelsius: 251 }),
    ).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
    expect(() =>
      rtdToleranceCelsius({ toleranceClass: 'AA', temperatureCelsius: 160, element: 'film' }),
    ).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() =>
      rtdToleranceCelsius({ toleranceClass: 'A', temperatureCelsius: -101 }),
    ).toThrowBridgeworkError('out-of-range');
    expect(() =>
      rtdToleranceCelsius({ toleranceClass: 'B', temperatureCelsius: -197 }),
    ).toThrowBridgeworkError('out-of-range');
    expect(() =>
      rtdToleranceCelsius({ toleranceClass: 'C', temperatureCelsius: 700 }),
    ).toThrowBridgeworkError('out-of-range');
    for (const [name, spec] of Object.entries(RTD_TOLERANCE_CLASSES)) {
      expect(spec.filmRangeCelsius[0] >= spec.wireWoundRangeCelsius[0], name).toBe(true);
    }
  });

  it.each([
    ['unknown class', { toleranceClass: 'D', temperatureCelsius: 0 }, 'invalid-option', 'toleranceClass'],
    ['lower-case class', { toleranceClass: 'a', temperatureCelsius: 0 }, 'invalid-option', 'toleranceClass'],
    [
      'unknown element',
      { toleranceClass: 'A', temperatureCelsius: 0, element: 'thick-film' },
      'invalid-option',
      'element',
    ],
    [
      'NaN temperature',
      { toleranceClass: 'A', temperatureCelsius: Number.NaN },
      'not-finite',
      'temperatureCelsius',
    ],
    ['missing temperature', { toleranceClass: 'A' }, 'missing-option', 'options.temperatureCelsius'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => rtdToleranceCelsius(options as never)).toThrowBridgeworkError(code, { param });
  });
});
