/**
 * The `groups` section of a channel file: multi-bridge transducers (a multi-component
 * force/moment sensor, a multi-cell platform) whose bridges are ordinary channels of the same
 * file. This module checks the section's layout and returns issues in the user's terms; reading
 * the schedule and test files and fitting is `loadGroups`.
 */
import { closestName, formatValue, type SpecIssue } from '@bridgework/core';
import { interactionTermChoices, instrumentAccuracyClasses } from '@bridgework/calibration';
import type { InstrumentAccuracyClass, InteractionTerms, TrimPlacement } from '@bridgework/calibration';
import { dimensionTable, dimensions, parseQuantity, type Dimension } from '@bridgework/channel';
import { channelNamePattern } from '../channelFile/loadChannelFile.js';
import { reservedNames } from '../channelFile/channelFileText.js';

/** What a component name must match: a C identifier of at most 32 characters (it names C constants and data columns). */
export const componentNamePattern = /^[A-Za-z][A-Za-z0-9_]{0,31}$/;

/** The most bridges a group may hold. */
export const MAX_GROUP_BRIDGES = 32;

/** One load component of a group (a force, a moment, the platform's indication). */
export interface GroupComponent {
  /** Its name (a key of `components`, or `indication.name`). */
  readonly name: string;
  /** The unit its values are in: loads in the schedule, converted components, the C constants. */
  readonly unit: string;
  /** The unit's dimension. */
  readonly dimension: Dimension;
  /** Full scale (> 0) in `unit`, when given. */
  readonly fullScale?: number;
}

/** A multi-component group: bridges mapped to load components by a calibration fitted to a loading schedule. */
export interface MultiComponentGroupSpec {
  /** The kind. */
  readonly kind: 'multi-component';
  /** The group's name (its key under `groups`). */
  readonly name: string;
  /** The bridges: names of channels of the same file, in the order of the readings. */
  readonly bridges: readonly string[];
  /** The load components, in file order. */
  readonly components: readonly GroupComponent[];
  /** The calibration: fitted to a loading schedule when the file is read, or stored coefficients. */
  readonly calibration: ScheduleCalibrationSpec | StoredCalibrationSpec;
}

/** A calibration fitted to a loading schedule each time the file is read. */
export interface ScheduleCalibrationSpec {
  /** The form. */
  readonly form: 'schedule';
  /** The loading-schedule file (CSV), relative to the channel file. */
  readonly schedule: string;
  /** The second-order terms the model may hold. */
  readonly interactions: InteractionTerms;
  /** Whether a zero offset per bridge is fitted. */
  readonly offset: boolean;
  /** The term-rejection tolerance, when given. */
  readonly independenceTolerance?: number;
}

/** Where stored coefficients came from (written by `fit-group`, or by hand). */
export interface StoredCalibrationSource {
  /** The loading-schedule file, as given to the command. */
  readonly schedule?: string;
  /** SHA-256 of its bytes. */
  readonly scheduleSha256?: string;
  /** Its number of load points. */
  readonly points?: number;
  /** The second-order terms the fit was allowed. */
  readonly interactions?: InteractionTerms;
  /** When the calibration was made (ISO 8601 date or date and time). */
  readonly date?: string;
  /** Who, with what, why (free text). */
  readonly note?: string;
}

/** Coefficients calibrated elsewhere (or by `fit-group` on another day), stored in the file. */
export interface StoredCalibrationSpec {
  /** The form. */
  readonly form: 'stored';
  /** The unit of the readings the coefficients give (one unit for every bridge); each bridge's channel unit when absent. */
  readonly readingUnit?: string;
  /** The terms of the coefficient columns, by name (`1`, `Fx`, `Fx²` or `Fx^2`, `Fx·My` or `Fx*My`). */
  readonly terms: readonly string[];
  /** One row per bridge, in the order of `bridges`: reading_i = Σ_t b_it·g_t(F). */
  readonly coefficients: readonly (readonly unknown[])[];
  /** The fit's covariance, when known: (AᵀA)⁻¹ over the terms and Σ over the readings. */
  readonly covariance?: {
    /** (AᵀA)⁻¹ (T×T). */
    readonly terms: unknown;
    /** Σ (N×N), in the reading unit squared. */
    readonly readings: unknown;
    /** Degrees of freedom of Σ. */
    readonly degreesOfFreedom?: number;
  };
  /** Where the coefficients came from. */
  readonly source?: StoredCalibrationSource;
}

