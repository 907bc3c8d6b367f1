import type { DesignReport } from './designReport.js';

/** JSON cannot hold ±Infinity: an infinite number of degrees of freedom is written as `null`. */
const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

/**
 * A channel's figures with every non-finite number written as `null`. Only a design whose
 * numbers are out of any sensible range has one, and its budget's `finite` check fails then, so
 * the report says so; a script reads the null, never a silent number.
 */
function nonFiniteAsNull(value: unknown): unknown {
  if (typeof value === 'number') return finiteOrNull(value);
  if (Array.isArray(value)) return value.map(nonFiniteAsNull);
  if (typeof value === 'object' && value !== null)
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, nonFiniteAsNull(v)]));
  return value;
}

/**
 * The design report as plain data for `--json`: per channel the budget in the channel's own unit
 * (SI, or µε and °C as the channel states), every line with its model and inputs, the combined
 * uncertainty, noise, resolution, checks and the validated inputs.
 *
 * @remarks
 * Conventions for scripts: numbers are in the channel's `unit` (not the shown unit of the text
 * report, which is given as `shownUnit` with its `shownFactor`); an informative line has
 * `standardUncertainty: null`; `effectiveDegreesOfFreedom: null` means infinitely many; any other
 * `null` figure is not finite (a nonsense design: its `finite` check fails). Each check carries its
 * `status` (`pass`, `warn`, `fail`), figure `value`, threshold `limit` and `unit`. The caller wraps the payload with {@link reportJson}, which adds the generator and the caution and
 * rejects any NaN.
 *
 * @param report - The design report.
 * @returns The payload.
 */
export function designReportPayload(report: DesignReport): Record<string, unknown> {
  return {
    file: report.file,
    project: report.project,
    ok: report.ok,
    channels: report.channels.map((c) => {
      const b = c.budget;
      return nonFiniteAsNull({
        name: c.loaded.name,
        quantity: b.quantity,
        unit: b.unit,
        shownUnit: c.display.unit,
        shownFactor: c.display.factor,
        ok: b.ok,
        span: b.span,
        at: b.at,
        code: b.code,
        quantityPerCode: b.quantityPerCode,
        inputRatioAtPoint: c.point.inputRatio,
        lines: b.lines.map((l) => ({
          name: l.name,
          kind: l.kind,
          value: l.value,
          standardUncertainty: l.standardUncertainty ?? null,
          model: l.model,
          inputs: l.inputs,
        })),
        combined: {
          value: b.combined.value,
          standardUncertainty: b.combined.standardUncertainty,
          coverage: b.combined.coverage,
          coverageFactor: b.combined.coverageFactor,
          expandedUncertainty: b.combined.expandedUncertainty,
          interval: b.combined.interval,
          effectiveDegreesOfFreedom: finiteOrNull(b.combined.effectiveDegreesOfFreedom),
          sensitivities: b.combined.sensitivities,
          contributions: b.combined.contributions,
        },
        noise: b.noise,
        resolution: b.resolution,
        checks: b.checks.map((k) => ({
          id: k.id,
          name: k.name,
          status: k.status,
          ok: k.ok,
          value: finiteOrNull(k.value),
          limit: finiteOrNull(k.limit),
          unit: k.unit,
          message: k.message,
          ...(k.path === undefined ? {} : { path: k.path }),
        })),
        gaugeWatts: b.frontEnd.value.gaugeWatts,
        spec: c.loaded.spec,
      });
    }),
  };
}
