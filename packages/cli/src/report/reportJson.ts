import { BridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../caution.js';

/** Options of {@link reportJson}. */
export interface ReportJsonOptions {
  /** The tool and version (`'bridgework 0.1.0'`), recorded as `generator`. */
  readonly generator: string;
}

function checkFiniteDeep(value: unknown, path: string): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new BridgeworkError(
        'not-finite',
        `\`${path}\` must be a finite number in a JSON report; got ${value}`,
        {
          param: path,
          value,
        },
      );
    }
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => checkFiniteDeep(v, `${path}[${i}]`));
  } else if (typeof value === 'object' && value !== null) {
    for (const [k, v] of Object.entries(value)) checkFiniteDeep(v, path === '' ? k : `${path}.${k}`);
  }
}

/**
 * Serialises a report for scripts: `{ generator, caution, ...payload }` as indented JSON with a
 * final newline.
 *
 * @remarks
 * The safety caution is a field of every JSON report, so it travels with the numbers. NaN and
 * ±Infinity are rejected rather than written as `null` (what `JSON.stringify` would do
 * silently): a non-finite number in a report is a defect upstream.
 *
 * @param payload - The report's content (must not use the keys `generator` or `caution`).
 * @param options - The generator.
 * @returns The JSON text.
 * @throws {@link @bridgework/core!BridgeworkError} `not-finite` naming the path of a NaN or ±Infinity;
 * `conflicting-options` when the payload has its own `generator` or `caution`.
 * @example
 * ```ts
 * reportJson({ channels: [] }, { generator: 'bridgework 0.1.0' });
 * // '{\n  "generator": "bridgework 0.1.0",\n  "caution": "Results support, ...",\n  "channels": []\n}\n'
 * ```
 */
export function reportJson(payload: Readonly<Record<string, unknown>>, options: ReportJsonOptions): string {
  for (const key of ['generator', 'caution']) {
    if (Object.hasOwn(payload, key)) {
      throw new BridgeworkError('conflicting-options', `\`payload.${key}\` is set by reportJson itself`, {
        param: `payload.${key}`,
      });
    }
  }
  checkFiniteDeep(payload, '');
  return `${JSON.stringify({ generator: options.generator, caution: SAFETY_CAUTION, ...payload }, null, 2)}\n`;
}

/**
 * Appends the safety caution to a text report, after a blank line.
 *
 * @param text - The report (with or without a final newline).
 * @returns The report followed by the caution and a newline.
 * @example
 * ```ts
 * appendCaution('north-cell  0.42 µε\n'); // 'north-cell  0.42 µε\n\nResults support, and do not replace, ...\n'
 * ```
 */
export function appendCaution(text: string): string {
  return `${text.replace(/\n*$/, '\n')}\n${SAFETY_CAUTION}\n`;
}
