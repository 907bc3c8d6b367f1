/**
 * The HTML page of `bridgework reduce-member --html`: the section resultants over the whole
 * recording, drawn from a bounded envelope (the smallest and largest value of each series in at
 * most {@link MAX_BUCKETS} buckets of rows), and the gauges as read.
 */
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport } from '../../html/renderHtmlReport.js';
import { formatNumber } from '../../report/formatNumber.js';

/** The most buckets an envelope keeps: its memory does not grow with the recording. */
export const MAX_BUCKETS = 1000;

/**
 * The smallest and largest value of each series per bucket of consecutive rows. When the buckets
 * fill, neighbours merge and each bucket covers twice the rows, so the envelope of 10 rows or of
 * 10⁷ rows is at most {@link MAX_BUCKETS} buckets, and no extreme of any row is lost.
 */
export class RowEnvelope {
  private rowsPerBucket = 1;
  /** Each bucket's index: it covers rows key·rowsPerBucket + 1 … (key + 1)·rowsPerBucket. */
  private keys: number[] = [];
  private low: number[][];
  private high: number[][];

  /** @param series - The number of series. */
  constructor(private readonly series: number) {
    this.low = Array.from({ length: series }, () => []);
    this.high = Array.from({ length: series }, () => []);
  }

  /** Adds row `row` (from 1, increasing) with one value per series; a row with a NaN is left out. */
  add(row: number, values: readonly number[]): void {
    if (values.some((v) => Number.isNaN(v))) return;
    let key = Math.floor((row - 1) / this.rowsPerBucket);
    if (this.keys.length > 0 && this.keys[this.keys.length - 1] === key) {
      const last = this.keys.length - 1;
      for (let s = 0; s < this.series; s++) {
        const lo = this.low[s] as number[];
        const hi = this.high[s] as number[];
        lo[last] = Math.min(lo[last] as number, values[s] as number);
        hi[last] = Math.max(hi[last] as number, values[s] as number);
      }
      return;
    }
    if (this.keys.length === MAX_BUCKETS) {
      this.coarsen();
      key = Math.floor((row - 1) / this.rowsPerBucket);
      if (this.keys[this.keys.length - 1] === key) {
        this.add(row, values);
        return;
      }
    }
    this.keys.push(key);
    for (let s = 0; s < this.series; s++) {
      (this.low[s] as number[]).push(values[s] as number);
      (this.high[s] as number[]).push(values[s] as number);
    }
  }

  /** Doubles the rows per bucket, merging the buckets that now share an index. */
  private coarsen(): void {
    this.rowsPerBucket *= 2;
    const keys: number[] = [];
    const low: number[][] = this.low.map(() => []);
    const high: number[][] = this.high.map(() => []);
    this.keys.forEach((k, i) => {
      const key = Math.floor(k / 2);
      const same = keys.length > 0 && keys[keys.length - 1] === key;
      if (!same) keys.push(key);
      for (let s = 0; s < this.series; s++) {
        const lo = this.low[s]?.[i] as number;
        const hi = this.high[s]?.[i] as number;
        const l = low[s] as number[];
        const h = high[s] as number[];
        if (same) {
          l[l.length - 1] = Math.min(l[l.length - 1] as number, lo);
          h[h.length - 1] = Math.max(h[h.length - 1] as number, hi);
        } else {
          l.push(lo);
          h.push(hi);
        }
      }
    });
    this.keys = keys;
    this.low = low;
    this.high = high;
  }

  /** The number of buckets held (at most {@link MAX_BUCKETS}). */
  get buckets(): number {
    return this.keys.length;
  }

  /**
   * One series as a polyline through each bucket's extremes (low then high at the bucket's first
   * row): a vertical stroke per bucket spanning the rows it covers.
   */
  polyline(s: number): { x: number[]; y: number[] } {
    const x: number[] = [];
    const y: number[] = [];
    this.keys.forEach((key, i) => {
      const row = key * this.rowsPerBucket + 1;
      x.push(row, row);
      y.push(this.low[s]?.[i] as number, this.high[s]?.[i] as number);
    });
    return { x, y };
  }

  /** The extremes of a series over every row added. */
  range(s: number): { min: number; max: number } {
    let min = Number.POSITIVE_INFINITY;
    let max = Number.NEGATIVE_INFINITY;
    for (const v of this.low[s] as number[]) min = Math.min(min, v);
    for (const v of this.high[s] as number[]) max = Math.max(max, v);
    return { min, max };
  }
}

/** What the member page shows. */
export interface MemberPage {
  readonly recording: string;
  readonly sectionText: string;
  readonly gauges: readonly { column: string; y: number; z: number; angleDegrees: number }[];
  /** The series: name, unit text, and which plot (force or moment). */
  readonly series: readonly { name: string; unit: string; plot: 'force' | 'moment' }[];
  readonly envelope: RowEnvelope;
  readonly rows: number;
  readonly conditionNumber: number;
  /** `bridgework <version>`. */
  readonly generator: string;
}

/**
 * The page: the axial force, and the moments and torque, against the row, and a table of the gauges.
 *
 * @param page - The envelope and its context.
 * @returns The page.
 */
export function memberHtml(page: MemberPage): string {
  const plots = (['force', 'moment'] as const).flatMap((kind) => {
    const chosen = page.series.map((s, i) => ({ ...s, i })).filter((s) => s.plot === kind);
    if (chosen.length === 0 || page.envelope.buckets === 0) return [];
    return [
      linePlot({
        id: `member-${kind}`,
        title: kind === 'force' ? 'Axial force over the recording' : 'Moments and torque over the recording',
        x: { label: 'Row', unit: '' },
        y: { label: kind === 'force' ? 'Force' : 'Moment', unit: chosen[0]?.unit ?? '' },
        width: 760,
        series: chosen.map((s) => ({ name: s.name, ...page.envelope.polyline(s.i) })),
      }),
    ];
  });
  const mm = (m: number) => formatNumber(m * 1e3, 5);
  return renderHtmlReport({
    title: 'Member: section resultants',
    subtitle: page.recording,
    meta: [
      { label: 'recording', value: `${page.recording} (${page.rows} rows)` },
      { label: 'section', value: page.sectionText },
      { label: 'condition number', value: formatNumber(page.conditionNumber, 3) },
    ],
    sections: [
      {
        title: 'Resultants',
        blocks: [
          {
            kind: 'text',
            text: `Each stroke spans the smallest and largest value of the rows it covers (${page.envelope.buckets} strokes for ${page.rows} rows), so no extreme is lost.`,
          },
          { kind: 'plots', plots },
          {
            kind: 'table',
            columns: [
              { header: 'resultant' },
              { header: 'smallest', align: 'right' },
              { header: 'largest', align: 'right' },
            ],
            rows: page.series.map((s, i) => {
              const r = page.envelope.range(i);
              return [s.name, `${formatNumber(r.min, 5)} ${s.unit}`, `${formatNumber(r.max, 5)} ${s.unit}`];
            }),
          },
        ],
      },
      {
        title: 'Gauges',
        blocks: [
          {
            kind: 'table',
            columns: [
              { header: 'column' },
              { header: 'y (mm)', align: 'right' },
              { header: 'z (mm)', align: 'right' },
              { header: 'direction from the axis', align: 'right' },
            ],
            rows: page.gauges.map((g) => [g.column, mm(g.y), mm(g.z), `${formatNumber(g.angleDegrees, 4)}°`]),
          },
        ],
      },
    ],
    generator: page.generator,
  });
}
