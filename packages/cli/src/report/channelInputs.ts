import { channelSpecFields, type ChannelSpec } from '@bridgework/channel';
import type { InputGroup, InputRow } from '../html/renderHtmlReport.js';

/** How units of the spec schema are printed for people. */
const unitSymbols: Readonly<Record<string, string>> = {
  ohm: 'Ω',
  degC: '°C',
  'm^2': 'm²',
  'm/s^2': 'm/s²',
  '1': '',
};

/** Units that the schema leaves unnamed (plain numbers) but the field's name states. */
function unitFromName(path: string, quantityUnit: string): string {
  if (path === 'output.range' || path === 'output.firmwareResolution') return quantityUnit;
  if (path === 'zero.code') return 'code';
  if (/VoltsPerRootHz$/.test(path)) return 'V/√Hz';
  if (/AmpsPerRootHz$/.test(path)) return 'A/√Hz';
  if (/PerKelvin$/.test(path)) return '1/K';
  if (/Microstrain$/.test(path)) return 'µε';
  return '';
}

let fieldUnits: Map<string, string> | undefined;

/** The schema's unit of a field path (`sensor.gaugeOhms` is looked up as `sensor<strain-gauge>.gaugeOhms`). */
function schemaUnit(path: string, sensorKind: string): string {
  fieldUnits ??= new Map(channelSpecFields().map((r) => [r.path, r.unit]));
  const key = path.startsWith('sensor.') ? path.replace(/^sensor\./, `sensor<${sensorKind}>.`) : path;
  return fieldUnits.get(key) ?? '';
}

function at(raw: unknown, path: readonly string[]): unknown {
  let x = raw;
  for (const k of path) {
    if (typeof x !== 'object' || x === null || Array.isArray(x)) return undefined;
    x = (x as Record<string, unknown>)[k];
  }
  return x;
}

/** A range `{ min, max }` of the validated spec, shown as `[min, max]` like the file writes it. */
function isInterval(v: unknown): boolean {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && Object.keys(v).join(',') === 'min,max';
}

function valueText(v: unknown): string {
  // The exact value (shortest round-trip text), with a true minus sign.
  if (typeof v === 'number') return String(v).replace(/-/g, '−');
  if (Array.isArray(v)) return `[${v.map(valueText).join(', ')}]`;
  return String(v);
}

/** The text as written in the file, when it differs from the value shown (a quantity with a unit). */
function written(raw: unknown, shown: string): string {
  if (typeof raw === 'string') return raw === shown ? '' : raw;
  if (Array.isArray(raw) && raw.some((x) => typeof x === 'string')) return `[${raw.map(String).join(', ')}]`;
  return '';
}

function rows(
  value: unknown,
  raw: unknown,
  path: string[],
  sensorKind: string,
  quantityUnit: string,
): InputRow[] {
  const interval = isInterval(value);
  if (typeof value === 'object' && value !== null && !Array.isArray(value) && !interval) {
    return Object.entries(value).flatMap(([k, v]) => rows(v, raw, [...path, k], sensorKind, quantityUnit));
  }
  const dotted = path.join('.');
  const rawValue = at(raw, path);
  // Fields in the channel's own unit (output.range) have no fixed unit in the schema.
  const unit = schemaUnit(dotted, sensorKind) === 'output unit' ? '' : schemaUnit(dotted, sensorKind);
  const shown = unitSymbols[unit] ?? unit;
  const text = interval
    ? valueText([(value as { min: number }).min, (value as { max: number }).max])
    : valueText(value);
  const w = written(rawValue, text);
  return [
    {
      name: path.slice(1).join('.') || (path[0] as string),
      value: text,
      unit: shown === '' ? unitFromName(dotted, quantityUnit) : shown,
      note: rawValue === undefined ? 'default' : w === '' ? 'in the file' : `"${w}" in the file`,
    },
  ];
}

/**
 * The inputs of a channel as tables for the HTML report: every field of the validated spec
 * (defaults applied), grouped by section (sensor, bridge, excitation...), with its SI value and
 * unit, and whether it was written in the file (with the text as written when it carried a unit,
 * e.g. `"35 m" in the file`) or is a default.
 *
 * @param spec - The validated spec.
 * @param raw - The channel's entry as written in the file.
 * @param quantityUnit - The channel's output unit (for `output.range`).
 * @returns One group per section of the spec, in the spec's order.
 */
export function channelInputs(spec: ChannelSpec, raw: unknown, quantityUnit: string): InputGroup[] {
  const groups: InputGroup[] = [];
  const loose: InputRow[] = [];
  for (const [key, value] of Object.entries(spec)) {
    if (key === 'name') continue;
    const r = rows(value, raw, [key], spec.sensor.kind, quantityUnit);
    if (typeof value === 'object' && value !== null && !Array.isArray(value))
      groups.push({ title: key, rows: r });
    else loose.push(...r);
  }
  if (loose.length > 0) groups.push({ title: 'other', rows: loose });
  return groups;
}
