import { dirname, resolve } from 'node:path';
import {
  checkEccentricity,
  createMultiComponentModel,
  fitCornerFactors,
  fitMultiComponent,
  fitSummingTrims,
  type CheckResult,
  type CornerFactors,
  type EccentricityCheck,
  type LoadingPoint,
  type MultiComponentCalibration,
  type MultiComponentModel,
  type SummingTrims,
} from '@bridgework/calibration';
import { createChannel, parseQuantity, type Channel } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError, type SpecIssue } from '@bridgework/core';
import { formatIssues } from '../channelFile/formatIssues.js';
import type { LoadedChannels } from '../channels/loadChannels.js';
import {
  validateGroups,
  type MultiComponentGroupSpec,
  type PlatformGroupSpec,
  type ScheduleCalibrationSpec,
  type StoredCalibrationSpec,
} from './groupSpec.js';
import { readGroupTable } from './readGroupTable.js';

/** One bridge of a group: its channel, whose converted values are the group's readings. */
export interface GroupBridge {
  /** The channel's name. */
  readonly name: string;
  /** The channel. */
  readonly channel: Channel;
  /** The unit of its readings (the channel's unit). */
  readonly unit: string;
}

/** A multi-component group with its calibration (fitted to its schedule, or from stored coefficients). */
export interface MultiComponentGroup {
  /** The kind. */
  readonly kind: 'multi-component';
  /** The validated spec. */
  readonly spec: MultiComponentGroupSpec;
  /** The bridges, in the order of the readings. */
  readonly bridges: readonly GroupBridge[];
  /** The model: coefficients, load matrix, inverse, uncertainty (in each component's and bridge's unit). */
  readonly calibration: MultiComponentModel;
  /** The fit, when the calibration is fitted to a schedule as the file is read. */
  readonly fit?: {
    /** The loading schedule as read (loads in each component's unit, readings in each bridge's unit). */
    readonly points: readonly LoadingPoint[];
    /** The fitted calibration (the same object as `calibration`). */
    readonly calibration: MultiComponentCalibration;
    /** The schedule form of the spec. */
    readonly spec: ScheduleCalibrationSpec;
  };
}

/** A platform group with its corner factors and the R 76 eccentricity check. */
export interface PlatformGroup {
  /** The kind. */
  readonly kind: 'platform';
  /** The validated spec. */
  readonly spec: PlatformGroupSpec;
  /** The load cells. */
  readonly bridges: readonly GroupBridge[];
  /** The position names of the test file, in file order (the zero row excluded). */
  readonly positions: readonly string[];
  /** Whether each position fitted the factors (false: a check position). */
  readonly fitted: readonly boolean[];
  /** The per-cell factors (indication unit per reading unit) and the indications. */
  readonly factors: CornerFactors;
  /** The indication at every position, in file order (indication unit). */
  readonly indications: readonly number[];
  /** The OIML R 76 eccentricity check of those indications. */
  readonly eccentricity: CheckResult<EccentricityCheck>;
  /**
   * With an analog summing junction: its trims (solved through the network exactly), the
   * indicator's span factor and each cell's reading-to-ratio factor; the indications are then the
   * junction's (`factors` stays the digital solution, for comparison).
   */
  readonly summing?: AnalogSumming;
}

/** An analog summing junction's trims and scale (see {@link PlatformGroup.summing}). */
export interface AnalogSumming {
  /** The trims, the reference cell, each position's summed output (V/V of the supply), the checks. */
  readonly trims: SummingTrims;
  /** The indicator's span factor: indication unit per V/V of summed output (the test load over the fitted positions' mean output). */
  readonly spanFactor: number;
  /** Each cell's V/V per unit of its channel's reading (1000 for mV/V). */
  readonly ratioPerReading: readonly number[];
}

/** A group of a channel file, ready to use. */
export type LoadedGroup = MultiComponentGroup | PlatformGroup;

/** The position name of a test file's row that holds the unloaded platform's readings. */
export const ZERO_POSITION = 'zero';

/**
 * A bridge of a group: the named channel of the file, as made by the loader (or made here when
 * the loader selected other channels).
 *
 * @param loaded - The channel file.
 * @param name - The channel's name.
 * @returns The bridge.
 */
