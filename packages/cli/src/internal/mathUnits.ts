/**
 * The one place that touches mathjs: a private instance (never the shared default one), loaded on
 * first use, and a typed view of the parts of its Unit class that parseQuantity needs. Importing
 * mathjs costs about 0.8 s, so it is loaded synchronously (through `createRequire`) only when a
 * quantity with a unit is first parsed; plain numbers never load it.
 */
import { createRequire } from 'node:module';
import type { MathJsInstance, Unit } from 'mathjs';

/** One factor of a parsed unit, e.g. `mm^-2` → prefix 1e-3, unit m (factor 1), power −2. */
export interface UnitFactor {
  /** The unit's name without prefix (`'m'`, `'ohm'`, `'degF'`). */
  readonly name: string;
  /** The prefix's factor (1e-3 for `m`, 1 for none). */
  readonly prefixValue: number;
  /** The unit's factor to SI, or `undefined` when mathjs keeps it as a fraction (degF). */
  readonly unitValue: number | undefined;
  /** The unit's offset to SI (273.15 for degC, 0 for most). */
  readonly offset: number;
  /** The power (2 for `m^2`, −1 for `/V`). */
  readonly power: number;
}

/** A parsed unit: its factors and dimension, and conversions. */
export interface ParsedUnit {
  /** The factors, in order. */
  readonly factors: readonly UnitFactor[];
  /** True when the unit has no dimension (V/V, m/m). */
  readonly dimensionless: boolean;
  /** True when the unit has the same dimension as the unit text `other`. */
  sameDimension(other: string): boolean;
  /** `value` in this unit, expressed in `target` (mathjs conversion, in doubles). */
  convert(value: number, target: string): number;
  /** `value` in this unit, in coherent SI (for dimensionless units: the plain number). */
  toSi(value: number): number;
  /** The unit of the SI equivalent, e.g. `'kg / m'`. */
  siText(): string;
}

interface RuntimeComponent {
  readonly power: number;
  readonly prefix: { readonly value: number };
  readonly unit: { readonly name: string; readonly value: unknown; readonly offset: unknown };
}

let math: MathJsInstance | undefined;

function instance(): MathJsInstance {
  if (math === undefined) {
    const require = createRequire(import.meta.url);
    const { all, create } = require('mathjs') as typeof import('mathjs');
    if (all === undefined) throw new Error('mathjs did not load its factories');
    math = create(all, {});
  }
  return math;
}

/**
 * Parses a unit text with mathjs's unit parser (not its expression evaluator).
 *
 * @param text - A unit such as `'kohm'`, `'mV/V'`, `'N/mm^2'`.
 * @returns The parsed unit; throws mathjs's message when the unit is unknown.
 */
export function parseUnit(text: string): ParsedUnit {
  const m = instance();
  const u: Unit = m.unit(1, text);
  const components = u.units as unknown as readonly RuntimeComponent[];
  return {
    factors: components.map((c) => ({
      name: c.unit.name,
      prefixValue: c.prefix.value,
      unitValue: typeof c.unit.value === 'number' ? c.unit.value : undefined,
      offset: typeof c.unit.offset === 'number' ? c.unit.offset : Number(c.unit.offset),
      power: c.power,
    })),
    dimensionless: u.dimensions.every((d) => d === 0),
    sameDimension(other) {
      return u.equalBase(m.unit(1, other));
    },
    convert(value, target) {
      return m.unit(value, text).toNumber(target);
    },
    toSi(value) {
      return m.unit(value, text).value;
    },
    siText() {
      return u.toSI().formatUnits();
    },
  };
}

/** Whether mathjs has been loaded in this process (for the test that plain numbers never load it). */
export function isMathLoaded(): boolean {
  return math !== undefined;
}