/** An analog summing junction: each cell's excitation through a trim resistor, the signals paralleled onto two buses. */
export interface SummingSpec {
  /** Each cell's bridge resistance, Ω (one per cell). */
  readonly cellOhms: readonly number[];
  /** Where the trims sit: split between +E and −E (default), or all in +E. */
  readonly trimPlacement: TrimPlacement;
  /** The resistor from each cell's +S and −S to the buses, Ω (0: paralleled directly). */
  readonly summingOhms: number;
  /** The indicator's input resistance across the buses, Ω (Infinity: open). */
  readonly meterOhms: number;
}

/** The trim placements of an analog summing junction. */
export const trimPlacements = ['both-excitation', 'positive-excitation'] as const;

/** A platform group: load cells summed with per-cell factors from an eccentricity (corner) test. */
export interface PlatformGroupSpec {
  /** The kind. */
  readonly kind: 'platform';
  /** The group's name. */
  readonly name: string;
  /** The load cells: names of channels of the same file. */
  readonly bridges: readonly string[];
  /** The platform's indication (one component). */
  readonly indication: GroupComponent;
  /** An analog summing junction whose trims the eccentricity test sets (digital summing without it). */
  readonly summing?: SummingSpec;
  /** The eccentricity test and the R 76 check. */
  readonly eccentricity: {
    /** The test file (CSV: a `position` column and one column per cell), relative to the channel file. */
    readonly test: string;
    /** The test load, in the indication's unit. */
    readonly testLoad: number;
    /** Positions of the test file used only to check the factors (the centre, say). */
    readonly checkPositions: readonly string[];
    /** The accuracy class for the OIML R 76 check. */
    readonly accuracyClass: InstrumentAccuracyClass;
    /** Max, in the indication's unit. */
    readonly maxCapacity: number;
    /** e, in the indication's unit. */
    readonly verificationInterval: number;
    /** Points of support of the load receptor. */
    readonly supportPoints: number;
  };
}

/** A validated group. */
export type GroupSpec = MultiComponentGroupSpec | PlatformGroupSpec;

/** The kinds of group. */
export const groupKinds = ['multi-component', 'platform'] as const;

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** The dimension of a unit symbol of the channel package's table, or undefined. */
export function dimensionOfUnitText(unit: string): Dimension | undefined {
  for (const d of dimensions) {
    if (d === 'dimensionless' || d === 'fraction') continue;
    try {
      parseQuantity(`1 ${unit}`, dimensionTable[d].si);
      return d;
    } catch {
      // not this dimension
    }
  }
  return undefined;
}

const componentDimensions: readonly Dimension[] = ['force', 'torque', 'mass', 'pressure', 'strain', 'ratio'];

class IssueList {
  readonly issues: SpecIssue[] = [];
  add(path: string, message: string, extra: Omit<SpecIssue, 'path' | 'message'> = {}): void {
    this.issues.push({ path, message, ...extra });
  }
  unknown(record: Record<string, unknown>, known: readonly string[], prefix: string): void {
    for (const k of Object.keys(record)) {
      if (known.includes(k)) continue;
      const near = closestName(k, known);
      this.add(
        `${prefix}.${k}`,
        `unknown field${near === undefined ? `; expected one of ${known.join(', ')}` : `; did you mean '${near}'?`}`,
        { code: 'unknown-option' },
      );
    }
  }
  required(record: Record<string, unknown>, keys: readonly string[], prefix: string, what: string): boolean {
    let ok = true;
    for (const k of keys) {
      if (record[k] === undefined) {
        this.add(`${prefix}.${k}`, `is required: ${what}`, { code: 'missing-option' });
        ok = false;
      }
    }
    return ok;
  }
}

/** Reads a quantity in `unit` (a number is taken in `unit`); positive when asked. */
function quantity(
  list: IssueList,
  path: string,
  value: unknown,
  unit: string,
  positive: boolean,
): number | undefined {
  if (typeof value !== 'number' && typeof value !== 'string') {
    list.add(path, `must be a quantity such as '100 ${unit}'; got ${formatValue(value)}`, {
      code: 'wrong-type',
    });
    return undefined;
  }
  let v: number;
  try {
    v = parseQuantity(value, unit);
  } catch (e) {
    list.add(path, `${(e as Error).message}`, {
      code: 'parse-error',
      expected: `a quantity in units of ${unit}, such as '100 ${unit}'`,
    });
    return undefined;
  }
  if (!Number.isFinite(v) || (positive && !(v > 0)) || Math.abs(v) > 1e100) {
    list.add(path, `must be ${positive ? 'positive and ' : ''}finite; got ${formatValue(value)}`, {
      code: 'out-of-range',
      expected: positive ? '> 0' : 'finite',
    });
    return undefined;
  }
  return v;
}