export function groupBridge(loaded: LoadedChannels, name: string): GroupBridge {
  const made = loaded.channels.find((c) => c.name === name);
  const channel =
    made?.channel ??
    createChannel({
      ...(loaded.file.channels.find((c) => c.name === name)?.spec as object),
      name,
    } as Parameters<typeof createChannel>[0]);
  return { name, channel, unit: channel.unit };
}

function fitIssue(path: string, file: string, e: unknown): SpecIssue {
  if (!isBridgeworkError(e)) throw e;
  return {
    code: e.code,
    path,
    message: `${file} does not determine the calibration: ${e.message}`,
    suggestion:
      e.code === 'singular'
        ? 'load every component on its own at several levels, and pairs together for interaction terms'
        : 'check the schedule against docs/multi-component.md',
  };
}

/** The parameter of a stored model's error, as the path of the field in the file. */
function storedPath(spec: MultiComponentGroupSpec, param: string | undefined): string {
  const at = `groups.${spec.name}.calibration`;
  if (param === undefined) return at;
  const row = /^coefficients\[(\d+)\](.*)$/.exec(param);
  if (row !== null) return `${at}.coefficients.${spec.bridges[Number(row[1])] ?? row[1]}${row[2] ?? ''}`;
  if (param === 'fullScale' || param.startsWith('fullScale['))
    return `groups.${spec.name}.components.${spec.components[Number(/\[(\d+)\]/.exec(param)?.[1] ?? 0)]?.name}.fullScale`;
  return `${at}.${param.replace(/^covariance\.unitCovariance/, 'covariance.terms').replace(/^covariance\.readingCovariance/, 'covariance.readings')}`;
}

/**
 * A stored calibration: the coefficients (and covariance) converted from `readingUnit` to each
 * bridge's unit, through the calibration package's `createMultiComponentModel`.
 */
function storedModel(
  spec: MultiComponentGroupSpec,
  stored: StoredCalibrationSpec,
  bridges: readonly GroupBridge[],
  issues: SpecIssue[],
): MultiComponentModel | undefined {
  const at = `groups.${spec.name}.calibration`;
  let factors = bridges.map(() => 1);
  if (stored.readingUnit !== undefined) {
    const unit = stored.readingUnit;
    try {
      factors = bridges.map((b) => parseQuantity(`1 ${unit}`, b.unit));
    } catch {
      issues.push({
        code: 'invalid-option',
        path: `${at}.readingUnit`,
        message: `'${unit}' is not a unit of every bridge's reading (${[...new Set(bridges.map((b) => b.unit))].join(', ')})`,
        suggestion:
          "give the unit the coefficients' readings are in, of the bridges' quantity (such as 'mV/V')",
      });
      return undefined;
    }
  }
  const scale = (row: readonly unknown[], f: number): unknown[] =>
    row.map((v) => (typeof v === 'number' ? v * f : v));
  const scaledMatrix = (value: unknown): unknown =>
    Array.isArray(value)
      ? value.map((row, i) =>
          Array.isArray(row)
            ? row.map((v, k) => (typeof v === 'number' ? v * (factors[i] ?? 1) * (factors[k] ?? 1) : v))
            : row,
        )
      : value;
  try {
    return createMultiComponentModel({
      components: spec.components.map((c) => c.name),
      bridges: spec.bridges,
      terms: stored.terms,
      coefficients: stored.coefficients.map((row, i) => scale(row, factors[i] as number)) as number[][],
      fullScale: spec.components.map((c) => c.fullScale as number),
      ...(stored.covariance === undefined
        ? {}
        : {
            covariance: {
              unitCovariance: stored.covariance.terms as number[][],
              readingCovariance: scaledMatrix(stored.covariance.readings) as number[][],
              ...(stored.covariance.degreesOfFreedom === undefined
                ? {}
                : { degreesOfFreedom: stored.covariance.degreesOfFreedom }),
            },
          }),
    });
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    issues.push({
      code: e.code,
      path: storedPath(spec, e.param),
      message: `the stored coefficients do not make a model: ${e.message}`,
    });
    return undefined;
  }
}

