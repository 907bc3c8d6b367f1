import { BridgeworkError, isBridgeworkError, type RosetteLayout } from '@bridgework/core';
import { resolve } from 'node:path';
import { SAFETY_CAUTION } from '../../caution.js';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { mohrHtml } from './mohrHtml.js';
import { exitCodes } from '../../exitCodes.js';
import type { CsvRecord } from '../../internal/csvRecords.js';
import { parseNumberText, quoteCsvField } from '../../internal/csvText.js';
import { refuseOutputOverInputs } from '../../internal/fileErrors.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatNumber } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import {
  csvCell as cell,
  findColumn,
  headerUnit,
  isBlankOrComment,
  optionError,
  refuseJsonWithoutOut,
  SkippedRows,
  specimenMaterial,
  streamCsvRecords,
  unitFactor,
} from '../recording/recordingTools.js';
import type { RosetteArgs } from './rosetteOptions.js';
import { createRowReducer, type ReducedRow } from './rosetteRows.js';

const DEG = Math.PI / 180;

/** The layout from `--layout` and `--angles`. */
export function rosetteLayout(
  layout: 'rectangular' | 'delta' | 'angles',
  angles: string | undefined,
): RosetteLayout {
  if (layout !== 'angles') {
    if (angles !== undefined)
      throw optionError('angles', `applies with --layout angles only (the ${layout} layout fixes them)`);
    return layout;
  }
  if (angles === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--angles is required with --layout angles: the directions of legs a, b and c in degrees, e.g. 0,30,90',
      {
        param: 'angles',
      },
    );
  }
  const list = splitOptionList(angles, '--angles').map((t) => {
    const x = parseNumberText(t);
    if (x === undefined || Math.abs(x) > 360)
      throw optionError('angles', `'${t}' must be an angle in degrees within ±360`, t);
    return x * DEG;
  });
  if (list.length !== 3)
    throw optionError('angles', `give three directions (legs a, b, c); got ${list.length}`, angles);
  return { anglesRadians: list as [number, number, number] };
}

/** Kt from `--transverse`: one value for all legs, or three. */
export function transverseOption(text: string | undefined): [number, number, number] | undefined {
  if (text === undefined) return undefined;
  const list = splitOptionList(text, '--transverse').map((t) => {
    const x = parseNumberText(t);
    if (x === undefined || !(x > -1 && x < 1)) {
      throw optionError(
        'transverse',
        `'${t}' must be a transverse sensitivity Kt as a fraction in (−1, 1), e.g. 0.02`,
        t,
      );
    }
    return x;
  });
  if (list.length === 1) return [list[0] as number, list[0] as number, list[0] as number];
  if (list.length !== 3)
    throw optionError('transverse', `give one Kt or three (Ka,Kb,Kc); got ${list.length}`, text);
  return list as [number, number, number];
}

/**
 * The body of `bridgework reduce-rosette`: streams a CSV recording of three rosette legs, row by
 * row, to principal strains, their direction and (with E and ν) the plane-stress state, passing the
 * other columns through; memory does not grow with the file.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when the layout's condition number exceeds
 *   `--max-condition` (the results are written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad option, an unreadable or malformed
 *   recording, a layout with (nearly) parallel legs.
 */