function componentUnit(
  list: IssueList,
  path: string,
  value: unknown,
): { unit: string; dimension: Dimension } | undefined {
  if (typeof value !== 'string' || value.trim() === '') {
    list.add(path, `must be a unit such as 'N', 'kN', 'N·m' or 'kg'; got ${formatValue(value)}`, {
      code: 'wrong-type',
    });
    return undefined;
  }
  const dimension = dimensionOfUnitText(value.trim());
  if (dimension === undefined || !componentDimensions.includes(dimension)) {
    list.add(path, `'${value}' is not a unit of force, torque, mass, pressure, strain or ratio`, {
      code: 'invalid-option',
      expected: "a unit such as 'N', 'kN', 'N·m', 'kg', 'Pa', 'µε', 'mV/V'",
    });
    return undefined;
  }
  return { unit: value.trim(), dimension };
}

function fileName(list: IssueList, path: string, value: unknown, what: string): string | undefined {
  if (typeof value !== 'string' || value.trim() === '') {
    list.add(path, `must be the path of ${what}, relative to the channel file; got ${formatValue(value)}`, {
      code: 'wrong-type',
    });
    return undefined;
  }
  return value;
}

function bridgeList(
  list: IssueList,
  path: string,
  value: unknown,
  channelNames: readonly string[],
  least: number,
): string[] | undefined {
  if (!Array.isArray(value) || value.length < least) {
    list.add(
      path,
      `must be a list of at least ${least} channel names of this file; got ${formatValue(value)}`,
      {
        code: 'invalid-shape',
      },
    );
    return undefined;
  }
  if (value.length > MAX_GROUP_BRIDGES) {
    list.add(path, `names ${value.length} bridges`, {
      code: 'out-of-range',
      limit: `${MAX_GROUP_BRIDGES} bridges`,
      suggestion: 'split the transducer into several groups',
    });
    return undefined;
  }
  let ok = true;
  const names: string[] = [];
  value.forEach((name, i) => {
    if (typeof name !== 'string' || !channelNames.includes(name)) {
      const near = typeof name === 'string' ? closestName(name, channelNames) : undefined;
      list.add(`${path}[${i}]`, `${formatValue(name)} is not a channel of this file`, {
        code: 'invalid-option',
        ...(near === undefined
          ? { expected: `one of ${channelNames.join(', ')}` }
          : { suggestion: `did you mean '${near}'?` }),
      });
      ok = false;
    } else if (names.includes(name)) {
      list.add(`${path}[${i}]`, `'${name}' is named twice: each bridge gives one reading`, {
        code: 'invalid-option',
      });
      ok = false;
    } else names.push(name);
  });
  return ok ? names : undefined;
}

const groupKeys = {
  'multi-component': ['kind', 'bridges', 'components', 'calibration'],
  platform: ['kind', 'bridges', 'indication', 'eccentricity', 'summing'],
} as const;

function interactionChoice(list: IssueList, path: string, value: unknown): InteractionTerms | undefined {
  if (value === undefined) return 'none';
  if (!interactionTermChoices.includes(value as InteractionTerms)) {
    list.add(path, `must be one of ${interactionTermChoices.join(', ')}; got ${formatValue(value)}`, {
      code: 'invalid-option',
    });
    return undefined;
  }
  return value as InteractionTerms;
}

/** The keys of a stored calibration. */
const storedKeys = ['readingUnit', 'terms', 'coefficients', 'covariance', 'source'] as const;
const sourceKeys = ['schedule', 'scheduleSha256', 'points', 'interactions', 'date', 'note'] as const;

