import { BridgeworkError, checkFinite, checkFiniteResult, checkOptions, formatValue } from '@bridgework/core';

/** Options of {@link fitTwoPoint}: a zero point and a span point. */
export interface TwoPointFitOptions {
  /** Load of the zero point, any unit. Default 0. */
  readonly zeroLoad?: number;
  /** Reading at the zero point (V/V, counts, any unit). */
  readonly zeroReading: number;
  /** Load of the span point, same unit as `zeroLoad`; must differ from it. */
  readonly spanLoad: number;
  /** Reading at the span point; must differ from `zeroReading`. */
  readonly spanReading: number;
}

/** A straight line through a zero point and a span point (see {@link fitTwoPoint}). */
export interface TwoPointFit {
  /** Reading per unit load. */
  readonly slope: number;
  /** Reading at load 0 (the line's intercept), in the reading unit. */
  readonly offset: number;
  /**
   * The reading the line gives at a load.
   *
   * @param load - Any finite load.
   */
  readingAt(load: number): number;
  /**
   * The load at which the line gives a reading (exact inverse).
   *
   * @param reading - Any finite reading.
   */
  loadAt(reading: number): number;
}

/**
 * A two-point (zero/span) calibration line: the straight line through two reference points.
 *
 * @remarks
 * slope = (y1 − y0)/(x1 − x0); reading(x) = y0 + slope·(x − x0) and load(y) = x0 + (y − y0)/slope,
 * both formed from the zero point, so the zero point maps back exactly and the round trip is
 * within a few ulps of the span. This is the usual zero/span adjustment of an instrument (common
 * practice); it carries no uncertainty estimate, since two points leave no degrees of freedom: use
 * {@link fitPolynomial} with more points for that.
 *
 * @param options - The zero and span points.
 * @returns The line and its two maps.
 * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type` for a bad number;
 *   `singular` when the two loads or the two readings are equal (no line, or no inverse);
 *   `out-of-range` when the changes, the slope or the offset lie beyond the double range (or the
 *   slope underflows to 0), and from `readingAt`/`loadAt` for a result beyond it.
 * @example
 * ```ts
 * const line = fitTwoPoint({ zeroReading: 1.2e-5, spanLoad: 1000, spanReading: 2.0012e-3 });
 * line.slope; // 1.9892e-6 (V/V per kg)
 * line.loadAt(1.0066e-3); // 500
 * ```
 */
export function fitTwoPoint(options: TwoPointFitOptions): TwoPointFit {
  const o = checkOptions('options', options, {
    known: ['zeroLoad', 'zeroReading', 'spanLoad', 'spanReading'],
    required: ['zeroReading', 'spanLoad', 'spanReading'],
  });
  const x0 = o['zeroLoad'] === undefined ? 0 : checkFinite('zeroLoad', o['zeroLoad']);
  const y0 = checkFinite('zeroReading', o['zeroReading']);
  const x1 = checkFinite('spanLoad', o['spanLoad']);
  const y1 = checkFinite('spanReading', o['spanReading']);
  for (const [param, a, b] of [
    ['spanLoad', x1, x0],
    ['spanReading', y1, y0],
  ] as const) {
    if (a === b) {
      throw new BridgeworkError(
        'singular',
        `\`${param}\` must differ from the zero point's ${param === 'spanLoad' ? 'load' : 'reading'}; got ${formatValue(a)} for both`,
        { param, value: a },
      );
    }
  }
  // Every figure is finite and the slope is not zero: a change or quotient beyond the double range
  // is refused against the option the caller gave.
  const dx = checkFiniteResult(x1 - x0, { what: 'the load change', param: 'spanLoad', value: x1 });
  const dy = checkFiniteResult(y1 - y0, { what: 'the reading change', param: 'spanReading', value: y1 });
  const slope = checkFiniteResult(dy / dx, {
    what: 'the slope (reading change per load change)',
    param: 'spanLoad',
    value: x1,
  });
  if (slope === 0) {
    throw new BridgeworkError(
      'out-of-range',
      `\`spanReading\` must differ from the zero reading by a slope a double can hold over the load change ${formatValue(dx)}; got ${formatValue(y1)}`,
      { param: 'spanReading', value: y1 },
    );
  }
  const offset = checkFiniteResult(y0 - slope * x0, { what: 'the offset', param: 'zeroLoad', value: x0 });
  return {
    slope,
    offset,
    readingAt: (load: number) =>
      checkFiniteResult(y0 + slope * (checkFinite('load', load) - x0), {
        what: 'the reading',
        param: 'load',
        value: load,
      }),
    loadAt: (reading: number) =>
      checkFiniteResult(x0 + (checkFinite('reading', reading) - y0) / slope, {
        what: 'the load',
        param: 'reading',
        value: reading,
      }),
  };
}
