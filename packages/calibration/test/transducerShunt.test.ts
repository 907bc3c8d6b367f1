import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  ratioChangeFromShunt,
  shuntEquivalentLoad,
  shuntOhmsForRatioChange,
  type BridgeArm,
} from '@bridgework/calibration';
import { physicalRatio } from './support/physicalBridge.js';

describe('full-bridge transducer shunt: check values', () => {
  it('43 575 Ω across one arm of four 350 Ω arms → −2.000000 mV/V (issue check value, derived)', () => {
    // R′ = Rg·Rs/(Rg + Rs); Vout/E = (R′R − R²)/((R′ + R)·2R) = (R′ − Rg)/(2(R′ + Rg)) = −Rg/(2(Rg + 2Rs))
    // = −350/(2·87 500) = −0.002 exactly (derived by hand from the bridge equation).
    // rel 1e-13: R′ is rounded to a double and the output is proportional to R′ − Rg (≈ 125× smaller).
    const change = ratioChangeFromShunt({ bridgeOhms: 350, shuntOhms: 43_575 });
    expect(change).toBeNear(-0.002, { rel: 1e-13 });
    expect((change * 1e3).toFixed(6)).toBe('-2.000000');
    expect(shuntOhmsForRatioChange({ bridgeOhms: 350, ratioChange: -0.002 })).toBeNear(43_575, {
      rel: 1e-13,
    });
  });

  it('follows −Rg/(2(Rg + 2Rs)) for any equal-arm bridge, and reverses sign on arms 2 and 4', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(120, 350, 700, 1000),
        fc.double({ min: 4, max: 7, noNaN: true }).map((d) => 10 ** d),
        fc.constantFrom<BridgeArm>(1, 2, 3, 4),
        (rg, rs, arm) => {
          const sign = arm % 2 === 1 ? -1 : 1;
          // rel: 32ε(1 + Rs/Rg), the rounding of R′ amplified by (Rg + Rs)/Rg (see the check above).
          expect(ratioChangeFromShunt({ bridgeOhms: rg, shuntOhms: rs, arm })).toBeNear(
            (sign * rg) / (2 * (rg + 2 * rs)),
            { rel: 32 * Number.EPSILON * (1 + rs / rg) },
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it('shunt for a target fraction of rated output: 80 % of 2 mV/V on 350 Ω arms', () => {
    // Rs = (Rg/(2|Δr|) − Rg)/2 = (350/0.0032 − 350)/2 = 54 512.5 Ω (the equal-arm formula inverted by hand).
    expect(shuntOhmsForRatioChange({ bridgeOhms: 350, ratioChange: -0.8 * 0.002 })).toBeNear(54_512.5, {
      rel: 1e-12,
    });
  });

  it('matches a 40-digit nodal solve of the transducer on four- and six-wire cables', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 4, max: 6, noNaN: true }).map((d) => 10 ** d),
        fc.constantFrom<BridgeArm>(1, 2, 3, 4),
        fc.constantFrom('four-wire', 'six-wire' as const),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        (rs, arm, wiring, ohmsPerLead, sourceOhms) => {
          // The physical circuit: excitation leads to the transducer, sense/signal leads without current.
          const bridge = {
            arrangement: 'full-bending',
            gaugeOhms: 350,
            completionOhms: 350,
            sourceOhms,
            wiring,
            ohmsPerLead,
          } as const;
          const physical =
            physicalRatio(bridge, { arm, placement: 'gauge', ohms: rs }) - physicalRatio(bridge);
          const computed = ratioChangeFromShunt({
            bridgeOhms: 350,
            shuntOhms: rs,
            arm,
            leads: { ohmsPerLead, wiring },
            sourceOhms,
          });
          expect(computed).toBeNear(physical, { rel: 32 * Number.EPSILON * (1 + rs / 350) + 1e-13 });
        },
      ),
      { numRuns: 120 },
    );
  });

  it('keeps an unbalanced bridge offset out of the step', () => {
    // Arms [351, 350, 350, 350]: the step is the shunted reading minus the unshunted one.
    const arms = [351, 350, 350, 350] as const;
    const ratio = (r1: number): number => (r1 * 350 - 350 * 350) / ((r1 + 350) * 700);
    const shunted = (351 * 43_575) / (351 + 43_575);
    expect(ratioChangeFromShunt({ armsOhms: arms, shuntOhms: 43_575 })).toBeNear(
      ratio(shunted) - ratio(351),
      {
        rel: 1e-12,
      },
    );
  });
});

