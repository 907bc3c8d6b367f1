import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveBridge, type StrainArrangement } from '@bridgework/bridge';
import type { LeadWiring } from '@bridgework/core';
import {
  shuntOhmsForStrain,
  shuntRatios,
  strainFromShunt,
  type BridgeArm,
  type ShuntBridgeOptions,
  type ShuntDefinition,
  type ShuntPlacement,
} from '@bridgework/calibration';
import { physicalRatio } from './support/physicalBridge.js';

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
const arrangements = Object.keys(wirings) as StrainArrangement[];
const definitions: readonly ShuntDefinition[] = ['resistance-equivalent', 'exact', 'linear'];

/** Random shunt configurations over the whole option space (placement 'instrument' only where a cable has one). */
const configuration = fc
  .record({
    arrangement: fc.constantFrom(...arrangements),
    gaugeFactor: fc.double({ min: 1.8, max: 4.5, noNaN: true }),
    gaugeOhms: fc.constantFrom(120, 350, 1000),
    completionFactor: fc.double({ min: 0.98, max: 1.02, noNaN: true }),
    arm: fc.constantFrom<BridgeArm>(1, 2, 3, 4),
    withLeads: fc.boolean(),
    wiringIndex: fc.nat(1),
    // 0, or 10 mΩ … 10 Ω per conductor (real cables; a subnormal lead is not a physical case).
    ohmsPerLead: fc.oneof(fc.constant(0), fc.double({ min: 0.01, max: 10, noNaN: true })),
    sourceOhms: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 20, noNaN: true })),
    instrument: fc.boolean(),
    definition: fc.constantFrom(...definitions),
    instrumentModelsLeads: fc.boolean(),
  })
  .map((c): ShuntBridgeOptions => {
    const wiring = wirings[c.arrangement][c.wiringIndex % wirings[c.arrangement].length]!;
    const full = wiring === 'four-wire' || wiring === 'six-wire';
    return {
      arrangement: c.arrangement,
      gaugeFactor: c.gaugeFactor,
      gaugeOhms: c.gaugeOhms,
      completionOhms: c.gaugeOhms * c.completionFactor,
      poissonRatio: 0.3,
      arm: c.arm,
      sourceOhms: c.sourceOhms,
      definition: c.definition,
      instrumentModelsLeads: c.instrumentModelsLeads,
      ...(c.withLeads ? { leads: { ohmsPerLead: c.ohmsPerLead, wiring } } : {}),
      placement: c.instrument && c.withLeads && !full ? 'instrument' : 'gauge',
    };
  });
const shuntOhms = fc.double({ min: 3, max: 7, noNaN: true }).map((d) => 10 ** d); // 1 kΩ … 10 MΩ

