/**
 * The channel schema: the common fields, the sensor kinds' fragments as a tagged union on
 * `sensor.kind`, the defaults that depend on other fields, and the rules across fields. Built
 * from a list of sensor kinds and an arrangement table, so a kind or an arrangement is added in
 * one place.
 */
import type { LeadWiring } from '@bridgework/core';
import type { GaugePattern } from '@bridgework/bridge';
import type { SensorKind, SpecReporter } from '../kinds/SensorKind.js';
import { defaultOutputUnit } from '../outputQuantities.js';
import { commonFields, type CommonSpec } from './commonSpec.js';
import {
  objectField,
  report,
  taggedField,
  type AnyNode,
  type ParseContext,
  type Presence,
  type SchemaNode,
} from './schema.js';

/** One arrangement of the table: its arms and the lead wirings it accepts (the bridge package's `ArrangementInfo`). */
export interface ArrangementRow {
  /** Arms R1…R4: each gauge's strain pattern, or null for a completion resistor. */
  readonly arms: readonly GaugePattern[];
  /** The lead wirings it accepts. */
  readonly wirings: readonly LeadWiring[];
}

/** The arrangements a channel may use, by name (the bridge package's `arrangementTable`, or a test's). */
export type ArrangementTable = Readonly<Record<string, ArrangementRow>>;

/** The wirings of a transducer's own full bridge. */
const TRANSDUCER_WIRINGS: readonly LeadWiring[] = ['four-wire', 'six-wire'];

/** What the schema's rules need besides the fields: the kinds by name and the arrangement table. */
export interface ChannelRules {
  /** The sensor kinds by `sensor.kind`. */
  readonly kinds: ReadonlyMap<string, SensorKind>;
  /** The arrangements by name. */
  readonly arrangements: ArrangementTable;
}

/** The wirings a channel's bridge accepts. */
export function wiringsOf(
  rules: ChannelRules,
  kind: SensorKind,
  arrangement: string | undefined,
): readonly LeadWiring[] {
  if (kind.placement === 'own-bridge') return TRANSDUCER_WIRINGS;
  return rules.arrangements[arrangement ?? 'quarter']?.wirings ?? [];
}

/** Whether every arm holds a gauge (a full bridge: remote sense applies). */
function isFullBridge(rules: ChannelRules, kind: SensorKind, arrangement: string | undefined): boolean {
  if (kind.placement === 'own-bridge') return true;
  return (rules.arrangements[arrangement ?? 'quarter']?.arms ?? []).every((a) => a !== null);
}

/** The default wiring: three-wire where allowed, else four-wire (six-wire with remote sense), else the only one. */
function defaultWiring(wirings: readonly LeadWiring[], remoteSense: boolean | undefined): LeadWiring {
  if (remoteSense === true && wirings.includes('six-wire')) return 'six-wire';
  for (const w of ['three-wire', 'four-wire'] as const) if (wirings.includes(w)) return w;
  return wirings[0] ?? 'two-wire';
}

type Spec = CommonSpec & { readonly sensor: Record<string, unknown> & { readonly kind: string } };

function reporterFor(ctx: ParseContext): SpecReporter {
  return (path, message, extra = {}) => {
    const { code, ...rest } = extra;
    report(
      ctx,
      path,
      code ?? (/^is required/.test(message) ? 'missing-option' : 'invalid-option'),
      message,
      rest,
    );
  };
}

