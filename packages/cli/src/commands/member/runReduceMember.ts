import { resolve } from 'node:path';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import {
  createMemberReduction,
  type MemberReduction,
  type MemberReductionResult,
  type MemberResultant,
} from '@bridgework/mechanics';
import { SAFETY_CAUTION } from '../../caution.js';
import { exitCodes } from '../../exitCodes.js';
import { parseNumberText, quoteCsvField } from '../../internal/csvText.js';
import { refuseOutputOverInputs } from '../../internal/fileErrors.js';
import { readVersion } from '../../internal/readVersion.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatNumber } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import type { CommandContext } from '../CommandContext.js';
import {
  csvCell,
  findColumn,
  headerUnit,
  isBlankOrComment,
  optionError,
  quantityOption,
  refuseJsonWithoutOut,
  SkippedRows,
  specimenMaterial,
  streamCsvRecords,
  unitFactor,
} from '../recording/recordingTools.js';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { openResultOutput } from '../resultOutput.js';
import { memberHtml, RowEnvelope } from './memberHtml.js';
import { gaugeEntries, resultantsOption, sectionChoice, type GaugeEntry } from './memberGauges.js';
import type { MemberArgs } from './memberOptions.js';

const DEG = Math.PI / 180;

/** The output column of each resultant, and which unit option applies. */
const columns: Record<
  MemberResultant,
  { name: string; unit: 'force' | 'moment'; key: keyof MemberReductionResult }
> = {
  axial: { name: 'axial_force', unit: 'force', key: 'axialForceNewtons' },
  'bending-y': { name: 'bending_moment_y', unit: 'moment', key: 'bendingMomentYNewtonMeters' },
  'bending-z': { name: 'bending_moment_z', unit: 'moment', key: 'bendingMomentZNewtonMeters' },
  torsion: { name: 'torque', unit: 'moment', key: 'torqueNewtonMeters' },
};

/** The library's option names in a message, as the command's options. */
function inCommandTerms(message: string, entries: readonly GaugeEntry[]): string {
  return message
    .replace(/`gauges\[(\d+)\]`/g, (_, i: string) => `--gauges '${entries[Number(i)]?.text ?? i}'`)
    .replace(/`gauges`/g, '--gauges')
    .replace(/`resultants`/g, '--resultants')
    .replace(/`torsionModulusCubicMeters`/g, '--torsion-modulus');
}

/** The reduction, its errors put in the command's terms. */
function reductionOf(
  args: MemberArgs,
  entries: readonly GaugeEntry[],
  material: { modulusPascals: number; poissonRatio: number },
): MemberReduction {
  const o = args.options;
  const choice = sectionChoice(o);
  const resultants = resultantsOption(o.resultants);
  try {
    return createMemberReduction({
      modulusPascals: material.modulusPascals,
      poissonRatio: material.poissonRatio,
      section: choice.section,
      ...(o.torsionModulus === undefined
        ? {}
        : { torsionModulusCubicMeters: quantityOption('torsion-modulus', o.torsionModulus, 'm³') }),
      gauges: entries.map((e) => e.gauge),
      ...(resultants === undefined ? {} : { resultants }),
    });
  } catch (e) {
    if (!isBridgeworkError(e) || e.param === undefined) throw e;
    const param = /^gauges/.test(e.param)
      ? 'gauges'
      : e.param === 'resultants'
        ? 'resultants'
        : e.param === 'torsionModulusCubicMeters'
          ? 'torsion-modulus'
          : undefined;
    if (param === undefined) throw e;
    throw new BridgeworkError(e.code, inCommandTerms(e.message, entries), { param, cause: e });
  }
}

/**
 * The body of `bridgework reduce-member`: streams a CSV recording of a member's gauges, row by
 * row, to the section resultants (mechanics `createMemberReduction`), passing the other columns
 * through; memory does not grow with the file.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when the layout's condition number exceeds
 *   `--max-condition` or a row's residual exceeds `--max-residual` (the results are written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad option, an unreadable or malformed
 *   recording, gauges that cannot separate the resultants.
 */
