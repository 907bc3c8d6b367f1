import { solveBridge, type StrainBridge } from '@bridgework/bridge';
import {
  BridgeworkError,
  blameOption,
  checkInterval,
  checkLength,
  checkObject,
  checkOptions,
  checkVolts,
  formatValue,
} from '@bridgework/core';
import type { OperatingPoint } from './checkHeadroom.js';

/** A range `[min, max]` of a measurand (strain in m/m or ratio in V/V), min < max. */
export interface MeasurandRange {
  /** Lower end. */
  readonly min: number;
  /** Upper end (> `min`). */
  readonly max: number;
}

/** A measured span in strain, on a strain-gauge bridge from `createStrainBridge`. */
export interface StrainSpan {
  /** The bridge (arrangement, gauge factor, leads), from `@bridgework/bridge`. */
  readonly bridge: StrainBridge;
  /** The strains at the ends of the span in m/m, inside `bridge.strainRange` (include any overload margin). */
  readonly strainRange: MeasurandRange;
}

/**
 * A measured span in output ratio, for a transducer (load cell, pressure or torque transducer)
 * whose bridge is given by its arms at zero. The ratio is referred to `excitationVolts` and the
 * bridge is taken as symmetric, so its common mode does not move with the output.
 */
export interface RatioSpan {
  /** The four arms at zero `[R1, R2, R3, R4]` in Ω (each > 0), all of them gauges. */
  readonly armsOhms: readonly [number, number, number, number];
  /** The output ratios Vout/Vexc at the ends of the span in V/V, inside (−1, 1) (e.g. ±rated output). */
  readonly ratioRange: MeasurandRange;
}

/** The span a channel must measure: in strain on a strain bridge, or in ratio on a transducer. */
export type BridgeSpan = StrainSpan | RatioSpan;

/** Options of {@link bridgeOperatingPoints}. */
export interface OperatingPointsOptions {
  /** The span. */
  readonly span: BridgeSpan;
  /** Excitation EMF in V (> 0). */
  readonly excitationVolts: number;
  /** Potential of E− relative to the amplifier's ground in V (include a return-lead drop if it matters). Default 0. */
  readonly excitationLowVolts?: number;
}

/** One operating point of a bridge span, with what set it (see {@link bridgeOperatingPoints}). */
export interface BridgeOperatingPoint extends OperatingPoint {
  /** The measurand at this point: strain in m/m or ratio in V/V. */
  readonly measurand: number;
  /** Output ratio Vout/Vexc in V/V. */
  readonly ratio: number;
  /** The four arms at this point in Ω (leads inside the arms included). */
  readonly armsOhms: readonly [number, number, number, number];
  /** Power in each arm in W, from `solveBridge`. */
  readonly armWatts: readonly [number, number, number, number];
}

/** The operating points of a span (see {@link bridgeOperatingPoints}). */
export interface BridgeOperatingPoints {
  /** `'strain'` (m/m) or `'ratio'` (V/V). */
  readonly measurand: 'strain' | 'ratio';
  /** The span's ends, and zero when it lies strictly inside: [min, 0, max] or [min, max]. */
  readonly points: readonly BridgeOperatingPoint[];
  /** The arms at zero (for noise), in Ω. */
  readonly zeroArmsOhms: readonly [number, number, number, number];
  /** Resistance in series with the excitation in Ω (the strain bridge's `seriesOhms`; 0 for a ratio span). */
  readonly seriesOhms: number;
  /** Which arms hold gauges (a strain bridge's arms that respond to strain; all four for a ratio span). */
  readonly gaugeArms: readonly [boolean, boolean, boolean, boolean];
  /** Input-referred signal per unit measurand at zero in V: E·sensitivity (strain) or E (ratio). */
  readonly sensitivityVolts: number;
  /** Ratio per unit measurand at zero: the bridge's exact `sensitivity` (strain) or 1 (ratio). */
  readonly sensitivityRatio: number;
}

type Arms = [number, number, number, number];

function checkMeasurandRange(
  param: string,
  value: unknown,
  limits: { min: number; max: number },
  what: string,
): MeasurandRange {
  const { min, max } = checkInterval(param, value, { strict: true });
  for (const [end, v] of [
    ['min', min],
    ['max', max],
  ] as const) {
    if (!(v > limits.min && v < limits.max)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`${param}.${end}\` must be in (${limits.min}, ${limits.max}), ${what}; got ${formatValue(v)}`,
        { param: `${param}.${end}`, value: v, limit: [limits.min, limits.max] },
      );
    }
  }
  return { min, max };
}

/** Common mode of the two output nodes: V(S−) = VE− + Vb·R2/(R1 + R2), V(S+) = VE− + Vb·R3/(R3 + R4). */
function commonMode(arms: readonly number[], bridgeVolts: number, low: number): number {
  const [r1, r2, r3, r4] = arms as Arms;
  return low + (bridgeVolts * (r2 / (r1 + r2) + r3 / (r3 + r4))) / 2;
}

function isStrainSpan(span: Record<string, unknown>): boolean {
  return span['bridge'] !== undefined || span['strainRange'] !== undefined;
}