/** Fills in every default that depends on other fields. */
function finalize(spec: Spec, ctx: ParseContext, rules: ChannelRules): Spec {
  const kind = rules.kinds.get(spec.sensor.kind) as SensorKind;
  const sensor =
    kind.finalize === undefined
      ? spec.sensor
      : (kind.finalize(spec.sensor as never, spec, 'sensor', ctx) as Spec['sensor']);
  const b = spec.bridge;
  const arrangement = kind.placement === 'own-bridge' ? b.arrangement : (b.arrangement ?? 'quarter');
  const wiring = b.wiring ?? defaultWiring(wiringsOf(rules, kind, arrangement), spec.excitation.remoteSense);
  const completionOhms =
    kind.placement === 'own-bridge'
      ? b.completionOhms
      : (b.completionOhms ?? kind.nominalOhms(sensor as never));
  const t = spec.environment.temperatureCelsius;
  const e = spec.environment;
  return {
    ...spec,
    sensor,
    bridge: {
      ...b,
      ...(arrangement === undefined ? {} : { arrangement }),
      ...(completionOhms === undefined ? {} : { completionOhms }),
      wiring,
    },
    excitation: { ...spec.excitation, remoteSense: spec.excitation.remoteSense ?? wiring === 'six-wire' },
    environment: {
      ...e,
      zeroTemperatureCelsius: e.zeroTemperatureCelsius ?? t,
      cableTemperatureCelsius: e.cableTemperatureCelsius ?? t,
      rangeCelsius: e.rangeCelsius ?? { min: t, max: t },
    },
    output: { ...spec.output, unit: spec.output.unit ?? defaultOutputUnit(spec.output.quantity) },
  } as Spec;
}

const memberFields = [
  'modulusPascals',
  'shearModulusPascals',
  'areaSquareMeters',
  'sectionModulusCubicMeters',
  'leverArmMeters',
  'shaftDiameterMeters',
  'shaftBoreMeters',
] as const;