export async function run(args: MemberArgs, context: CommandContext): Promise<number> {
  const o = args.options;
  const input = args.positionals.recording;
  if (o.gauges === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--gauges is required: each gauge column and where it sits, e.g. --gauges n@+z,s@-z,e@+y,w@-y',
      { param: 'gauges' },
    );
  }
  const choice = sectionChoice(o);
  const entries = gaugeEntries(o.gauges, choice);
  const material = await specimenMaterial(o);
  if (material === undefined) {
    throw new BridgeworkError(
      'missing-option',
      "--modulus and --poisson (or --channel-file) are required: the member's E and ν turn strains into loads",
      { param: 'modulus' },
    );
  }
  const reduction = reductionOf(args, entries, material);
  const forceUnit = o.forceUnit;
  const momentUnit = o.momentUnit;
  const perUnit = {
    force: unitFactor('force-unit', forceUnit, 'N'),
    moment: unitFactor('moment-unit', momentUnit, 'N·m'),
  };
  const maxResidual =
    o.maxResidual === undefined ? undefined : quantityOption('max-residual', o.maxResidual, 'm/m');
  if (maxResidual !== undefined && reduction.redundancy === 0) {
    throw optionError(
      'max-residual',
      `needs more gauges than resultants: ${entries.length} gauges for ${reduction.resultants.length} resultants leave no residual`,
      o.maxResidual,
    );
  }
  refuseJsonWithoutOut(o.json, o.out);
  if (o.out !== undefined && o.out !== '-') await refuseOutputOverInputs(o.out, [input]);
  if (o.html !== undefined) {
    await refuseOutputOverInputs(o.html, [input]);
    if (o.out !== undefined && o.out !== '-' && resolve(o.html) === resolve(o.out)) {
      throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
        param: 'html',
        value: o.html,
      });
    }
  }
  const envelope = o.html === undefined ? undefined : new RowEnvelope(reduction.resultants.length);
  const html: AtomicFile | undefined =
    o.html === undefined ? undefined : await openAtomicFile(o.html, { force: o.force });
  const output = await openResultOutput(context, o.out, o.force);
  const skipped = new SkippedRows();
  const withResidual = reduction.redundancy > 0;
  let header: string[] | undefined;
  let gaugeColumns: number[] = [];
  let keep: number[] = [];
  let strainUnit = '';
  let perStrain = 1;
  let rows = 0;
  let worst: { strain: number; gauge: number; line: number; row: number } | undefined;
  let over = 0;
  let firstOver: number | undefined;
  const resultCount = reduction.resultants.length + (withResidual ? 1 : 0);
  const onRecords = async (records: readonly { fields: string[]; line: number }[]) => {
    const lines: string[] = [];
    for (const record of records) {
      const f = record.fields;
      if (isBlankOrComment(f)) continue;
      if (header === undefined) {
        header = f.map((x) => x.trim());
        const h = header;
        gaugeColumns = entries.map((e) => findColumn('gauges', e.column, h, input));
        if (new Set(gaugeColumns).size !== gaugeColumns.length) {
          throw optionError('gauges', 'names a column twice: each gauge has its own column', o.gauges);
        }
        keep =
          o.keepColumns === undefined
            ? h.map((_, i) => i).filter((i) => !gaugeColumns.includes(i))
            : o.keepColumns.trim() === ''
              ? []
              : splitOptionList(o.keepColumns, '--keep-columns').map((e) =>
                  findColumn('keep-columns', e, h, input),
                );
        const fromHeader = headerUnit(h[gaugeColumns[0] as number] as string);
        strainUnit = o.strainUnit ?? fromHeader ?? 'µε';
        perStrain = unitFactor(
          o.strainUnit === undefined && fromHeader !== undefined ? 'gauges' : 'strain-unit',
          strainUnit,
          'm/m',
        );
        const names = [
          ...keep.map((i) => h[i] as string),
          ...reduction.resultants.map(
            (r) => `${columns[r].name} (${columns[r].unit === 'force' ? forceUnit : momentUnit})`,
          ),
          ...(withResidual ? [`max_residual (${strainUnit})`] : []),
        ];
        lines.push(names.map(quoteCsvField).join(','));
        continue;
      }
      rows++;
      const passed = keep.map((i) => quoteCsvField(f[i] ?? ''));
      const raw = gaugeColumns.map((i) => parseNumberText((f[i] ?? '').trim()));
      let values: number[] | undefined;
      if (raw.some((x) => x === undefined)) {
        skipped.add('a gauge is empty or not a number', record.line);
      } else {
        try {
          const r = reduction.reduce(raw.map((x) => (x as number) * perStrain));
          values = reduction.resultants.map(
            (name) => (r[columns[name].key] as number) / perUnit[columns[name].unit],
          );
          envelope?.add(rows, values);
          if (withResidual) {
            values.push(r.maxResidualStrain / perStrain);
            if (worst === undefined || r.maxResidualStrain > worst.strain) {
              const gauge = r.residualStrains.findIndex((x) => Math.abs(x) === r.maxResidualStrain);
              worst = { strain: r.maxResidualStrain, gauge, line: record.line, row: rows };
            }
            if (maxResidual !== undefined && r.maxResidualStrain > maxResidual) {
              over++;
              firstOver ??= record.line;
            }
          }
        } catch (e) {
          if (!isBridgeworkError(e)) throw e;
          skipped.add(
            e.code === 'out-of-range'
              ? 'a gauge strain of 1 m/m or more (check --strain-unit)'
              : `gauges not reducible (${e.code})`,
            record.line,
          );
        }
      }
      const cells = values ?? new Array<number>(resultCount).fill(Number.NaN);
      lines.push([...passed, ...cells.map(csvCell)].join(','));
    }
    if (lines.length > 0) await output.write(`${lines.join('\n')}\n`);
  };
  try {
    await streamCsvRecords(input, onRecords);
    if (header === undefined)
      throw new BridgeworkError('parse-error', `${input}: no header row`, { param: input });
    if (html !== undefined && envelope !== undefined) {
      if (envelope.buckets === 0) {
        throw new BridgeworkError(
          'invalid-option',
          `--html: no row of ${input} could be reduced, so there is nothing to draw`,
          {
            param: 'html',
          },
        );
      }
      await html.write(
        memberHtml({
          recording: input,
          sectionText: choice.text,
          gauges: entries.map((e) => ({
            column: e.column,
            y: e.gauge.yMeters,
            z: e.gauge.zMeters,
            angleDegrees: e.gauge.angleRadians / DEG,
          })),
          series: reduction.resultants.map((name) => ({
            name: columns[name].name.replace(/_/g, ' '),
            unit: columns[name].unit === 'force' ? forceUnit : momentUnit,
            plot: columns[name].unit,
          })),
          envelope,
          rows,
          conditionNumber: reduction.conditionNumber,
          generator: `bridgework ${await readVersion()}`,
        }),
      );
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${o.html}\n`);
    }
    await output.commit('the member reduction');
  } finally {
    await html?.abort();
    await output.abort();
  }

  const kappa = reduction.conditionNumber;
  const illConditioned = kappa > o.maxCondition;
  const residualFailed = over > 0;
  const gaugeName = (i: number) => entries[i]?.column ?? String(i + 1);
  const checks = [
    {
      id: 'condition-number',
      status: illConditioned ? 'fail' : 'pass',
      value: kappa,
      limit: o.maxCondition,
      message: illConditioned
        ? `the layout's condition number ${formatNumber(kappa, 3)} exceeds --max-condition ${o.maxCondition}: the gauges' errors are amplified up to that many times in the loads; place gauges on opposite faces and 90° apart`
        : `the layout's condition number ${formatNumber(kappa, 3)} is within --max-condition ${o.maxCondition}`,
    },
    ...(maxResidual === undefined
      ? []
      : [
          {
            id: 'residual',
            status: residualFailed ? 'fail' : 'pass',
            value: (worst?.strain ?? 0) / perStrain,
            limit: maxResidual / perStrain,
            message: residualFailed
              ? `${over} row${over === 1 ? '' : 's'} with a residual above --max-residual ${o.maxResidual} (first at line ${firstOver}); the largest, ${formatNumber((worst?.strain ?? 0) / perStrain, 4)} ${strainUnit}, at gauge '${gaugeName(worst?.gauge ?? 0)}' (line ${worst?.line}): check that gauge, its place and its zero`
              : `every residual within --max-residual ${o.maxResidual}`,
          },
        ]),
  ];
  const ok = !illConditioned && !residualFailed;
  if (o.json) {
    context.io.stdout.write(
      reportJson(
        {
          recording: input,
          output: o.out,
          rows,
          reducedRows: rows - skipped.total,
          section: { ...sectionChoice(o).section, description: sectionChoice(o).text },
          gauges: entries.map((e) => ({
            column: e.column,
            yMeters: e.gauge.yMeters,
            zMeters: e.gauge.zMeters,
            angleDegrees: e.gauge.angleRadians / DEG,
          })),
          material,
          resultants: reduction.resultants,
          units: { strain: strainUnit, force: forceUnit, moment: momentUnit },
          conditionNumber: kappa,
          redundancy: reduction.redundancy,
          largestResidual:
            worst === undefined
              ? null
              : {
                  value: worst.strain / perStrain,
                  gauge: gaugeName(worst.gauge),
                  row: worst.row,
                  line: worst.line,
                },
          skipped: skipped.toJson(),
          checks,
          ok,
        },
        { generator: `bridgework ${await readVersion()}` },
      ),
    );
  } else {
    const summary = [
      `reduced ${rows - skipped.total} of ${rows} rows of ${input}: ${entries.length} gauges on a ${choice.text}, solving ${reduction.resultants.join(', ')}; condition number ${formatNumber(kappa, 3)}`,
      `material: E ${formatNumber(material.modulusPascals / 1e9, 6)} GPa, ν ${material.poissonRatio} (from ${material.from}); loads in ${forceUnit} and ${momentUnit}`,
      ...(worst === undefined
        ? withResidual
          ? []
          : [`residuals: none (${entries.length} gauges for ${reduction.resultants.length} resultants)`]
        : [
            `largest residual ${formatNumber(worst.strain / perStrain, 4)} ${strainUnit} at gauge '${gaugeName(worst.gauge)}' (line ${worst.line})`,
          ]),
      ...skipped.lines(),
      ...checks.filter((c) => c.status === 'fail').map((c) => `check failed: ${c.message}`),
      '',
      ...wrapText(SAFETY_CAUTION, 100),
    ];
    context.io.stderr.write(`${summary.join('\n')}\n`);
  }
  return ok ? exitCodes.ok : exitCodes.failedCheck;
}
