import { basename } from 'node:path';
import { BridgeworkError } from '@bridgework/core';
import { loadChannels } from '../../channels/loadChannels.js';
import { withGroups } from '../../groups/groupConstants.js';
import { loadGroups } from '../../groups/loadGroups.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { constantsSql } from '../../report/constantsSql.js';
import { constantsFiles, parsePerChannel, parseTypeList } from '../../report/constantsText.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import type { ConstantsArgs } from './constantsOptions.js';

/**
 * The body of `bridgework constants`: the firmware constants of the selected channels as one C
 * header or JSON ({@link constantsFiles}), to a file (atomically) or standard output, with the C
 * test program on request; a summary line per function on standard error.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file or option, a target no form
 * meets (nothing is written then), or an existing output without `--force`.
 */
export async function run(args: ConstantsArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const types = options.types === undefined ? undefined : parseTypeList(options.types);
  if (options.format === 'sql' && types !== undefined) {
    throw new BridgeworkError(
      'invalid-option',
      "--types chooses firmware evaluators; --format sql writes each channel's map as SQL and takes none",
      { param: '--types', value: options.types },
    );
  }
  if (options.format === 'sql' && options.outputStep !== undefined) {
    throw new BridgeworkError(
      'conflicting-options',
      "--output-step sets the fixed-point function's output step; --format sql writes binary64 SQL and takes none (--target-error sets a nonlinear channel's bound)",
      { param: '--output-step', value: options.outputStep },
    );
  }
  if (options.format === 'sql' && options.hardwareDivide) {
    throw new BridgeworkError(
      'conflicting-options',
      "--hardware-divide makes the Moebius form a firmware candidate; --format sql writes a linear-fractional channel's exact map as it is and a nonlinear channel's polynomial, and takes none",
      { param: '--hardware-divide' },
    );
  }
  if (options.testProgram !== undefined && options.format !== 'c') {
    throw new BridgeworkError(
      'conflicting-options',
      '`--test-program` checks a C header: it needs `--format c`',
      {
        param: '--test-program',
        value: options.testProgram,
      },
    );
  }
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
    context.channels,
  );
  const names = loaded.channels.map((c) => c.name);
  const targetErrors =
    options.targetError === undefined
      ? undefined
      : parsePerChannel(options.targetError, '--target-error', names);
  const outputSteps =
    options.outputStep === undefined
      ? undefined
      : parsePerChannel(options.outputStep, '--output-step', names);
  const headerName =
    options.out === undefined || options.out === '-'
      ? `${options.prefix}_constants.h`
      : basename(options.out);
  const output = await openResultOutput(context, options.out, options.force);
  const program =
    options.testProgram === undefined
      ? undefined
      : await openAtomicFile(options.testProgram, { force: options.force });
  try {
    const generator = `bridgework ${await readVersion()}`;
    if (options.format === 'sql') {
      const sql = constantsSql(loaded, {
        dialect: options.dialect,
        table: options.table,
        verification: options.verification,
        generator,
        maxTableBytes: options.maxTableBytes,
        ...(targetErrors === undefined ? {} : { targetErrors }),
      });
      for (const line of sql.summary) context.io.stderr.write(`${line}\n`);
      await output.write(sql.sql);
      if (options.channel === undefined && (await loadGroups(loaded)).length > 0)
        context.io.stderr.write(
          "bridgework constants: the SQL holds the channels only; the file's multi-bridge groups are written by the C and JSON formats\n",
        );
    } else {
      const files = constantsFiles(loaded, {
        format: options.format,
        prefix: options.prefix,
        verification: options.verification,
        generator,
        ...(types === undefined ? {} : { types }),
        ...(targetErrors === undefined ? {} : { targetErrors }),
        ...(outputSteps === undefined ? {} : { outputSteps }),
        design: {
          coefficientBits: options.coefficientBits,
          accumulatorBits: options.accumulatorBits === '32' ? 32 : 64,
          hardwareDivide: options.hardwareDivide,
          maxTableBytes: options.maxTableBytes,
        },
        ...(program === undefined ? {} : { testProgramHeader: headerName }),
      });
      for (const line of files.summary) context.io.stderr.write(`${line}\n`);
      // The file's multi-bridge groups follow when every channel is written.
      const groups = options.channel === undefined ? await loadGroups(loaded) : [];
      await output.write(
        groups.length === 0
          ? files.text
          : withGroups(files.text, groups, {
              format: options.format,
              prefix: options.prefix,
              types,
              source: `${loaded.file.file} by ${generator}`,
            }),
      );
      if (program !== undefined) await program.write(files.testProgram as string);
    }
    const n = loaded.channels.length;
    await output.commit(
      `the ${options.format === 'sql' ? 'SQL maps' : 'constants'} of ${n} channel${n === 1 ? '' : 's'}`,
    );
    if (program !== undefined) {
      await program.commit();
      context.io.stderr.write(`wrote the test program to ${options.testProgram}\n`);
    }
    return exitCodes.ok;
  } finally {
    await output.abort();
    await program?.abort();
  }
}
