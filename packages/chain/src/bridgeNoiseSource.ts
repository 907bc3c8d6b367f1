import { solveBridge } from '@bridgework/bridge';
import { checkLength, checkOhms, checkOptions } from '@bridgework/core';
import { checkTemperature, johnsonNoiseDensity } from './johnsonNoiseDensity.js';

const ZERO_OK = { allowZero: true } as const;

/** @internal The keys of {@link BridgeNoiseOptions}. */
export const bridgeNoiseKeys = ['armsOhms', 'sourceOhms', 'inputSeriesOhms', 'temperatureCelsius'];

/** Options of {@link bridgeNoiseSource}. */
export interface BridgeNoiseOptions {
  /** The four arms `[R1, R2, R3, R4]` in Ω (each > 0), ring order as in docs/conventions.md. */
  readonly armsOhms: readonly [number, number, number, number];
  /** Resistance in series with the excitation (source plus excitation leads) in Ω (≥ 0). Default 0. */
  readonly sourceOhms?: number;
  /**
   * Resistances in series with the amplifier inputs `[to S+, to S−]` in Ω (each ≥ 0): sense leads,
   * input-protection or RFI-filter resistors. Default `[0, 0]`.
   */
  readonly inputSeriesOhms?: readonly [number, number];
  /** Temperature of the bridge and series resistors in °C (> −273.15). Default 25. */
  readonly temperatureCelsius?: number;
}

/** The bridge as a noise source seen by a differential amplifier (see {@link bridgeNoiseSource}). */
export interface BridgeNoiseSource {
  /** Output (Thevenin) resistance of the bridge between S+ and S−, from `solveBridge`, in Ω. */
  readonly bridgeOhms: number;
  /** `bridgeOhms` plus both input series resistances: the resistance whose thermal noise the amplifier sees, in Ω. */
  readonly outputOhms: number;
  /** Thermal noise density of `outputOhms`, √(4kT·outputOhms), in V/√Hz. */
  readonly voltsPerRootHz: number;
  /**
   * Transimpedance from a current injected into the S+ input to the differential voltage
   * V(S+) − V(S−), in Ω (series resistance included).
   */
  readonly positiveInputOhms: number;
  /** Transimpedance from a current drawn out of the S− input to V(S+) − V(S−), in Ω (series resistance included). */
  readonly negativeInputOhms: number;
  /**
   * √(positiveInputOhms² + negativeInputOhms²), in Ω: multiplied by an amplifier's current-noise
   * density (equal and uncorrelated at each input) it gives the differential noise voltage density.
   */
  readonly currentNoiseOhms: number;
}

/**
 * A bridge seen as a noise source: its output resistance, thermal noise, and the transimpedances
 * that turn amplifier input current noise into a differential voltage.
 *
 * @remarks
 * Thermal noise: by Nyquist's theorem a passive network at one temperature has the open-circuit
 * noise 4kT·Re(Z_out), so the bridge contributes the Johnson noise of its output resistance, here
 * `solveBridge(...).theveninOhms` (with the excitation source resistance, itself a resistor at the
 * same temperature) plus any resistances in series with the inputs. A regulated excitation
 * source's own noise is not thermal and is not included (it cancels in a ratiometric measurement).
 *
 * Current noise: an amplifier input noise current flows into the bridge node it is connected to
 * and returns through the network to the excitation terminals. With E− at ground and the source
 * EMF shorted, nodal analysis of the three nodes E+ (conductance gs = 1/Rs to ground), S− and S+
 * gives, in conductances gᵢ = 1/Rᵢ and with rs = Rs,
 *
 *   a = [(g1 + g2) + rs·g2·(g1 + g4)] / D,  b = [(g3 + g4) + rs·g3·(g1 + g4)] / D,
 *   D = (g1 + g2)(g3 + g4) + rs·[g1·g2·(g3 + g4) + g3·g4·(g1 + g2)],
 *
 * where a is V(S+) − V(S−) per ampere into S+ and b the same per ampere out of S−. With a stiff
 * source (rs = 0) these are R3∥R4 and R1∥R2, and a + b is always the output resistance (the tests
 * check this identity against `solveBridge`). Input noise currents at the two inputs are taken as
 * uncorrelated, as data sheets specify them per input, so they add as i_n·√(a² + b²): for four
 * equal arms R, i_n·R/√2. Every term is positive: no cancellation; within a few ulps.
 *
 * @param options - Arms, source resistance, input series resistances, temperature.
 * @returns Output resistance, thermal noise density and current-noise transimpedances.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape`, `not-positive`, `not-finite`,
 *   `wrong-type` for bad arms (from `solveBridge`); `negative` for a negative source or series
 *   resistance; `out-of-range` for a temperature at or below absolute zero or a resistance
 *   outside `OHMS_LIMITS` of the core package; `unknown-option` for a key it does not know
 *   (naming the closest), `missing-option` without `armsOhms`.
 * @example
 * ```ts
 * const n = bridgeNoiseSource({ armsOhms: [350, 350, 350, 350] });
 * n.outputOhms; // 350
 * n.voltsPerRootHz; // 2.40062…e-9
 * n.currentNoiseOhms; // 247.48737341529164 (350/√2)
 * ```
 */
export function bridgeNoiseSource(options: BridgeNoiseOptions): BridgeNoiseSource {
  const o = checkOptions('options', options, { known: bridgeNoiseKeys, required: ['armsOhms'] });
  const temperatureCelsius = checkTemperature('temperatureCelsius', o['temperatureCelsius']);
  const sourceOhms = o['sourceOhms'] === undefined ? 0 : checkOhms('sourceOhms', o['sourceOhms'], ZERO_OK);
  const series =
    o['inputSeriesOhms'] === undefined
      ? [0, 0]
      : checkLength<unknown>('inputSeriesOhms', o['inputSeriesOhms'], 2);
  const seriesPositive = checkOhms('inputSeriesOhms[0]', series[0], ZERO_OK);
  const seriesNegative = checkOhms('inputSeriesOhms[1]', series[1], ZERO_OK);
  // solveBridge validates the arms; the excitation does not enter the output resistance.
  const arms = o['armsOhms'] as readonly [number, number, number, number];
  const bridgeOhms = solveBridge({ armsOhms: arms, excitationVolts: 1, sourceOhms }).theveninOhms;

  const [g1, g2, g3, g4] = arms.map((r) => 1 / r) as [number, number, number, number];
  const p = g1 + g2;
  const q = g3 + g4;
  const d = p * q + sourceOhms * (g1 * g2 * q + g3 * g4 * p);
  const a = (p + sourceOhms * g2 * (g1 + g4)) / d;
  const b = (q + sourceOhms * g3 * (g1 + g4)) / d;

  const outputOhms = bridgeOhms + seriesPositive + seriesNegative;
  const positiveInputOhms = a + seriesPositive;
  const negativeInputOhms = b + seriesNegative;
  return {
    bridgeOhms,
    outputOhms,
    voltsPerRootHz: johnsonNoiseDensity({ ohms: outputOhms, temperatureCelsius }),
    positiveInputOhms,
    negativeInputOhms,
    currentNoiseOhms: Math.hypot(positiveInputOhms, negativeInputOhms),
  };
}