function storedCalibration(
  list: IssueList,
  cal: Record<string, unknown>,
  cat: string,
  bridges: readonly string[] | undefined,
  components: readonly GroupComponent[],
  componentsOk: boolean,
): StoredCalibrationSpec | undefined {
  const before = list.issues.length;
  list.unknown(cal, storedKeys, cat);
  if (cal['schedule'] !== undefined)
    list.add(
      `${cat}.schedule`,
      'cannot be given with stored coefficients: the calibration is either fitted to a schedule when the file is read, or stored',
      {
        code: 'conflicting-options',
        suggestion: "keep 'schedule' (fit when read) or 'terms' and 'coefficients' (stored), not both",
      },
    );
  list.required(
    cal,
    ['terms', 'coefficients'],
    cat,
    'stored coefficients need their terms and one row per bridge',
  );
  const terms = cal['terms'];
  if (
    terms !== undefined &&
    !(
      Array.isArray(terms) &&
      terms.length > 0 &&
      terms.every((t) => typeof t === 'string' || typeof t === 'number')
    )
  )
    list.add(
      `${cat}.terms`,
      `must be a list of term names ('1', a component, 'Fx^2', 'Fx*My'); got ${formatValue(terms)}`,
      {
        code: 'invalid-shape',
      },
    );
  const termCount = Array.isArray(terms) ? terms.length : 0;
  const unit = cal['readingUnit'];
  if (unit !== undefined && (typeof unit !== 'string' || unit.trim() === ''))
    list.add(`${cat}.readingUnit`, `must be a unit such as 'mV/V'; got ${formatValue(unit)}`, {
      code: 'wrong-type',
    });
  const rows: unknown[][] = [];
  const coefficients = cal['coefficients'];
  if (coefficients !== undefined) {
    if (!isRecord(coefficients)) {
      list.add(
        `${cat}.coefficients`,
        `must map each bridge to its row of coefficients (one per term); got ${formatValue(coefficients)}`,
        {
          code: 'invalid-shape',
        },
      );
    } else if (bridges !== undefined) {
      list.unknown(coefficients, bridges, `${cat}.coefficients`);
      for (const b of bridges) {
        const row = coefficients[b];
        if (row === undefined) {
          list.add(
            `${cat}.coefficients.${b}`,
            'is required: one coefficient per term for each bridge of the group',
            {
              code: 'missing-option',
            },
          );
        } else if (!Array.isArray(row) || (termCount > 0 && row.length !== termCount)) {
          list.add(
            `${cat}.coefficients.${b}`,
            `must be a list of ${termCount} numbers, one per term; got ${formatValue(row)}`,
            {
              code: 'invalid-shape',
              limit: `${termCount} numbers`,
            },
          );
        } else rows.push(row as unknown[]);
      }
    }
  }
  const cov = cal['covariance'];
  let covariance: StoredCalibrationSpec['covariance'];
  if (cov !== undefined) {
    if (!isRecord(cov)) {
      list.add(
        `${cat}.covariance`,
        `must be a mapping with 'terms' and 'readings' (matrices); got ${formatValue(cov)}`,
        {
          code: 'invalid-shape',
        },
      );
    } else {
      list.unknown(cov, ['terms', 'readings', 'degreesOfFreedom'], `${cat}.covariance`);
      list.required(
        cov,
        ['terms', 'readings'],
        `${cat}.covariance`,
        'the covariance is (AᵀA)⁻¹ over the terms and Σ over the readings',
      );
      const dof = cov['degreesOfFreedom'];
      if (dof !== undefined && !(typeof dof === 'number' && dof > 0))
        list.add(`${cat}.covariance.degreesOfFreedom`, `must be a number > 0; got ${formatValue(dof)}`, {
          code: 'out-of-range',
          limit: '> 0',
        });
      covariance = {
        terms: cov['terms'],
        readings: cov['readings'],
        ...(typeof dof === 'number' ? { degreesOfFreedom: dof } : {}),
      };
    }
  }
  const src = cal['source'];
  let source: StoredCalibrationSource | undefined;
  if (src !== undefined) {
    if (!isRecord(src)) {
      list.add(
        `${cat}.source`,
        `must be a mapping (schedule, scheduleSha256, points, interactions, date, note); got ${formatValue(src)}`,
        {
          code: 'invalid-shape',
        },
      );
    } else {
      list.unknown(src, sourceKeys, `${cat}.source`);
      for (const k of ['schedule', 'scheduleSha256', 'date', 'note'] as const) {
        if (src[k] !== undefined && typeof src[k] !== 'string')
          list.add(`${cat}.source.${k}`, `must be a text; got ${formatValue(src[k])}`, {
            code: 'wrong-type',
          });
      }
      if (src['points'] !== undefined && !(Number.isInteger(src['points']) && (src['points'] as number) > 0))
        list.add(`${cat}.source.points`, `must be a whole number > 0; got ${formatValue(src['points'])}`, {
          code: 'not-integer',
        });
      const interactions = interactionChoice(list, `${cat}.source.interactions`, src['interactions']);
      source = {
        ...(src as StoredCalibrationSource),
        ...(src['interactions'] === undefined || interactions === undefined ? {} : { interactions }),
      };
    }
  }
  if (componentsOk && components.some((c) => c.fullScale === undefined))
    list.add(
      `${cat.replace(/\.calibration$/, '')}.components`,
      'needs a fullScale for every component with stored coefficients (there is no schedule to take it from)',
      { code: 'missing-option', suggestion: "give each component a fullScale, such as '2 kN'" },
    );
  if (list.issues.length > before || bridges === undefined) return undefined;
  return {
    form: 'stored',
    ...(typeof unit === 'string' ? { readingUnit: unit.trim() } : {}),
    terms: (terms as (string | number)[]).map(String),
    coefficients: rows,
    ...(covariance === undefined ? {} : { covariance }),
    ...(source === undefined ? {} : { source }),
  };
}