/**
 * The operating points of a bridge over a span: differential output, common mode, arms and arm
 * powers at the span's ends (and at zero when it lies inside), ready for {@link checkHeadroom}.
 *
 * @remarks
 * Strain span: the output is the bridge's exact map, ratioFromStrain(ε)·E; the arms come from
 * its `armsOhms(strain)` and the network state (bridge voltage, arm powers) from `solveBridge`
 * with the bridge's series excitation resistance; the output node voltages are the two dividers V(S−) = VE− + Vb·R2/(R1 + R2) and
 * V(S+) = VE− + Vb·R3/(R3 + R4) (Vb the bridge voltage; ideal meter), so the common mode is
 * exact too. Gauge arms are those whose resistance differs between the span's ends (a transverse
 * gauge with ν = 0 does not respond and is not counted). Ratio span: Vd = ratio·E, and the
 * common mode is that of the arms at zero (a symmetric full bridge).
 *
 * @param options - Span, excitation and the potential of E−.
 * @returns The points, the arms at zero, the sensitivity and which arms are gauges.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for a span with max ≤ min,
 *   outside the bridge's strain range (or whose arms leave `OHMS_LIMITS`), a ratio span outside
 *   (−1, 1), an excitation outside [1e-9, 1e6] V or an E− potential beyond ±1e6 V; `wrong-type`
 *   when `span.bridge` is not a strain bridge; errors of `solveBridge` for bad arms;
 *   `unknown-option` for a key it does not know, also inside `span` and its ranges (naming the
 *   closest), `missing-option` for a required one.
 * @example
 * ```ts
 * const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
 * const { points } = bridgeOperatingPoints({
 *   span: { bridge, strainRange: { min: -1e-3, max: 1e-3 } },
 *   excitationVolts: 5,
 * });
 * points.map((p) => p.differentialVolts); // [-0.0025025…, 0, 0.0024975…]
 * ```
 */
export function bridgeOperatingPoints(options: OperatingPointsOptions): BridgeOperatingPoints {
  const o = checkOptions('options', options, {
    known: ['span', 'excitationVolts', 'excitationLowVolts'],
    required: ['span', 'excitationVolts'],
  });
  const span = checkObject('span', o['span']);
  const e = checkVolts('excitationVolts', o['excitationVolts']);
  const low =
    o['excitationLowVolts'] === undefined
      ? 0
      : checkVolts('excitationLowVolts', o['excitationLowVolts'], { signed: true });

  if (isStrainSpan(span)) {
    checkOptions('span', span, { known: ['bridge', 'strainRange'], required: ['bridge', 'strainRange'] });
    const bridge = span['bridge'] as StrainBridge;
    if (typeof bridge !== 'object' || bridge === null || typeof bridge.armsOhms !== 'function') {
      throw new BridgeworkError(
        'wrong-type',
        `\`span.bridge\` must be a strain bridge from createStrainBridge; got ${formatValue(bridge)}`,
        { param: 'span.bridge', value: bridge },
      );
    }
    const range = checkMeasurandRange(
      'span.strainRange',
      span['strainRange'],
      bridge.strainRange,
      "the bridge's strain range",
    );
    const strains = range.min < 0 && range.max > 0 ? [range.min, 0, range.max] : [range.min, range.max];
    const points = strains.map((strain, i): BridgeOperatingPoint => {
      // The output from the bridge's exact map (the arms as doubles would lose the small imbalance's
      // low digits); the network state (bridge voltage, arm powers) from solveBridge.
      const end = i === 0 ? 'min' : i === strains.length - 1 ? 'max' : undefined;
      const network = () => {
        const armsOhms = bridge.armsOhms(strain);
        return { armsOhms, s: solveBridge({ armsOhms, excitationVolts: e, sourceOhms: bridge.seriesOhms }) };
      };
      const { armsOhms, s } =
        end === undefined
          ? network()
          : blameOption(
              {
                param: `span.strainRange.${end}`,
                value: strain,
                requirement: 'must keep every arm a resistance the network accepts',
              },
              network,
            );
      const ratio = bridge.ratioFromStrain(strain);
      return {
        measurand: strain,
        ratio,
        differentialVolts: ratio * e,
        commonModeVolts: commonMode(armsOhms, s.bridgeVolts, low),
        armsOhms,
        armWatts: s.armWatts,
      };
    });
    const atMin = bridge.armsOhms(range.min);
    const atMax = bridge.armsOhms(range.max);
    return {
      measurand: 'strain',
      points,
      zeroArmsOhms: bridge.armsOhms(0),
      seriesOhms: bridge.seriesOhms,
      gaugeArms: atMin.map((r, i) => r !== atMax[i]) as [boolean, boolean, boolean, boolean],
      sensitivityVolts: e * bridge.sensitivity,
      sensitivityRatio: bridge.sensitivity,
    };
  }

  checkOptions('span', span, { known: ['armsOhms', 'ratioRange'], required: ['armsOhms', 'ratioRange'] });
  const arms = checkLength<number>('span.armsOhms', span['armsOhms'], 4) as unknown as Arms;
  const range = checkMeasurandRange(
    'span.ratioRange',
    span['ratioRange'],
    { min: -1, max: 1 },
    'the ratios a bridge of positive arms can give',
  );
  const zero = solveBridge({ armsOhms: arms, excitationVolts: e });
  const vcm = commonMode(arms, zero.bridgeVolts, low);
  const ratios = range.min < 0 && range.max > 0 ? [range.min, 0, range.max] : [range.min, range.max];
  return {
    measurand: 'ratio',
    points: ratios.map((ratio) => ({
      measurand: ratio,
      ratio,
      differentialVolts: ratio * e,
      commonModeVolts: vcm,
      armsOhms: arms,
      armWatts: zero.armWatts,
    })),
    zeroArmsOhms: arms,
    seriesOhms: 0,
    gaugeArms: [true, true, true, true],
    sensitivityVolts: e,
    sensitivityRatio: 1,
  };
}
