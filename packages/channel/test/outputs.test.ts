/**
 * Output quantities beyond strain, each against an independent 40-digit reference of its
 * textbook relation, in the units people write.
 */
import { describe, expect, it } from 'vitest';
import { channelBudget, createChannel, validateChannelSpec, type ChannelSpec } from '@bridgework/channel';
import { D, ratioFromCodeRef } from './support/reference.js';

const PI = D.acos(-1);

/** A full bridge of equal halves without leads reads r = GF·ε exactly: ε = r/GF (any circuit text). */
const strainOf = (code: number, gain: number, gf: number) => ratioFromCodeRef(code, gain, 24).div(gf);

const shearBridge: ChannelSpec = {
  sensor: { kind: 'strain-gauge', gaugeFactor: 2, gaugeOhms: 350 },
  bridge: { arrangement: 'full-shear', wiring: 'six-wire' },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: {
    quantity: 'torque',
    unit: 'N·m',
    shaftDiameterMeters: '40 mm',
    modulusPascals: '200 GPa',
    range: [-2000, 2000],
  },
};

describe('torque on a shaft from a full-shear bridge (mechanics createShaft)', () => {
  it('T = τ·J/r with τ = G·γ, γ = 2·ε₄₅, G = E/(2(1 + ν)), J = πD⁴/32 (Gere & Goodno, torsion; from memory)', () => {
    const ch = createChannel({ ...shearBridge, bridge: { ...shearBridge.bridge, poissonRatio: 0.3 } });
    const G = new D(200e9).div(new D(2).times(new D('1.3')));
    const J = PI.times(new D('0.04').pow(4)).div(32);
    for (const code of [-4_000_000, -1, 0, 777_777, 4_000_000]) {
      const tau = G.times(strainOf(code, 128, 2).times(2));
      const torque = tau.times(J).div('0.02');
      expect(ch.quantityFromCode(code)).toBeNear(torque.toNumber(), { rel: 1e-13, abs: 1e-12 });
    }
    expect(ch.display.unit).toBe('N·m');
  });

  it('a hollow shaft with the shear modulus given, in kN·m: J = π(D⁴ − d⁴)/32', () => {
    const ch = createChannel({
      ...shearBridge,
      output: {
        quantity: 'torque',
        unit: 'kN·m',
        shaftDiameterMeters: 0.1,
        shaftBoreMeters: '60 mm',
        shearModulusPascals: '80 GPa',
      },
    });
    const J = PI.times(new D('0.1').pow(4).minus(new D('0.06').pow(4))).div(32);
    const code = 1_000_000;
    const torque = new D(80e9)
      .times(strainOf(code, 128, 2).times(2))
      .times(J)
      .div('0.05')
      .div(1000);
    expect(ch.quantityFromCode(code)).toBeNear(torque.toNumber(), { rel: 1e-13 });
  });

  it('shear stress τ = 2G·ε₄₅; "stress" from a shear bridge is refused with the reason', () => {
    const ch = createChannel({
      ...shearBridge,
      output: { quantity: 'shear-stress', unit: 'MPa', shearModulusPascals: '80 GPa' },
    });
    const code = -2_500_000;
    expect(ch.quantityFromCode(code)).toBeNear(
      new D(80e3)
        .times(strainOf(code, 128, 2))
        .times(2)
        .toNumber(),
      { rel: 1e-13 },
    );
    const stress = validateChannelSpec({
      ...shearBridge,
      output: { quantity: 'stress', modulusPascals: '200 GPa' },
    });
    expect(stress.issues).toEqual([
      expect.objectContaining({
        path: 'output.quantity',
        message: expect.stringMatching(
          /shear bridge reads the ±45° strain of pure shear, which is not a normal strain/,
        ),
      }),
    ]);
    const unused = validateChannelSpec({
      ...shearBridge,
      output: { ...shearBridge.output, areaSquareMeters: 1e-3 },
    });
    expect(unused.issues.map((i) => [i.code, i.path])).toEqual([
      ['unknown-option', 'output.areaSquareMeters'],
      ['missing-option', 'output.shearModulusPascals'],
    ]);
  });
});

describe('bending moment from a bending bridge (mechanics createBendingMember)', () => {
  const bending: ChannelSpec = {
    sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
    bridge: { arrangement: 'full-bending', wiring: 'six-wire' },
    excitation: { volts: 10 },
    amplifier: { gain: 64 },
    adc: { bits: 24, referenceVolts: 10, ratiometric: true },
    output: {
      quantity: 'bending-moment',
      unit: 'kN·m',
      modulusPascals: '70 GPa',
      sectionModulusCubicMeters: '25 cm³',
    },
  };
  it('M = σ·W = E·ε·W (Euler–Bernoulli; any strength-of-materials text)', () => {
    const ch = createChannel(bending);
    for (const code of [-3_000_000, 123_456, 3_000_000]) {
      const m = new D(70e9)
        .times(strainOf(code, 64, 2.1))
        .times('25e-6')
        .div(1000);
      expect(ch.quantityFromCode(code)).toBeNear(m.toNumber(), { rel: 1e-13 });
    }
    expect(channelBudget(ch).ok).toBe(true);
  });

  it('force at a lever arm F = M/L; force on an axial member needs an axial arrangement', () => {
    const ch = createChannel({
      ...bending,
      output: { ...bending.output, quantity: 'force', unit: 'N', leverArmMeters: '250 mm' },
    });
    const code = 2_000_000;
    expect(ch.quantityFromCode(code)).toBeNear(
      new D(70e9)
        .times(strainOf(code, 64, 2.1))
        .times('25e-6')
        .div('0.25')
        .toNumber(),
      { rel: 1e-13 },
    );
    const missing = validateChannelSpec({
      ...bending,
      output: { quantity: 'force', modulusPascals: 70e9, sectionModulusCubicMeters: 25e-6 },
    });
    expect(missing.issues.map((i) => i.path)).toEqual(['output.leverArmMeters']);
  });
});

describe('a pressure transducer rated in bar (calibration createCertificateScale, linear)', () => {
  it('p = capacity·(r − zero)/RO in the output unit', () => {
    const ch = createChannel({
      sensor: {
        kind: 'transducer',
        capacity: '10 bar',
        ratedOutputVoltsPerVolt: '2 mV/V',
        zeroBalanceVoltsPerVolt: '0.05 mV/V',
      },
      bridge: { wiring: 'six-wire' },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'pressure', unit: 'bar' },
    });
    expect(ch.span).toEqual({ min: 0, max: 10 });
    expect(ch.description).toBe('bridge transducer, capacity 10 bar, rated output 2 mV/V');
    for (const code of [0, 1_000_000, 2_000_000]) {
      const p = new D(10).times(ratioFromCodeRef(code, 128, 24).minus('5e-5')).div('0.002');
      expect(ch.quantityFromCode(code)).toBeNear(p.toNumber(), { rel: 1e-13, abs: 1e-13 });
    }
    const wrong = validateChannelSpec({
      sensor: { kind: 'transducer', capacity: '10 bar', ratedOutputVoltsPerVolt: '2 mV/V' },
      excitation: { volts: 5 },
      adc: { bits: 24, referenceVolts: 5 },
      output: { quantity: 'force' },
    });
    expect(wrong.issues).toEqual([
      expect.objectContaining({
        path: 'output.quantity',
        message: "cannot be 'force' from a transducer rated in pressure or stress",
      }),
    ]);
  });
});
