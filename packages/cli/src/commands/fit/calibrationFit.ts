/** The result of `bridgework fit-calibration` (the JSON payload's shape). */
import type { CalibrationPoint, ErrorTerm } from './loadCellErrors.js';

/** One point of the fit report. */
export interface FittedPoint extends CalibrationPoint {
  /** The reading as written in the points file. */
  readonly given: number;
  /** Reading minus fitted reading, V/V. */
  readonly residual: number;
  /**
   * The load the calibrated channel indicates for this reading minus the load applied (channel
   * unit); for a fit without an inverse, the residual over the fit's slope, or undefined where the
   * slope vanishes.
   */
  readonly error: number | undefined;
  /** Standard uncertainty of the fitted curve at this load, in load (channel unit). */
  readonly fitUncertainty: number;
}

/** An error term in the reading's unit, in load and as a fraction of the span. */
export interface ErrorFigure extends ErrorTerm {
  /** In load (channel unit): the reading's value over the mean slope of the span. */
  readonly load: number;
  /** As a fraction of the span's reading. */
  readonly fractionOfSpan: number;
}

/** The fit of one channel's calibration (the JSON payload). */
export interface CalibrationFit {
  /** The channel. */
  readonly channel: string;
  /** The channel's unit (loads, errors). */
  readonly unit: string;
  /** The polynomial degree. */
  readonly degree: number;
  /** What the reading column held. */
  readonly reading: 'codes' | 'mV/V' | 'V/V';
  /** The points file and its SHA-256. */
  readonly pointsFile: string;
  /** SHA-256 of its bytes. */
  readonly pointsSha256: string;
  /** Coefficients c0…cd: bridge ratio (V/V) against load (channel unit). */
  readonly coefficients: readonly number[];
  /** Their covariance. */
  readonly covariance: readonly (readonly number[])[];
  /** Their standard uncertainties. */
  readonly standardUncertainties: readonly number[];
  /** Residual standard deviation, V/V (undefined with no degree of freedom). */
  readonly residualStandardDeviation: number | undefined;
  /** Degrees of freedom. */
  readonly degreesOfFreedom: number;
  /** The reference loads' span. */
  readonly range: { readonly min: number; readonly max: number };
  /** Loads over which the fit has an inverse (undefined: it turns inside the span). */
  readonly inverseRange: { readonly min: number; readonly max: number } | undefined;
  /** The points. */
  readonly points: readonly FittedPoint[];
  /** Largest |error| of the calibrated channel at the points, channel unit. */
  readonly largestError: number;
  /** Largest standard uncertainty of the fitted curve over the span, in load. */
  readonly largestFitUncertainty: number;
  /** OIML R 60 error terms of the readings. */
  readonly nonlinearity: ErrorFigure;
  /** Hysteresis error (undefined without unloading points). */
  readonly hysteresis: ErrorFigure | undefined;
  /** Repeatability error (undefined without repeated loads). */
  readonly repeatability: ErrorFigure | undefined;
}
