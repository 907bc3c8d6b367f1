import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge, solveBridge } from '@bridgework/bridge';
import {
  correctTemperatureEffects,
  createThermalOutput,
  gaugeFactorAt,
  indicatedStrainWithTemperatureEffects,
} from '@bridgework/compensation';

const lot = createThermalOutput({
  coefficientsMicrostrain: [-30.5, 2.61, -5.7e-2, 2.9e-4, -4.1e-7],
  gaugeFactor: 2,
  rangeCelsius: [-30, 200],
});
const gauge = {
  gaugeFactor: 2.08,
  gaugeFactorTemperatureCoefficientPerKelvin: 1.2e-4,
  gaugeFactorReferenceCelsius: 24,
  thermalOutput: lot,
} as const;
const temperature = fc.double({ min: -30, max: 200, noNaN: true });

describe('correctTemperatureEffects', () => {
  it('hand check: zeroed at 20 °C, read at 100 °C with the instrument at GF 2.00', () => {
    // By hand: ε_app(100) − ε_app(20) = −90.5 − 1.1544 = −91.6544 µε at GF_ref = 2.00 = the
    // setting, GF(100) = 2.08·(1 + 1.2e-4·76) = 2.0989696; ε = (400 + 91.6544)·2/2.0989696 = 468.4608 µε.
    const corrected = correctTemperatureEffects({
      ...gauge,
      indicatedStrain: 400e-6,
      gaugeFactorSetting: 2,
      zeroCelsius: 20,
      temperatureCelsius: 100,
    });
    expect(corrected * 1e6).toBeNear(((400 + 91.6544) * 2) / 2.0989696, { rel: 1e-12 });
  });

  it('end to end through an exact quarter bridge: a gauge that obeys the model is read back exactly', () => {
    // Independent path: build the gauge resistance from the published model,
    // R = R0·[1 + GF(T)·ε + GF_ref·(ε_app(T) − ε_app(T0))], read it on a quarter bridge with
    // solveBridge, invert with createStrainBridge's two-reading method at the instrument setting,
    // then correct. The corrected strain must be the ε we put in.
    fc.assert(
      fc.property(
        temperature,
        temperature,
        fc.double({ min: -3e-3, max: 3e-3, noNaN: true }),
        fc.double({ min: 1.9, max: 2.2, noNaN: true }),
        (t0, t, strain, setting) => {
          const r0 = 350.4; // the real gauge at zeroing, a little off nominal
          const gfNow = gaugeFactorAt({
            gaugeFactor: 2.08,
            temperatureCoefficientPerKelvin: 1.2e-4,
            referenceCelsius: 24,
            temperatureCelsius: t,
          });
          const thermal = 2 * (lot.apparentStrainAt(t) - lot.apparentStrainAt(t0));
          const rNow = r0 * (1 + gfNow * strain + thermal);
          const read = (arm: number) =>
            solveBridge({ armsOhms: [arm, 350, 350, 350], excitationVolts: 5 }).ratio;
          const instrument = createStrainBridge({ arrangement: 'quarter', gaugeFactor: setting });
          const indicated = instrument.strainFromRatio(read(rNow), { zeroRatio: read(r0) });
          const corrected = correctTemperatureEffects({
            ...gauge,
            indicatedStrain: indicated,
            gaugeFactorSetting: setting,
            zeroCelsius: t0,
            temperatureCelsius: t,
          });
          // 1e-9 relative, 1e-14 absolute: the bridge inverse is good to ~1e-12 relative of the
          // resistance change, which includes the thermal part (up to 300 µε).
          expect(corrected).toBeNear(strain, { rel: 1e-9, abs: 1e-14 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('round-trips with indicatedStrainWithTemperatureEffects over the whole range', () => {
    fc.assert(
      fc.property(
        temperature,
        temperature,
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        fc.double({ min: 1.5, max: 4.5, noNaN: true }),
        (t0, t, strain, setting) => {
          const common = { ...gauge, gaugeFactorSetting: setting, zeroCelsius: t0, temperatureCelsius: t };
          const indicated = indicatedStrainWithTemperatureEffects({ ...common, strain });
          // Floor 1e-19: the thermal strain (≤ 2e-4) is subtracted back, ulp(2e-4) ≈ 3e-20.
          expect(correctTemperatureEffects({ ...common, indicatedStrain: indicated })).toBeNear(strain, {
            rel: 1e-14,
            abs: 1e-19,
          });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('reduces to rescaleGaugeFactor without thermal output or GF drift, and to the thermal output alone at ε = 0', () => {
    const plain = correctTemperatureEffects({
      indicatedStrain: 1e-3,
      gaugeFactorSetting: 2,
      zeroCelsius: 20,
      temperatureCelsius: 60,
      gaugeFactor: 2.1,
    });
    expect(plain).toBeNear((1e-3 * 2) / 2.1, { ulps: 1 });
    const apparent = indicatedStrainWithTemperatureEffects({
      ...gauge,
      strain: 0,
      gaugeFactorSetting: 2.1,
      zeroCelsius: 20,
      temperatureCelsius: 150,
    });
    expect(apparent).toBeNear(lot.apparentStrainAt(150, 2.1) - lot.apparentStrainAt(20, 2.1), { ulps: 0 });
    expect(
      indicatedStrainWithTemperatureEffects({
        ...gauge,
        strain: 5e-4,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 20,
      }),
    ).toBeNear(
      (5e-4 *
        gaugeFactorAt({
          gaugeFactor: 2.08,
          temperatureCoefficientPerKelvin: 1.2e-4,
          referenceCelsius: 24,
          temperatureCelsius: 20,
        })) /
        2,
      { ulps: 1 },
    );
  });

  it.each([
    [
      'coefficient without its reference temperature',
      {
        indicatedStrain: 0,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 30,
        gaugeFactor: 2,
        gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
      },
      'missing-option',
      'gaugeFactorReferenceCelsius',
    ],
    [
      'NaN reading',
      {
        indicatedStrain: Number.NaN,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 30,
        gaugeFactor: 2,
      },
      'not-finite',
      'indicatedStrain',
    ],
    [
      'zero setting',
      { indicatedStrain: 0, gaugeFactorSetting: 0, zeroCelsius: 20, temperatureCelsius: 30, gaugeFactor: 2 },
      'not-positive',
      'gaugeFactorSetting',
    ],
    [
      'missing zero temperature',
      { indicatedStrain: 0, gaugeFactorSetting: 2, temperatureCelsius: 30, gaugeFactor: 2 },
      'missing-option',
      'options.zeroCelsius',
    ],
    [
      'infinite temperature',
      {
        indicatedStrain: 0,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: -Infinity,
        gaugeFactor: 2,
      },
      'not-finite',
      'temperatureCelsius',
    ],
    [
      'missing gauge factor',
      { indicatedStrain: 0, gaugeFactorSetting: 2, zeroCelsius: 20, temperatureCelsius: 30 },
      'missing-option',
      'options.gaugeFactor',
    ],
    [
      'a plain object as thermal output',
      {
        indicatedStrain: 0,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 30,
        gaugeFactor: 2,
        thermalOutput: { coefficientsMicrostrain: [1] },
      },
      'wrong-type',
      'thermalOutput',
    ],
    [
      'a temperature outside the thermal output',
      {
        indicatedStrain: 0,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 250,
        gaugeFactor: 2,
        thermalOutput: lot,
      },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'NaN coefficient',
      {
        indicatedStrain: 0,
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 30,
        gaugeFactor: 2,
        gaugeFactorTemperatureCoefficientPerKelvin: Number.NaN,
        gaugeFactorReferenceCelsius: 24,
      },
      'not-finite',
      'gaugeFactorTemperatureCoefficientPerKelvin',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => correctTemperatureEffects(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('forward model rejects a missing true strain', () => {
    expect(() =>
      indicatedStrainWithTemperatureEffects({
        gaugeFactorSetting: 2,
        zeroCelsius: 20,
        temperatureCelsius: 30,
        gaugeFactor: 2,
      } as never),
    ).toThrowBridgeworkError('missing-option', { param: 'options.strain' });
  });
});
