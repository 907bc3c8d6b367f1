import {
  emitCHeader,
  emitJson,
  evaluatorTypes,
  type EvaluatorType,
  type VerificationMode,
} from '@bridgework/firmware';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import { channelConstants } from '@bridgework/channel';
import { inChannel, type LoadedChannels } from '../channels/loadChannels.js';
import { splitOptionList } from '../internal/splitOptionList.js';

/** Options of {@link constantsText}. */
export interface ConstantsTextOptions {
  /** `'c'` for a C99 header, `'json'` for JSON. */
  readonly format: 'c' | 'json';
  /** Prefix of every emitted name (the firmware package's rules). */
  readonly prefix: string;
  /** The evaluators to write; default every one. */
  readonly types?: readonly EvaluatorType[];
  /** How the bounds are verified. */
  readonly verification: VerificationMode;
  /** The tool and version for the header's first comment (`'bridgework 0.1.0'`). */
  readonly generator: string;
}

/**
 * Splits `--types`: evaluator types, comma-separated, each once.
 *
 * @param list - The option's text, e.g. `'fixed,float32'`.
 * @returns The types in the order given.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty, unknown or repeated type.
 */
export function parseTypeList(list: string): EvaluatorType[] {
  const types = splitOptionList(list, '--types');
  types.forEach((t, i) => {
    if (!(evaluatorTypes as readonly string[]).includes(t) || types.indexOf(t) !== i) {
      throw new BridgeworkError(
        'invalid-option',
        `\`--types\` must list some of ${evaluatorTypes.join(', ')}, each once; got '${list}'`,
        { param: '--types', value: list, limit: evaluatorTypes },
      );
    }
  });
  return types as EvaluatorType[];
}

/** Text as safe for a C comment: printable ASCII, no `*`, `\` or `?`. */
function commentSafe(text: string): string {
  return text.replace(/[^\x20-\x7e]|[*\\?]/g, '_');
}

/**
 * The firmware constants of the loaded channels as one C header or one JSON document.
 *
 * @remarks
 * Each channel's constants are the channel package's (`Channel.constants`: a fixed-point map on
 * the minimax line of the exact map, float32 and float64 Chebyshev polynomials, each with its
 * proved rounding bound and its error against the exact map), emitted by the firmware package's
 * `emitCHeader` or `emitJson`, which write the units, the bounds and how they were obtained, and
 * the safety caution. A header starts
 * with one more comment naming the channel file, its channels and the generator.
 *
 * @param loaded - The channel file and its channels.
 * @param options - Format, prefix, types, verification, generator.
 * @returns The text.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` (param `--prefix`) for a prefix
 * the firmware package rejects, and what the emitters throw.
 */
export function constantsText(loaded: LoadedChannels, options: ConstantsTextOptions): string {
  const channels = loaded.channels.map(
    (c) =>
      inChannel(loaded, c, () => channelConstants(c.channel, { verification: options.verification }))
        .firmwareChannel,
  );
  const emitOptions = {
    channels,
    prefix: options.prefix,
    ...(options.types === undefined ? {} : { types: options.types }),
  };
  let text: string;
  try {
    text = options.format === 'c' ? emitCHeader(emitOptions) : emitJson(emitOptions);
  } catch (e) {
    if (isBridgeworkError(e) && e.param === 'prefix') {
      throw new BridgeworkError('invalid-option', e.message.replace('`prefix`', '`--prefix`'), {
        param: '--prefix',
        value: options.prefix,
        cause: e,
      });
    }
    throw e;
  }
  if (options.format === 'json') return text;
  const names = loaded.channels.map((c) => c.name).join(', ');
  return `/* From the channel file ${commentSafe(loaded.file.file)} (channels ${commentSafe(names)}) by ${commentSafe(options.generator)}. */\n${text}`;
}