/** Rules that involve several fields; each failure names the field the user can change. */
function check(spec: Spec, ctx: ParseContext, rules: ChannelRules): void {
  const reportAt = reporterFor(ctx);
  const kind = rules.kinds.get(spec.sensor.kind) as SensorKind;
  const b = spec.bridge;
  const q = spec.output.quantity;
  const quantities = [...kind.quantities, 'ratio'];
  if (!quantities.includes(q)) {
    reportAt('output.quantity', `cannot be '${q}' for a '${kind.name}' sensor`, {
      expected: `one of ${quantities.map((x) => `'${x}'`).join(', ')}`,
    });
    return;
  }
  const given = ctx.parsed.get('bridge.arrangement');
  if (kind.placement === 'own-bridge' && b.arrangement !== undefined) {
    reportAt(
      'bridge.arrangement',
      `must be absent for a '${kind.name}' sensor (it has its own full bridge); got '${b.arrangement}'`,
    );
  }
  if (kind.placement === 'arm-1' && given !== undefined && given !== 'quarter') {
    reportAt(
      'bridge.arrangement',
      `must be 'quarter' (or absent) for a '${kind.name}' sensor, which sits in arm 1 of a quarter bridge; got '${String(given)}'`,
    );
  }
  const arrangement = b.arrangement;
  if (kind.placement === 'arrangement' && arrangement !== undefined) {
    const row = rules.arrangements[arrangement];
    if (row !== undefined && row.arms.some((a) => a !== null && a[1] !== 0) && b.poissonRatio === undefined) {
      reportAt(
        'bridge.poissonRatio',
        `is required for a '${arrangement}' bridge (it has a transverse gauge)`,
        { code: 'missing-option' },
      );
    }
  }
  const wirings = wiringsOf(rules, kind, arrangement);
  if (!wirings.includes(b.wiring)) {
    reportAt(
      'bridge.wiring',
      `must be one of ${wirings.map((w) => `'${w}'`).join(', ')} for ${kind.placement === 'own-bridge' ? 'a transducer' : `a '${arrangement ?? 'quarter'}' bridge`}; got '${b.wiring}'`,
    );
  }
  if (b.ohmsPerLead !== undefined && b.cable !== undefined) {
    reportAt('bridge.cable', 'must not be given together with bridge.ohmsPerLead (give one of them)', {
      code: 'conflicting-options',
    });
  }
  if (b.cable !== undefined && (b.cable.awg === undefined) === (b.cable.diameterMeters === undefined)) {
    reportAt('bridge.cable', 'must give exactly one of awg and diameterMeters', {
      code: b.cable.awg === undefined ? 'missing-option' : 'conflicting-options',
    });
  }
  const remote = ctx.parsed.get('excitation.remoteSense');
  if (remote === true && b.wiring !== 'six-wire') {
    reportAt(
      'excitation.remoteSense',
      `needs bridge.wiring 'six-wire' (sense conductors); got '${b.wiring}'`,
      { code: 'conflicting-options' },
    );
  }
  if (remote === false && b.wiring === 'six-wire') {
    reportAt('excitation.remoteSense', "must not be false with bridge.wiring 'six-wire'", {
      code: 'conflicting-options',
    });
  }
  if (b.wiring === 'six-wire' && !isFullBridge(rules, kind, arrangement)) {
    reportAt('bridge.wiring', 'six-wire (remote sense) applies to full bridges and transducers only');
  }
  if (spec.adc.ratiometric && spec.adc.referenceVolts !== spec.excitation.volts) {
    reportAt(
      'adc.referenceVolts',
      `must equal excitation.volts (${spec.excitation.volts} V) for a ratiometric converter, whose reference is the excitation; got ${spec.adc.referenceVolts} V`,
      {
        code: 'conflicting-options',
        suggestion: `set adc.referenceVolts to ${spec.excitation.volts} V, or adc.ratiometric to false`,
      },
    );
  }
  if (spec.adc.ratiometric && spec.excitation.sourceOhms > 0 && b.wiring !== 'six-wire') {
    // The converter's reference is the excitation at the instrument's terminals: the source
    // resistance leaves the ratio unchanged but lowers the bridge voltage to E·Rin/(Rin + Rs),
    // which moves with the bridge's input resistance over the span. The channel models the
    // bridge voltage as given, so it asks for it rather than for an EMF and a source resistance.
    reportAt(
      'excitation.sourceOhms',
      `must be 0 with a ratiometric converter: its reference is taken at the excitation terminals, where a source resistance changes the bridge voltage, not the ratio; got ${spec.excitation.sourceOhms} Ω`,
      {
        code: 'conflicting-options',
        limit: '0 Ω',
        suggestion:
          'write the terminal voltage as excitation.volts and adc.referenceVolts, or set adc.ratiometric to false',
      },
    );
  }
  if (spec.zero !== undefined) {
    const bits = spec.adc.bits;
    const lo = spec.adc.bipolar ? -(2 ** (bits - 1)) : 0;
    const hi = spec.adc.bipolar ? 2 ** (bits - 1) - 1 : 2 ** bits - 1;
    if (!(spec.zero.code > lo && spec.zero.code < hi)) {
      reportAt(
        'zero.code',
        `must lie strictly inside the converter's codes (${lo}, ${hi}); got ${spec.zero.code}`,
        {
          code: 'out-of-range',
          limit: `${spec.zero.code <= lo ? lo : hi}`,
        },
      );
    }
  }
  const used = kind.outputFields?.(spec.sensor as never, spec) ?? [];
  for (const field of memberFields) {
    if (spec.output[field] !== undefined && !used.includes(field)) {
      reportAt(
        `output.${field}`,
        `is not used by a '${kind.name}' channel with output '${q}'${used.length === 0 ? '' : ` (it uses ${used.join(', ')})`}; remove it`,
        {
          code: 'unknown-option',
        },
      );
    }
  }
  const sensorCtx = reporterFor(ctx);
  kind.check?.(spec.sensor as never, spec, sensorCtx, ctx);
}

/**
 * The channel schema for a set of sensor kinds (their fragments in `variants`, keyed by name)
 * and an arrangement table.
 */
export function channelSchemaFor<
  const V extends Readonly<Record<string, SchemaNode<object, object, Presence>>>,
  const A extends string,
>(variants: V, arrangementNames: readonly A[], rules: ChannelRules) {
  const { name, ...rest } = commonFields(arrangementNames);
  const sensor = taggedField('kind', variants, { doc: 'The sensor' });
  return objectField(
    { name, sensor, ...rest },
    {
      finalize: (value, _path, ctx) =>
        finalize(value as unknown as Spec, ctx, rules) as unknown as typeof value,
      check: (value, _path, ctx) => check(value as unknown as Spec, ctx, rules),
    },
  );
}

/** The sensor fragment of a kind as an object node. */
export function kindNode(kind: SensorKind): AnyNode {
  return objectField(kind.fields, kind.doc === undefined ? {} : { doc: kind.doc });
}