function multiComponent(
  list: IssueList,
  name: string,
  raw: Record<string, unknown>,
  channelNames: readonly string[],
): MultiComponentGroupSpec | undefined {
  const at = `groups.${name}`;
  list.unknown(raw, groupKeys['multi-component'], at);
  if (!list.required(raw, ['bridges', 'components', 'calibration'], at, 'see docs/multi-component.md'))
    return undefined;
  const bridges = bridgeList(list, `${at}.bridges`, raw['bridges'], channelNames, 1);
  const rawComponents = raw['components'];
  const components: GroupComponent[] = [];
  let componentsOk = true;
  if (!isRecord(rawComponents) || Object.keys(rawComponents).length === 0) {
    list.add(
      `${at}.components`,
      `must be a mapping from component name to { unit, fullScale }; got ${formatValue(rawComponents)}`,
      { code: 'invalid-shape' },
    );
    componentsOk = false;
  } else {
    for (const [cname, c] of Object.entries(rawComponents)) {
      const cat = `${at}.components.${cname}`;
      if (!componentNamePattern.test(cname) || reservedNames.has(cname)) {
        list.add(
          cat,
          'is not a valid component name: start with a letter; use letters, digits and _ (at most 32)',
          {
            code: 'invalid-option',
          },
        );
        componentsOk = false;
        continue;
      }
      if (!isRecord(c)) {
        list.add(cat, `must be a mapping with 'unit' and 'fullScale'; got ${formatValue(c)}`, {
          code: 'invalid-shape',
        });
        componentsOk = false;
        continue;
      }
      list.unknown(c, ['unit', 'fullScale'], cat);
      if (!list.required(c, ['unit'], cat, "the component's unit, such as 'N' or 'N·m'")) {
        componentsOk = false;
        continue;
      }
      const u = componentUnit(list, `${cat}.unit`, c['unit']);
      if (u === undefined) {
        componentsOk = false;
        continue;
      }
      const fullScale =
        c['fullScale'] === undefined
          ? undefined
          : quantity(list, `${cat}.fullScale`, c['fullScale'], u.unit, true);
      if (c['fullScale'] !== undefined && fullScale === undefined) componentsOk = false;
      components.push({ name: cname, ...u, ...(fullScale === undefined ? {} : { fullScale }) });
    }
  }
  if (bridges !== undefined && componentsOk && bridges.length < components.length) {
    list.add(
      `${at}.bridges`,
      `names ${bridges.length} bridges for ${components.length} components: the loads are determined only with at least as many bridges as components`,
      {
        code: 'invalid-shape',
        limit: `at least ${components.length} bridges`,
        suggestion: 'add bridges or remove components',
      },
    );
    componentsOk = false;
  }
  const cal = raw['calibration'];
  const cat = `${at}.calibration`;
  let calibration: MultiComponentGroupSpec['calibration'] | undefined;
  if (!isRecord(cal)) {
    list.add(
      cat,
      `must be a mapping with 'schedule' (a loading-schedule file) or 'terms' and 'coefficients' (stored coefficients); got ${formatValue(cal)}`,
      { code: 'invalid-shape' },
    );
  } else if (cal['coefficients'] !== undefined || cal['terms'] !== undefined) {
    calibration = storedCalibration(list, cal, cat, bridges, components, componentsOk);
  } else {
    list.unknown(cal, ['schedule', 'interactions', 'offset', 'independenceTolerance'], cat);
    if (
      list.required(
        cal,
        ['schedule'],
        cat,
        "the loading-schedule file (CSV) the calibration is fitted to (or 'terms' and 'coefficients' for stored coefficients)",
      )
    ) {
      const schedule = fileName(list, `${cat}.schedule`, cal['schedule'], 'a loading-schedule file (CSV)');
      const interactions = interactionChoice(list, `${cat}.interactions`, cal['interactions']);
      if (cal['offset'] !== undefined && typeof cal['offset'] !== 'boolean')
        list.add(`${cat}.offset`, `must be true or false; got ${formatValue(cal['offset'])}`, {
          code: 'wrong-type',
        });
      const tol = cal['independenceTolerance'];
      if (tol !== undefined && !(typeof tol === 'number' && tol > 0 && tol <= 0.1))
        list.add(`${cat}.independenceTolerance`, `must be a number in (0, 0.1]; got ${formatValue(tol)}`, {
          code: 'out-of-range',
          limit: '(0, 0.1]',
        });
      if (schedule !== undefined && interactions !== undefined)
        calibration = {
          form: 'schedule',
          schedule,
          interactions,
          offset: cal['offset'] !== false,
          ...(typeof tol === 'number' ? { independenceTolerance: tol } : {}),
        };
    }
  }
  if (bridges === undefined || !componentsOk || calibration === undefined) return undefined;
  return { kind: 'multi-component', name, bridges, components, calibration };
}