async function loadMultiComponent(
  loaded: LoadedChannels,
  base: string,
  spec: MultiComponentGroupSpec,
  issues: SpecIssue[],
): Promise<MultiComponentGroup | undefined> {
  const bridges = spec.bridges.map((b) => groupBridge(loaded, b));
  if (spec.calibration.form === 'stored') {
    const calibration = storedModel(spec, spec.calibration, bridges, issues);
    return calibration === undefined ? undefined : { kind: 'multi-component', spec, bridges, calibration };
  }
  const form = spec.calibration;
  const read = await readSchedule(base, spec, form.schedule, bridges, issues);
  if (read === undefined) return undefined;
  const { points } = read;
  const at = `groups.${spec.name}.calibration.schedule`;
  const file = form.schedule;
  const fullScale = spec.components.map((c) => c.fullScale);
  if (fullScale.some((f) => f !== undefined) && !fullScale.every((f) => f !== undefined)) {
    issues.push({
      code: 'missing-option',
      path: `groups.${spec.name}.components`,
      message: 'gives fullScale for some components but not all',
      suggestion: 'give every component a fullScale, or none (the schedule’s largest loads are then used)',
    });
    return undefined;
  }
  try {
    const calibration = fitGroup(spec, points, form);
    return { kind: 'multi-component', spec, bridges, calibration, fit: { points, calibration, spec: form } };
  } catch (e) {
    issues.push(fitIssue(at, file, e));
    return undefined;
  }
}

/**
 * Fits a multi-component group's calibration to a loading schedule read by {@link readSchedule}
 * (`fitMultiComponent` with the components' full scales when every one is given).
 *
 * @param spec - The group.
 * @param points - The schedule's points.
 * @param form - Interactions, offset and tolerance.
 * @returns The calibration.
 */
export function fitGroup(
  spec: MultiComponentGroupSpec,
  points: readonly LoadingPoint[],
  form: Pick<ScheduleCalibrationSpec, 'interactions' | 'offset' | 'independenceTolerance'>,
): MultiComponentCalibration {
  const fullScale = spec.components.map((c) => c.fullScale);
  return fitMultiComponent({
    components: spec.components.map((c) => c.name),
    bridges: spec.bridges,
    points,
    interactions: form.interactions,
    offset: form.offset,
    ...(fullScale.every((f) => f !== undefined) ? { fullScale: fullScale as number[] } : {}),
    ...(form.independenceTolerance === undefined
      ? {}
      : { independenceTolerance: form.independenceTolerance }),
  });
}

/**
 * Reads a group's loading schedule (CSV): a column per component and per bridge, in their units
 * (a heading's bracketed unit converted), `direction` and `run` optional.
 *
 * @param base - The directory the file is relative to.
 * @param spec - The group.
 * @param file - The schedule, as written in the file or given to the command.
 * @param bridges - The group's bridges.
 * @param issues - Where problems go (path `groups.<name>.calibration.schedule`).
 * @returns The points and the file's SHA-256, or undefined when there were problems.
 */
export async function readSchedule(
  base: string,
  spec: MultiComponentGroupSpec,
  file: string,
  bridges: readonly GroupBridge[],
  issues: SpecIssue[],
): Promise<{ readonly points: LoadingPoint[]; readonly sha256: string } | undefined> {
  const at = `groups.${spec.name}.calibration.schedule`;
  const read = await readGroupTable(resolve(base, file), file, [
    ...spec.components.map((c) => ({ name: c.name, unit: c.unit, required: true })),
    ...bridges.map((b) => ({ name: b.name, unit: b.unit, required: true })),
    { name: 'direction', required: false },
    { name: 'run', unit: '', required: false },
  ]);
  if (read.table === undefined) {
    issues.push(...read.issues.map((i) => ({ ...i, message: `${i.path}: ${i.message}`, path: at })));
    return undefined;
  }
  const t = read.table;
  const directions = t.texts.get('direction');
  const runs = t.numbers.get('run');
  const rowIssues: SpecIssue[] = [];
  const points: LoadingPoint[] = t.lines.map((line, r) => {
    const direction = directions?.[r];
    if (
      direction !== undefined &&
      direction !== '' &&
      direction !== 'ascending' &&
      direction !== 'descending'
    )
      rowIssues.push({
        code: 'invalid-option',
        path: at,
        message: `${file}:${line} (direction): '${direction}' must be ascending, descending or empty`,
      });
    const run = runs?.[r];
    if (run !== undefined && !(Number.isInteger(run) && run >= 0))
      rowIssues.push({
        code: 'not-integer',
        path: at,
        message: `${file}:${line} (run): must be a whole number ≥ 0`,
      });
    return {
      loads: spec.components.map((c) => t.numbers.get(c.name)?.[r] as number),
      readings: bridges.map((b) => t.numbers.get(b.name)?.[r] as number),
      ...(direction === 'ascending' || direction === 'descending' ? { direction } : {}),
      ...(run === undefined || !Number.isInteger(run) || run < 0 ? {} : { run }),
    };
  });
  if (rowIssues.length > 0) {
    issues.push(...rowIssues);
    return undefined;
  }
  return { points, sha256: t.sha256 };
}