describe('shunt calibration: check values', () => {
  it('350 Ω, GF 2.0, 1000 µε → 174 650 Ω (issue check value, derived)', () => {
    // Resistance-equivalent shunt: Rg·Rs/(Rg + Rs) = Rg(1 + GF·ε) ⇒ Rs = Rg/(GF·|ε|) − Rg
    // = 350/0.002 − 350 = 175 000 − 350 = 174 650 Ω (derived by hand).
    expect(shuntOhmsForStrain({ gaugeOhms: 350, gaugeFactor: 2, strain: -1e-3 })).toBeNear(174_650, {
      ulps: 2,
    });
    expect(strainFromShunt({ gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 174_650 })).toBeNear(-1e-3, {
      ulps: 2,
    });
  });

  it('the resistance-equivalent strain is the textbook −Rg/(GF(Rg + Rs)) without leads', () => {
    // Window & Holister, Strain Gauge Technology, shunt calibration (from memory).
    for (const [rg, gf, rs] of [
      [120, 2.05, 59_880],
      [350, 2.1, 100_000],
      [1000, 3.2, 1e6],
    ] as const) {
      expect(strainFromShunt({ gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs })).toBeNear(
        -rg / (gf * (rg + rs)),
        {
          ulps: 4,
        },
      );
    }
  });

  it('quarter bridge, no leads: exact and linear instruments against the hand-derived bridge output', () => {
    // Arms [R′, R, R, R] with R′ = R·Rs/(R + Rs): Vout/E = (R′ − R)/(2(R′ + R)) = −R/(2(R + 2Rs))
    // (derived from (R1R3 − R2R4)/((R1 + R2)(R3 + R4))). The linear instrument reads 4r/GF; the exact
    // one inverts r = x/(4 + 2x), x = GF·ε ⇒ ε = 4r/(GF(1 − 2r)).
    const rg = 350;
    const gf = 2;
    const rs = 174_650;
    const r = -rg / (2 * (rg + 2 * rs));
    // rel 2e-13: the shunted arm R∥Rs is rounded to a double and the output is proportional to its
    // change R²/(R + Rs), (R + Rs)/R ≈ 500 times smaller: about 500 ulps of relative precision.
    expect(shuntRatios({ gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs }).shuntedRatio).toBeNear(r, {
      rel: 2e-13,
    });
    expect(strainFromShunt({ gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs, definition: 'linear' })).toBeNear(
      (4 * r) / gf,
      { rel: 1e-12 },
    );
    expect(strainFromShunt({ gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs, definition: 'exact' })).toBeNear(
      (4 * r) / (gf * (1 - 2 * r)),
      { rel: 1e-12 },
    );
    // And the exact instrument recovers the resistance-equivalent −1000 µε (the shunted gauge is a gauge at that strain).
    expect(strainFromShunt({ gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs, definition: 'exact' })).toBeNear(
      -1e-3,
      {
        rel: 1e-12,
      },
    );
  });

  it('two-wire cable: the shunt at the instrument spans both leads (hand formulas)', () => {
    // At the instrument the arm Rg + 2RL becomes (Rg + 2RL)∥Rs: ΔR = −(Rg + 2RL)²/(Rg + 2RL + Rs), so
    // the resistance-equivalent strain is ΔR/(GF·Rg); an exact instrument that models the leads solves
    // Rg(1 + GF·ε) + 2RL = (Rg + 2RL)∥Rs. At the gauge the leads stay outside: −Rg/(GF(Rg + Rs)).
    const rg = 350;
    const gf = 2.1;
    const rl = 1.7;
    const rs = 80_000;
    const leads = { ohmsPerLead: rl, wiring: 'two-wire' } as const;
    const ra = rg + 2 * rl;
    const base = { gaugeOhms: rg, gaugeFactor: gf, shuntOhms: rs, leads };
    expect(strainFromShunt({ ...base, placement: 'instrument' })).toBeNear(
      (-ra * ra) / (gf * rg * (ra + rs)),
      {
        rel: 1e-14,
      },
    );
    expect(strainFromShunt({ ...base, placement: 'gauge' })).toBeNear(-rg / (gf * (rg + rs)), { rel: 1e-14 });
    const shunted = (ra * rs) / (ra + rs);
    expect(strainFromShunt({ ...base, placement: 'instrument', definition: 'exact' })).toBeNear(
      (shunted - 2 * rl - rg) / (gf * rg),
      { rel: 1e-11 },
    );
  });

  it('three-wire cable, shunt at the gauge: an exact instrument indicates the resistance-equivalent strain', () => {
    // With the shunt across the gauge itself, arm 1 is (Rg∥Rs) + RL: a gauge at ε = −Rg/(GF(Rg + Rs))
    // behind its lead. An instrument modelling the leads sees exactly that gauge.
    const options = {
      gaugeOhms: 350,
      gaugeFactor: 2.08,
      shuntOhms: 100_000,
      leads: { ohmsPerLead: 2.5, wiring: 'three-wire' },
      sourceOhms: 5,
    } as const;
    expect(strainFromShunt({ ...options, definition: 'exact' })).toBeNear(strainFromShunt(options), {
      rel: 1e-12,
    });
  });

  it('three-wire cable: an instrument that ignores the leads shows the span loss Rg/(Rg + RL) (common practice)', () => {
    // Three-wire quarter bridge: sensitivity falls by Rg/(Rg + RL) to first order (common practice);
    // the linear reading of a shunt at the gauge, divided by the resistance-equivalent strain, shows
    // it to the order of the strain (1e-3 here).
    const rg = 350;
    const rl = 3.5;
    const options = {
      gaugeOhms: rg,
      gaugeFactor: 2,
      shuntOhms: 174_650,
      leads: { ohmsPerLead: rl, wiring: 'three-wire' },
      instrumentModelsLeads: false,
    } as const;
    const ratio = strainFromShunt({ ...options, definition: 'linear' }) / strainFromShunt(options);
    expect(ratio).toBeNear(rg / (rg + rl), { rel: 2e-3 });
  });
});