function summingJunction(
  list: IssueList,
  at: string,
  raw: unknown,
  bridges: readonly string[] | undefined,
): SummingSpec | undefined {
  if (!isRecord(raw)) {
    list.add(
      at,
      `must be a mapping with 'cellOhms' (the cells' bridge resistance); got ${formatValue(raw)}`,
      {
        code: 'invalid-shape',
      },
    );
    return undefined;
  }
  const before = list.issues.length;
  list.unknown(raw, ['cellOhms', 'trimPlacement', 'summingOhms', 'meterOhms'], at);
  if (
    !list.required(
      raw,
      ['cellOhms'],
      at,
      "each cell's bridge resistance, such as '350 Ω' (one for all, or a list)",
    )
  )
    return undefined;
  const ohms = (path: string, value: unknown): number | undefined => {
    const v = quantity(list, path, value, 'Ω', true);
    if (v !== undefined && (v < 1e-3 || v > 1e12)) {
      list.add(path, `${formatValue(value)} is outside 1 mΩ … 1 TΩ`, {
        code: 'out-of-range',
        limit: '1 mΩ … 1 TΩ',
      });
      return undefined;
    }
    return v;
  };
  const raws = raw['cellOhms'];
  let cellOhms: number[] | undefined;
  if (Array.isArray(raws)) {
    if (bridges !== undefined && raws.length !== bridges.length)
      list.add(`${at}.cellOhms`, `lists ${raws.length} resistances for ${bridges.length} cells`, {
        code: 'invalid-shape',
        suggestion: 'give one resistance per cell, or one for all',
      });
    else {
      const values = raws.map((v, i) => ohms(`${at}.cellOhms[${i}]`, v));
      if (values.every((v) => v !== undefined)) cellOhms = values as number[];
    }
  } else {
    const one = ohms(`${at}.cellOhms`, raws);
    if (one !== undefined && bridges !== undefined) cellOhms = bridges.map(() => one);
  }
  const placement = raw['trimPlacement'] ?? 'both-excitation';
  if (!trimPlacements.includes(placement as TrimPlacement))
    list.add(
      `${at}.trimPlacement`,
      `must be one of ${trimPlacements.join(', ')}; got ${formatValue(placement)}`,
      {
        code: 'invalid-option',
      },
    );
  let summingOhms = 0;
  if (raw['summingOhms'] !== undefined) {
    const v = quantity(list, `${at}.summingOhms`, raw['summingOhms'], 'Ω', false);
    if (v !== undefined && !(v >= 0 && v <= 1e12))
      list.add(
        `${at}.summingOhms`,
        `must be ≥ 0 Ω and at most 1 TΩ; got ${formatValue(raw['summingOhms'])}`,
        {
          code: 'out-of-range',
          limit: '0 … 1 TΩ',
        },
      );
    else if (v !== undefined) summingOhms = v;
  }
  let meterOhms = Infinity;
  if (raw['meterOhms'] !== undefined && raw['meterOhms'] !== 'open') {
    const v = ohms(`${at}.meterOhms`, raw['meterOhms']);
    if (v !== undefined) meterOhms = v;
  }
  if (list.issues.length > before || cellOhms === undefined) return undefined;
  return { cellOhms, trimPlacement: placement as TrimPlacement, summingOhms, meterOhms };
}

