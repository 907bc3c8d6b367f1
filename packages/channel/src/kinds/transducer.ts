/**
 * A bridge transducer with a certificate (load cell, pressure or torque transducer): its own full
 * bridge, rated output at capacity, zero balance, and data-sheet temperature coefficients. The
 * certificate's scaling (with gravity and buoyancy for masses) is the calibration package's
 * `createCertificateScale`; the four-wire lead loss is the compensation package's
 * `leadDesensitization`.
 */
import { STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED, formatValue } from '@bridgework/core';
import { createCertificateScale } from '@bridgework/calibration';
import { leadDesensitization } from '@bridgework/compensation';
import { displayUnitFor, type OutputQuantity } from '../outputQuantities.js';
import {
  choiceField,
  numberField,
  report,
  type ObjectOut,
  type ParseContext,
  type SchemaNode,
} from '../spec/schema.js';
import { findUnit, formatQuantity, formatSignificant, readQuantity } from '../units/quantity.js';
import { dimensionTable, type Dimension } from '../units/unitTable.js';
import { KIND_PARAMETERS_START, Parameter, type KindContext, type SensorKind } from './SensorKind.js';

/** What a transducer's capacity is. */
const ratedQuantities = ['force', 'mass', 'pressure', 'torque'] as const;
type RatedQuantity = (typeof ratedQuantities)[number];
const ratedDimension: Readonly<Record<RatedQuantity, Dimension>> = {
  force: 'force',
  mass: 'mass',
  pressure: 'pressure',
  torque: 'torque',
};

/** The capacity: a force, mass, pressure or torque, its kind told by its unit. */
function capacityField(): SchemaNode<number | `${number}${string}`, number, 'required'> {
  return {
    presence: 'required',
    doc: 'Rated capacity: a force, mass, pressure or torque with its unit (`20 t`, `50 kN`, `10 bar`, `500 N·m`)',
    fallback: undefined,
    shape: {
      form: 'custom',
      type: 'number (> 0)',
      unit: 'N, kg, Pa or N·m',
      json: { anyOf: [{ type: 'number', exclusiveMinimum: 0 }, { type: 'string' }] },
    },
    parse(value: unknown, path: string, ctx: ParseContext) {
      if (typeof value === 'string') {
        const unitText = value.replace(/^\s*[+\-−]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+\-−]?\d+)?\s*/, '');
        const dimension = ratedQuantities
          .map((q) => ratedDimension[q])
          .find((d) => unitText !== '' && findUnit(d, unitText) !== undefined);
        if (unitText !== '' && dimension === undefined) {
          return report(
            ctx,
            path,
            'wrong-type',
            `'${value}' is not a force, mass, pressure or torque; write it with its unit, such as '20 t', '50 kN', '10 bar' or '500 N·m'`,
            {
              expected: 'a force, mass, pressure or torque with its unit',
            },
          );
        }
        if (dimension !== undefined) {
          const r = readQuantity(value, dimension);
          if (!r.ok) return report(ctx, path, r.problem.code, r.problem.message);
          if (!(r.value > 0))
            return report(ctx, path, 'not-positive', `must be > 0; got ${value}`, { expected: '> 0' });
          ctx.parsed.set(
            `${path}#quantity`,
            ratedQuantities.find((q) => ratedDimension[q] === dimension),
          );
          ctx.writtenUnits.set(path, r.writtenUnit);
          return r.value;
        }
      }
      const r = readQuantity(value, 'dimensionless');
      if (!r.ok) return report(ctx, path, r.problem.code, r.problem.message);
      if (!(r.value > 0))
        return report(ctx, path, 'not-positive', `must be > 0; got ${formatValue(r.value)}`, {
          expected: '> 0',
        });
      return r.value;
    },
  };
}

const ohms = { dimension: 'resistance' } as const;
const perKelvin = { dimension: 'per-kelvin' } as const;
const gravity = {
  unit: { dimension: 'acceleration' },
  min: 0,
  minExclusive: true,
  default: STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED,
} as const;

