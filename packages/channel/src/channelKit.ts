import { BridgeworkError, checkOptions, formatValue, type SpecIssue } from '@bridgework/core';
import type { Channel } from './Channel.js';
import { makeChannel } from './internal/makeChannel.js';
import { prepareChannel, type PreparedChannel } from './internal/prepare.js';
import type { AnySpec } from './internal/resolve.js';
import type { SensorKind } from './kinds/SensorKind.js';
import { buildChannelSchema, type AnySensorKind } from './spec/buildSchema.js';
import { runSchema, type AnyNode } from './spec/schema.js';

/** Options of {@link validateChannelSpec}. */
export interface ValidateChannelSpecOptions {
  /** Prefix of every issue's path (`channels.hanger-3`). Default: none. */
  readonly path?: string;
}

/** The outcome of a validation: the spec with every default applied, or every problem. */
export type SpecValidation<V> =
  | {
      /** The spec is valid. */
      readonly ok: true;
      /** The spec with every default applied, deeply frozen; `createChannel` takes it without checking it again. */
      readonly value: V;
      /** Always empty. */
      readonly issues: readonly SpecIssue[];
    }
  | {
      /** The spec has problems. */
      readonly ok: false;
      /** Always undefined. */
      readonly value: undefined;
      /** Every problem, by field path, with its message in the user's terms (`path: message` reads as a sentence). */
      readonly issues: readonly SpecIssue[];
    };

/** Validation, channel creation and the spec's documentation for one set of sensor kinds (see {@link createChannelKit}). */
export interface ChannelKit {
  /** The sensor kinds, in field-reference order. */
  readonly sensorKinds: readonly SensorKind[];
  /**
   * Validates a spec once: the schema, the rules across fields, and what only the built model can
   * tell (a span the channel cannot read). Never throws for a bad spec.
   *
   * @param spec - The candidate spec (any value).
   * @param options - A path prefix for the issues.
   */
  validateChannelSpec(spec: unknown, options?: ValidateChannelSpecOptions): SpecValidation<unknown>;
  /**
   * Creates a channel from a spec (a validated one is taken as it is).
   *
   * @param spec - The spec.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-spec` with every problem in `issues`.
   */
  createChannel(spec: unknown): Channel;
  /**
   * The schema that validates a spec: the field reference and the JSON Schema are made from it by
   * `kitSpecFields` and `kitSpecJsonSchema` (channelSpecReference.ts), which validation and
   * conversion do not import.
   */
  readonly schema: AnyNode;
}

/** Validated values and their prepared channels: the private brand of a validated spec. */
const prepared = new WeakMap<object, PreparedChannel>();

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** The message of an `invalid-spec` error listing every issue. */
export function invalidSpecMessage(issues: readonly SpecIssue[]): string {
  return `channel spec has ${issues.length} problem${issues.length === 1 ? '' : 's'}:\n${issues.map((i) => `  ${i.path === '' ? '(spec)' : i.path}: ${i.message}`).join('\n')}`;
}

/**
 * A set of functions (validate, create, document) for a list of sensor kinds: how a new kind is
 * tried before it joins the registry, or used by an application of its own.
 *
 * @remarks
 * The built-in kinds are `builtInSensorKinds`; the package's own `validateChannelSpec`,
 * `createChannel`, `channelSpecJsonSchema` and `channelSpecFields` are this kit over them. The
 * arrangements are the bridge package's `arrangementTable` as it is when the kit is made.
 *
 * @param options - `sensorKinds`: the kinds (names unique).
 * @returns The kit.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `wrong-type`, `invalid-option` (two kinds of one name).
 * @example
 * ```ts
 * const kit = createChannelKit({ sensorKinds: [...builtInSensorKinds, myKind] });
 * const channel = kit.createChannel({ sensor: { kind: 'my-kind' }, excitation: { volts: 5 }, adc: { bits: 24, referenceVolts: 5 }, output: { quantity: 'temperature' } });
 * ```
 */
export function createChannelKit(options: { readonly sensorKinds: readonly SensorKind[] }): ChannelKit {
  const o = checkOptions('options', options, { known: ['sensorKinds'], required: ['sensorKinds'] });
  const kinds = o['sensorKinds'];
  if (!Array.isArray(kinds) || kinds.length === 0) {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.sensorKinds\` must be a non-empty array of sensor kinds; got ${formatValue(kinds)}`,
      {
        param: 'options.sensorKinds',
      },
    );
  }
  let built: ReturnType<typeof buildChannelSchema>;
  try {
    built = buildChannelSchema(kinds as readonly AnySensorKind[]);
  } catch (e) {
    throw new BridgeworkError('invalid-option', `\`options.sensorKinds\` ${(e as Error).message}`, {
      param: 'options.sensorKinds',
      cause: e,
    });
  }
  const { schema, rules } = built;

  function validate(spec: unknown, opts: ValidateChannelSpecOptions = {}): SpecValidation<unknown> {
    const v = checkOptions('options', opts, { known: ['path'] });
    const prefix = v['path'] === undefined ? '' : String(v['path']);
    if (typeof spec === 'object' && spec !== null && prepared.has(spec) && prefix === '') {
      return { ok: true, value: spec, issues: [] };
    }
    const { value, ctx } = runSchema(schema, spec, prefix);
    if (value === undefined) {
      const issues =
        ctx.issues.length > 0
          ? ctx.issues
          : [{ code: 'invalid-spec' as const, path: prefix, message: 'is not a valid channel spec' }];
      return { ok: false, value: undefined, issues };
    }
    const issues: SpecIssue[] = [];
    const ready = prepareChannel(value as unknown as AnySpec, rules, prefix, issues);
    if (ready === undefined) return { ok: false, value: undefined, issues };
    const frozen = deepFreeze(value);
    prepared.set(frozen, ready);
    return { ok: true, value: frozen, issues: [] };
  }

  return {
    sensorKinds: kinds as readonly SensorKind[],
    validateChannelSpec: validate,
    createChannel(spec) {
      const known = typeof spec === 'object' && spec !== null ? prepared.get(spec) : undefined;
      if (known !== undefined) return makeChannel(known);
      const result = validate(spec);
      if (!result.ok)
        throw new BridgeworkError('invalid-spec', invalidSpecMessage(result.issues), {
          issues: result.issues,
        });
      return makeChannel(prepared.get(result.value as object) as PreparedChannel);
    },
    schema,
  };
}
