import {
  BridgeworkError,
  checkInterval,
  checkObject,
  checkOptions,
  checkVolts,
  formatValue,
  type Interval,
} from '@bridgework/core';
import type { Adc } from './createAdc.js';
import type { DesignCheck } from './DesignCheck.js';
import { checkGain } from './internal/domain.js';
import { finiteFigures } from './internal/finiteFigures.js';

const SIGNED = { signed: true } as const;
const pointKeys = [
  'differentialVolts',
  'commonModeVolts',
  'measurand',
  'ratio',
  'armsOhms',
  'armWatts',
  'adcCode',
];

/** An interval of voltages, each end within ±1e6 V. */
function checkVoltInterval(param: string, value: unknown): Interval {
  const r = checkInterval(param, value);
  checkVolts(`${param}.min`, r.min, SIGNED);
  checkVolts(`${param}.max`, r.max, SIGNED);
  return r;
}

/** Validated {@link AmplifierLimits}. */
interface CheckedLimits {
  readonly commonMode: Interval | undefined;
  readonly differential: number | undefined;
  readonly firstStage: Interval | undefined;
  readonly output: Interval | undefined;
}

/** @internal Validates {@link AmplifierLimits} (param: `limits`, or `amplifier.limits` in a budget). */
export function checkAmplifierLimits(param: string, value: unknown): CheckedLimits {
  const l =
    value === undefined
      ? {}
      : checkOptions(param, value, {
          known: ['inputCommonModeVolts', 'inputDifferentialVolts', 'firstStageVolts', 'outputVolts'],
        });
  const interval = (key: string) =>
    l[key] === undefined ? undefined : checkVoltInterval(`${param}.${key}`, l[key]);
  return {
    commonMode: interval('inputCommonModeVolts'),
    differential:
      l['inputDifferentialVolts'] === undefined
        ? undefined
        : checkVolts(`${param}.inputDifferentialVolts`, l['inputDifferentialVolts']),
    firstStage: interval('firstStageVolts'),
    output: interval('outputVolts'),
  };
}

/** One state of the amplifier input: the bridge output and its common-mode voltage. */
export interface OperatingPoint {
  /** Differential input V(S+) − V(S−) in V. */
  readonly differentialVolts: number;
  /** Common-mode input (V(S+) + V(S−))/2 in V, relative to the amplifier's ground. */
  readonly commonModeVolts: number;
}

/** The limits of a differential amplifier, each an absolute voltage relative to its ground (omit one to skip it). */
export interface AmplifierLimits {
  /** Input common-mode range in V (the data sheet's, at the supply used). */
  readonly inputCommonModeVolts?: Interval;
  /** Largest differential input magnitude in V (> 0), e.g. a PGA's input range or a protection limit. */
  readonly inputDifferentialVolts?: number;
  /** Range each first-stage output can reach in V (the supply rails less the first stage's swing headroom). */
  readonly firstStageVolts?: Interval;
  /** Output swing in V (the supply rails less the output stage's swing headroom). */
  readonly outputVolts?: Interval;
}

/** Options of {@link checkHeadroom}. */
export interface HeadroomOptions {
  /** The operating points to check: at least the ends of the measured span (and zero). */
  readonly points: readonly OperatingPoint[];
  /** Total differential gain G (> 0). */
  readonly gain: number;
  /** Gain of the second (difference) stage G2 (> 0); the first stage has G1 = G/G2. Default 1. */
  readonly secondStageGain?: number;
  /** Voltage of the output reference pin in V: output = reference + G·Vd. Default 0. */
  readonly outputReferenceVolts?: number;
  /** The limits to check. */
  readonly limits?: AmplifierLimits;
  /**
   * The converter after the amplifier, created with the same total gain (`adc.gain` = G): its
   * quantizer input G·Vd must give codes strictly inside the rails.
   */
  readonly adc?: Adc;
}

/** The limits checked by {@link checkHeadroom}, each a lower or upper bound at one node. */
export type HeadroomLimit =
  | 'input-common-mode-low'
  | 'input-common-mode-high'
  | 'input-differential'
  | 'first-stage-low'
  | 'first-stage-high'
  | 'output-low'
  | 'output-high'
  | 'adc-low'
  | 'adc-high';