function platform(
  list: IssueList,
  name: string,
  raw: Record<string, unknown>,
  channelNames: readonly string[],
): PlatformGroupSpec | undefined {
  const at = `groups.${name}`;
  list.unknown(raw, groupKeys.platform, at);
  if (!list.required(raw, ['bridges', 'indication', 'eccentricity'], at, 'see docs/multi-component.md'))
    return undefined;
  const bridges = bridgeList(list, `${at}.bridges`, raw['bridges'], channelNames, 2);
  const ind = raw['indication'];
  let indication: GroupComponent | undefined;
  if (!isRecord(ind)) {
    list.add(`${at}.indication`, `must be a mapping with 'name' and 'unit'; got ${formatValue(ind)}`, {
      code: 'invalid-shape',
    });
  } else {
    list.unknown(ind, ['name', 'unit'], `${at}.indication`);
    if (
      list.required(
        ind,
        ['name', 'unit'],
        `${at}.indication`,
        "the platform's indication, such as { name: W, unit: kg }",
      )
    ) {
      const n = ind['name'];
      const u = componentUnit(list, `${at}.indication.unit`, ind['unit']);
      if (typeof n !== 'string' || !componentNamePattern.test(n) || reservedNames.has(n))
        list.add(
          `${at}.indication.name`,
          `must be a name: start with a letter; use letters, digits and _ (at most 32); got ${formatValue(n)}`,
          {
            code: 'invalid-option',
          },
        );
      else if (u !== undefined) indication = { name: n, ...u };
    }
  }
  const ecc = raw['eccentricity'];
  const eat = `${at}.eccentricity`;
  let eccentricity: PlatformGroupSpec['eccentricity'] | undefined;
  if (!isRecord(ecc)) {
    list.add(
      eat,
      `must be a mapping with 'test', 'testLoad', 'accuracyClass', 'maxCapacity' and 'verificationInterval'; got ${formatValue(ecc)}`,
      {
        code: 'invalid-shape',
      },
    );
  } else {
    const keys = [
      'test',
      'testLoad',
      'checkPositions',
      'accuracyClass',
      'maxCapacity',
      'verificationInterval',
      'supportPoints',
    ];
    list.unknown(ecc, keys, eat);
    if (
      list.required(
        ecc,
        ['test', 'testLoad', 'accuracyClass', 'maxCapacity', 'verificationInterval'],
        eat,
        'see docs/multi-component.md',
      ) &&
      indication !== undefined
    ) {
      const test = fileName(list, `${eat}.test`, ecc['test'], 'the eccentricity test file (CSV)');
      const testLoad = quantity(list, `${eat}.testLoad`, ecc['testLoad'], indication.unit, true);
      const maxCapacity = quantity(list, `${eat}.maxCapacity`, ecc['maxCapacity'], indication.unit, true);
      const verificationInterval = quantity(
        list,
        `${eat}.verificationInterval`,
        ecc['verificationInterval'],
        indication.unit,
        true,
      );
      const cls = ecc['accuracyClass'];
      const okClass = instrumentAccuracyClasses.includes(cls as InstrumentAccuracyClass);
      if (!okClass)
        list.add(
          `${eat}.accuracyClass`,
          `must be one of ${instrumentAccuracyClasses.join(', ')} (OIML R 76); got ${formatValue(cls)}`,
          {
            code: 'invalid-option',
          },
        );
      const sp = ecc['supportPoints'] ?? 4;
      const okSupports = Number.isInteger(sp) && (sp as number) >= 1 && (sp as number) <= 64;
      if (!okSupports)
        list.add(
          `${eat}.supportPoints`,
          `must be a whole number of supports in [1, 64]; got ${formatValue(sp)}`,
          {
            code: 'out-of-range',
          },
        );
      const cp = ecc['checkPositions'] ?? [];
      const okChecks = Array.isArray(cp) && cp.every((x) => typeof x === 'string' && x !== '');
      if (!okChecks)
        list.add(
          `${eat}.checkPositions`,
          `must be a list of position names of the test file; got ${formatValue(cp)}`,
          {
            code: 'invalid-shape',
          },
        );
      if (testLoad !== undefined && maxCapacity !== undefined && testLoad > maxCapacity * (1 + 1e-12)) {
        list.add(
          `${eat}.testLoad`,
          `${formatValue(ecc['testLoad'])} is above Max (${formatValue(ecc['maxCapacity'])})`,
          {
            code: 'out-of-range',
            limit: `${maxCapacity} ${indication.unit}`,
            suggestion: 'use a test load of about Max/3 (OIML R 76, eccentric loading)',
          },
        );
      } else if (
        test !== undefined &&
        testLoad !== undefined &&
        maxCapacity !== undefined &&
        verificationInterval !== undefined &&
        okClass &&
        okSupports &&
        okChecks
      ) {
        eccentricity = {
          test,
          testLoad,
          maxCapacity,
          verificationInterval,
          accuracyClass: cls as InstrumentAccuracyClass,
          supportPoints: sp as number,
          checkPositions: cp as string[],
        };
      }
    }
  }
  const summing =
    raw['summing'] === undefined
      ? undefined
      : summingJunction(list, `${at}.summing`, raw['summing'], bridges);
  if (bridges === undefined || indication === undefined || eccentricity === undefined) return undefined;
  if (raw['summing'] !== undefined && summing === undefined) return undefined;
  return {
    kind: 'platform',
    name,
    bridges,
    indication,
    eccentricity,
    ...(summing === undefined ? {} : { summing }),
  };
}

