import { dirname, resolve } from 'node:path';
import {
  checkEccentricity,
  fitCornerFactors,
  fitMultiComponent,
  type CheckResult,
  type CornerFactors,
  type EccentricityCheck,
  type LoadingPoint,
  type MultiComponentCalibration,
} from '@bridgework/calibration';
import { createChannel, type Channel } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError, type SpecIssue } from '@bridgework/core';
import { formatIssues } from '../channelFile/formatIssues.js';
import type { LoadedChannels } from '../channels/loadChannels.js';
import { validateGroups, type MultiComponentGroupSpec, type PlatformGroupSpec } from './groupSpec.js';
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

/** A multi-component group with its fitted calibration. */
export interface MultiComponentGroup {
  /** The kind. */
  readonly kind: 'multi-component';
  /** The validated spec. */
  readonly spec: MultiComponentGroupSpec;
  /** The bridges, in the order of the readings. */
  readonly bridges: readonly GroupBridge[];
  /** The loading schedule as read (loads in each component's unit, readings in each bridge's unit). */
  readonly points: readonly LoadingPoint[];
  /** The calibration fitted to it. */
  readonly calibration: MultiComponentCalibration;
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
}

/** A group of a channel file, ready to use. */
export type LoadedGroup = MultiComponentGroup | PlatformGroup;

/** The position name of a test file's row that holds the unloaded platform's readings. */
export const ZERO_POSITION = 'zero';

function channelFor(loaded: LoadedChannels, name: string): GroupBridge {
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

async function loadMultiComponent(
  loaded: LoadedChannels,
  base: string,
  spec: MultiComponentGroupSpec,
  issues: SpecIssue[],
): Promise<MultiComponentGroup | undefined> {
  const bridges = spec.bridges.map((b) => channelFor(loaded, b));
  const at = `groups.${spec.name}.calibration.schedule`;
  const file = spec.calibration.schedule;
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
    const calibration = fitMultiComponent({
      components: spec.components.map((c) => c.name),
      bridges: spec.bridges,
      points,
      interactions: spec.calibration.interactions,
      offset: spec.calibration.offset,
      ...(fullScale.every((f) => f !== undefined) ? { fullScale: fullScale as number[] } : {}),
      ...(spec.calibration.independenceTolerance === undefined
        ? {}
        : { independenceTolerance: spec.calibration.independenceTolerance }),
    });
    return { kind: 'multi-component', spec, bridges, points, calibration };
  } catch (e) {
    issues.push(fitIssue(at, file, e));
    return undefined;
  }
}

async function loadPlatform(
  loaded: LoadedChannels,
  base: string,
  spec: PlatformGroupSpec,
  issues: SpecIssue[],
): Promise<PlatformGroup | undefined> {
  const bridges = spec.bridges.map((b) => channelFor(loaded, b));
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
  try {
    const factors = fitCornerFactors({
      cellReadings: fitRows,
      testLoad: e.testLoad,
      checkReadings: checkRows,
    });
    let fi = 0;
    let ci = 0;
    const indications = fitted.map((f) =>
      f ? (factors.positions[fi++]?.indication as number) : (factors.checks[ci++]?.indication as number),
    );
    const eccentricity = checkEccentricity({
      accuracyClass: e.accuracyClass,
      maxCapacity: e.maxCapacity,
      verificationInterval: e.verificationInterval,
      testLoad: e.testLoad,
      indications,
      supportPoints: e.supportPoints,
    });
    return { kind: 'platform', spec, bridges, positions, fitted, factors, indications, eccentricity };
  } catch (err) {
    if (!isBridgeworkError(err)) throw err;
    issues.push({
      code: err.code,
      path: at,
      message: `${e.test} does not determine the cell factors: ${err.message}`,
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
