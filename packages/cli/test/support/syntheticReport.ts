/**
 * TEST ONLY: a report page built from synthetic plot data (invented curves, not channel results)
 * to exercise the plotting module and the page template. The numbers mean nothing physically.
 */
import { barChart } from '../../src/html/barChart.js';
import { linePlot } from '../../src/html/linePlot.js';
import { renderHtmlReport } from '../../src/html/renderHtmlReport.js';

export interface SyntheticPlotExpectation {
  readonly id: string;
  readonly series: readonly string[];
  readonly axes: readonly string[];
}

export function syntheticReport(): { html: string; plots: readonly SyntheticPlotExpectation[] } {
  const n = 101;
  const load = Array.from({ length: n }, (_, i) => i); // 0 … 100 (synthetic abscissa)
  const curve = load.map((x) => 0.02 * x - 1.2e-5 * x * x); // an invented, slightly bent curve
  const line = load.map((x) => 0.02 * x - 1.2e-3 * x); // its end-point line
  const error = load.map((x, i) => (i > 90 ? NaN : (curve[i] as number) - (line[i] as number) + 0 * x)); // gap at the end
  const output = linePlot({
    id: 'output',
    title: 'Output against load',
    x: { label: 'Load', unit: 'kN' },
    y: { label: 'Output', unit: 'mV/V' },
    series: [
      { name: 'exact', x: load, y: curve },
      { name: 'linear (end points)', x: load, y: line, dashed: true },
    ],
  });
  const nonlinearity = linePlot({
    id: 'nonlinearity',
    title: 'Nonlinearity error',
    x: { label: 'Load', unit: 'kN' },
    y: { label: 'Error', unit: 'µV/V' },
    series: [{ name: 'exact − linear', x: load, y: error.map((e) => e * 1000) }],
  });
  const budget = barChart({
    id: 'budget',
    title: 'Error budget (standard uncertainties)',
    categories: [
      'noise (amplifier, Johnson, quantization)',
      'resolution',
      'nonlinearity of a linear map',
      'lead desensitization',
      'temperature: gauge thermal output over the stated range',
      'gain tolerance',
      'offset',
      'combined standard uncertainty',
    ],
    value: { label: 'Standard uncertainty', unit: 'µε' },
    series: [{ name: 'u', values: [0.42, 0.03, 1.9, -0.8, 3.1, 2.2, 0.6, 4.4] }],
    emphasize: [7],
  });
  const noise = barChart({
    id: 'noise',
    title: 'Noise contributions',
    categories: [
      'amplifier voltage noise',
      'amplifier current noise',
      'bridge Johnson noise',
      'quantization',
    ],
    value: { label: 'Noise referred to the output', unit: 'µε' },
    series: [
      { name: 'rms', values: [0.21, 0.02, 0.09, 0.05] },
      { name: 'peak-to-peak', values: [1.39, 0.13, 0.59, 0.33] },
    ],
  });
  const html = renderHtmlReport({
    title: 'Synthetic plots: test page',
    subtitle: 'Invented curves that exercise the report template; not a channel result.',
    meta: [
      { label: 'channel file', value: 'synthetic.yaml' },
      { label: 'date', value: '2026-01-01' },
    ],
    generator: 'bridgework test',
    sections: [
      {
        title: 'synthetic-channel',
        blocks: [
          { kind: 'text', text: 'Every curve on this page is synthetic.' },
          {
            kind: 'checks',
            checks: [
              { name: 'amplifier headroom', status: 'pass', detail: 'peak input 3.1 mV of 19.5 mV' },
              {
                name: 'share of the converter range',
                status: 'warn',
                detail: 'the span uses 2 % (threshold 5 %)',
              },
              { name: 'converter headroom', status: 'fail', detail: 'peak code 8 390 000 of 8 388 607' },
            ],
          },
          { kind: 'plots', plots: [output, nonlinearity, budget, noise] },
          {
            kind: 'table',
            caption: 'Budget',
            columns: [{ header: 'source' }, { header: 'u (µε)', align: 'right' }],
            rows: [
              ['noise', '0.42'],
              ['combined', '4.4'],
            ],
          },
          {
            kind: 'inputs',
            groups: [
              {
                title: 'sensor',
                rows: [
                  { name: 'gaugeFactor', value: '2.1', note: 'from the file' },
                  { name: 'gaugeOhms', value: '350', unit: 'Ω', note: 'from the file' },
                ],
              },
              {
                title: 'excitation',
                rows: [{ name: 'volts', value: '5', unit: 'V', note: 'from the file' }],
              },
            ],
          },
        ],
      },
    ],
  });
  return {
    html,
    plots: [
      { id: 'output', series: ['exact', 'linear (end points)'], axes: ['Load (kN)', 'Output (mV/V)'] },
      { id: 'nonlinearity', series: ['exact − linear'], axes: ['Load (kN)', 'Error (µV/V)'] },
      { id: 'budget', series: ['u'], axes: ['Standard uncertainty (µε)'] },
      { id: 'noise', series: ['rms', 'peak-to-peak'], axes: ['Noise referred to the output (µε)'] },
    ],
  };
}