/**
 * Validates the `groups` section of a channel file.
 *
 * @remarks
 * `groups` maps a group name (the pattern of channel names, distinct from every channel name) to
 * a group: `kind` (`multi-component`, the default, or `platform`), `bridges` (names of channels of
 * the file), and for a multi-component group `components` (name → `{ unit, fullScale }`) and
 * `calibration`, either fitted when read (`schedule`, `interactions`, `offset`,
 * `independenceTolerance`) or stored (`terms`, `coefficients` per bridge, `readingUnit`,
 * `covariance`, `source`; every component then needs a `fullScale`); for a platform
 * `indication` (`{ name, unit }`), optionally `summing` (an analog junction: `cellOhms`,
 * `trimPlacement`, `summingOhms`, `meterOhms`) and `eccentricity` (`test`, `testLoad`, `checkPositions`,
 * `accuracyClass`, `maxCapacity`, `verificationInterval`, `supportPoints`). Every problem is an
 * issue with its full field path (`groups.coupling.components.Fx.unit`).
 *
 * @param raw - The section as parsed (undefined when the file has none).
 * @param channelNames - The channels of the file.
 * @returns The groups and the issues (the groups are complete only when there are no issues).
 */
export function validateGroups(
  raw: unknown,
  channelNames: readonly string[],
): { readonly groups: readonly GroupSpec[]; readonly issues: readonly SpecIssue[] } {
  const list = new IssueList();
  const groups: GroupSpec[] = [];
  if (raw === undefined) return { groups, issues: [] };
  if (!isRecord(raw) || Object.keys(raw).length === 0) {
    list.add('groups', `must be a non-empty mapping from group name to group; got ${formatValue(raw)}`, {
      code: 'invalid-shape',
    });
    return { groups, issues: list.issues };
  }
  for (const [name, g] of Object.entries(raw)) {
    const at = `groups.${name}`;
    if (!channelNamePattern.test(name) || reservedNames.has(name)) {
      list.add(
        at,
        'is not a valid group name: start with a letter; use letters, digits, _ and - (at most 63)',
        {
          code: 'invalid-option',
        },
      );
      continue;
    }
    if (channelNames.includes(name)) {
      list.add(
        at,
        `'${name}' names a channel too: a group's name must differ from every channel's (they name data columns)`,
        {
          code: 'invalid-option',
        },
      );
      continue;
    }
    if (!isRecord(g)) {
      list.add(at, `must be a mapping with 'bridges'; got ${formatValue(g)}`, { code: 'invalid-shape' });
      continue;
    }
    const kind = g['kind'] ?? 'multi-component';
    if (!groupKinds.includes(kind as (typeof groupKinds)[number])) {
      list.add(`${at}.kind`, `must be one of ${groupKinds.join(', ')}; got ${formatValue(kind)}`, {
        code: 'invalid-option',
      });
      continue;
    }
    const spec =
      kind === 'platform'
        ? platform(list, name, g, channelNames)
        : multiComponent(list, name, g, channelNames);
    if (spec !== undefined) groups.push(spec);
  }
  return { groups, issues: list.issues };
}