/** The worst margin to one limit over all operating points. */
export interface HeadroomMargin {
  /** Which limit. */
  readonly limit: HeadroomLimit;
  /** Distance from the node to the limit in V at the node where the limit applies; negative when violated. */
  readonly marginVolts: number;
  /** The node voltage at the worst point, in V (for `input-differential`, |Vd|; for `adc-…`, G·Vd at the quantizer). */
  readonly nodeVolts: number;
  /** The limit in V. */
  readonly limitVolts: number;
  /** Index into `points` of the worst point. */
  readonly pointIndex: number;
  /** True when the limit is met at every point. */
  readonly ok: boolean;
}

/** A violated limit (a {@link HeadroomMargin} below zero), with a message. */
export interface HeadroomIssue extends HeadroomMargin {
  /** What clips, where, and by how much. */
  readonly message: string;
}

/** The node voltages of one operating point (see {@link checkHeadroom}). */
export interface AmplifierNodes {
  /** Differential input Vd in V. */
  readonly differentialVolts: number;
  /** Common-mode input in V. */
  readonly commonModeVolts: number;
  /** First-stage output on the S+ side, Vcm + G1·Vd/2, in V. */
  readonly firstStagePositiveVolts: number;
  /** First-stage output on the S− side, Vcm − G1·Vd/2, in V. */
  readonly firstStageNegativeVolts: number;
  /** Amplifier output, reference + G·Vd, in V. */
  readonly outputVolts: number;
  /** Differential quantizer input G·Vd in V (with `adc`: adc.gain·Vd). */
  readonly quantizerVolts: number;
}

/** What {@link checkHeadroom} found: every margin and every node. */
export interface HeadroomValue {
  /** The worst margin to each limit that was given, in the order of {@link HeadroomLimit}. */
  readonly margins: readonly HeadroomMargin[];
  /** Node voltages at each operating point. */
  readonly nodes: readonly AmplifierNodes[];
  /** First-stage gain G1 = G/G2. */
  readonly firstStageGain: number;
}

const nodeNames: Record<HeadroomLimit, string> = {
  'input-common-mode-low': 'the input common mode is below its range',
  'input-common-mode-high': 'the input common mode is above its range',
  'input-differential': 'the differential input exceeds its range',
  'first-stage-low': 'a first-stage output clips at its low limit',
  'first-stage-high': 'a first-stage output clips at its high limit',
  'output-low': 'the output clips at its low swing limit',
  'output-high': 'the output clips at its high swing limit',
  'adc-low': 'the converter reads its low rail',
  'adc-high': 'the converter reads its high rail',
};

