import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  createStrainBridge,
  needsPoissonRatio,
  solveBridge,
  strainArrangements,
  type StrainArrangement,
  type StrainBridgeOptions,
} from '@bridgework/bridge';
import type { LeadWiring } from '@bridgework/core';

const reference = JSON.parse(
  readFileSync(new URL('./fixtures/strain-bridge/reference.json', import.meta.url), 'utf8'),
) as { cases: (StrainBridgeOptions & { strain: number; ratio: string })[] };

const wirings: Record<StrainArrangement, readonly LeadWiring[]> = {
  quarter: ['two-wire', 'three-wire'],
  'half-bending': ['three-wire'],
  'half-poisson': ['three-wire'],
  'half-opposite': ['two-wire'],
  'full-bending': ['four-wire', 'six-wire'],
  'full-poisson': ['four-wire', 'six-wire'],
  'full-shear': ['four-wire', 'six-wire'],
  'full-bending-poisson': ['four-wire', 'six-wire'],
};

/** Random bridge options over the domain: GF 1.8–4.5, leads optional, ν 0.25–0.35. */
const bridgeOptions = fc
  .record({
    arrangement: fc.constantFrom(...strainArrangements),
    gaugeFactor: fc.double({ min: 1.8, max: 4.5, noNaN: true }),
    gaugeOhms: fc.constantFrom(120, 350, 1000),
    poissonRatio: fc.double({ min: 0.25, max: 0.35, noNaN: true }),
    ohmsPerLead: fc.double({ min: 0, max: 5, noNaN: true }),
    withLeads: fc.boolean(),
    wiringIndex: fc.nat(1),
    sourceOhms: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 10, noNaN: true })),
  })
  .map((o): StrainBridgeOptions => {
    const choices = wirings[o.arrangement];
    const wiring = choices[o.wiringIndex % choices.length]!;
    return {
      arrangement: o.arrangement,
      gaugeFactor: o.gaugeFactor,
      gaugeOhms: o.gaugeOhms,
      poissonRatio: o.poissonRatio,
      sourceOhms: o.sourceOhms,
      ...(o.withLeads ? { leads: { ohmsPerLead: o.ohmsPerLead, wiring } } : {}),
    };
  });
const microstrain = fc.double({ min: -50_000, max: 50_000, noNaN: true });

describe('createStrainBridge: check values', () => {
  it('quarter, GF 2.0, ±1000 µε → 0.4995004995 / −0.5005005005 mV/V', () => {
    // Quarter-bridge equation Vout/E = GF·ε/(4 + 2·GF·ε): Dally & Riley, Experimental Stress
    // Analysis, Wheatstone bridge chapter (from memory); values by hand: 0.002/4.004, −0.002/3.996.
    const b = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(b.ratioFromStrain(1e-3) * 1e3).toBeNear(0.4995004995, { rel: 1e-10 });
    expect(b.ratioFromStrain(-1e-3) * 1e3).toBeNear(-0.5005005005, { rel: 1e-10 });
    expect(b.ratioFromStrain(1e-3)).toBeNear(0.002 / 4.004, { ulps: 2 });
  });

  it('half-poisson, GF 2.0, ν 0.3, +1000 µε → 0.649545318277 mV/V', () => {
    // Vout/E = GF·ε(1 + ν)/(4 + 2·GF·ε(1 − ν)): the two-active-arm bridge with a Poisson gauge
    // (Window & Holister, Strain Gauge Technology, bridge chapter; from memory).
    const b = createStrainBridge({ arrangement: 'half-poisson', gaugeFactor: 2, poissonRatio: 0.3 });
    expect(b.ratioFromStrain(1e-3) * 1e3).toBeNear(0.649545318277, { rel: 1e-12 });
    expect(b.ratioFromStrain(1e-3)).toBeNear((0.002 * 1.3) / (4 + 0.004 * 0.7), { ulps: 4 });
  });

  it('full-poisson, GF 2.0, ν 0.3, +10 000 µε → 12.909632572 mV/V', () => {
    // Vout/E = GF·ε(1 + ν)/(2 + GF·ε(1 − ν)): the axial column with Poisson gauges in both halves
    // (same handbook chapter; from memory).
    const b = createStrainBridge({ arrangement: 'full-poisson', gaugeFactor: 2, poissonRatio: 0.3 });
    expect(b.ratioFromStrain(1e-2) * 1e3).toBeNear(12.909632572, { rel: 1e-10 });
  });

  it('gives the textbook nonlinearity of a quarter bridge, GF·ε/(2 + GF·ε), and none for bending bridges', () => {
    // Quarter-bridge nonlinearity η = x/(2 + x), x = GF·ε: same textbook (from memory).
    const q = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2.1 });
    for (const e of [-0.05, -1e-3, 1e-6, 1e-3, 0.05]) {
      const x = 2.1 * e;
      expect(q.nonlinearity(e)).toBeNear(x / (2 + x), { rel: 1e-13 });
    }
    expect(q.nonlinearity(0)).toBe(0);
    for (const arrangement of ['half-bending', 'full-bending', 'full-shear'] as const) {
      const b = createStrainBridge({ arrangement, gaugeFactor: 2.1 });
      expect(b.nonlinearity(0.02)).toBe(0);
      expect(b.ratioFromStrain(0.02)).toBeNear((b.bridgeFactor * 2.1 * 0.02) / 4, { ulps: 2 });
    }
  });

  it('has the nominal bridge factors N (Vout/E ≈ N·GF·ε/4)', () => {
    const nu = 0.3;
    const expected: Record<StrainArrangement, number> = {
      quarter: 1,
      'half-bending': 2,
      'half-poisson': 1 + nu,
      'half-opposite': 2,
      'full-bending': 4,
      'full-poisson': 2 * (1 + nu),
      'full-shear': 4,
      'full-bending-poisson': 2 * (1 + nu),
    };
    for (const arrangement of strainArrangements) {
      const b = createStrainBridge({ arrangement, gaugeFactor: 2, poissonRatio: nu });
      expect(b.bridgeFactor).toBeNear(expected[arrangement], { ulps: 1 });
      // Without leads the exact slope at zero equals the nominal one.
      expect(b.sensitivity).toBeNear((expected[arrangement] * 2) / 4, { ulps: 2 });
      expect(b.offsetRatio).toBe(0);
    }
  });
});

