import { dirname, relative, resolve, sep } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import type { MultiComponentCalibration } from '@bridgework/calibration';
import { BridgeworkError, isBridgeworkError, type SpecIssue } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { openChannelFileEditor } from '../../channelFile/editChannelFile.js';
import { formatIssues } from '../../channelFile/formatIssues.js';
import { loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { formatGroupText } from '../../groups/formatGroups.js';
import { groupReport } from '../../groups/groupReport.js';
import {
  validateGroups,
  type MultiComponentGroupSpec,
  type ScheduleCalibrationSpec,
} from '../../groups/groupSpec.js';
import {
  fitGroup,
  groupBridge,
  loadGroups,
  readSchedule,
  type MultiComponentGroup,
} from '../../groups/loadGroups.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import type { FitGroupArgs } from './fitGroupOptions.js';

/** The group the command fits: `--group`, or the file's only multi-component group. */
function chooseGroup(
  groups: readonly MultiComponentGroupSpec[],
  name: string | undefined,
  file: string,
): MultiComponentGroupSpec {
  const names = groups.map((g) => g.name);
  if (name !== undefined) {
    const g = groups.find((x) => x.name === name);
    if (g === undefined) {
      throw new BridgeworkError(
        'invalid-option',
        `\`--group\` '${name}' is not a multi-component group of ${file}${names.length === 0 ? ' (it has none)' : `; its multi-component groups are ${names.join(', ')}`}`,
        { param: '--group', value: name },
      );
    }
    return g;
  }
  if (groups.length !== 1) {
    throw new BridgeworkError(
      'missing-option',
      groups.length === 0
        ? `${file} has no multi-component group: add one under \`groups\` (docs/multi-component.md)`
        : `${file} has ${groups.length} multi-component groups (${names.join(', ')}): choose one with --group`,
      { param: '--group' },
    );
  }
  return groups[0] as MultiComponentGroupSpec;
}

/** The section `fit-group --write` sets: the stored form of the group's calibration. */
export function storedCalibrationSection(
  group: MultiComponentGroup,
  fit: MultiComponentCalibration,
  source: { schedule: string; sha256: string; points: number; interactions: string; date: string },
): Record<string, unknown> {
  const units = [...new Set(group.bridges.map((b) => b.unit))];
  return {
    ...(units.length === 1 ? { readingUnit: units[0] } : {}),
    terms: fit.terms.map((t) => t.name),
    coefficients: Object.fromEntries(
      group.spec.bridges.map((b, i) => [b, [...(fit.coefficients[i] as number[])]]),
    ),
    covariance: {
      terms: fit.unitCovariance.map((row) => [...row]),
      readings: fit.readingCovariance.map((row) => [...row]),
      degreesOfFreedom: fit.degreesOfFreedom,
    },
    source: {
      schedule: source.schedule,
      scheduleSha256: source.sha256,
      points: source.points,
      interactions: source.interactions,
      date: source.date,
    },
  };
}

function refuse(
  file: string,
  issues: readonly SpecIssue[],
  locate?: Parameters<typeof formatIssues>[2],
): never {
  const count = issues.length === 1 ? 'a problem' : `${issues.length} problems`;
  throw new BridgeworkError(
    'invalid-spec',
    `${file} has ${count}:\n${formatIssues(file, issues, locate).trimEnd()}`,
    {
      param: file,
      issues,
    },
  );
}

/**
 * The body of `bridgework fit-group`: fits one multi-component group of a channel file to a
 * loading schedule (`fitMultiComponent` of the calibration package), reports it as `report`
 * does, and with `--write` stores the coefficients, their covariance and the schedule's
 * provenance in the group's `calibration` section.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file or schedule, a schedule that
 *   cannot determine the calibration, a file changed since it was read.
 */
export async function run(args: FitGroupArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const path = args.positionals.channelFile;
  const scheduleFile = args.positionals.scheduleFile;
  const loaded = await loadChannels(path);
  const raw = (loaded.document.data as Record<string, unknown>)['groups'];
  const validated = validateGroups(
    raw,
    loaded.file.channels.map((c) => c.name),
  );
  if (validated.issues.length > 0) refuse(path, validated.issues, loaded.document.locate);
  const spec = chooseGroup(
    validated.groups.filter((g): g is MultiComponentGroupSpec => g.kind === 'multi-component'),
    options.group,
    path,
  );
  const bridges = spec.bridges.map((b) => groupBridge(loaded, b));
  const issues: SpecIssue[] = [];
  const read = await readSchedule(process.cwd(), spec, scheduleFile, bridges, issues);
  if (read === undefined) refuse(scheduleFile, issues);
  const scheduleForm = spec.calibration.form === 'schedule' ? spec.calibration : undefined;
  const interactions =
    options.interactions ??
    scheduleForm?.interactions ??
    (spec.calibration.form === 'stored' ? spec.calibration.source?.interactions : undefined) ??
    'none';
  const fromChannelFile = relative(dirname(resolve(path)), resolve(scheduleFile))
    .split(sep)
    .join('/');
  const form: ScheduleCalibrationSpec = {
    form: 'schedule',
    schedule: fromChannelFile,
    interactions,
    offset: scheduleForm?.offset ?? true,
    ...(scheduleForm?.independenceTolerance === undefined
      ? {}
      : { independenceTolerance: scheduleForm.independenceTolerance }),
  };
  let fit: MultiComponentCalibration;
  try {
    fit = fitGroup(spec, read.points, form);
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    throw new BridgeworkError(
      e.code,
      `${scheduleFile} does not determine the calibration of group '${spec.name}': ${e.message}${e.code === 'singular' ? '; load every component on its own at several levels, and pairs together for interaction terms' : ''}`,
      { param: scheduleFile },
    );
  }
  const group: MultiComponentGroup = {
    kind: 'multi-component',
    spec: { ...spec, calibration: form },
    bridges,
    calibration: fit,
    fit: { points: read.points, calibration: fit, spec: form },
  };
  const report = groupReport(group);
  const date = options.date ?? runDate(context.io.env);
  const output = await openResultOutput(context, options.out, options.force);
  let written = false;
  try {
    if (options.write) {
      const editor = await openChannelFileEditor(path);
      if (!isDeepStrictEqual(editor.original, loaded.document.data)) {
        throw new BridgeworkError(
          'io-error',
          `${path} changed since it was read; nothing was written: run the command again`,
          {
            param: path,
          },
        );
      }
      editor.set(
        ['groups', spec.name, 'calibration'],
        storedCalibrationSection(group, fit, {
          schedule: fromChannelFile,
          sha256: read.sha256,
          points: read.points.length,
          interactions,
          date,
        }),
        {
          comment: `multi-component calibration fitted to ${fromChannelFile} (bridgework fit-group, ${date})`,
        },
      );
      // A stored model needs every full scale: the fit's (the schedule's largest loads when the
      // file gives none) go beside the components.
      spec.components.forEach((c, j) => {
        if (c.fullScale === undefined)
          editor.set(['groups', spec.name, 'components', c.name, 'fullScale'], fit.fullScale[j] as number);
      });
      // The edited file must read back as this fit: the same coefficients, bit for bit.
      const reread = await loadGroups({
        ...loaded,
        document: { ...loaded.document, data: editor.data() },
      });
      const back = reread.find((g) => g.spec.name === spec.name);
      if (
        back?.kind !== 'multi-component' ||
        !isDeepStrictEqual(back.calibration.loadMatrix, fit.loadMatrix)
      ) {
        // An invariant of the writer (numbers are written at full precision): never expected.
        throw new Error(
          `the written calibration of '${spec.name}' does not read back as the fit; nothing was written`,
        );
      }
      await editor.save();
      written = true;
    }
    if (options.json) {
      await output.write(
        reportJson(
          {
            file: path,
            group: spec.name,
            schedule: scheduleFile,
            scheduleSha256: read.sha256,
            ...report.payload,
            written,
            date,
          },
          { generator: `bridgework ${await readVersion()}` },
        ),
      );
    } else {
      const note = written
        ? `wrote the coefficients of '${spec.name}' (${fit.terms.length} terms, ${bridges.length} bridges) into ${path}; report, convert and constants now use them`
        : 'not written (give --write to store the coefficients in the channel file)';
      await output.write(
        `${formatGroupText(report, output.style)}\n\n${note}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`,
      );
    }
    await output.commit('the group fit');
  } finally {
    await output.abort();
  }
  return exitCodes.ok;
}
