import type { DisplayUnit } from '@bridgework/channel';
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport } from '../../html/renderHtmlReport.js';
import { formatNumber, formatStated } from '../../report/formatNumber.js';
import type { CertificateCheck } from './certificateCheck.js';

/**
 * The HTML page of `bridgework check-certificate --html`: the error against load of every run
 * (loading and unloading means over the cycles) inside the class's ±mpe envelope, and the checks.
 *
 * @param check - The check.
 * @param options - Channel, display unit, files, date, generator.
 * @returns The page.
 */
export function certificateHtml(
  check: CertificateCheck,
  options: {
    channel: string;
    display: DisplayUnit;
    channelFile: string;
    certificateFile: string;
    date: string;
    generator: string;
  },
): string {
  const d = options.display;
  const f = d.factor;
  // One line per run, loading then unloading (a hysteresis loop), means over the cycles; a plot
  // holds at most 8 lines, so the first 6 runs and the envelope.
  const series = check.runs.slice(0, 6).map((run, index) => {
    const xs: number[] = [];
    const ys: number[] = [];
    for (const direction of ['up', 'down'] as const) {
      const here = check.errors.filter((e) => e.run === index && e.direction === direction);
      const loads = [...new Set(here.map((e) => e.load))].sort((a, b) =>
        direction === 'up' ? a - b : b - a,
      );
      for (const q of loads) {
        const errors = here.filter((e) => e.load === q).map((e) => e.error);
        xs.push(q * f);
        ys.push((errors.reduce((s, x) => s + x, 0) / errors.length) * f);
      }
    }
    return { name: run.label, x: xs, y: ys };
  });
  const x = check.envelope.map((p) => p.load * f);
  const plot = linePlot({
    id: 'certificate-errors',
    title: `Load cell error against load, class ${check.accuracyClass}${check.intervals} envelope`,
    x: { label: 'Load', unit: d.unit },
    y: { label: 'Indication minus applied load', unit: d.unit },
    series: [
      ...series,
      { name: '+mpe', x, y: check.envelope.map((p) => p.mpe * f), dashed: true, color: '#b00' },
      { name: '−mpe', x, y: check.envelope.map((p) => -p.mpe * f), dashed: true, color: '#b00' },
    ],
  });
  const q = (v: number) => `${formatNumber(v * f, 3)} ${d.unit}`;
  return renderHtmlReport({
    title: 'Load cell certificate against OIML R 60',
    subtitle: `channel ${options.channel}, class ${check.accuracyClass}, nLC ${check.intervals}`,
    meta: [
      { label: 'channel file', value: options.channelFile },
      { label: 'certificate', value: options.certificateFile },
      { label: 'date', value: options.date },
      { label: 'result', value: check.ok ? 'every check passed' : 'a check failed' },
    ],
    sections: [
      {
        title: 'Errors and checks',
        blocks: [
          {
            kind: 'text',
            text: `pLC ${check.apportionment}, Emax ${formatStated(check.capacity * f)} ${d.unit}, measuring range ${formatStated(check.minLoad * f)} to ${formatStated(check.maxLoad * f)} ${d.unit}, v = ${q(check.verificationInterval)}. Each line is one run at one temperature, loading then unloading, the mean over its cycles; the check itself applies the mpe to every reading.${check.runs.length > 6 ? ' The plot shows the first 6 runs.' : ''}`,
          },
          { kind: 'plots', plots: [plot] },
          {
            kind: 'table',
            caption: 'Checks',
            columns: [
              { header: 'check' },
              { header: 'value', align: 'right' },
              { header: 'limit', align: 'right' },
              { header: 'margin', align: 'right' },
              { header: 'result' },
              { header: 'how' },
            ],
            rows: check.checks.map((c) =>
              c.name === 'class declaration'
                ? [c.name, '', '', '', 'fail', c.detail]
                : [c.name, q(c.value), q(c.limit), q(c.margin), c.ok ? 'pass' : 'fail', c.detail],
            ),
          },
        ],
      },
    ],
    generator: options.generator,
  });
}