const fields = {
  capacity: capacityField(),
  ratedQuantity: choiceField(ratedQuantities, {
    derived: true,
  }),
  ratedOutputVoltsPerVolt: numberField({
    doc: 'Rated output at capacity (certificate)',
    unit: { dimension: 'ratio' },
    min: 0,
    minExclusive: true,
    max: 0.5,
  }),
  ratedOutputToleranceFraction: numberField({
    unit: { dimension: 'fraction' },
    min: 0,
    max: 1,
    maxExclusive: true,
    default: 0,
  }),
  zeroBalanceVoltsPerVolt: numberField({
    unit: { dimension: 'ratio' },
    min: -0.5,
    max: 0.5,
    default: 0,
  }),
  inputOhms: numberField({
    unit: ohms,
    min: 0,
    minExclusive: true,
    default: 350,
  }),
  outputOhms: numberField({ unit: ohms, min: 0, minExclusive: true, default: 350 }),
  calibrationGravityMetersPerSecondSquared: numberField({
    ...gravity,
  }),
  localGravityMetersPerSecondSquared: numberField({
    ...gravity,
  }),
  zeroTemperatureCoefficientPerKelvin: numberField({
    unit: perKelvin,
    default: 0,
  }),
  spanTemperatureCoefficientPerKelvin: numberField({
    unit: perKelvin,
    default: 0,
  }),
  certificateCelsius: numberField({
    unit: { dimension: 'temperature' },
    default: 23,
  }),
};

type TransducerSpec = ObjectOut<typeof fields>;
/** Index of the rated output (V/V) in the parameter vector. */
export const RATED_OUTPUT = KIND_PARAMETERS_START;

/** Output quantities a rated quantity can give (besides the bridge ratio). */
const outputsOf: Readonly<Record<RatedQuantity, readonly OutputQuantity[]>> = {
  force: ['force', 'mass'],
  mass: ['mass', 'force'],
  pressure: ['pressure'],
  torque: ['torque'],
};

/** The certificate scale's units for a channel: what the capacity is, what comes out. */
export function scaleUnits(s: TransducerSpec, quantity: OutputQuantity) {
  const capacityUnit = s.ratedQuantity === 'mass' ? ('kilogram' as const) : ('newton' as const);
  const out = quantity === 'ratio' ? s.ratedQuantity : quantity;
  // Pressure and torque scale linearly through the 'newton' path (no gravity or buoyancy).
  const outputUnit = out === 'mass' ? ('kilogram' as const) : ('newton' as const);
  return { capacityUnit, outputUnit };
}

/** The certificate scale's gravities from the spec. */
export function gravities(s: TransducerSpec) {
  return {
    calibrationGravityMetersPerSecondSquared: s.calibrationGravityMetersPerSecondSquared,
    localGravityMetersPerSecondSquared: s.localGravityMetersPerSecondSquared,
  };
}

/** The four-wire lead and source loss: Rin/(Rin + 2·RL + Rs) (compensation leadDesensitization), 1 with remote sense. */
function spanFactor(ctx: KindContext<TransducerSpec>, ohmsPerLead: number): number {
  return ctx.wiring === 'six-wire'
    ? 1
    : leadDesensitization({
        wiring: 'four-wire',
        inputOhms: ctx.sensor.inputOhms,
        ohmsPerLead: ohmsPerLead + ctx.sourceOhms / 2,
      });
}