describe('createStrainBridge against 50-digit references (fixture: strain-bridge)', () => {
  it(`matches all ${reference.cases.length} reference ratios, leads and source resistance included`, () => {
    for (const { strain, ratio: exact, ...options } of reference.cases) {
      const b = createStrainBridge(options);
      const expected = Number(exact);
      const ratio = b.ratioFromStrain(strain);
      expect(ratio).toBeNear(expected, { rel: 1e-14, abs: 1e-20 });
      // And back: the inverse returns the strain (absolute floor 1e-17 m/m at zero strain).
      expect(b.strainFromRatio(expected)).toBeNear(strain, { rel: 1e-12, abs: 1e-17 });
    }
  });
});

describe('createStrainBridge: round trips and consistency', () => {
  it('strain → ratio → strain is exact to 1e-12 for every arrangement over ±50 000 µε, GF 1.8–4.5', () => {
    fc.assert(
      fc.property(bridgeOptions, microstrain, (options, ue) => {
        const b = createStrainBridge(options);
        const strain = ue / 1e6;
        // Absolute floor 1e-16 m/m (1e-10 µε): with a two-wire lead offset r0 the ratio's own
        // rounding, ulp(r0)/sensitivity, is a few 1e-18 m/m, so relative precision ends there.
        expect(b.strainFromRatio(b.ratioFromStrain(strain))).toBeNear(strain, { rel: 1e-12, abs: 1e-16 });
      }),
      { numRuns: 5000 },
    );
  });

  it('equals solveBridge on the same arms and series resistance (two closed forms, one network)', () => {
    fc.assert(
      fc.property(bridgeOptions, microstrain, (options, ue) => {
        const b = createStrainBridge(options);
        const strain = ue / 1e6;
        const s = solveBridge({ armsOhms: b.armsOhms(strain), excitationVolts: 1, sourceOhms: b.seriesOhms });
        // Absolute floor 1e-16 V/V: armsOhms rounds each arm to a double (ulp(R)/4R ≈ 3e-17).
        expect(b.ratioFromStrain(strain)).toBeNear(s.ratio, { rel: 1e-12, abs: 1e-16 });
      }),
      { numRuns: 2000 },
    );
  });

  it('has a linear-fractional form in lowest terms for every arrangement but full-bending-poisson', () => {
    fc.assert(
      fc.property(bridgeOptions, microstrain, (options, ue) => {
        const b = createStrainBridge(options);
        const lf = b.linearFractional;
        if (options.arrangement === 'full-bending-poisson') {
          expect(lf).toBeUndefined();
          return;
        }
        expect(lf).toBeDefined();
        const strain = ue / 1e6;
        const [m0, m1] = lf!.numerator;
        const [k0, k1] = lf!.denominator;
        // Same map as the quadratic form (absolute floor: the ratio's own rounding near zero).
        expect((m0 + m1 * strain) / (k0 + k1 * strain)).toBeNear(b.ratioFromStrain(strain), {
          rel: 1e-13,
          abs: 1e-17,
        });
      }),
      { numRuns: 2000 },
    );
  });

  it('is strictly increasing in strain over its whole range (so the inverse is unique)', () => {
    fc.assert(
      fc.property(bridgeOptions, fc.double({ min: 0.001, max: 0.999, noNaN: true }), (options, u) => {
        const b = createStrainBridge(options);
        const lo = Math.max(b.strainRange.min, -0.5);
        const hi = Math.min(b.strainRange.max, 0.5);
        const e1 = lo + (hi - lo) * u;
        const e2 = e1 + (hi - e1) * 0.01;
        expect(b.ratioFromStrain(e2)).toBeGreaterThan(b.ratioFromStrain(e1));
      }),
      { numRuns: 1000 },
    );
  });

  it('never returns NaN: a ratio is either solved inside the strain range or rejected', () => {
    fc.assert(
      fc.property(bridgeOptions, fc.double({ min: -1.5, max: 1.5, noNaN: true }), (options, ratio) => {
        const b = createStrainBridge(options);
        let strain: number | undefined;
        try {
          strain = b.strainFromRatio(ratio);
        } catch (e) {
          expect((e as { code: string }).code).toBe('ratio-out-of-range');
          expect(ratio <= b.ratioRange.min || ratio >= b.ratioRange.max).toBe(true);
          return;
        }
        expect(strain > b.strainRange.min && strain < b.strainRange.max).toBe(true);
        expect(b.ratioFromStrain(strain)).toBeNear(ratio, { rel: 1e-9, abs: 1e-15 });
      }),
      { numRuns: 3000 },
    );
  });
});

