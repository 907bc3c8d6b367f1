import { checkOneOf } from '@bridgework/core';
import { fromBaseUnit } from './units/quantity.js';
import { dimensionTable, type Dimension } from './units/unitTable.js';

/** What a channel measures. */
export type OutputQuantity =
  | 'strain'
  | 'stress'
  | 'shear-stress'
  | 'force'
  | 'mass'
  | 'torque'
  | 'bending-moment'
  | 'pressure'
  | 'temperature'
  | 'ratio';

/** What the channel knows of an output quantity. */
export interface OutputQuantityInfo {
  /** Its dimension, which sets the units it may be written and shown in. */
  readonly dimension: Dimension;
  /** Its meaning, in words. */
  readonly doc: string;
}

/** Each output quantity: its dimension (so its units) and its meaning. */
export const outputQuantityTable: Readonly<Record<OutputQuantity, OutputQuantityInfo>> = {
  strain: { dimension: 'strain', doc: 'strain (m/m; µε usual)' },
  stress: { dimension: 'pressure', doc: "normal stress σ = E·ε (uniaxial Hooke's law)" },
  'shear-stress': { dimension: 'pressure', doc: 'shear stress τ = G·γ from a shear bridge' },
  force: { dimension: 'force', doc: 'force on an axial member, at a lever arm, or from a force transducer' },
  mass: { dimension: 'mass', doc: 'mass on a load cell (local gravity)' },
  torque: { dimension: 'torque', doc: 'torque on a shaft (shear bridge) or from a torque transducer' },
  'bending-moment': { dimension: 'torque', doc: 'bending moment M = σ·W on a section (bending bridge)' },
  pressure: { dimension: 'pressure', doc: 'pressure from a pressure transducer' },
  temperature: { dimension: 'temperature', doc: 'temperature (RTD, thermistor)' },
  ratio: { dimension: 'ratio', doc: 'the bridge output ratio Vout/Vexc (any sensor)' },
};

/** Every output quantity, in the order of the table. */
export const outputQuantities: readonly OutputQuantity[] = Object.keys(
  outputQuantityTable,
) as OutputQuantity[];

/**
 * The unit a quantity's values are in when `output.unit` is not given: the dimension's SI unit.
 *
 * @param quantity - One of {@link outputQuantities}.
 * @returns The unit symbol (`'N'` for force, `'°C'` for temperature, `'m/m'` for strain).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a quantity not in the table
 *   (the message lists them).
 * @example
 * ```ts
 * defaultOutputUnit('pressure'); // 'Pa'
 * ```
 */
export function defaultOutputUnit(quantity: OutputQuantity): string {
  checkOneOf('quantity', quantity, outputQuantities);
  return dimensionTable[outputQuantityTable[quantity].dimension].si;
}

/**
 * How a channel's quantity is shown to people: `shown = value × factor` in `unit`.
 */
export interface DisplayUnit {
  /** The unit's symbol (`'µε'`, `'kN'`, `'mV/V'`). */
  readonly unit: string;
  /** Multiplier from the channel's values to the shown unit (1 when they are in it already). */
  readonly factor: number;
}

/**
 * The unit people read a quantity in, when the spec names none (values are then SI): strain in
 * µε, ratios in mV/V, stress in MPa (GPa from 1 GPa), pressure in bar (kPa below 1 bar, MPa from
 * 1000 bar), force in N, kN from 10 kN, MN from 10 MN, mass in kg, t from 10 t, torque and
 * moment in N·m, kN·m from 10 kN·m, temperature in °C. Chosen from the span's largest magnitude
 * so one channel shows in one unit throughout.
 *
 * @internal
 */
export function displayUnitFor(quantity: OutputQuantity, largestMagnitude: number): DisplayUnit {
  const dimension = outputQuantityTable[quantity].dimension;
  const pick = (unit: string): DisplayUnit => {
    const factor = fromBaseUnit(1, dimension, unit);
    return { unit, factor };
  };
  const m = largestMagnitude;
  switch (quantity) {
    case 'strain':
      return pick('µε');
    case 'ratio':
      return pick('mV/V');
    case 'stress':
    case 'shear-stress':
      return pick(m >= 1e9 ? 'GPa' : 'MPa');
    case 'pressure':
      return pick(m >= 1e8 ? 'MPa' : m >= 1e5 ? 'bar' : m >= 1e3 ? 'kPa' : 'Pa');
    case 'force':
      return pick(m >= 1e7 ? 'MN' : m >= 1e4 ? 'kN' : 'N');
    case 'mass':
      return pick(m >= 1e4 ? 't' : 'kg');
    case 'torque':
    case 'bending-moment':
      return pick(m >= 1e4 ? 'kN·m' : 'N·m');
    case 'temperature':
      return pick('°C');
  }
}
