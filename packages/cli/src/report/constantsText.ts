import { channelConstants, type ChannelConstants, type ConstantsOptions } from '@bridgework/channel';
import {
  emitCHeader,
  emitJson,
  emitTestProgram,
  evaluatorTypes,
  firmwareCost,
  type EvaluatorType,
  type FirmwareMap,
  type VerificationMode,
} from '@bridgework/firmware';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import { inChannel, type LoadedChannels } from '../channels/loadChannels.js';
import { splitOptionList } from '../internal/splitOptionList.js';

/** Options of {@link constantsFiles} and {@link constantsText}. */
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
  /** Total error target per channel name, output unit; absent: the channel's default. */
  readonly targetErrors?: ReadonlyMap<string, number>;
  /** Fixed-point output step per channel name, output unit; absent: the channel's default. */
  readonly outputSteps?: ReadonlyMap<string, number>;
  /** Further design limits passed to every channel (word widths, table size, divider). */
  readonly design?: Pick<
    ConstantsOptions,
    'coefficientBits' | 'accumulatorBits' | 'hardwareDivide' | 'maxTableBytes' | 'maxDegree'
  >;
  /** When given, also write a C test program that includes the header by this name. */
  readonly testProgramHeader?: string;
}

/** What `bridgework constants` writes. */
export interface ConstantsFiles {
  /** The header (or JSON). */
  readonly text: string;
  /** The C test program, when asked for. */
  readonly testProgram: string | undefined;
  /** One line per channel and function: form, table bytes, total error and how it was obtained. */
  readonly summary: readonly string[];
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

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Reads a per-channel numeric option: one positive number for every channel (`0.01`), or
 * `name=value` entries, comma-separated (`deck-temp=0.01,gusset-g2=0.5`), each in that channel's
 * output unit.
 *
 * @param text - The option's text.
 * @param option - The option as written (`'--target-error'`), for messages.
 * @param channels - The names of the selected channels.
 * @returns The value per channel name (channels not listed are absent).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a malformed entry, an unknown or
 *   repeated channel, or a value that is not a positive finite number.
 */
export function parsePerChannel(
  text: string,
  option: string,
  channels: readonly string[],
): Map<string, number> {
  const out = new Map<string, number>();
  const value = (v: string, entry: string): number => {
    const x = Number(v.trim());
    if (!NUMBER.test(v.trim()) || !Number.isFinite(x) || !(x > 0)) {
      throw new BridgeworkError(
        'invalid-option',
        `\`${option}\` must be a positive number in the channel's output unit, or name=value entries; got '${entry}'`,
        { param: option, value: text },
      );
    }
    return x;
  };
  if (!text.includes('=')) {
    const x = value(text, text);
    for (const c of channels) out.set(c, x);
    return out;
  }
  for (const entry of splitOptionList(text, option)) {
    const at = entry.indexOf('=');
    const name = entry.slice(0, at).trim();
    if (at < 0 || !channels.includes(name) || out.has(name)) {
      throw new BridgeworkError(
        'invalid-option',
        `\`${option}\` entries must be name=value for distinct channels of the file (${channels.join(', ')}); got '${entry}'`,
        { param: option, value: text, limit: channels },
      );
    }
    out.set(name, value(entry.slice(at + 1), entry));
  }
  return out;
}

/** Text as safe for a C comment: printable ASCII, no `*`, `\` or `?`. */
function commentSafe(text: string): string {
  return text.replace(/[^\x20-\x7e]|[*\\?]/g, '_');
}

/** The form of a map in a few words. */
function formOf(map: FirmwareMap): string {
  if (map.kind === 'piecewise-polynomial') {
    const degree =
      ['constant', 'linear', 'quadratic', 'cubic', 'quartic', 'quintic'][map.degree] ??
      `degree ${map.degree}`;
    return `piecewise ${degree}, ${map.segmentCount} segment${map.segmentCount === 1 ? '' : 's'}`;
  }
  return map.kind === 'mobius' ? 'Moebius' : map.kind;
}

/** Three significant digits without trailing zeros. @internal */
export function short(x: number): string {
  return String(Number(x.toPrecision(3)));
}

/** A bound to three significant digits, rounded up so that it stays a bound. @internal */
export function shortUp(x: number): string {
  const rounded = Number(x.toPrecision(3));
  return String(
    rounded >= x ? rounded : Number((rounded + 10 ** (Math.floor(Math.log10(x)) - 2)).toPrecision(3)),
  );
}

/** How a total error bound was found, for a summary line. @internal */
export function howChecked(total: { readonly proved: boolean; readonly codesChecked: number }): string {
  return total.proved
    ? `proved over all ${total.codesChecked} codes`
    : `measured on ${total.codesChecked} codes`;
}

function summaryLines(
  name: string,
  unit: string,
  c: ChannelConstants,
  types: readonly EvaluatorType[],
): string[] {
  return types.flatMap((t) => {
    const map = c[t];
    const total = c.totals[t];
    if (map === undefined || total === undefined) return [];
    const how = howChecked(total);
    return [
      `${name} ${t}: ${formOf(map)}, ${firmwareCost(map).tableBytes} bytes; total error <= ${shortUp(total.bound)} ${unit} (${how}; target ${short(c.targetError)} ${unit})`,
    ];
  });
}

/** Puts the command line's option names into a library message about its options. @internal */
export function asCommandLine(e: unknown): never {
  if (isBridgeworkError(e)) {
    const renamed: Record<string, string> = {
      targetError: '--target-error',
      outputResolution: '--output-step',
      outputUnit: '--output-step',
      coefficientBits: '--coefficient-bits',
      maxTableBytes: '--max-table-bytes',
    };
    let message = e.message;
    for (const [from, to] of Object.entries(renamed))
      message = message.split(`\`${from}\``).join(`\`${to}\``);
    if (message !== e.message) {
      throw new BridgeworkError(e.code, message, {
        ...(e.param === undefined ? {} : { param: e.param }),
        ...(e.value === undefined ? {} : { value: e.value }),
        ...(e.limit === undefined ? {} : { limit: e.limit }),
        cause: e,
      });
    }
  }
  throw e;
}

/**
 * The firmware constants of the loaded channels as one C header or one JSON document, with the C
 * test program when asked for and a summary line per function.
 *
 * @remarks
 * Each channel's constants come from the channel package's `channelConstants`: for each type the
 * cheapest function meeting the channel's total error target against its exact map (default
 * max(u_c/10, one output step)), verified over every code of the span, with test vectors. They are
 * emitted by the firmware package's `emitCHeader`, `emitJson` and `emitTestProgram`, which state
 * each function's total error, its parts, its cost and the safety caution. A target that cannot be
 * met is an error naming the best bound reached, so nothing is written. A header starts with one
 * more comment naming the channel file, its channels and the generator.
 *
 * @param loaded - The channel file and its channels.
 * @param options - Format, prefix, types, verification, generator, targets and limits.
 * @returns The text, the test program and the summary.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (a target that cannot be met, naming
 *   the channel and `--target-error`), `invalid-option` (param `--prefix`) for a prefix the
 *   firmware package rejects, and what the emitters throw.
 */
export function constantsFiles(loaded: LoadedChannels, options: ConstantsTextOptions): ConstantsFiles {
  const summary: string[] = [];
  const channels = loaded.channels.map((c) => {
    const target = options.targetErrors?.get(c.name);
    const step = options.outputSteps?.get(c.name);
    const constants = inChannel(loaded, c, () => {
      try {
        return channelConstants(c.channel, {
          verification: options.verification,
          ...(options.types === undefined ? {} : { types: options.types }),
          ...(target === undefined ? {} : { targetError: target }),
          ...(step === undefined ? {} : { outputResolution: step }),
          ...options.design,
        });
      } catch (e) {
        return asCommandLine(e);
      }
    });
    summary.push(...summaryLines(c.name, c.channel.unit, constants, options.types ?? evaluatorTypes));
    return constants.firmwareChannel;
  });
  const emitOptions = {
    channels,
    prefix: options.prefix,
    ...(options.types === undefined ? {} : { types: options.types }),
  };
  let text: string;
  let testProgram: string | undefined;
  try {
    text = options.format === 'c' ? emitCHeader(emitOptions) : emitJson(emitOptions);
    testProgram =
      options.testProgramHeader === undefined
        ? undefined
        : emitTestProgram({ ...emitOptions, header: options.testProgramHeader });
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
  if (options.format === 'c') {
    const names = loaded.channels.map((c) => c.name).join(', ');
    text = `/* From the channel file ${commentSafe(loaded.file.file)} (channels ${commentSafe(names)}) by ${commentSafe(options.generator)}. */\n${text}`;
  }
  return { text, testProgram, summary };
}

/**
 * The firmware constants of the loaded channels as one C header or one JSON document (the text of
 * {@link constantsFiles}).
 *
 * @param loaded - The channel file and its channels.
 * @param options - As for {@link constantsFiles}.
 * @returns The text.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link constantsFiles}.
 */
export function constantsText(loaded: LoadedChannels, options: ConstantsTextOptions): string {
  return constantsFiles(loaded, options).text;
}