describe('createStrainBridge: leads', () => {
  const rg = 350;
  const rl = 1.5;

  it('three-wire quarter bridge: no zero offset, span reduced by exactly Rg/(Rg + RL)', () => {
    // Common practice: the three-wire circuit puts one lead in each of arms 1 and 2, so lead
    // resistance cancels at balance and desensitizes by Rg/(Rg + RL) (equal completion).
    const b = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      gaugeOhms: rg,
      leads: { ohmsPerLead: rl, wiring: 'three-wire' },
    });
    const ideal = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2, gaugeOhms: rg });
    expect(b.offsetRatio).toBe(0);
    expect(b.ratioFromStrain(0)).toBe(0);
    expect(b.sensitivity / ideal.sensitivity).toBeNear(rg / (rg + rl), { rel: 1e-15 });
  });

  it('two-wire quarter bridge balanced with the leads: span reduced by exactly Rg/(Rg + 2RL)', () => {
    // Common practice: the lead-wire desensitization of a two-wire gauge is Rg/(Rg + 2RL) when the
    // bridge is balanced (completion = Rg + 2RL).
    const b = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      gaugeOhms: rg,
      completionOhms: rg + 2 * rl,
      leads: { ohmsPerLead: rl, wiring: 'two-wire' },
    });
    expect(b.offsetRatio).toBe(0);
    expect(b.sensitivity).toBeNear(((2 / 4) * rg) / (rg + 2 * rl), { rel: 1e-15 });
  });

  it('two-wire quarter bridge with nominal completion shows the lead offset 2RL/(2(2Rg + 2RL))', () => {
    const b = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      gaugeOhms: rg,
      leads: { ohmsPerLead: rl, wiring: 'two-wire' },
    });
    expect(b.offsetRatio).toBeNear((2 * rl) / (2 * (2 * rg + 2 * rl)), { rel: 1e-15 });
  });

  it('four-wire full bridge: span factor Rin/(Rin + 2RL); six-wire remote sense removes it', () => {
    // Common practice: excitation-lead drop on a 4-wire cable scales the output by Rin/(Rin + 2RL).
    const four = createStrainBridge({
      arrangement: 'full-bending',
      gaugeFactor: 2,
      gaugeOhms: rg,
      leads: { ohmsPerLead: rl, wiring: 'four-wire' },
    });
    const six = createStrainBridge({
      arrangement: 'full-bending',
      gaugeFactor: 2,
      gaugeOhms: rg,
      leads: { ohmsPerLead: rl, wiring: 'six-wire' },
    });
    const ideal = createStrainBridge({ arrangement: 'full-bending', gaugeFactor: 2, gaugeOhms: rg });
    // A full-bending bridge's input resistance stays Rg at every strain.
    for (const e of [-0.01, 1e-3, 0.02]) {
      expect(four.ratioFromStrain(e) / ideal.ratioFromStrain(e)).toBeNear(rg / (rg + 2 * rl), { rel: 1e-15 });
      expect(six.ratioFromStrain(e)).toBe(ideal.ratioFromStrain(e));
    }
    expect(four.seriesOhms).toBe(2 * rl);
    expect(six.seriesOhms).toBe(0);
  });

  it('rejects wirings an arrangement cannot take', () => {
    expect(() =>
      createStrainBridge({
        arrangement: 'quarter',
        gaugeFactor: 2,
        leads: { ohmsPerLead: 1, wiring: 'four-wire' },
      }),
    ).toThrowBridgeworkError('invalid-option', { param: 'leads.wiring' });
    expect(() =>
      createStrainBridge({
        arrangement: 'full-poisson',
        gaugeFactor: 2,
        poissonRatio: 0.3,
        leads: { ohmsPerLead: 1, wiring: 'three-wire' },
      }),
    ).toThrowBridgeworkError('invalid-option', { param: 'leads.wiring' });
    expect(() =>
      createStrainBridge({
        arrangement: 'quarter',
        gaugeFactor: 2,
        leads: { ohmsPerLead: -1, wiring: 'two-wire' },
      }),
    ).toThrowBridgeworkError('negative', { param: 'leads.ohmsPerLead' });
    expect(() =>
      createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2, leads: 3 as never }),
    ).toThrowBridgeworkError('wrong-type', { param: 'leads' });
  });
});