async function loadPlatform(
  loaded: LoadedChannels,
  base: string,
  spec: PlatformGroupSpec,
  issues: SpecIssue[],
): Promise<PlatformGroup | undefined> {
  const bridges = spec.bridges.map((b) => groupBridge(loaded, b));
  const e = spec.eccentricity;
  const at = `groups.${spec.name}.eccentricity.test`;
  const read = await readGroupTable(resolve(base, e.test), e.test, [
    { name: 'position', required: true },
    ...bridges.map((b) => ({ name: b.name, unit: b.unit, required: true })),
  ]);
  if (read.table === undefined) {
    issues.push(...read.issues.map((i) => ({ ...i, message: `${i.path}: ${i.message}`, path: at })));
    return undefined;
  }
  const t = read.table;
  const names = t.texts.get('position') as readonly string[];
  const zeroRow = names.indexOf(ZERO_POSITION);
  const rowOf = (r: number): number[] =>
    bridges.map(
      (b) =>
        (t.numbers.get(b.name)?.[r] as number) -
        (zeroRow < 0 ? 0 : (t.numbers.get(b.name)?.[zeroRow] as number)),
    );
  const positions: string[] = [];
  const fitted: boolean[] = [];
  const fitRows: number[][] = [];
  const checkRows: number[][] = [];
  const local: SpecIssue[] = [];
  names.forEach((n, r) => {
    if (r === zeroRow) return;
    if (n === '' || names.indexOf(n) !== r) {
      local.push({
        code: 'invalid-option',
        path: at,
        message: `${e.test}:${t.lines[r]} (position): ${n === '' ? 'a position needs a name' : `'${n}' is given twice`}`,
      });
      return;
    }
    positions.push(n);
    const check = e.checkPositions.includes(n);
    fitted.push(!check);
    (check ? checkRows : fitRows).push(rowOf(r));
  });
  for (const c of e.checkPositions) {
    if (!names.includes(c))
      local.push({
        code: 'invalid-option',
        path: `groups.${spec.name}.eccentricity.checkPositions`,
        message: `'${c}' is not a position of ${e.test}`,
        expected: `one of ${names.filter((n) => n !== ZERO_POSITION).join(', ')}`,
      });
  }
  if (local.length > 0) {
    issues.push(...local);
    return undefined;
  }
  // An analog junction works on the cells' own output ratios: each cell's reading in V/V.
  let ratioPerReading: number[] | undefined;
  if (spec.summing !== undefined) {
    try {
      ratioPerReading = bridges.map((b) => parseQuantity(`1 ${b.unit}`, 'V/V'));
    } catch {
      issues.push({
        code: 'invalid-option',
        path: `groups.${spec.name}.summing`,
        message: `an analog summing junction needs each cell's own output ratio, but the cells read ${[...new Set(bridges.map((b) => b.unit))].join(', ')}`,
        suggestion: 'read the cells as their output ratio (output: { quantity: ratio, unit: mV/V })',
      });
      return undefined;
    }
  }
  try {
    const factors = fitCornerFactors({
      cellReadings: fitRows,
      testLoad: e.testLoad,
      checkReadings: checkRows,
    });
    let summing: AnalogSumming | undefined;
    let fi = 0;
    let ci = 0;
    let indications: number[];
    if (spec.summing !== undefined && ratioPerReading !== undefined) {
      const perCell = ratioPerReading;
      const toRatios = (rows: number[][]) => rows.map((row) => row.map((x, i) => x * (perCell[i] as number)));
      const trims = fitSummingTrims({
        cellOhms: spec.summing.cellOhms,
        trimPlacement: spec.summing.trimPlacement,
        summingOhms: spec.summing.summingOhms,
        meterOhms: spec.summing.meterOhms,
        cellRatios: toRatios(fitRows),
        checkRatios: toRatios(checkRows),
      });
      const mean = trims.positionRatios.reduce((a, x) => a + x, 0) / trims.positionRatios.length;
      const spanFactor = e.testLoad / mean;
      summing = { trims, spanFactor, ratioPerReading: perCell };
      indications = fitted.map((f) =>
        f
          ? spanFactor * (trims.positionRatios[fi++] as number)
          : spanFactor * (trims.checks[ci++]?.ratio as number),
      );
    } else {
      indications = fitted.map((f) =>
        f ? (factors.positions[fi++]?.indication as number) : (factors.checks[ci++]?.indication as number),
      );
    }
    const eccentricity = checkEccentricity({
      accuracyClass: e.accuracyClass,
      maxCapacity: e.maxCapacity,
      verificationInterval: e.verificationInterval,
      testLoad: e.testLoad,
      indications,
      supportPoints: e.supportPoints,
    });
    return {
      kind: 'platform',
      spec,
      bridges,
      positions,
      fitted,
      factors,
      indications,
      eccentricity,
      ...(summing === undefined ? {} : { summing }),
    };
  } catch (err) {
    if (!isBridgeworkError(err)) throw err;
    issues.push({
      code: err.code,
      path: at,
      message: `${e.test} does not determine the cell ${spec.summing === undefined ? 'factors' : 'trims'}: ${err.message}`,
      suggestion: 'put the test load over each cell (each corner or segment) in turn',
    });
    return undefined;
  }
}

