/**
 * Strain gauges in one of the bridge package's arrangements: the gauge-factor setting maps the
 * bridge to indicated strain (bridge `createStrainBridge`, exact, leads and source resistance
 * included, the two-reading method for a zero reading); the gauge-factor temperature coefficient
 * and the lot's thermal output are corrected (compensation); transverse sensitivity is corrected
 * for a uniaxial field (compensation); strain becomes stress, shear stress, force, bending moment
 * or torque through the mechanics package.
 */
import { arrangementTable, createStrainBridge, type ArrangementInfo } from '@bridgework/bridge';
import {
  correctTemperatureEffects,
  createThermalOutput,
  indicatedStrainWithTemperatureEffects,
  indicatedTransverseStrain,
  type ThermalOutput,
} from '@bridgework/compensation';
import { createAxialMember, createBendingMember, createShaft } from '@bridgework/mechanics';
import { type OutputQuantity } from '../outputQuantities.js';
import { intervalField, numberField, numberListField, objectField, type ObjectOut } from '../spec/schema.js';
import type { CommonSpec } from '../spec/commonSpec.js';
import { formatSignificant } from '../units/quantity.js';
import { KIND_PARAMETERS_START, Parameter, type SensorKind, type SpecReporter } from './SensorKind.js';

const fields = {
  gaugeFactor: numberField({
    doc: 'Gauge factor at the reference temperature',
    min: 0,
    minExclusive: true,
  }),
  gaugeOhms: numberField({
    unit: { dimension: 'resistance' },
    min: 0,
    minExclusive: true,
    default: 350,
  }),
  gaugeFactorToleranceFraction: numberField({
    unit: { dimension: 'fraction' },
    min: 0,
    max: 1,
    maxExclusive: true,
    default: 0,
  }),
  transverseSensitivity: numberField({
    unit: { dimension: 'fraction' },
    min: -1,
    max: 1,
    minExclusive: true,
    maxExclusive: true,
    default: 0,
  }),
  gaugeFactorTemperatureCoefficientPerKelvin: numberField({
    unit: { dimension: 'per-kelvin' },
    default: 0,
  }),
  gaugeFactorReferenceCelsius: numberField({
    unit: { dimension: 'temperature' },
    default: 24,
  }),
  thermalOutput: objectField(
    {
      coefficientsMicrostrain: numberListField({
        doc: 'Thermal output ε_app(T) = Σ aᵢ·Tⁱ: a0…a4 in µε/°Cⁱ',
        minLength: 1,
        maxLength: 5,
        item: { doc: 'µε/°Cⁱ' },
      }),
      gaugeFactor: numberField({
        min: 0,
        minExclusive: true,
        default: 2,
      }),
      rangeCelsius: intervalField({
        doc: 'Temperatures over which the curve holds',
        unit: { dimension: 'temperature' },
      }),
    },
    { presence: 'optional' },
  ),
};

type StrainGaugeSpec = ObjectOut<typeof fields>;

/** What the strain of an arrangement is (the bridge table's `measures`; a row without it gives strain only). */
function strainMeaning(arrangement: string | undefined): 'normal' | 'bending' | 'shear' | 'unknown' {
  const row = (arrangementTable as Readonly<Record<string, Partial<ArrangementInfo> | undefined>>)[
    arrangement ?? 'quarter'
  ];
  return row?.measures ?? 'unknown';
}

const quantitiesByMeaning: Readonly<
  Record<'normal' | 'bending' | 'shear' | 'unknown', readonly OutputQuantity[]>
> = {
  normal: ['strain', 'stress', 'force', 'bending-moment'],
  bending: ['strain', 'stress', 'bending-moment', 'force'],
  shear: ['strain', 'shear-stress', 'torque'],
  unknown: ['strain'],
};

/** The output fields a quantity needs (beyond `quantity`, `unit`, `range`, `firmwareResolution`). */
function memberFields(quantity: OutputQuantity, meaning: string, spec: CommonSpec): readonly string[] {
  const shear = spec.output.shearModulusPascals !== undefined ? ['shearModulusPascals'] : ['modulusPascals'];
  switch (quantity) {
    case 'stress':
      return ['modulusPascals'];
    case 'shear-stress':
      return shear;
    case 'force':
      return meaning === 'bending'
        ? ['modulusPascals', 'sectionModulusCubicMeters', 'leverArmMeters']
        : ['modulusPascals', 'areaSquareMeters'];
    case 'bending-moment':
      return ['modulusPascals', 'sectionModulusCubicMeters'];
    case 'torque':
      return [
        ...shear,
        'shaftDiameterMeters',
        ...(spec.output.shaftBoreMeters === undefined ? [] : ['shaftBoreMeters']),
      ];
    default:
      return [];
  }
}

