import type { CommandContext } from '../commands/CommandContext.js';

/**
 * The kinds of value an option takes.
 *
 * @remarks
 * - `'boolean'`: a flag without a value; absent means `false`.
 * - `'string'`: any text, such as a file name.
 * - `'number'`: a finite decimal number (`12`, `-0.5`, `2.5e-3`); hexadecimal, `NaN`,
 *   `Infinity` and empty text are rejected.
 * - `'integer'`: a number that is a whole number.
 * - `'choice'`: one of the option's `choices`.
 */
export type OptionType = 'boolean' | 'string' | 'number' | 'integer' | 'choice';

/**
 * One row of a command's option table. The parser, the `--help` text and docs/cli.md are all
 * generated from these rows, so they cannot disagree.
 */
export interface OptionSpec {
  /** Long name in kebab case, without dashes: `'input-format'` is given as `--input-format`. */
  readonly name: string;
  /** Single-letter alias, without the dash: `'o'` is given as `-o`. */
  readonly short?: string;
  /** The kind of value (see {@link OptionType}). */
  readonly type: OptionType;
  /** Name of the value in help text, e.g. `'file'` shows as `--out <file>`. Default `'value'`. */
  readonly placeholder?: string;
  /** Unit of a numeric value, shown in help (`'frames'`, `'digits'`). */
  readonly unit?: string;
  /** Value used when the option is absent (booleans are always `false` when absent). */
  readonly default?: string | number;
  /** Shown instead of a literal default when the default is computed (`'the channel count'`). */
  readonly defaultText?: string;
  /** The allowed values of a `'choice'` option. */
  readonly choices?: readonly string[];
  /** Smallest allowed value of a numeric option (inclusive). */
  readonly min?: number;
  /** Largest allowed value of a numeric option (inclusive). */
  readonly max?: number;
  /** One or two sentences for help and docs. */
  readonly description: string;
}

/** One positional argument of a command. */
export interface PositionalSpec {
  /** Name in kebab case, shown as `<channel-file>`. */
  readonly name: string;
  /** Whether the argument must be given. */
  readonly required: boolean;
  /** One sentence for help and docs. */
  readonly description: string;
}

/** An example invocation shown in help and docs. */
export interface CommandExample {
  /** The full command line, starting with `bridgework`. */
  readonly command: string;
  /** What it does. */
  readonly description: string;
}

/** Turns a kebab-case name into camel case: `'input-format'` → `'inputFormat'`. */
export type CamelCase<S extends string> = S extends `${infer Head}-${infer Tail}`
  ? `${Head}${Capitalize<CamelCase<Tail>>}`
  : S;

/** The parsed type of one option's value. */
export type OptionValue<O extends OptionSpec> = O['type'] extends 'boolean'
  ? boolean
  : O['type'] extends 'number' | 'integer'
    ? number
    : O extends {
          /** The allowed values. */
          readonly choices: readonly (infer C)[];
        }
      ? C
      : string;

/**
 * The parsed options of a command, keyed by camel-case name. Booleans are always present;
 * options with a default are always present; the others may be `undefined`.
 */
export type OptionValues<Os extends readonly OptionSpec[]> = {
  readonly [O in Os[number] as CamelCase<O['name']>]: O['type'] extends 'boolean'
    ? boolean
    : O extends {
          /** The default value. */
          readonly default: string | number;
        }
      ? OptionValue<O>
      : OptionValue<O> | undefined;
};

/** The parsed positional arguments of a command, keyed by camel-case name. */
export type PositionalValues<Ps extends readonly PositionalSpec[]> = {
  readonly [P in Ps[number] as CamelCase<P['name']>]: P extends {
    /** The argument must be given. */
    readonly required: true;
  }
    ? string
    : string | undefined;
};

/** A parsed command line: what a command's `run` receives. */
export interface ParsedArgs<
  Os extends readonly OptionSpec[] = readonly OptionSpec[],
  Ps extends readonly PositionalSpec[] = readonly PositionalSpec[],
> {
  /** The options, with defaults applied. */
  readonly options: OptionValues<Os>;
  /** The positional arguments. */
  readonly positionals: PositionalValues<Ps>;
}

/** What a command module exports: its body. */
export interface CommandModule<
  Os extends readonly OptionSpec[] = readonly OptionSpec[],
  Ps extends readonly PositionalSpec[] = readonly PositionalSpec[],
> {
  /**
   * Runs the command and returns its exit code (see {@link exitCodes}). Bad input is thrown as a
   * `BridgeworkError`; the caller prints it and exits with 1.
   */
  run(args: ParsedArgs<Os, Ps>, context: CommandContext): Promise<number>;
}

/**
 * A command: its name, help texts, option table, and a loader that imports its body only when it
 * runs (so `bridgework --help` loads nothing heavy).
 */
export interface CommandSpec<
  Os extends readonly OptionSpec[] = readonly OptionSpec[],
  Ps extends readonly PositionalSpec[] = readonly PositionalSpec[],
> {
  /** The command word, e.g. `'report'`. */
  readonly name: string;
  /** One line for the command list. */
  readonly summary: string;
  /** One or more paragraphs for `--help` and docs (separated by blank lines). */
  readonly description: string;
  /** Positional arguments, in order. */
  readonly positionals: Ps;
  /** The option table (`-h, --help` is added to every command). */
  readonly options: Os;
  /** Example invocations. */
  readonly examples: readonly CommandExample[];
  /** Imports the command's body. */
  readonly load: () => Promise<CommandModule<Os, Ps>>;
}

/**
 * Declares a command with a typed option table.
 *
 * @remarks
 * An identity function: it exists so that TypeScript infers the literal types of the table
 * (`const` type parameters), which give the command body typed, camel-cased option values.
 *
 * @param spec - The command.
 * @returns `spec`, unchanged.
 * @example
 * ```ts
 * const hello = defineCommand({
 *   name: 'hello', summary: 'says hello', description: 'Says hello.', positionals: [],
 *   options: [{ name: 'loud', type: 'boolean', description: 'Shout.' }], examples: [],
 *   load: () => import('./hello.js'),
 * });
 * ```
 */
export function defineCommand<
  const Os extends readonly OptionSpec[],
  const Ps extends readonly PositionalSpec[],
>(spec: CommandSpec<Os, Ps>): CommandSpec<Os, Ps> {
  return spec;
}
