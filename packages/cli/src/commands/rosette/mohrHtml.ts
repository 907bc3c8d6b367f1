/**
 * The HTML page of `bridgework reduce-rosette --html`: Mohr's circle of strain (and of stress,
 * with E and ν) for one row of the recording, with the legs and the x–y diameter on it.
 */
import { linePlot } from '../../html/linePlot.js';
import type { SvgPlot } from '../../html/plotTypes.js';
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

/** A point of Mohr's circle: normal component, half shear component (strain) or shear (stress). */
export interface MohrPoint {
  readonly x: number;
  readonly y: number;
}

/** Mohr's circle of a plane state from its principal values and the direction of the larger one. */
export interface MohrCircle {
  /** Centre on the normal axis and radius (half the difference of the principal values). */
  readonly centre: number;
  readonly radius: number;
  /** The direction of the larger principal value, rad, in the layout's frame. */
  readonly theta1: number;
  /** The state of the direction θ (rad, counterclockwise, in the frame of the layout's angles). */
  at(theta: number): MohrPoint;
}

/**
 * Mohr's circle from the principal values p1 ≥ p2 and the direction θ1 of p1 in the layout's
 * frame: the direction θ plots at (p(θ), q(θ)) with p(θ) = c + R·cos 2(θ − θ1) and
 * q(θ) = −R·sin 2(θ − θ1), c = (p1 + p2)/2, R = (p1 − p2)/2 — the transformation equations of
 * plane strain (q = γ/2, the half engineering shear strain of the directions θ and θ + 90°) and of
 * plane stress (q = τ), written from the principal frame (any mechanics text; Dally & Riley,
 * _Experimental Stress Analysis_, ch. on strain analysis — from memory). A turn of the direction
 * by θ counterclockwise moves its point by 2θ clockwise on this plot.
 *
 * @param p1 - The larger principal value.
 * @param p2 - The smaller principal value.
 * @param theta1 - The direction of p1, rad (0 when p1 = p2: every direction is principal).
 * @returns The circle.
 */
export function mohrCircle(p1: number, p2: number, theta1: number): MohrCircle {
  const centre = (p1 + p2) / 2;
  const radius = (p1 - p2) / 2;
  return {
    centre,
    radius,
    theta1,
    at: (theta) => ({
      x: centre + radius * Math.cos(2 * (theta - theta1)),
      y: -radius * Math.sin(2 * (theta - theta1)),
    }),
  };
}

/**
 * The strain circle of a reduced row, in its layout's frame: the direction of ε1 is the row's
 * angle from leg a plus leg a's own angle. Each leg's point lies at its reduced strain.
 *
 * @param anglesRadians - The legs' directions, rad.
 * @param reduced - The reduced row.
 * @returns The circle.
 */
export function rowStrainCircle(
  anglesRadians: readonly [number, number, number],
  reduced: ReducedRow,
): MohrCircle {
  const fromLegA = Number.isNaN(reduced.angleRadians) ? 0 : reduced.angleRadians;
  return mohrCircle(reduced.strain1, reduced.strain2, fromLegA + anglesRadians[0]);
}

/** What one Mohr plot shows, in the page's unit (values divided by `perUnit`). */
interface MohrPlotOptions {
  readonly id: string;
  readonly title: string;
  readonly x: string;
  readonly y: string;
  readonly unit: string;
  readonly perUnit: number;
  readonly circle: MohrCircle;
  /** Directions drawn as radii from the centre, with their names (the legs). */
  readonly directions: readonly { readonly name: string; readonly theta: number }[];
}

/**
 * One Mohr plot: the circle (181 points), the principal diameter, the x–y diameter (the states of
 * the directions 0 and 90° of the layout's frame) and a radius to each named direction.
 */
function mohrPlot(o: MohrPlotOptions): SvgPlot {
  const u = (v: number) => v / o.perUnit;
  const { centre, radius } = o.circle;
  const span = Math.max(Math.abs(radius), Math.abs(centre) * 1e-6, 1e-300) * 1.25;
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i <= 180; i++) {
    const phi = (2 * Math.PI * i) / 180;
    x.push(u(centre + radius * Math.cos(phi)));
    y.push(u(radius * Math.sin(phi)));
  }
  const px = o.circle.at(0);
  const py = o.circle.at(Math.PI / 2);
  return linePlot({
    id: o.id,
    title: o.title,
    x: { label: o.x, unit: o.unit, min: u(centre - span), max: u(centre + span) },
    y: { label: o.y, unit: o.unit, min: u(-span), max: u(span) },
    width: 480,
    height: 480,
    series: [
      { name: 'circle', x, y },
      {
        name: 'principal diameter',
        x: [u(centre - Math.abs(radius)), u(centre + Math.abs(radius))],
        y: [0, 0],
        dashed: true,
        color: '#777',
      },
      {
        name: 'x–y diameter (0°, 90°)',
        x: [u(px.x), u(py.x)],
        y: [u(px.y), u(py.y)],
        dashed: true,
        color: '#b35',
      },
      ...o.directions.map((d) => {
        const p = o.circle.at(d.theta);
        return { name: d.name, x: [u(centre), u(p.x)], y: [0, u(p.y)] };
      }),
    ],
  });
}

/**
 * Mohr's circle of a reduced row: of strain, in the plane of normal strain ε and half the
 * engineering shear γ/2, with each leg as a radius to the point of its direction and the x–y
 * diameter; with stresses, the stress circle likewise from σ1 and σ2 (the principal directions of
 * stress and strain coincide in an isotropic material). See {@link mohrCircle} for the convention.
 *
 * @param page - The row and its context.
 * @returns The page.
 */
export function mohrHtml(page: MohrPage): string {
  const r = page.reduced;
  const s = (x: number) => x / page.perStrain;
  const strainCircle = rowStrainCircle(page.anglesRadians, r);
  const plots = [
    mohrPlot({
      id: 'mohr-strain',
      title: `Mohr's circle of strain, row ${page.row}`,
      x: 'Normal strain ε',
      y: 'Half shear γ/2',
      unit: page.strainUnit,
      perUnit: page.perStrain,
      circle: strainCircle,
      directions: page.anglesRadians.map((t, i) => ({
        name: `leg ${'abc'[i]} (${formatNumber((t * 180) / Math.PI, 4)}°)`,
        theta: t,
      })),
    }),
  ];
  const st = r.stresses;
  if (st !== undefined) {
    plots.push(
      mohrPlot({
        id: 'mohr-stress',
        title: `Mohr's circle of stress, row ${page.row}`,
        x: 'Normal stress σ',
        y: 'Shear stress τ',
        unit: page.stressUnit,
        perUnit: page.pascalsPerUnit,
        circle: mohrCircle(st.stress1, st.stress2, strainCircle.theta1),
        directions: [],
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