const why: Readonly<Record<string, string>> = {
  shear:
    "a shear bridge reads the ±45° strain of pure shear, which is not a normal strain: use quantity 'shear-stress' (τ = 2G·ε45) or 'torque' (a shaft)",
  bending:
    "a bending bridge cancels the axial strain: use quantity 'bending-moment', or 'force' at a lever arm",
  normal:
    "this arrangement reads normal (axial or surface) strain: use 'stress', 'force' or 'bending-moment'",
  unknown: 'the channel knows no member conversion for this arrangement: use quantity strain',
};

/** The linear conversion strain → quantity (every member conversion is linear in strain), in SI. */
export function quantityPerStrain(
  spec: CommonSpec,
  arrangement: string | undefined,
  poissonRatio: number | undefined,
): number {
  const o = spec.output;
  const meaning = strainMeaning(arrangement);
  const shearModulus = () =>
    o.shearModulusPascals ??
    createShaft({
      diameterMeters: 1,
      modulusPascals: o.modulusPascals as number,
      poissonRatio: poissonRatio as number,
    }).shearModulusPascals;
  // Each member map is linear, q = k·ε; k is read at ε = 1/2 (an exact halving) from the mechanics package.
  const half = 0.5;
  switch (spec.output.quantity) {
    case 'stress':
      return o.modulusPascals as number; // uniaxial Hooke's law σ = E·ε
    case 'shear-stress':
      return 2 * shearModulus(); // Hooke's law in shear, τ = G·γ with γ = 2·ε45
    case 'force':
      return meaning === 'bending'
        ? createBendingMember({
            modulusPascals: o.modulusPascals as number,
            sectionModulusCubicMeters: o.sectionModulusCubicMeters as number,
            leverArmMeters: o.leverArmMeters as number,
          }).forceFromStrain(half) / half
        : createAxialMember({
            modulusPascals: o.modulusPascals as number,
            areaSquareMeters: o.areaSquareMeters as number,
          }).forceFromStrain(half) / half;
    case 'bending-moment':
      return (
        createBendingMember({
          modulusPascals: o.modulusPascals as number,
          sectionModulusCubicMeters: o.sectionModulusCubicMeters as number,
        }).momentFromStrain(half) / half
      );
    case 'torque':
      return (
        createShaft({
          diameterMeters: o.shaftDiameterMeters as number,
          ...(o.shaftBoreMeters === undefined ? {} : { innerDiameterMeters: o.shaftBoreMeters }),
          ...(o.shearModulusPascals !== undefined
            ? { shearModulusPascals: o.shearModulusPascals }
            : { modulusPascals: o.modulusPascals as number, poissonRatio: poissonRatio as number }),
        }).torqueFromStrain(half) / half
      );
    default:
      return 1;
  }
}

/** Index of the gauge factor in the parameter vector. */
export const GAUGE_FACTOR = KIND_PARAMETERS_START;