/**
 * Validates the `groups` section of a loaded channel file, reads each group's schedule or test
 * file (relative to the channel file) and fits it: a multi-component calibration
 * (`fitMultiComponent` of the calibration package) or a platform's corner factors
 * (`fitCornerFactors`) with the OIML R 76 eccentricity check (`checkEccentricity`).
 *
 * @remarks
 * A group's readings are its bridges' values as their channels convert them, in each channel's
 * unit (V/V for a channel whose output quantity is `ratio`). Every problem — of the section, of a
 * schedule's rows, or one the fit finds (a component never loaded) — is reported at once, with
 * the field path and, for files, the line and column.
 *
 * @param loaded - The channel file (its `document` holds the raw `groups`).
 * @returns The groups in file order (empty when the file has none).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-spec` listing every problem; `io-error`
 *   for a file that cannot be read.
 */
export async function loadGroups(loaded: LoadedChannels): Promise<readonly LoadedGroup[]> {
  const raw = (loaded.document.data as Record<string, unknown>)['groups'];
  if (raw === undefined) return [];
  const { groups, issues: specIssues } = validateGroups(
    raw,
    loaded.file.channels.map((c) => c.name),
  );
  const issues: SpecIssue[] = [...specIssues];
  const out: LoadedGroup[] = [];
  if (issues.length === 0) {
    const base = dirname(loaded.document.file);
    for (const g of groups) {
      const made =
        g.kind === 'platform'
          ? await loadPlatform(loaded, base, g, issues)
          : await loadMultiComponent(loaded, base, g, issues);
      if (made !== undefined) out.push(made);
    }
  }
  if (issues.length > 0) {
    const file = loaded.document.file;
    const count = issues.length === 1 ? 'a problem' : `${issues.length} problems`;
    throw new BridgeworkError(
      'invalid-spec',
      `${file} has ${count}:\n${formatIssues(file, issues, loaded.document.locate).trimEnd()}`,
      { param: file, issues },
    );
  }
  return out;
}
