/** An axis of a plot: its label, unit and (optionally) fixed ends. */
export interface PlotAxis {
  /** What the axis shows (`'Load'`, `'Nonlinearity error'`). */
  readonly label: string;
  /** Unit, shown in parentheses after the label (`'kN'`, `'µε'`); omit for dimensionless values. */
  readonly unit?: string;
  /** Lower end; default from the data (rounded out to a tick). */
  readonly min?: number;
  /** Upper end; default from the data (rounded out to a tick). */
  readonly max?: number;
}

/**
 * A rendered SVG plot. Only the plot functions make these, so a report page can embed them as
 * markup without re-checking them.
 */
export interface SvgPlot {
  /** The `<svg>` element, self-contained (styles as attributes, no external references). */
  readonly svg: string;
  /** The plot's id (also its `data-plot` attribute). */
  readonly id: string;
  /** The title, for captions and the page's table of contents. */
  readonly title: string;
  /** Number of series drawn (also the `data-series-count` attribute). */
  readonly seriesCount: number;
}