/** The strain-gauge kind. */
export const strainGaugeKind: SensorKind<typeof fields, 'strain-gauge'> = {
  name: 'strain-gauge',
  fields,
  quantities: ['strain', 'stress', 'shear-stress', 'force', 'bending-moment', 'torque'],
  placement: 'arrangement',
  temperatureLine: 'gauge temperature',
  parameters: (s) => [{ key: 'gaugeFactor', nominal: s.gaugeFactor }],
  nominalOhms: (s) => s.gaugeOhms,
  check(s, spec, report: SpecReporter) {
    const arrangement = spec.bridge.arrangement ?? 'quarter';
    const meaning = strainMeaning(arrangement);
    const q = spec.output.quantity;
    if (q !== 'ratio' && !quantitiesByMeaning[meaning].includes(q)) {
      report('output.quantity', `cannot be '${q}' from a '${arrangement}' bridge: ${why[meaning]}`, {
        expected: `one of ${[...quantitiesByMeaning[meaning], 'ratio'].map((x) => `'${x}'`).join(', ')}`,
      });
      return;
    }
    if (s.transverseSensitivity !== 0 && spec.bridge.poissonRatio === undefined) {
      report(
        'bridge.poissonRatio',
        'is required to correct transverse sensitivity (the transverse strain is −ν·ε)',
      );
    }
    const needed = q === 'ratio' ? [] : memberFields(q, meaning, spec);
    for (const field of needed) {
      if (spec.output[field as keyof CommonSpec['output']] === undefined) {
        report(`output.${field}`, `is required for output '${q}' from a '${arrangement}' bridge`);
      }
    }
    if (
      (q === 'shear-stress' || q === 'torque') &&
      spec.output.shearModulusPascals === undefined &&
      spec.bridge.poissonRatio === undefined
    ) {
      report(
        'output.shearModulusPascals',
        `is required for output '${q}' (or give output.modulusPascals and bridge.poissonRatio: G = E/(2(1 + ν)))`,
      );
    }
    if (
      q === 'torque' &&
      spec.output.shaftBoreMeters !== undefined &&
      spec.output.shaftDiameterMeters !== undefined &&
      !(spec.output.shaftBoreMeters < spec.output.shaftDiameterMeters)
    ) {
      report(
        'output.shaftBoreMeters',
        `must be smaller than output.shaftDiameterMeters (${spec.output.shaftDiameterMeters} m); got ${spec.output.shaftBoreMeters} m`,
      );
    }
    const t = s.thermalOutput;
    if (t !== undefined) {
      const range = spec.environment.rangeCelsius;
      for (const [label, x] of [
        ['environment.rangeCelsius', range.min],
        ['environment.rangeCelsius', range.max],
        ['environment.zeroTemperatureCelsius', spec.environment.zeroTemperatureCelsius],
      ] as const) {
        if (!(x >= t.rangeCelsius.min && x <= t.rangeCelsius.max)) {
          report(
            label,
            `must lie inside sensor.thermalOutput.rangeCelsius [${t.rangeCelsius.min}, ${t.rangeCelsius.max}] °C, where the thermal-output curve holds; got ${x} °C`,
            {
              suggestion: 'narrow the temperatures or give a thermal-output curve that covers them',
            },
          );
          break;
        }
      }
    }
  },
  outputFields(_s, spec) {
    const arrangement = spec.bridge.arrangement ?? 'quarter';
    const meaning = strainMeaning(arrangement);
    return spec.output.quantity === 'ratio' ? [] : memberFields(spec.output.quantity, meaning, spec);
  },
  describe: (s, spec) =>
    `${spec.bridge.arrangement ?? 'quarter'} bridge of ${formatSignificant(s.gaugeOhms)} Ω strain gauges, gauge factor ${formatSignificant(s.gaugeFactor)}`,
  defaultSpan(ctx) {
    // ±3000 µε of the arrangement's strain (common practice: beyond steel's yield strain).
    const k = quantityPerStrain(ctx.spec, ctx.arrangement, ctx.poissonRatio);
    return { min: -3e-3 * k, max: 3e-3 * k };
  },
  exactMap(ctx, p, zeroRatio) {
    const s = ctx.sensor;
    const arrangement = ctx.arrangement as string;
    const bridge = createStrainBridge({
      // The arrangement comes from the bridge package's own table.
      arrangement: arrangement as Parameters<typeof createStrainBridge>[0]['arrangement'],
      gaugeFactor: s.gaugeFactor,
      gaugeOhms: s.gaugeOhms,
      completionOhms: p[Parameter.completionOhms] as number,
      sourceOhms: ctx.sourceOhms,
      ...(ctx.poissonRatio === undefined ? {} : { poissonRatio: ctx.poissonRatio }),
      leads: { ohmsPerLead: p[Parameter.ohmsPerLead] as number, wiring: ctx.wiring },
    });
    const thermalOutput: ThermalOutput | undefined =
      s.thermalOutput === undefined
        ? undefined
        : createThermalOutput({
            coefficientsMicrostrain: s.thermalOutput.coefficientsMicrostrain,
            gaugeFactor: s.thermalOutput.gaugeFactor,
            rangeCelsius: [s.thermalOutput.rangeCelsius.min, s.thermalOutput.rangeCelsius.max],
          });
    const temperature = {
      gaugeFactorSetting: s.gaugeFactor,
      zeroCelsius: ctx.zeroTemperatureCelsius,
      temperatureCelsius: p[Parameter.temperatureCelsius] as number,
      ...(thermalOutput === undefined ? {} : { thermalOutput }),
      gaugeFactor: p[GAUGE_FACTOR] as number,
      gaugeFactorTemperatureCoefficientPerKelvin: s.gaugeFactorTemperatureCoefficientPerKelvin,
      gaugeFactorReferenceCelsius: s.gaugeFactorReferenceCelsius,
    };
    // Transverse sensitivity in a uniaxial stress field: the gauge reads ε·t with
    // t = indicated(axial 1, transverse −ν), so the true strain is the reading divided by t.
    const transverse =
      s.transverseSensitivity === 0
        ? 1
        : indicatedTransverseStrain({
            axialStrain: 1,
            transverseStrain: -(ctx.poissonRatio as number),
            transverseSensitivity: s.transverseSensitivity,
          });
    const perStrain = quantityPerStrain(ctx.spec, arrangement, ctx.poissonRatio);
    const zero = zeroRatio === undefined ? {} : { zeroRatio };
    return {
      quantityFromRatio(ratio) {
        const indicated = bridge.strainFromRatio(ratio, zero);
        return (
          (perStrain * correctTemperatureEffects({ ...temperature, indicatedStrain: indicated })) / transverse
        );
      },
      ratioFromQuantity(q) {
        const strain = (q / perStrain) * transverse;
        return bridge.ratioFromStrain(
          indicatedStrainWithTemperatureEffects({ ...temperature, strain }),
          zero,
        );
      },
      ratioRange: bridge.ratioRange,
      linearFractional: bridge.linearFractional !== undefined,
      frontEndSpan(ratioMin, ratioMax) {
        const ends = [bridge.strainFromRatio(ratioMin), bridge.strainFromRatio(ratioMax)].sort(
          (a, b) => a - b,
        ) as [number, number];
        return { bridge, strainRange: { min: ends[0], max: ends[1] } };
      },
    };
  },
};

export type { StrainGaugeSpec };
