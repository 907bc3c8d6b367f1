import type { DesignReport } from './designReport.js';

/** JSON cannot hold ±Infinity: an infinite number of degrees of freedom is written as `null`. */
const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

/**
 * The design report as plain data for `--json`: per channel the budget in the channel's own unit
 * (SI, or µε and °C as the channel states), every line with its model and inputs, the combined
 * uncertainty, noise, resolution, checks and the validated inputs.
 *
 * @remarks
 * Conventions for scripts: numbers are in the channel's `unit` (not the shown unit of the text
 * report, which is given as `shownUnit` with its `shownFactor`); an informative line has
 * `standardUncertainty: null`; `effectiveDegreesOfFreedom: null` means infinitely many. The
 * caller wraps the payload with {@link reportJson}, which adds the generator and the caution and
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
      return {
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
        inputRatioAtPoint: c.inputRatioAtPoint,
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
        checks: c.checks,
        gaugeWatts: b.frontEnd.value.gaugeWatts,
        spec: c.loaded.spec,
      };
    }),
  };
}