describe('shunt calibration: sign convention (docs/conventions.md)', () => {
  it('a shunt across arm 1 or 3 simulates compression, across arm 2 or 4 tension', () => {
    for (const definition of definitions) {
      for (const arm of [1, 2, 3, 4] as const) {
        const strain = strainFromShunt({
          arrangement: 'half-bending',
          gaugeOhms: 350,
          gaugeFactor: 2,
          shuntOhms: 100_000,
          arm,
          definition,
        });
        expect(Math.sign(strain)).toBe(arm % 2 === 1 ? -1 : 1);
        const ratios = shuntRatios({
          arrangement: 'half-bending',
          gaugeOhms: 350,
          gaugeFactor: 2,
          shuntOhms: 100_000,
          arm,
        });
        expect(Math.sign(ratios.shuntedRatio - ratios.zeroRatio)).toBe(arm % 2 === 1 ? -1 : 1);
      }
    }
  });

  it('is symmetric in magnitude between arms 1 and 2 for the resistance-equivalent definition', () => {
    const base = { gaugeOhms: 350, gaugeFactor: 2 } as const;
    expect(shuntOhmsForStrain({ ...base, strain: 1e-3, arm: 2 })).toBeNear(174_650, { ulps: 2 });
    expect(shuntOhmsForStrain({ ...base, strain: -1e-3, arm: 3 })).toBeNear(174_650, { ulps: 2 });
  });

  it('rejects a strain whose sign the arm cannot simulate, and zero', () => {
    const base = { gaugeOhms: 350, gaugeFactor: 2 } as const;
    expect(() => shuntOhmsForStrain({ ...base, strain: 1e-3 })).toThrowBridgeworkError('out-of-range', {
      param: 'strain',
    });
    expect(() => shuntOhmsForStrain({ ...base, strain: -1e-3, arm: 4 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'strain',
      },
    );
    expect(() => shuntOhmsForStrain({ ...base, strain: 0 })).toThrowBridgeworkError('out-of-range', {
      param: 'strain',
    });
    expect(() =>
      shuntOhmsForStrain({ ...base, strain: -1e-3, definition: 'exact', arm: 2 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'strain' });
  });

  it('rejects a strain that would need a negative shunt resistance', () => {
    // |ε| ≥ 1/GF would need Rg∥Rs ≤ 0: with GF 2, −0.5 needs Rs = 0 and −0.6 a negative Rs.
    const base = { gaugeOhms: 350, gaugeFactor: 2 } as const;
    expect(() => shuntOhmsForStrain({ ...base, strain: -0.5 })).toThrowBridgeworkError('no-solution', {
      param: 'strain',
    });
    expect(() => shuntOhmsForStrain({ ...base, strain: -0.6 })).toThrowBridgeworkError('no-solution', {
      param: 'strain',
    });
    // The linear instrument of a quarter bridge can ask for more output than any shunt gives
    // (the reading of R1 → 0 is −1/2, i.e. ε = −1 with GF 2).
    expect(() => shuntOhmsForStrain({ ...base, strain: -1.2, definition: 'linear' })).toThrowBridgeworkError(
      'no-solution',
      { param: 'strain' },
    );
  });
});

describe('shunt calibration against a 40-digit nodal solve of the physical circuit', () => {
  it('zero and shunted readings agree for every arrangement, wiring, placement and arm (250 random cases)', () => {
    fc.assert(
      fc.property(configuration, shuntOhms, (options, rs) => {
        const computed = shuntRatios({ ...options, shuntOhms: rs });
        const bridge = {
          arrangement: options.arrangement!,
          gaugeOhms: options.gaugeOhms,
          completionOhms: options.completionOhms!,
          sourceOhms: options.sourceOhms!,
          wiring: options.leads?.wiring,
          ohmsPerLead: options.leads?.ohmsPerLead ?? 0,
        };
        const shunt = { arm: options.arm!, placement: options.placement!, ohms: rs };
        // Zero: relative 1e-12 with an absolute floor of 1e-16 V/V (a balanced bridge reads ~0, and
        // the arms are rounded to doubles, ulp(R)/4R ≈ 3e-17, before either solve sees them).
        expect(computed.zeroRatio).toBeNear(physicalRatio(bridge), { rel: 1e-12, abs: 1e-16 });
        // Shunt step: the shunted arm R∥Rs is rounded to a double, and the step is proportional to
        // the change R²/(R + Rs), about Rs/R times smaller than R: a relative error of order
        // ε·Rs/R (1e-11 at 10 MΩ across 120 Ω). Tolerance 16ε(1 + Rs/R) + 1e-13.
        const step = computed.shuntedRatio - computed.zeroRatio;
        const physicalStep = physicalRatio(bridge, shunt) - physicalRatio(bridge);
        const rel =
          16 * Number.EPSILON * (1 + rs / Math.min(options.gaugeOhms, options.completionOhms!)) + 1e-13;
        expect(step).toBeNear(physicalStep, { rel });
      }),
      { numRuns: 250 },
    );
  });

  it('three-wire at the instrument: the sense lead carries the shunt current (differs from a plain arm shunt)', () => {
    // A shunt across E+ and the S− terminal spans lead 1 + gauge, with the sense lead in its path and
    // the reading taken at the sense lead's instrument end. Nodal solve of that circuit vs the model;
    // and the naive model (shunt straight across arm 1 = Rg + RL) is measurably different.
    const rl = 5;
    const options = {
      gaugeOhms: 350,
      gaugeFactor: 2,
      shuntOhms: 50_000,
      leads: { ohmsPerLead: rl, wiring: 'three-wire' },
      placement: 'instrument',
      sourceOhms: 10,
    } as const;
    const bridge = {
      arrangement: 'quarter',
      gaugeOhms: 350,
      completionOhms: 350,
      sourceOhms: 10,
      wiring: 'three-wire',
      ohmsPerLead: rl,
    } as const;
    const exact = physicalRatio(bridge, { arm: 1, placement: 'instrument', ohms: 50_000 });
    expect(shuntRatios(options).shuntedRatio).toBeNear(exact, { rel: 1e-13 });
    const naiveArm = (355 * 50_000) / (355 + 50_000);
    const naive = solveBridge({
      armsOhms: [naiveArm, 355, 350, 350],
      excitationVolts: 1,
      sourceOhms: 10,
    }).ratio;
    // The shunt current, ≈ 0.5 V across 50 kΩ = 10 µA per volt of excitation, drops ≈ 5e-5 V/V in
    // the 5 Ω sense lead: about 2.7 % of the step, far beyond rounding, so the models differ.
    expect(Math.abs(exact - naive) / Math.abs(exact)).toBeGreaterThan(0.02);
  });
});

describe('shunt calibration: round trips', () => {
  it('shuntOhmsForStrain inverts strainFromShunt for every definition and placement (1000 random cases)', () => {
    fc.assert(
      fc.property(configuration, shuntOhms, (options, rs) => {
        const strain = strainFromShunt({ ...options, shuntOhms: rs });
        // Relative 1e-9: the shunt is recovered from the small difference of two arm resistances,
        // which costs up to log10(Rs/Rg) ≈ 5 digits at 10 MΩ across 120 Ω.
        expect(shuntOhmsForStrain({ ...options, strain })).toBeNear(rs, { rel: 1e-9 });
      }),
      { numRuns: 1000 },
    );
  });

  it('strainFromShunt inverts shuntOhmsForStrain over ±(1 … 20 000) µε (resistance-equivalent, closed form)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 2e-2, noNaN: true }),
        fc.constantFrom<BridgeArm>(1, 2, 3, 4),
        fc.double({ min: 1.8, max: 4.5, noNaN: true }),
        (magnitude, arm, gaugeFactor) => {
          const strain = arm % 2 === 1 ? -magnitude : magnitude;
          const options = { gaugeOhms: 350, gaugeFactor, arm };
          const rs = shuntOhmsForStrain({ ...options, strain });
          expect(strainFromShunt({ ...options, shuntOhms: rs })).toBeNear(strain, { rel: 1e-13 });
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('shunt calibration: bad input', () => {
  const base = { gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 100_000 };
  it.each([
    ['gaugeOhms', { ...base, gaugeOhms: Number.NaN }, 'not-finite'],
    ['gaugeOhms', { ...base, gaugeOhms: -350 }, 'not-positive'],
    ['gaugeOhms', { ...base, gaugeOhms: '350' }, 'wrong-type'],
    ['options.gaugeOhms', { gaugeFactor: 2, shuntOhms: 1e5 }, 'missing-option'],
    ['options.gaugeOhm', { ...base, gaugeOhm: 350 }, 'unknown-option'],
    ['leads.ohmsPerLeed', { ...base, leads: { ohmsPerLeed: 1, wiring: 'two-wire' } }, 'unknown-option'],
    ['gaugeFactor', { ...base, gaugeFactor: Infinity }, 'not-finite'],
    ['gaugeFactor', { ...base, gaugeFactor: 0 }, 'not-positive'],
    ['shuntOhms', { ...base, shuntOhms: Number.NaN }, 'not-finite'],
    ['shuntOhms', { ...base, shuntOhms: Infinity }, 'not-finite'],
    ['shuntOhms', { ...base, shuntOhms: 0 }, 'not-positive'],
    ['arm', { ...base, arm: 5 }, 'out-of-range'],
    ['arm', { ...base, arm: 1.5 }, 'not-integer'],
    ['definition', { ...base, definition: 'nominal' }, 'invalid-option'],
    ['placement', { ...base, placement: 'middle' }, 'invalid-option'],
    ['instrumentModelsLeads', { ...base, instrumentModelsLeads: 'yes' }, 'wrong-type'],
    ['arrangement', { ...base, arrangement: 'quater' }, 'invalid-option'],
    ['poissonRatio', { ...base, arrangement: 'half-poisson' }, 'missing-option'],
    ['leads.wiring', { ...base, leads: { ohmsPerLead: 1, wiring: 'four-wire' } }, 'invalid-option'],
    ['leads.ohmsPerLead', { ...base, leads: { ohmsPerLead: -1, wiring: 'two-wire' } }, 'negative'],
    [
      'placement',
      {
        ...base,
        arrangement: 'full-bending',
        leads: { ohmsPerLead: 1, wiring: 'four-wire' },
        placement: 'instrument',
      },
      'invalid-option',
    ],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => strainFromShunt(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a bad strain and a non-object', () => {
    expect(() =>
      shuntOhmsForStrain({ gaugeOhms: 350, gaugeFactor: 2, strain: Number.NaN }),
    ).toThrowBridgeworkError('not-finite', { param: 'strain' });
    expect(() => shuntOhmsForStrain({ gaugeOhms: 350, gaugeFactor: 2 } as never)).toThrowBridgeworkError(
      'missing-option',
      { param: 'options.strain' },
    );
    expect(() => strainFromShunt(null as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
    expect(() => shuntRatios({ ...base, shuntOhms: -1 })).toThrowBridgeworkError('not-positive', {
      param: 'shuntOhms',
    });
  });
});

describe('shunt placements are the same without leads', () => {
  it.each(['gauge', 'instrument'] as ShuntPlacement[])('%s', (placement) => {
    expect(strainFromShunt({ gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 174_650, placement })).toBeNear(
      -1e-3,
      {
        ulps: 2,
      },
    );
  });
});
