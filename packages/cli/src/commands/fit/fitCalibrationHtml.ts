import type { PolynomialFit } from '@bridgework/calibration';
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport, type ReportSection } from '../../html/renderHtmlReport.js';
import type { DisplayUnit } from '@bridgework/channel';
import { formatNumber, formatPercent, formatStated } from '../../report/formatNumber.js';
import type { CalibrationFit } from './calibrationFit.js';

/**
 * The HTML page of `bridgework fit-calibration --html`: the fit, the points table, and two plots
 * (the calibrated channel's error at each point against load, loading and unloading, with the
 * fitted curve's ±1 standard uncertainty; the residuals in mV/V).
 *
 * @param fit - The fit.
 * @param polynomial - The calibration package's fit (for the uncertainty curve).
 * @param options - Display unit, channel file, date, generator.
 * @returns The page.
 */
export function fitCalibrationHtml(
  fit: CalibrationFit,
  polynomial: PolynomialFit,
  options: { display: DisplayUnit; channelFile: string; date: string; generator: string },
): string {
  const d = options.display;
  const f = d.factor;
  // One series per direction and cycle, in load order, so each run draws as its own line.
  const runs = new Map<string, { x: number[]; error: number[]; residual: number[] }>();
  for (const p of fit.points) {
    const key = `${p.direction === 'up' ? 'loading' : 'unloading'}, cycle ${p.cycle}`;
    const run = runs.get(key) ?? { x: [], error: [], residual: [] };
    run.x.push(p.load * f);
    run.error.push(p.error === undefined ? Number.NaN : p.error * f);
    run.residual.push(p.residual * 1e3);
    runs.set(key, run);
  }
  const { min, max } = fit.range;
  const grid = Array.from({ length: 101 }, (_, i) => min + ((max - min) * i) / 100);
  const slope = (q: number) => {
    let s = 0;
    for (let k = fit.coefficients.length - 1; k >= 1; k--) s = s * q + k * (fit.coefficients[k] as number);
    return s;
  };
  const band = grid.map((q) => (polynomial.readingUncertaintyAt(q) / Math.abs(slope(q))) * f);
  const errorPlot = linePlot({
    id: 'calibration-error',
    title: 'Error of the calibrated channel at the points',
    x: { label: 'Load', unit: d.unit },
    y: { label: 'Indicated minus applied', unit: d.unit },
    series: [
      ...[...runs].map(([name, r]) => ({ name, x: r.x, y: r.error })),
      { name: '+u(fit)', x: grid.map((q) => q * f), y: band, dashed: true, color: '#777' },
      { name: '−u(fit)', x: grid.map((q) => q * f), y: band.map((u) => -u), dashed: true, color: '#777' },
    ],
  });
  const residualPlot = linePlot({
    id: 'calibration-residuals',
    title: 'Residuals of the fit',
    x: { label: 'Load', unit: d.unit },
    y: { label: 'Reading minus fit', unit: 'mV/V' },
    series: [...runs].map(([name, r]) => ({ name, x: r.x, y: r.residual })),
  });
  const term = (name: string, t: CalibrationFit['hysteresis']) =>
    t === undefined
      ? [name, '—', '—', '—']
      : [
          name,
          `${formatNumber(t.load * f, 3)} ${d.unit}`,
          formatPercent(t.fractionOfSpan),
          `${formatStated(t.atLoad * f)} ${d.unit}`,
        ];
  const sections: ReportSection[] = [
    {
      title: `Channel ${fit.channel}: degree-${fit.degree} fit of the bridge ratio against load`,
      blocks: [
        {
          kind: 'text',
          text: `r = ${fit.coefficients.map((c, k) => `${formatNumber(c, 8)}${k === 0 ? '' : k === 1 ? '·q' : `·q^${k}`}`).join(' + ')} (V/V, q in ${fit.unit}); residual standard deviation ${fit.residualStandardDeviation === undefined ? '—' : `${formatNumber(fit.residualStandardDeviation * 1e3, 3)} mV/V`}, ${fit.degreesOfFreedom} degrees of freedom; ${fit.points.length} points from ${fit.pointsFile} (SHA-256 ${fit.pointsSha256}).`,
        },
        { kind: 'plots', plots: [errorPlot, residualPlot] },
        {
          kind: 'table',
          caption: 'Error terms of the readings (OIML R 60 terms) and of the fit',
          columns: [
            { header: 'term' },
            { header: `value (${d.unit})`, align: 'right' },
            { header: 'of span', align: 'right' },
            { header: 'at load', align: 'right' },
          ],
          rows: [
            term('nonlinearity', fit.nonlinearity),
            term('hysteresis', fit.hysteresis),
            term('repeatability', fit.repeatability),
            ['largest error at the points', `${formatNumber(fit.largestError * f, 3)} ${d.unit}`, '', ''],
            [
              'largest u(fit) over the span',
              `${formatNumber(fit.largestFitUncertainty * f, 3)} ${d.unit}`,
              '',
              '',
            ],
          ],
        },
        {
          kind: 'table',
          caption: 'Points',
          columns: [
            { header: `load (${d.unit})`, align: 'right' },
            { header: 'run' },
            { header: 'cycle', align: 'right' },
            { header: `reading (${fit.reading})`, align: 'right' },
            { header: 'residual (mV/V)', align: 'right' },
            { header: `error (${d.unit})`, align: 'right' },
            { header: `u(fit) (${d.unit})`, align: 'right' },
          ],
          rows: fit.points.map((p) => [
            formatStated(p.load * f),
            p.direction,
            String(p.cycle),
            formatStated(p.given),
            formatNumber(p.residual * 1e3, 3),
            p.error === undefined ? '—' : formatNumber(p.error * f, 3),
            formatNumber(p.fitUncertainty * f, 2),
          ]),
        },
      ],
    },
  ];
  return renderHtmlReport({
    title: 'Calibration against reference loads',
    subtitle: `channel ${fit.channel}`,
    meta: [
      { label: 'channel file', value: options.channelFile },
      { label: 'points file', value: fit.pointsFile },
      { label: 'date', value: options.date },
    ],
    sections,
    generator: options.generator,
  });
}
