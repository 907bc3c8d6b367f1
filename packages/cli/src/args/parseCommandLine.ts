import { parseArgs } from 'node:util';
import { BridgeworkError } from '@bridgework/core';
import { closestName } from '@bridgework/core';
import type { CommandSpec, OptionSpec, ParsedArgs, PositionalSpec } from './optionTable.js';

/** The `-h, --help` option that every command accepts. */
export const helpOption: OptionSpec = Object.freeze({
  name: 'help',
  short: 'h',
  type: 'boolean',
  description: 'Show this help and exit.',
});

/** The result of {@link parseCommandLine}: either a request for help or the parsed arguments. */
export type ParsedCommandLine<
  Os extends readonly OptionSpec[] = readonly OptionSpec[],
  Ps extends readonly PositionalSpec[] = readonly PositionalSpec[],
> =
  | {
      /** `-h` or `--help` was given: show the help and do nothing else. */
      readonly help: true;
    }
  | ({
      /** No help was asked for: the arguments follow. */
      readonly help: false;
    } & ParsedArgs<Os, Ps>);

const decimal = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** The option as the user wrote it, for messages: `--out` or `-o`. */
function flag(o: OptionSpec): string {
  return `--${o.name}`;
}

function camel(name: string): string {
  return name.replace(/-([a-z0-9])/g, (_, c: string) => c.toUpperCase());
}

function usageError(code: 'invalid-option' | 'missing-option', param: string, message: string): never {
  throw new BridgeworkError(code, message, { param });
}

/**
 * Converts an option's text value to its typed value, or throws a message naming the option.
 *
 * @param o - The option's table row.
 * @param text - The text given on the command line.
 * @returns The typed value.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (not a number), `not-integer`, `out-of-range`,
 * `invalid-option` (not one of the choices).
 */
export function convertOptionValue(o: OptionSpec, text: string): string | number {
  const name = flag(o);
  switch (o.type) {
    case 'string':
      return text;
    case 'choice': {
      const choices = o.choices ?? [];
      if (choices.includes(text)) return text;
      throw new BridgeworkError(
        'invalid-option',
        `\`${name}\` must be one of ${choices.join(', ')}; got '${text}'`,
        { param: name, value: text, limit: choices },
      );
    }
    case 'number':
    case 'integer': {
      const trimmed = text.trim();
      if (!decimal.test(trimmed)) {
        throw new BridgeworkError(
          'wrong-type',
          `\`${name}\` must be ${o.type === 'integer' ? 'an integer' : 'a number'}; got '${text}'`,
          {
            param: name,
            value: text,
          },
        );
      }
      const x = Number(trimmed);
      if (!Number.isFinite(x)) {
        throw new BridgeworkError('not-finite', `\`${name}\` must be a finite number; got '${text}'`, {
          param: name,
          value: text,
        });
      }
      if (o.type === 'integer' && !Number.isSafeInteger(x)) {
        throw new BridgeworkError('not-integer', `\`${name}\` must be an integer; got '${text}'`, {
          param: name,
          value: text,
        });
      }
      const lo = o.min ?? -Infinity;
      const hi = o.max ?? Infinity;
      if (x < lo || x > hi) {
        const range = hi === Infinity ? `>= ${lo}` : lo === -Infinity ? `<= ${hi}` : `in [${lo}, ${hi}]`;
        throw new BridgeworkError('out-of-range', `\`${name}\` must be ${range}; got ${text}`, {
          param: name,
          value: x,
          limit: [lo, hi],
        });
      }
      return x;
    }
    case 'boolean':
      throw new BridgeworkError('invalid-option', `\`${name}\` takes no value; got '${text}'`, {
        param: name,
        value: text,
      });
  }
}

