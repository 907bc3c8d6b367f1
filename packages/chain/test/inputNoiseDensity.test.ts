import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bridgeNoiseSource, combineNoise, inputNoiseDensity, johnsonNoiseDensity } from '@bridgework/chain';
import { exactDecimalString } from '@bridgework/core';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });

describe('inputNoiseDensity: the issue #4 combined budget', () => {
  it('350 Ω bridge, 10 nV/√Hz, 1 pA/√Hz, 25 °C → 10.28709 nV/√Hz total', () => {
    // Derived by hand: e² = e_n² + 4kT·R + i_n²·((R/2)² + (R/2)²)
    //   = 100 + 5.762967 + 0.06125 (nV/√Hz)² = 105.824217 → 10.287090 nV/√Hz.
    // Each input's noise current flows through its own node (R1∥R2 = R3∥R4 = 175 Ω), uncorrelated.
    const r = inputNoiseDensity({
      armsOhms: [350, 350, 350, 350],
      temperatureCelsius: 25,
      amplifier: { inputVoltageNoiseVoltsPerRootHz: 10e-9, currentNoiseAmpsPerRootHz: 1e-12 },
    });
    expect(r.totalVoltsPerRootHz * 1e9).toBeNear(10.28709, { abs: 5e-6 });
    const hand = Math.sqrt(1e-16 + johnsonNoiseDensity({ ohms: 350 }) ** 2 + (1e-12 * 175) ** 2 * 2);
    expect(r.totalVoltsPerRootHz).toBeNear(hand, { ulps: 4 });
    expect(r.terms.map((t) => t.name)).toEqual([
      'bridge-thermal',
      'amplifier-voltage',
      'amplifier-current',
      'amplifier-output',
    ]);
    expect(r.terms[2]!.value).toBeNear((1e-12 * 350) / Math.SQRT2, { ulps: 2 });
    expect(r.terms.reduce((s, t) => s + t.fractionOfPower, 0)).toBeNear(1, { ulps: 4 });
  });

  it('evaluates the 1/f terms at a frequency, refers output noise to the input by the gain', () => {
    const base = {
      armsOhms: [350, 350, 350, 350] as const,
      amplifier: {
        inputVoltageNoiseVoltsPerRootHz: 8e-9,
        voltageCornerHertz: 50,
        currentNoiseAmpsPerRootHz: 0.5e-12,
        currentCornerHertz: 200,
        outputVoltageNoiseVoltsPerRootHz: 90e-9,
      },
      gain: 100,
    };
    const at2 = inputNoiseDensity({ ...base, frequencyHertz: 2 });
    const byTerm = Object.fromEntries(at2.terms.map((t) => [t.name, t.value]));
    expect(byTerm['amplifier-voltage']).toBeNear(8e-9 * Math.sqrt(1 + 50 / 2), { ulps: 2 });
    expect(byTerm['amplifier-current']).toBeNear(0.5e-12 * (350 / Math.SQRT2) * Math.sqrt(1 + 200 / 2), {
      ulps: 4,
    });
    expect(byTerm['amplifier-output']).toBeNear(0.9e-9, { ulps: 1 });
    const white = inputNoiseDensity(base);
    expect(white.terms[1]!.value).toBe(8e-9);
    expect(white.terms[1]!.cornerHertz).toBe(50);
    expect(white.bridge).toEqual(bridgeNoiseSource({ armsOhms: base.armsOhms }));
  });

  it('with no amplifier is the bridge thermal noise alone', () => {
    const r = inputNoiseDensity({ armsOhms: [120, 120, 120, 120] });
    expect(r.totalVoltsPerRootHz).toBe(johnsonNoiseDensity({ ohms: 120 }));
  });

  it.each([
    [
      'negative voltage noise',
      { amplifier: { inputVoltageNoiseVoltsPerRootHz: -1e-9 } },
      'negative',
      'amplifier.inputVoltageNoiseVoltsPerRootHz',
    ],
    [
      'NaN corner',
      { amplifier: { voltageCornerHertz: Number.NaN } },
      'not-finite',
      'amplifier.voltageCornerHertz',
    ],
    [
      'string current noise',
      { amplifier: { currentNoiseAmpsPerRootHz: '1p' } },
      'wrong-type',
      'amplifier.currentNoiseAmpsPerRootHz',
    ],
    [
      'negative output noise',
      { amplifier: { outputVoltageNoiseVoltsPerRootHz: -1 } },
      'negative',
      'amplifier.outputVoltageNoiseVoltsPerRootHz',
    ],
    ['zero gain', { gain: 0 }, 'not-positive', 'gain'],
    ['zero frequency', { frequencyHertz: 0 }, 'not-positive', 'frequencyHertz'],
    ['amplifier not an object', { amplifier: 5 }, 'wrong-type', 'amplifier'],
  ] as const)('%s → %s', (_name, extra, code, param) => {
    expect(() =>
      inputNoiseDensity({ armsOhms: [350, 350, 350, 350], ...extra } as never),
    ).toThrowBridgeworkError(code, { param });
  });
});

describe('combineNoise', () => {
  it('3 and 4 give 5, with power shares 0.36 and 0.64', () => {
    const r = combineNoise([
      { name: 'a', value: 3 },
      { name: 'b', value: 4 },
    ]);
    expect(r.total).toBe(5);
    expect(r.terms.map((t) => t.fractionOfPower)).toBeNear([0.36, 0.64], { ulps: 2 });
  });

  it('agrees with a 40-digit root-sum-square, without overflow or underflow at the extremes', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -300, max: 300, noNaN: true }), { minLength: 1, maxLength: 8 }),
        (exps) => {
          const values = exps.map((e) => 10 ** e);
          const ref = values
            .reduce((s, v) => s.plus(new D(exactDecimalString(v)).pow(2)), new D(0))
            .sqrt()
            .toNumber();
          const r = combineNoise(values.map((value, i) => ({ name: `t${i}`, value })));
          expect(r.total).toBeNear(ref, { ulps: 8 }); // n ≤ 8 scaled squares, a sum and a root
          expect(r.terms.reduce((s, t) => s + t.fractionOfPower, 0)).toBeNear(1, { rel: 1e-14 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('gives 0 for no terms or all-zero terms', () => {
    expect(combineNoise([])).toEqual({ total: 0, terms: [] });
    expect(combineNoise([{ name: 'a', value: 0 }])).toEqual({
      total: 0,
      terms: [{ name: 'a', value: 0, fractionOfPower: 0 }],
    });
  });

  it.each([
    ['not an array', 5, 'invalid-shape', 'terms'],
    ['a null term', [null], 'wrong-type', 'terms[0]'],
    ['a nameless term', [{ value: 1 }], 'missing-option', 'terms[0].name'],
    ['a negative value', [{ name: 'a', value: -1 }], 'negative', 'terms[0].value'],
    [
      'a NaN value',
      [
        { name: 'a', value: 1 },
        { name: 'b', value: Number.NaN },
      ],
      'not-finite',
      'terms[1].value',
    ],
  ] as const)('%s → %s', (_name, terms, code, param) => {
    expect(() => combineNoise(terms as never)).toThrowBridgeworkError(code, { param });
  });
});
