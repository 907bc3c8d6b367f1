/**
 * The sections a test day writes into a channel file: the span correction from a shunt
 * calibration, and a calibration fitted against reference loads. Both change the channel's map
 * (see internal/resolve.ts and internal/calibrationMap.ts); the rest of each section is
 * provenance (when, with what, from which readings).
 */
import { defaultOutputUnit, outputQuantities, type OutputQuantity } from '../outputQuantities.js';
import { calibrationProblem } from '../internal/calibrationPolynomial.js';
import {
  choiceField,
  intervalField,
  numberField,
  numberListField,
  objectField,
  report,
  textField,
  type ParseContext,
  type UnitRule,
} from './schema.js';

const provenance = {
  date: textField({
    optional: true,
    maxLength: 40,
  }),
  note: textField({ optional: true, maxLength: 500 }),
};

/** The output quantity parsed so far, if valid. */
function quantityOf(ctx: ParseContext): OutputQuantity | undefined {
  const q = ctx.parsed.get('output.quantity');
  return typeof q === 'string' && (outputQuantities as readonly string[]).includes(q)
    ? (q as OutputQuantity)
    : undefined;
}

/**
 * `spanCorrection` and `calibration`, the sections of a channel that a test day writes.
 *
 * @param outputUnitRule - The unit rule of the channel's output unit (for `calibration.range`).
 */
export function testDayFields(outputUnitRule: UnitRule) {
  return {
    spanCorrection: objectField(
      {
        factor: numberField({
          doc: 'Span factor k = expected shunt step / measured shunt step; every change of the code from the zero-input code is multiplied by k (the channel converts as if its gain were amplifier.gain / k)',
          min: 0.5,
          max: 2,
        }),
        factorStandardUncertainty: numberField({
          min: 0,
          optional: true,
        }),
        shuntOhms: numberField({
          unit: { dimension: 'resistance' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        arm: numberField({
          integer: true,
          min: 1,
          max: 4,
          optional: true,
        }),
        placement: choiceField(['gauge', 'instrument'] as const, {
          optional: true,
        }),
        expectedStepCodes: numberField({
          optional: true,
        }),
        measuredStepCodes: numberField({
          optional: true,
        }),
        readings: numberField({
          integer: true,
          min: 1,
          optional: true,
        }),
        ...provenance,
      },
      {
        presence: 'optional',
      },
    ),
    calibration: objectField(
      {
        unit: textField({
          doc: 'The unit of the quantity in the coefficients; must equal output.unit',
          maxLength: 20,
        }),
        coefficients: numberListField({
          doc: 'Bridge ratio (V/V) as a polynomial of the quantity q: c0 + c1·q + c2·q² + c3·q³ (degree 1 to 3)',
          minLength: 2,
          maxLength: 4,
          item: { doc: 'coefficient' },
        }),
        covariance: numberListField({
          minLength: 4,
          maxLength: 16,
          item: { doc: 'covariance entry' },
          optional: true,
        }),
        range: intervalField({ doc: 'The reference loads’ span', unit: outputUnitRule }),
        extrapolationFraction: numberField({
          min: 0,
          max: 1,
          default: 0.05,
        }),
        residualStandardDeviation: numberField({
          min: 0,
          optional: true,
        }),
        points: numberField({ integer: true, min: 2, optional: true }),
        pointsFile: textField({
          optional: true,
          maxLength: 500,
        }),
        pointsSha256: textField({
          pattern: /^[0-9a-f]{64}$/,
          optional: true,
        }),
        ...provenance,
      },
      {
        presence: 'optional',
        check(value, path, ctx) {
          const q = quantityOf(ctx);
          if (q === undefined) return;
          if (q === 'ratio') {
            report(
              ctx,
              path,
              'invalid-option',
              "does not apply to output 'ratio' (the calibration maps the ratio to a quantity)",
            );
            return;
          }
          const given = ctx.parsed.get('output.unit');
          const unit = typeof given === 'string' ? given : defaultOutputUnit(q);
          if (value.unit !== unit) {
            report(
              ctx,
              `${path}.unit`,
              'conflicting-options',
              `must equal output.unit ('${unit}'), the unit the coefficients were fitted in; got '${value.unit}'`,
              { suggestion: `set output.unit back to '${value.unit}', or fit the calibration again` },
            );
            return;
          }
          const n = value.coefficients.length;
          if (value.covariance !== undefined && value.covariance.length !== n * n) {
            report(
              ctx,
              `${path}.covariance`,
              'invalid-shape',
              `must hold ${n * n} numbers (${n}×${n}, row by row) for ${n} coefficients; got ${value.covariance.length}`,
            );
            return;
          }
          const problem = calibrationProblem(value);
          if (problem !== undefined) report(ctx, `${path}.${problem.field}`, problem.code, problem.message);
        },
      },
    ),
  };
}