/**
 * Checks a bridge amplifier's headroom: input common-mode range, differential input range,
 * first-stage swing and output swing, and optionally the converter's code range, at each
 * operating point; every violated limit is listed with its margin in volts.
 *
 * @remarks
 * Model: the classic three-op-amp instrumentation amplifier (any in-amp text, e.g. Kitchin &
 * Counts, A Designer's Guide to Instrumentation Amplifiers — from memory). The first stage has
 * differential gain G1 and unity common-mode gain, so its two outputs sit at Vcm ± G1·Vd/2; the
 * difference stage (gain G2, G = G1·G2) gives output = Vref + G·Vd. A first stage can therefore
 * clip while the output is well inside its swing: with a high common mode, a high first-stage
 * gain, or first-stage amplifiers whose swing is narrower than the output's. A PGA at a
 * converter input is the same model with G2 = 1 and the output range given by its own limits.
 *
 * Margins are at the node where each limit applies (positive = inside): Vcm − min and max − Vcm
 * for the common mode; max − |Vd| for the differential input; min(node) − min and max − max(node)
 * over both first-stage outputs; output − min and max − output; and for the converter
 * G·Vd − (codeMin + ½)·Vref/s and (codeMax − ½)·Vref/s − G·Vd (s = codeScale), the quantizer
 * inputs whose codes stay strictly inside the rails. Each margin reported is the worst over the
 * points. A margin of exactly 0 counts as within an analog limit. For the converter the violation
 * is decided by its own exact code decision ({@link createAdc}): a point whose code is a rail code
 * violates the limit (at exactly (codeMin + ½)·Vref/s the tie rounds to the even rail code), and
 * the margin is clamped to agree in sign within rounding of the threshold. Node voltages are linear in Vd, so
 * over a span on which Vd and Vcm vary monotonically the extremes lie at its ends: pass the span
 * ends (and zero, if inside).
 *
 * @param options - Operating points, gain, second-stage gain, output reference, limits, converter.
 * @returns `{ ok, value, issues }`: every margin and node, and the violated limits.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for an empty or non-array
 *   `points`; `not-finite`, `wrong-type` for a bad voltage; `not-positive` for a gain or the
 *   differential limit; `out-of-range` for a range with max < min, a voltage beyond ±1e6 V or a
 *   gain outside [1e-9, 1e9]; `unknown-option` for a key it does not know, also inside `limits`
 *   (naming the closest), `missing-option` without `points` or `gain`. `ok` is false whenever a
 *   figure is not finite (which the limits above rule out).
 * @example
 * ```ts
 * const r = checkHeadroom({
 *   points: [{ differentialVolts: 0.02, commonModeVolts: 2.5 }],
 *   gain: 200,
 *   outputReferenceVolts: 0.5,
 *   limits: { firstStageVolts: { min: 1.2, max: 3.8 }, outputVolts: { min: 0.1, max: 4.9 } },
 * });
 * r.ok; // false: the first stage would need 0.5 V and 4.5 V
 * r.issues.map((i) => i.limit); // ['first-stage-low', 'first-stage-high']
 * ```
 */