describe('createStrainBridge: two-reading method', () => {
  it('recovers the true strain of a gauge that is off nominal at zero (exact for a quarter bridge)', () => {
    // The real gauge is 351.2 Ω at zero load; the instrument is set up for a nominal 350 Ω gauge.
    fc.assert(
      fc.property(
        fc.double({ min: 345, max: 355, noNaN: true }),
        microstrain,
        fc.constantFrom<LeadWiring | undefined>(undefined, 'two-wire', 'three-wire'),
        (actualOhms, ue, wiring) => {
          const leads = wiring === undefined ? {} : { leads: { ohmsPerLead: 0.8, wiring } };
          const real = createStrainBridge({
            arrangement: 'quarter',
            gaugeFactor: 2.05,
            gaugeOhms: actualOhms,
            completionOhms: 350,
            ...leads,
          });
          const nominal = createStrainBridge({
            arrangement: 'quarter',
            gaugeFactor: 2.05,
            gaugeOhms: 350,
            ...leads,
          });
          const strain = ue / 1e6;
          const zeroRatio = real.ratioFromStrain(0);
          const got = nominal.strainFromRatio(real.ratioFromStrain(strain), { zeroRatio });
          expect(got).toBeNear(strain, { rel: 1e-10, abs: 1e-16 });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('ratioFromStrain with the same zero is its exact inverse', () => {
    fc.assert(
      fc.property(
        bridgeOptions,
        microstrain,
        fc.double({ min: -2000, max: 2000, noNaN: true }),
        (options, ue, zeroUe) => {
          const b = createStrainBridge(options);
          const zeroRatio = b.ratioFromStrain(zeroUe / 1e6);
          const strain = ue / 1e6;
          const ratio = b.ratioFromStrain(strain, { zeroRatio });
          expect(b.strainFromRatio(ratio, { zeroRatio })).toBeNear(strain, { rel: 1e-11, abs: 1e-16 });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('differs from subtracting ratios, which carries the zero offset into the span', () => {
    // A gauge 2 % above nominal: subtracting ratios reads 2000 µε as 1999.76 µε (−1.2e-4 relative).
    const real = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      gaugeOhms: 357,
      completionOhms: 350,
    });
    const nominal = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2, gaugeOhms: 350 });
    const zeroRatio = real.ratioFromStrain(0);
    const loaded = real.ratioFromStrain(2e-3);
    expect(nominal.strainFromRatio(loaded, { zeroRatio })).toBeNear(2e-3, { rel: 1e-12 });
    const subtracted = nominal.strainFromRatio(loaded - zeroRatio);
    expect(Math.abs(subtracted - 2e-3) / 2e-3).toBeGreaterThan(1e-4);
  });
});

describe('createStrainBridge: ranges and bad inputs', () => {
  it('states its strain and ratio ranges and rejects values outside them', () => {
    const q = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(q.strainRange).toEqual({ min: -0.5, max: Infinity });
    expect(q.ratioRange.min).toBeNear(-0.5, { ulps: 0 });
    expect(q.ratioRange.max).toBeNear(0.5, { ulps: 0 });
    expect(() => q.ratioFromStrain(-0.5)).toThrowBridgeworkError('out-of-range', { param: 'strain' });
    expect(() => q.strainFromRatio(0.5)).toThrowBridgeworkError('ratio-out-of-range', { param: 'ratio' });
    expect(() => q.strainFromRatio(-0.7)).toThrowBridgeworkError('ratio-out-of-range');
    expect(() => q.strainFromRatio(1e-3, { zeroRatio: 0.9 })).toThrowBridgeworkError('ratio-out-of-range', {
      param: 'zeroRatio',
    });
    const fb = createStrainBridge({ arrangement: 'full-bending', gaugeFactor: 2 });
    expect(fb.strainRange).toEqual({ min: -0.5, max: 0.5 });
    expect(() => fb.strainFromRatio(1)).toThrowBridgeworkError('ratio-out-of-range');
  });

  it.each([
    ['unknown arrangement', { arrangement: 'quater', gaugeFactor: 2 }, 'invalid-option', 'arrangement'],
    [
      'missing Poisson ratio',
      { arrangement: 'half-poisson', gaugeFactor: 2 },
      'missing-option',
      'poissonRatio',
    ],
    [
      'Poisson ratio 0.6',
      { arrangement: 'full-poisson', gaugeFactor: 2, poissonRatio: 0.6 },
      'out-of-range',
      'poissonRatio',
    ],
    [
      'Poisson ratio −1',
      { arrangement: 'full-poisson', gaugeFactor: 2, poissonRatio: -1 },
      'out-of-range',
      'poissonRatio',
    ],
    [
      'Poisson ratio NaN',
      { arrangement: 'full-bending-poisson', gaugeFactor: 2, poissonRatio: Number.NaN },
      'not-finite',
      'poissonRatio',
    ],
    ['zero gauge factor', { arrangement: 'quarter', gaugeFactor: 0 }, 'not-positive', 'gaugeFactor'],
    ['negative gauge factor', { arrangement: 'quarter', gaugeFactor: -2 }, 'not-positive', 'gaugeFactor'],
    ['NaN gauge factor', { arrangement: 'quarter', gaugeFactor: Number.NaN }, 'not-finite', 'gaugeFactor'],
    ['missing gauge factor', { arrangement: 'quarter' }, 'missing-option', 'options.gaugeFactor'],
    [
      'zero gauge resistance',
      { arrangement: 'quarter', gaugeFactor: 2, gaugeOhms: 0 },
      'not-positive',
      'gaugeOhms',
    ],
    [
      'infinite completion',
      { arrangement: 'quarter', gaugeFactor: 2, completionOhms: Infinity },
      'not-finite',
      'completionOhms',
    ],
    ['negative source', { arrangement: 'quarter', gaugeFactor: 2, sourceOhms: -1 }, 'negative', 'sourceOhms'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => createStrainBridge(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects non-finite strains and ratios', () => {
    const b = createStrainBridge({ arrangement: 'half-bending', gaugeFactor: 2 });
    for (const bad of [Number.NaN, Infinity, -Infinity]) {
      expect(() => b.ratioFromStrain(bad)).toThrowBridgeworkError('not-finite', { param: 'strain' });
      expect(() => b.strainFromRatio(bad)).toThrowBridgeworkError('not-finite', { param: 'ratio' });
      expect(() => b.nonlinearity(bad)).toThrowBridgeworkError('not-finite');
    }
  });

  it('knows which arrangements need a Poisson ratio', () => {
    expect(strainArrangements.filter(needsPoissonRatio)).toEqual([
      'half-poisson',
      'full-poisson',
      'full-bending-poisson',
    ]);
    // A Poisson ratio given to an arrangement without a transverse gauge is ignored.
    expect(
      createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2, poissonRatio: 0.3 }).poissonRatio,
    ).toBeUndefined();
  });
});
