import { loadChannels } from '../../channels/loadChannels.js';
import { streamSink } from '../../data/outputSink.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { constantsText, parseTypeList } from '../../report/constantsText.js';
import type { CommandContext } from '../CommandContext.js';
import type { ConstantsArgs } from './constantsCommand.js';

/**
 * The body of `bridgework constants`: the firmware constants of the selected channels as one C
 * header or JSON ({@link constantsText}), to a file (atomically) or standard output.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file, `--prefix` or `--types`,
 * or an existing output without `--force`.
 */
export async function run(args: ConstantsArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const types = options.types === undefined ? undefined : parseTypeList(options.types);
  const out = options.out === '-' ? undefined : options.out;
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
  );
  const file = out === undefined ? undefined : await openAtomicFile(out, { force: options.force });
  try {
    const text = constantsText(loaded, {
      format: options.format,
      prefix: options.prefix,
      verification: options.verification,
      generator: `bridgework ${await readVersion()}`,
      ...(types === undefined ? {} : { types }),
    });
    if (file === undefined) {
      await streamSink(context.io.stdout).write(text);
    } else {
      await file.write(text);
      await file.commit();
      const n = loaded.channels.length;
      context.io.stderr.write(`wrote the constants of ${n} channel${n === 1 ? '' : 's'} to ${out}\n`);
    }
    return exitCodes.ok;
  } finally {
    await file?.abort();
  }
}
