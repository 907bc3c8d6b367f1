import { loadChannels } from '../../channels/loadChannels.js';
import { withGroups } from '../../groups/groupConstants.js';
import { loadGroups } from '../../groups/loadGroups.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { constantsText, parseTypeList } from '../../report/constantsText.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
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
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
    context.channels,
  );
  const output = await openResultOutput(context, options.out, options.force);
  try {
    const generator = `bridgework ${await readVersion()}`;
    const text = constantsText(loaded, {
      format: options.format,
      prefix: options.prefix,
      verification: options.verification,
      generator,
      ...(types === undefined ? {} : { types }),
    });
    // The file's multi-bridge groups follow when every channel is written.
    const groups = options.channel === undefined ? await loadGroups(loaded) : [];
    await output.write(
      groups.length === 0
        ? text
        : withGroups(text, groups, {
            format: options.format,
            prefix: options.prefix,
            types,
            source: `${loaded.file.file} by ${generator}`,
          }),
    );
    const n = loaded.channels.length;
    await output.commit(`the constants of ${n} channel${n === 1 ? '' : 's'}`);
    return exitCodes.ok;
  } finally {
    await output.abort();
  }
}