export async function run(args: RosetteArgs, context: CommandContext): Promise<number> {
  const o = args.options;
  const input = args.positionals.recording;
  if (o.legs === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--legs is required: the columns of legs a, b and c (names or numbers), e.g. --legs ra,rb,rc',
      {
        param: 'legs',
      },
    );
  }
  const legEntries = splitOptionList(o.legs, '--legs');
  if (legEntries.length !== 3)
    throw optionError('legs', `name three columns (legs a, b, c); got ${legEntries.length}`, o.legs);
  const layout = rosetteLayout(o.layout, o.angles);
  const kt = transverseOption(o.transverse);
  const material = await specimenMaterial(o);
  const stressUnit = o.stressUnit;
  const pascalsPerUnit = unitFactor('stress-unit', stressUnit, 'Pa');
  let reducer;
  try {
    reducer = createRowReducer({
      layout,
      transverseSensitivity: kt,
      poissonRatio0: o.calibrationPoisson,
      material,
    });
  } catch (e) {
    if (!isBridgeworkError(e) || e.code !== 'singular') throw e;
    throw new BridgeworkError(
      'invalid-option',
      `--angles ${o.angles}: the legs are (nearly) parallel, so no strain state follows from them: ${e.message}`,
      { param: 'angles', value: o.angles, cause: e },
    );
  }
  const kappa = reducer.rosette.conditionNumber;
  refuseJsonWithoutOut(o.json, o.out);
  if (o.out !== undefined && o.out !== '-') await refuseOutputOverInputs(o.out, [input]);

  if (o.mohrRow !== undefined && o.html === undefined) {
    throw new BridgeworkError('missing-option', '--mohr-row needs --html (the page it draws)', {
      param: 'html',
    });
  }
  if (o.html !== undefined) {
    await refuseOutputOverInputs(o.html, [input]);
    if (o.out !== undefined && o.out !== '-' && resolve(o.html) === resolve(o.out)) {
      throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
        param: 'html',
        value: o.html,
      });
    }
  }
  // The row --html draws: the one asked for, or the one with the largest von Mises stress (shear
  // strain without stresses), kept as the stream passes it.
  let drawn: { row: number; line: number; reduced: ReducedRow; score: number } | undefined;
  const html: AtomicFile | undefined =
    o.html === undefined ? undefined : await openAtomicFile(o.html, { force: o.force });
  const output = await openResultOutput(context, o.out, o.force);
  const skipped = new SkippedRows();
  let header: string[] | undefined;
  let legs: number[] = [];
  let keep: number[] = [];
  let strainUnit = '';
  let perStrain = 1;
  let rows = 0;
  let bad = 0;
  const writeRows = async (records: readonly CsvRecord[]) => {
    const lines: string[] = [];
    for (const record of records) {
      const f = record.fields;
      if (isBlankOrComment(f)) continue;
      if (header === undefined) {
        header = f.map((x) => x.trim());
        legs = legEntries.map((e) => findColumn('legs', e, header as string[], input));
        if (new Set(legs).size !== 3) throw optionError('legs', 'name three different columns', o.legs);
        keep =
          o.keepColumns === undefined
            ? header.map((_, i) => i).filter((i) => !legs.includes(i))
            : o.keepColumns.trim() === ''
              ? []
              : splitOptionList(o.keepColumns, '--keep-columns').map((e) =>
                  findColumn('keep-columns', e, header as string[], input),
                );
        const fromHeader = headerUnit(header[legs[0] as number] as string);
        strainUnit = o.strainUnit ?? fromHeader ?? 'µε';
        perStrain = unitFactor(
          o.strainUnit === undefined && fromHeader !== undefined ? 'legs' : 'strain-unit',
          strainUnit,
          'm/m',
        );
        const names = [
          ...keep.map((i) => header?.[i] as string),
          ...(o.keepLegs ? ['a', 'b', 'c'].map((l) => `leg_${l}_reduced (${strainUnit})`) : []),
          `strain_1 (${strainUnit})`,
          `strain_2 (${strainUnit})`,
          `max_shear_strain (${strainUnit})`,
          'angle_from_a (°)',
          ...(material === undefined
            ? []
            : ['stress_1', 'stress_2', 'max_shear_stress', 'von_mises', 'tresca'].map(
                (n) => `${n} (${stressUnit})`,
              )),
        ];
        lines.push(names.map(quoteCsvField).join(','));
        continue;
      }
      rows++;
      const passed = keep.map((i) => quoteCsvField(f[i] ?? ''));
      const values: number[] = [];
      let row: ReducedRow | undefined;
      const raw = legs.map((i) => parseNumberText((f[i] ?? '').trim()));
      if (raw.some((x) => x === undefined)) {
        skipped.add('a leg is empty or not a number', record.line);
      } else {
        try {
          row = reducer.reduce(raw.map((x) => (x as number) * perStrain) as [number, number, number]);
        } catch (e) {
          if (!isBridgeworkError(e)) throw e;
          skipped.add(
            e.code === 'out-of-range' && /inconsistent/.test(e.message)
              ? 'legs inconsistent with any strain state'
              : `legs not reducible (${e.code})`,
            record.line,
          );
        }
      }
      if (row === undefined) {
        bad++;
        const n = (o.keepLegs ? 3 : 0) + 4 + (material === undefined ? 0 : 5);
        for (let k = 0; k < n; k++) values.push(Number.NaN);
      } else {
        if (html !== undefined) {
          const score = row.stresses?.vonMises ?? row.maxShearStrain;
          if (o.mohrRow === undefined ? drawn === undefined || score > drawn.score : rows === o.mohrRow) {
            drawn = { row: rows, line: record.line, reduced: row, score };
          }
        }
        if (o.keepLegs) values.push(...row.legs.map((x) => x / perStrain));
        values.push(
          row.strain1 / perStrain,
          row.strain2 / perStrain,
          row.maxShearStrain / perStrain,
          row.angleRadians / DEG,
        );
        if (row.stresses !== undefined) {
          const s = row.stresses;
          values.push(s.stress1, s.stress2, s.maxShear, s.vonMises, s.tresca);
          for (let k = values.length - 5; k < values.length; k++)
            values[k] = (values[k] as number) / pascalsPerUnit;
        }
      }
      lines.push([...passed, ...values.map(cell)].join(','));
    }
    if (lines.length > 0) await output.write(`${lines.join('\n')}\n`);
  };
  try {
    await streamCsvRecords(input, writeRows);
    if (header === undefined)
      throw new BridgeworkError('parse-error', `${input}: no header row`, { param: input });
    if (html !== undefined) {
      if (drawn === undefined) {
        throw new BridgeworkError(
          'invalid-option',
          o.mohrRow === undefined
            ? `--html: no row of ${input} could be reduced, so there is no circle to draw`
            : `--mohr-row ${o.mohrRow}: ${input} has ${rows} data rows${o.mohrRow <= rows ? ` and row ${o.mohrRow} could not be reduced` : ''}`,
          { param: o.mohrRow === undefined ? 'html' : 'mohr-row', value: o.mohrRow },
        );
      }
      await html.write(
        mohrHtml({
          recording: input,
          row: drawn.row,
          line: drawn.line,
          why:
            o.mohrRow !== undefined
              ? 'the row asked for (--mohr-row)'
              : material === undefined
                ? 'the largest shear strain of the recording'
                : 'the largest von Mises stress of the recording',
          anglesRadians: reducer.rosette.anglesRadians,
          reduced: drawn.reduced,
          strainUnit,
          perStrain,
          stressUnit,
          pascalsPerUnit,
          generator: `bridgework ${await readVersion()}`,
        }),
      );
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${o.html} (row ${drawn.row})\n`);
    }
    await output.commit('the rosette reduction');
  } finally {
    await html?.abort();
    await output.abort();
  }
  const illConditioned = kappa > o.maxCondition;
  const anglesDegrees = reducer.rosette.anglesRadians.map((a) => a / DEG);
  const conditionMessage = illConditioned
    ? `the layout's condition number ${formatNumber(kappa, 3)} exceeds --max-condition ${o.maxCondition}: the legs' errors are amplified up to that many times in the strains; spread the legs further apart (rectangular 3.87, delta 3.16)`
    : `the layout's condition number ${formatNumber(kappa, 3)} is within --max-condition ${o.maxCondition}`;
  if (o.json) {
    context.io.stdout.write(
      reportJson(
        {
          recording: input,
          output: o.out,
          rows,
          reducedRows: rows - bad,
          layout: { name: o.layout, anglesDegrees, conditionNumber: kappa },
          transverse:
            kt === undefined
              ? null
              : { transverseSensitivity: kt, calibrationPoissonRatio: o.calibrationPoisson },
          material: material ?? null,
          units: { strain: strainUnit, stress: material === undefined ? null : stressUnit },
          html:
            o.html === undefined || drawn === undefined
              ? null
              : { file: o.html, row: drawn.row, line: drawn.line },
          skipped: skipped.toJson(),
          checks: [
            {
              id: 'condition-number',
              status: illConditioned ? 'fail' : 'pass',
              value: kappa,
              limit: o.maxCondition,
              message: conditionMessage,
            },
          ],
          ok: !illConditioned,
        },
        { generator: `bridgework ${await readVersion()}` },
      ),
    );
    return illConditioned ? exitCodes.failedCheck : exitCodes.ok;
  }
  const angles = anglesDegrees.map((a) => formatNumber(a, 4)).join('°, ');
  const summary = [
    `reduced ${rows - bad} of ${rows} rows of ${input}: rosette legs at ${angles}° (${o.layout}), condition number ${formatNumber(kappa, 3)}`,
    kt === undefined
      ? 'transverse sensitivity: not corrected (give --transverse)'
      : `transverse sensitivity corrected: Kt ${kt.join(', ')} (ν0 ${o.calibrationPoisson}; compensation correctRosetteTransverse)`,
    material === undefined
      ? 'stresses: not written (give --modulus and --poisson, or --channel-file)'
      : `stresses: plane stress, E ${formatNumber(material.modulusPascals / 1e9, 6)} GPa, ν ${material.poissonRatio} (from ${material.from}); von Mises and Tresca with σ3 = 0`,
    ...skipped.lines(),
    ...(illConditioned ? [`check failed: ${conditionMessage}`] : []),
    '',
    ...wrapText(SAFETY_CAUTION, 100),
  ];
  context.io.stderr.write(`${summary.join('\n')}\n`);
  return illConditioned ? exitCodes.failedCheck : exitCodes.ok;
}