describe('full-bridge transducer shunt: round trip', () => {
  it('shuntOhmsForRatioChange inverts ratioChangeFromShunt (500 random cases, leads included)', () => {
    fc.assert(
      fc.property(
        fc.tuple(
          fc.double({ min: 300, max: 400, noNaN: true }),
          fc.double({ min: 300, max: 400, noNaN: true }),
          fc.double({ min: 300, max: 400, noNaN: true }),
          fc.double({ min: 300, max: 400, noNaN: true }),
        ),
        fc.double({ min: 4, max: 7, noNaN: true }).map((d) => 10 ** d),
        fc.constantFrom<BridgeArm>(1, 2, 3, 4),
        fc.option(fc.constantFrom('four-wire', 'six-wire' as const), { nil: undefined }),
        (armsOhms, rs, arm, wiring) => {
          const network = {
            armsOhms,
            arm,
            sourceOhms: 2,
            ...(wiring === undefined ? {} : { leads: { ohmsPerLead: 1.5, wiring } }),
          };
          const ratioChange = ratioChangeFromShunt({ ...network, shuntOhms: rs });
          // rel 1e-9: the shunt is recovered from the arm change, (R + Rs)/R up to ~3e4 times smaller.
          expect(shuntOhmsForRatioChange({ ...network, ratioChange })).toBeNear(rs, { rel: 1e-9 });
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('shuntEquivalentLoad', () => {
  it('is capacity × shunt reading / rated output (common practice)', () => {
    // 5000 kg cell, RO 2.0012 mV/V, shunt reading −1.4979 mV/V → −3742.504… kg (by hand: 5000·1.4979/2.0012).
    expect(
      shuntEquivalentLoad({ capacity: 5000, ratedOutputVoltsPerVolt: 2.0012e-3, ratioChange: -1.4979e-3 }),
    ).toBeNear((-5000 * 1.4979) / 2.0012, { rel: 1e-15 });
    // Combined with the network: 43 575 Ω on a 2 mV/V, 350 Ω cell simulates exactly −capacity.
    const change = ratioChangeFromShunt({ bridgeOhms: 350, shuntOhms: 43_575 });
    expect(
      shuntEquivalentLoad({ capacity: 1000, ratedOutputVoltsPerVolt: 0.002, ratioChange: change }),
    ).toBeNear(-1000, { rel: 1e-13 });
  });

  it.each([
    ['capacity', { capacity: 0, ratedOutputVoltsPerVolt: 2e-3, ratioChange: 1e-3 }, 'not-positive'],
    ['capacity', { capacity: Number.NaN, ratedOutputVoltsPerVolt: 2e-3, ratioChange: 1e-3 }, 'not-finite'],
    [
      'ratedOutputVoltsPerVolt',
      { capacity: 1, ratedOutputVoltsPerVolt: 0, ratioChange: 1e-3 },
      'out-of-range',
    ],
    [
      'ratedOutputVoltsPerVolt',
      { capacity: 1, ratedOutputVoltsPerVolt: '2', ratioChange: 1e-3 },
      'wrong-type',
    ],
    ['ratioChange', { capacity: 1, ratedOutputVoltsPerVolt: 2e-3, ratioChange: Infinity }, 'not-finite'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => shuntEquivalentLoad(options as never)).toThrowBridgeworkError(code, { param });
  });
});

describe('full-bridge transducer shunt: bad input', () => {
  it.each([
    ['armsOhms', { bridgeOhms: 350, armsOhms: [350, 350, 350, 350], shuntOhms: 1e5 }, 'conflicting-options'],
    ['armsOhms', { armsOhms: [350, 350, 350], shuntOhms: 1e5 }, 'invalid-shape'],
    ['armsOhms[2]', { armsOhms: [350, 350, -1, 350], shuntOhms: 1e5 }, 'not-positive'],
    ['bridgeOhms', { bridgeOhms: Number.NaN, shuntOhms: 1e5 }, 'not-finite'],
    ['shuntOhms', { shuntOhms: 0 }, 'not-positive'],
    ['shuntOhms', { shuntOhms: Number.NaN }, 'not-finite'],
    ['arm', { shuntOhms: 1e5, arm: 0 }, 'out-of-range'],
    ['leads.wiring', { shuntOhms: 1e5, leads: { ohmsPerLead: 1, wiring: 'three-wire' } }, 'invalid-option'],
    [
      'leads.ohmsPerLead',
      { shuntOhms: 1e5, leads: { ohmsPerLead: Number.NaN, wiring: 'four-wire' } },
      'not-finite',
    ],
    ['sourceOhms', { shuntOhms: 1e5, sourceOhms: -1 }, 'negative'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => ratioChangeFromShunt(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a change of the wrong sign, zero, and one no positive shunt reaches', () => {
    expect(() => shuntOhmsForRatioChange({ ratioChange: 1e-3 })).toThrowBridgeworkError('out-of-range', {
      param: 'ratioChange',
    });
    expect(() => shuntOhmsForRatioChange({ ratioChange: 0, arm: 2 })).toThrowBridgeworkError('out-of-range', {
      param: 'ratioChange',
    });
    // A short across arm 1 of an equal-arm bridge gives −1/2 (R′ → 0: (0 − R)/(2(0 + R))): −0.6 is beyond it.
    expect(() => shuntOhmsForRatioChange({ ratioChange: -0.6 })).toThrowBridgeworkError('no-solution', {
      param: 'ratioChange',
    });
    expect(() => shuntOhmsForRatioChange({ ratioChange: Number.NaN })).toThrowBridgeworkError('not-finite', {
      param: 'ratioChange',
    });
  });
});
