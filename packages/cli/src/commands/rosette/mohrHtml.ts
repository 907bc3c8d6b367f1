/**
 * The HTML page of `bridgework reduce-rosette --html`: Mohr's circle of strain (and of stress,
 * with E and ν) for one row of the recording, with the legs and the x–y diameter on it.
 */
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport } from '../../html/renderHtmlReport.js';
import { formatNumber } from '../../report/formatNumber.js';
import type { ReducedRow } from './rosetteRows.js';

/** The row drawn and what the page says about it. */
export interface MohrPage {
  /** The recording. */
  readonly recording: string;
  /** The data row (from 1) and its line in the file. */
  readonly row: number;
  readonly line: number;
  /** Why this row: chosen, or the largest von Mises stress / shear strain. */
  readonly why: string;
  /** The legs' directions, rad, and the reduced row. */
  readonly anglesRadians: readonly [number, number, number];
  readonly reduced: ReducedRow;
  /** Strain unit text and its size in m/m; stress unit text and its size in Pa. */
  readonly strainUnit: string;
  readonly perStrain: number;
  readonly stressUnit: string;
  readonly pascalsPerUnit: number;
  /** `bridgework <version>`. */
  readonly generator: string;
}

/** Points of a circle of centre c and radius r (181 points), for a line plot. */
function circle(c: number, r: number): { x: number[]; y: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i <= 180; i++) {
    const phi = (2 * Math.PI * i) / 180;
    x.push(c + r * Math.cos(phi));
    y.push(r * Math.sin(phi));
  }
  return { x, y };
}

/**
 * Mohr's circle of a reduced row: centre (ε1 + ε2)/2, radius (ε1 − ε2)/2 in the plane of normal
 * strain ε and half the engineering shear γ/2; each leg at θ plots at (ε(θ), −γ(θ)/2), the
 * diameter from (εx, −γxy/2) to (εy, γxy/2) (clockwise-positive shear on the vertical axis, the
 * usual drawing convention). With stresses, the stress circle likewise from σ1 and σ2.
 *
 * @param page - The row and its context.
 * @returns The page.
 */
export function mohrHtml(page: MohrPage): string {
  const r = page.reduced;
  const s = (x: number) => x / page.perStrain;
  const c = (r.strain1 + r.strain2) / 2;
  const R = (r.strain1 - r.strain2) / 2;
  // The strain state back from the principal values and the direction (from leg a).
  const th = Number.isNaN(r.angleRadians) ? 0 : r.angleRadians;
  const strainAt = (t: number) => c + R * Math.cos(2 * (t - th));
  const halfShearAt = (t: number) => -R * Math.sin(2 * (t - th));
  const legs = page.anglesRadians.map((t) => ({ x: s(strainAt(t)), y: s(halfShearAt(t)) }));
  const span = Math.max(Math.abs(R), 1e-300) * 1.25;
  const strainCircle = circle(s(c), s(R));
  const plots = [
    linePlot({
      id: 'mohr-strain',
      title: `Mohr's circle of strain, row ${page.row}`,
      x: { label: 'Normal strain ε', unit: page.strainUnit, min: s(c - span), max: s(c + span) },
      y: { label: 'Half shear γ/2', unit: page.strainUnit, min: s(-span), max: s(span) },
      width: 480,
      height: 480,
      series: [
        { name: 'circle', x: strainCircle.x, y: strainCircle.y },
        {
          name: 'principal diameter',
          x: [s(r.strain2), s(r.strain1)],
          y: [0, 0],
          dashed: true,
          color: '#777',
        },
        ...legs.map((p, i) => ({
          name: `leg ${'abc'[i]} (${formatNumber(((page.anglesRadians[i] as number) * 180) / Math.PI, 4)}°)`,
          x: [s(c), p.x],
          y: [0, p.y],
        })),
      ],
    }),
  ];
  const st = r.stresses;
  if (st !== undefined) {
    const u = (x: number) => x / page.pascalsPerUnit;
    const sc = (st.stress1 + st.stress2) / 2;
    const sr = (st.stress1 - st.stress2) / 2;
    const sspan = Math.max(Math.abs(sr), Math.abs(sc) * 1e-6, 1e-300) * 1.25;
    const stressCircle = circle(u(sc), u(sr));
    plots.push(
      linePlot({
        id: 'mohr-stress',
        title: `Mohr's circle of stress, row ${page.row}`,
        x: { label: 'Normal stress σ', unit: page.stressUnit, min: u(sc - sspan), max: u(sc + sspan) },
        y: { label: 'Shear stress τ', unit: page.stressUnit, min: u(-sspan), max: u(sspan) },
        width: 480,
        height: 480,
        series: [
          { name: 'circle', x: stressCircle.x, y: stressCircle.y },
          {
            name: 'principal diameter',
            x: [u(st.stress2), u(st.stress1)],
            y: [0, 0],
            dashed: true,
            color: '#777',
          },
        ],
      }),
    );
  }
  const f = (x: number) => formatNumber(x, 6);
  return renderHtmlReport({
    title: "Rosette: Mohr's circle",
    subtitle: `${page.recording}, row ${page.row}`,
    meta: [
      { label: 'recording', value: page.recording },
      { label: 'row', value: `${page.row} (line ${page.line}): ${page.why}` },
    ],
    sections: [
      {
        title: `Row ${page.row}`,
        blocks: [
          {
            kind: 'table',
            columns: [{ header: 'quantity' }, { header: 'value', align: 'right' }],
            rows: [
              ...r.legs.map((x, i) => [`leg ${'abc'[i]} as reduced`, `${f(s(x))} ${page.strainUnit}`]),
              ['ε1', `${f(s(r.strain1))} ${page.strainUnit}`],
              ['ε2', `${f(s(r.strain2))} ${page.strainUnit}`],
              ['γmax', `${f(s(r.maxShearStrain))} ${page.strainUnit}`],
              [
                'direction of ε1 from leg a',
                Number.isNaN(r.angleRadians) ? '— (ε1 = ε2)' : `${f((r.angleRadians * 180) / Math.PI)}°`,
              ],
              ...(st === undefined
                ? []
                : [
                    ['σ1', `${f(st.stress1 / page.pascalsPerUnit)} ${page.stressUnit}`],
                    ['σ2', `${f(st.stress2 / page.pascalsPerUnit)} ${page.stressUnit}`],
                    ['τmax (in-plane)', `${f(st.maxShear / page.pascalsPerUnit)} ${page.stressUnit}`],
                    ['von Mises', `${f(st.vonMises / page.pascalsPerUnit)} ${page.stressUnit}`],
                    ['Tresca', `${f(st.tresca / page.pascalsPerUnit)} ${page.stressUnit}`],
                  ]),
            ],
          },
          { kind: 'plots', plots },
        ],
      },
    ],
    generator: page.generator,
  });
}