/** The transducer kind. */
export const transducerKind: SensorKind<typeof fields, 'transducer'> = {
  name: 'transducer',
  fields,
  quantities: ['force', 'mass', 'pressure', 'torque'],
  placement: 'own-bridge',
  temperatureLine: 'transducer temperature',
  parameters: (s) => [{ key: 'ratedOutputVoltsPerVolt', nominal: s.ratedOutputVoltsPerVolt }],
  nominalOhms: (s) => s.outputOhms,
  finalize(s, spec, path, ctx) {
    const written = ctx.parsed.get(`${path}.capacity#quantity`) as RatedQuantity | undefined;
    const q = spec.output.quantity;
    if (s.ratedQuantity !== undefined && written !== undefined && s.ratedQuantity !== written) {
      report(
        ctx,
        `${path}.ratedQuantity`,
        'conflicting-options',
        `must agree with the capacity's unit (a ${written}); got '${s.ratedQuantity}'`,
        {
          suggestion: 'remove ratedQuantity or write the capacity in a unit of it',
        },
      );
      return s;
    }
    const rated =
      s.ratedQuantity ??
      written ??
      (ratedQuantities.includes(q as RatedQuantity) ? (q as RatedQuantity) : undefined);
    if (rated === undefined) {
      report(
        ctx,
        `${path}.capacity`,
        'missing-option',
        `must carry its unit for output '${q}' (is it a force, mass, pressure or torque?); got ${s.capacity}`,
        {
          suggestion: "write it as '20 t', '50 kN', '10 bar' or '500 N·m'",
        },
      );
      return s;
    }
    return { ...s, ratedQuantity: rated };
  },
  check(s, spec, reportAt) {
    const q = spec.output.quantity;
    if (q !== 'ratio' && !outputsOf[s.ratedQuantity].includes(q)) {
      reportAt(
        'output.quantity',
        `cannot be '${q}' from a transducer rated in ${dimensionTable[ratedDimension[s.ratedQuantity]].what.replace(/^an? /, '')}`,
        {
          expected: `one of ${[...outputsOf[s.ratedQuantity], 'ratio'].map((x) => `'${x}'`).join(', ')}`,
        },
      );
    }
    if (spec.bridge.completionOhms !== undefined) {
      reportAt('bridge.completionOhms', 'must be absent for a transducer (it has no completion resistors)');
    }
  },
  describe: (s) => {
    // The capacity in the unit people read it in (bar, kN, t, kN·m).
    const shown = displayUnitFor(s.ratedQuantity, s.capacity);
    return `bridge transducer, capacity ${formatQuantity(s.capacity * shown.factor, shown.unit)}, rated output ${formatSignificant(s.ratedOutputVoltsPerVolt * 1e3)} mV/V`;
  },
  defaultSpan(ctx) {
    const s = ctx.sensor;
    const { capacityUnit, outputUnit } = scaleUnits(s, ctx.quantity);
    const full = createCertificateScale({
      capacity: s.capacity,
      capacityUnit,
      ratedOutputVoltsPerVolt: 1,
      outputUnit,
      ...gravities(s),
    }).loadPerRatio;
    const out = ctx.quantity === 'ratio' ? s.ratedQuantity : ctx.quantity;
    return out === 'mass' || out === 'pressure' ? { min: 0, max: full } : { min: -full, max: full };
  },
  exactMap(ctx, p, zeroRatio) {
    const s = ctx.sensor;
    const span = spanFactor(ctx, p[Parameter.ohmsPerLead] as number);
    const t = p[Parameter.temperatureCelsius] as number;
    const rated = p[RATED_OUTPUT] as number;
    // Data-sheet temperature effects: the zero moves by TK0·RO·(T − T_zero), the rated output
    // scales by 1 + TKC·(T − T_certificate).
    const zeroDrift = s.zeroTemperatureCoefficientPerKelvin * rated * (t - ctx.zeroTemperatureCelsius);
    const ratedNow = rated * (1 + s.spanTemperatureCoefficientPerKelvin * (t - s.certificateCelsius));
    const zero = (zeroRatio === undefined ? s.zeroBalanceVoltsPerVolt : zeroRatio / span) + zeroDrift;
    const scale = createCertificateScale({
      capacity: s.capacity,
      ...scaleUnits(s, ctx.quantity),
      ratedOutputVoltsPerVolt: ratedNow,
      zeroVoltsPerVolt: zero,
      ...gravities(s),
    });
    return {
      quantityFromRatio: (ratio) => scale.loadFromRatio(ratio / span),
      ratioFromQuantity: (q) => scale.ratioFromLoad(q) * span,
      ratioRange: { min: -span, max: span },
      linearFractional: true,
      frontEndSpan(ratioMin, ratioMax) {
        const r = s.outputOhms;
        return {
          armsOhms: [r, r, r, r],
          ratioRange: { min: Math.min(ratioMin, ratioMax), max: Math.max(ratioMin, ratioMax) },
        };
      },
    };
  },
};

export type { TransducerSpec };