export function checkHeadroom(options: HeadroomOptions): DesignCheck<HeadroomValue, HeadroomIssue> {
  const o = checkOptions('options', options, {
    known: ['points', 'gain', 'secondStageGain', 'outputReferenceVolts', 'limits', 'adc'],
    required: ['points', 'gain'],
  });
  const rawPoints = o['points'];
  if (!Array.isArray(rawPoints) || rawPoints.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`points\` must be a non-empty array; got ${formatValue(rawPoints)}`,
      { param: 'points', value: rawPoints },
    );
  }
  const points = rawPoints.map((p: unknown, i) => {
    // The operating points of bridgeOperatingPoints (and a budget's) carry more fields: they may be
    // passed as they are; only the two voltages are read.
    const r = checkOptions(`points[${i}]`, p, {
      known: pointKeys,
      required: ['differentialVolts', 'commonModeVolts'],
    });
    return {
      differentialVolts: checkVolts(`points[${i}].differentialVolts`, r['differentialVolts'], SIGNED),
      commonModeVolts: checkVolts(`points[${i}].commonModeVolts`, r['commonModeVolts'], SIGNED),
    };
  });
  const gain = checkGain('gain', o['gain']);
  const secondStageGain =
    o['secondStageGain'] === undefined ? 1 : checkGain('secondStageGain', o['secondStageGain']);
  const reference =
    o['outputReferenceVolts'] === undefined
      ? 0
      : checkVolts('outputReferenceVolts', o['outputReferenceVolts'], SIGNED);
  const { commonMode, differential, firstStage, output } = checkAmplifierLimits('limits', o['limits']);
  const adc = o['adc'] === undefined ? undefined : checkAdc(o['adc']);
  const quantizerGain = adc === undefined ? gain : adc.gain;
  const firstStageGain = gain / secondStageGain;

  const nodes: AmplifierNodes[] = points.map((p) => {
    const half = (firstStageGain * p.differentialVolts) / 2;
    return {
      differentialVolts: p.differentialVolts,
      commonModeVolts: p.commonModeVolts,
      firstStagePositiveVolts: p.commonModeVolts + half,
      firstStageNegativeVolts: p.commonModeVolts - half,
      outputVolts: reference + gain * p.differentialVolts,
      quantizerVolts: quantizerGain * p.differentialVolts,
    };
  });

  const margins: HeadroomMargin[] = [];
  /**
   * Adds the worst (smallest) margin of one limit; `margin(n)` returns [margin, node value] and
   * `fails(n, i)`, when given, decides the violation exactly instead of the margin's sign.
   */
  function worst(
    limit: HeadroomLimit,
    limitVolts: number,
    margin: (n: AmplifierNodes) => [number, number],
    fails?: (i: number) => boolean,
  ) {
    let best: HeadroomMargin | undefined;
    nodes.forEach((n, pointIndex) => {
      const [raw, node] = margin(n);
      const violated = fails === undefined ? raw < 0 : fails(pointIndex);
      // An exact decision overrides the sign of a margin within rounding of the threshold.
      const m = fails === undefined ? raw : violated ? Math.min(raw, 0) : Math.max(raw, 0);
      const worse =
        best === undefined || (violated && best.ok) || (violated === !best.ok && m < best.marginVolts);
      if (worse) best = { limit, marginVolts: m, nodeVolts: node, limitVolts, pointIndex, ok: !violated };
    });
    margins.push(best as HeadroomMargin);
  }
  if (commonMode !== undefined) {
    worst('input-common-mode-low', commonMode.min, (n) => [
      n.commonModeVolts - commonMode.min,
      n.commonModeVolts,
    ]);
    worst('input-common-mode-high', commonMode.max, (n) => [
      commonMode.max - n.commonModeVolts,
      n.commonModeVolts,
    ]);
  }
  if (differential !== undefined) {
    worst('input-differential', differential, (n) => [
      differential - Math.abs(n.differentialVolts),
      Math.abs(n.differentialVolts),
    ]);
  }
  if (firstStage !== undefined) {
    worst('first-stage-low', firstStage.min, (n) => {
      const low = Math.min(n.firstStagePositiveVolts, n.firstStageNegativeVolts);
      return [low - firstStage.min, low];
    });
    worst('first-stage-high', firstStage.max, (n) => {
      const high = Math.max(n.firstStagePositiveVolts, n.firstStageNegativeVolts);
      return [firstStage.max - high, high];
    });
  }
  if (output !== undefined) {
    worst('output-low', output.min, (n) => [n.outputVolts - output.min, n.outputVolts]);
    worst('output-high', output.max, (n) => [output.max - n.outputVolts, n.outputVolts]);
  }
  if (adc !== undefined) {
    const step = adc.referenceVolts / adc.codeScale;
    const low = (adc.codeMin + 0.5) * step;
    const high = (adc.codeMax - 0.5) * step;
    // The converter decides each code exactly (createAdc); its rails decide the violation.
    const codes = points.map((p) => adc.codeFromVolts(p.differentialVolts).code);
    worst(
      'adc-low',
      low,
      (n) => [n.quantizerVolts - low, n.quantizerVolts],
      (i) => codes[i]! <= adc.codeMin,
    );
    worst(
      'adc-high',
      high,
      (n) => [high - n.quantizerVolts, n.quantizerVolts],
      (i) => codes[i]! >= adc.codeMax,
    );
  }

  const issues: HeadroomIssue[] = margins
    .filter((m) => !m.ok)
    .map((m) => ({
      ...m,
      message: `${nodeNames[m.limit]}: ${formatVolts(m.nodeVolts)} against ${formatVolts(m.limitVolts)} at point ${m.pointIndex} (margin ${formatVolts(m.marginVolts)})`,
    }));
  const value = { margins, nodes, firstStageGain };
  return { ok: issues.length === 0 && finiteFigures(value), value, issues };
}

function checkAdc(value: unknown): Adc {
  const a = checkObject('adc', value);
  if (typeof a['codeFromVolts'] !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`adc\` must be a converter from createAdc; got ${formatValue(value)}`,
      {
        param: 'adc',
        value,
      },
    );
  }
  return a as unknown as Adc;
}

function formatVolts(v: number): string {
  return `${Number(v.toPrecision(6))} V`;
}