/**
 * Parses a command's arguments against its option table.
 *
 * @remarks
 * Tokenising is done by `node:util` `parseArgs` (so `-o file`, `-ofile`, `--out file`,
 * `--out=file`, grouped short flags `-fq` and the `--` terminator behave as usual); everything
 * else is checked here, so every mistake gets one clear message:
 * - an unknown option (with the closest known name, when there is one),
 * - an option given twice,
 * - a value missing (`--out` at the end, or followed by another option: write `--out=-x` for a
 *   value that starts with a dash), or a value given to a flag (`--force=yes`),
 * - a number that is not a plain finite decimal, an integer option given a fraction, a value
 *   outside the option's `[min, max]`, a choice not in the list,
 * - a missing required positional argument, or one too many.
 *
 * `-h`/`--help` anywhere wins over every other problem: the user asked for help.
 *
 * @param spec - The command (its option table and positionals).
 * @param argv - The arguments after the command word.
 * @returns `{ help: true }`, or `{ help: false, options, positionals }` with defaults applied.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option`, `missing-option`, `wrong-type`, `not-finite`,
 * `not-integer` or `out-of-range`, with `param` naming the option (e.g. `'--out'`) or the
 * argument (`'<channel-file>'`).
 * @example
 * ```ts
 * const parsed = parseCommandLine(convertCommand, ['hopper.yaml', 'codes.bin', '-o', 'out.csv']);
 * // { help: false, options: { out: 'out.csv', force: false, ... }, positionals: { ... } }
 * ```
 */
export function parseCommandLine<Os extends readonly OptionSpec[], Ps extends readonly PositionalSpec[]>(
  spec: Pick<CommandSpec<Os, Ps>, 'options' | 'positionals'>,
  argv: readonly string[],
): ParsedCommandLine<Os, Ps> {
  const table: readonly OptionSpec[] = [...spec.options, helpOption];
  const byName = new Map(table.map((o) => [o.name, o]));
  const config: Record<string, { type: 'string' | 'boolean'; short?: string }> = {};
  for (const o of table) {
    config[o.name] = {
      type: o.type === 'boolean' ? 'boolean' : 'string',
      ...(o.short === undefined ? {} : { short: o.short }),
    };
  }
  const { tokens } = parseArgs({
    args: [...argv],
    options: config,
    strict: false,
    allowPositionals: true,
    tokens: true,
  });
  if (tokens.some((t) => t.kind === 'option' && t.name === 'help')) return { help: true };

  const values: Record<string, string | number | boolean | undefined> = {};
  const seen = new Set<string>();
  const positionals: string[] = [];
  for (const t of tokens) {
    if (t.kind === 'positional') {
      positionals.push(t.value);
      continue;
    }
    if (t.kind !== 'option') continue;
    const o = byName.get(t.name);
    if (o === undefined || (t.rawName.length === 2 && t.rawName[1] !== o.short)) {
      const near = closestName(
        t.rawName.replace(/^-+/, ''),
        table.map((x) => x.name),
      );
      usageError(
        'invalid-option',
        t.rawName,
        `unknown option \`${t.rawName}\`${near === undefined ? '' : `; did you mean \`--${near}\`?`}`,
      );
    }
    if (seen.has(o.name)) usageError('invalid-option', flag(o), `\`${flag(o)}\` is given more than once`);
    seen.add(o.name);
    if (o.type === 'boolean') {
      if (t.value !== undefined) convertOptionValue(o, t.value);
      values[camel(o.name)] = true;
      continue;
    }
    const placeholder = `<${o.placeholder ?? 'value'}>`;
    if (
      t.value === undefined ||
      (!t.inlineValue && t.value !== '-' && t.value.startsWith('-') && !decimal.test(t.value))
    ) {
      const next =
        t.value === undefined
          ? ''
          : ` (\`${t.value}\` looks like an option; write ${flag(o)}=${t.value} if it is the value)`;
      usageError('missing-option', flag(o), `\`${flag(o)}\` needs a value ${placeholder}${next}`);
    }
    values[camel(o.name)] = convertOptionValue(o, t.value);
  }
  for (const o of spec.options) {
    const key = camel(o.name);
    if (values[key] === undefined) values[key] = o.type === 'boolean' ? false : o.default;
  }

  const named: Record<string, string | undefined> = {};
  spec.positionals.forEach((p, i) => {
    const v = positionals[i];
    if (v === undefined && p.required) {
      usageError('missing-option', `<${p.name}>`, `missing argument <${p.name}>: ${p.description}`);
    }
    named[camel(p.name)] = v;
  });
  if (positionals.length > spec.positionals.length) {
    const extra = positionals[spec.positionals.length] as string;
    usageError('invalid-option', extra, `unexpected argument '${extra}'`);
  }
  return {
    help: false,
    options: values as ParsedArgs<Os, Ps>['options'],
    positionals: named as ParsedArgs<Os, Ps>['positionals'],
  };
}
