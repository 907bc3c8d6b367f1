/**
 * The budget side of the transducer kind (see `SensorKindBudget`): its map as straight-line arithmetic for Monte Carlo, its rated-output tolerance and the plausible ranges of its inputs. Only the budget imports
 * it (through `budgetRegistry.ts`), so the conversion path does not carry it.
 */
import { createCertificateScale } from '@bridgework/calibration';
import { formatSignificant } from '../units/quantity.js';
import { Parameter, type SensorKindBudget } from './SensorKind.js';
import { toleranceFractionCheck } from './toleranceCheck.js';
import { RATED_OUTPUT, gravities, scaleUnits, type transducerKind } from './transducer.js';

/** The transducer kind's budget side. */
export const transducerBudget: SensorKindBudget<(typeof transducerKind)['fields']> = {
  fastMap(ctx) {
    const s = ctx.sensor;
    const units = scaleUnits(s, ctx.quantity);
    // The certificate's load per unit ratio at a rated output of 1: loadPerRatio = this/RO (calibration createCertificateScale).
    const capacityInOutput = createCertificateScale({
      capacity: s.capacity,
      ...units,
      ratedOutputVoltsPerVolt: 1,
      ...gravities(s),
    }).loadPerRatio;
    const tk0 = s.zeroTemperatureCoefficientPerKelvin;
    const tkc = s.spanTemperatureCoefficientPerKelvin;
    const tZero = ctx.zeroTemperatureCelsius;
    const tCert = s.certificateCelsius;
    const rin = s.inputOhms;
    const rs = ctx.sourceOhms;
    const sixWire = ctx.wiring === 'six-wire';
    return {
      quantity(ratio, zeroRatio, p) {
        const lead = p[Parameter.ohmsPerLead] as number;
        const span = sixWire ? 1 : rin / (rin + 2 * (lead + rs / 2));
        const t = p[Parameter.temperatureCelsius] as number;
        const rated = p[RATED_OUTPUT] as number;
        const zeroDrift = tk0 * rated * (t - tZero);
        const ratedNow = rated * (1 + tkc * (t - tCert));
        const zero = (zeroRatio === zeroRatio ? zeroRatio / span : s.zeroBalanceVoltsPerVolt) + zeroDrift;
        return (capacityInOutput / ratedNow) * (ratio / span - zero);
      },
    };
  },
  budgetInputs(ctx) {
    const s = ctx.sensor;
    return s.ratedOutputToleranceFraction > 0
      ? [
          {
            name: 'rated output',
            first: true,
            index: RATED_OUTPUT,
            halfWidth: s.ratedOutputToleranceFraction * s.ratedOutputVoltsPerVolt,
            kind: 'tolerance',
            model: `the exact map with the certificate's rated output varied over ±${formatSignificant(s.ratedOutputToleranceFraction * 100)} %`,
          },
        ]
      : [];
  },
  calibrationCheck: (s) =>
    toleranceFractionCheck(
      s.ratedOutputToleranceFraction,
      'sensor.ratedOutputToleranceFraction',
      "the rated output's tolerance",
      "the budget lacks the transducer's calibration uncertainty: sensor.ratedOutputToleranceFraction is 0, so U covers the electronics and the noise only; fill it in from the certificate (the rated output's tolerance, or its calibration uncertainty as a rectangular half-width), or calibrate the channel against reference loads (calibration)",
    ),
  plausibleRanges: (s) => [
    {
      path: 'sensor.ratedOutputVoltsPerVolt',
      value: s.ratedOutputVoltsPerVolt * 1e3,
      range: { min: 0.5, max: 5 },
      unit: 'mV/V',
    },
    { path: 'sensor.inputOhms', value: s.inputOhms, range: { min: 100, max: 10_000 }, unit: 'Ω' },
  ],
};
