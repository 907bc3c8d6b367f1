import { checkOptions } from '@bridgework/core';
import { checkSpectrum } from './bandNoise.js';
import { checkDensity, checkGain, checkHertz } from './internal/domain.js';
import {
  bridgeNoiseKeys,
  bridgeNoiseSource,
  type BridgeNoiseOptions,
  type BridgeNoiseSource,
} from './bridgeNoiseSource.js';
import { combineNoise, type NoiseShare } from './combineNoise.js';

/** Noise of a differential amplifier (in-amp or PGA), as its data sheet specifies it. */
export interface AmplifierNoiseOptions {
  /** Input voltage noise density (white floor) in V/√Hz, in [0, 1]. Default 0. */
  readonly inputVoltageNoiseVoltsPerRootHz?: number;
  /** 1/f corner of the input voltage noise in Hz, in [0, 1e12] (0 for a chopper-stabilised amplifier). Default 0. */
  readonly voltageCornerHertz?: number;
  /** Input current noise density of each input (white floor) in A/√Hz, in [0, 1]. Default 0. */
  readonly currentNoiseAmpsPerRootHz?: number;
  /** 1/f corner of the current noise in Hz, in [0, 1e12]. Default 0. */
  readonly currentCornerHertz?: number;
  /** Output voltage noise density in V/√Hz, in [0, 1], white; referred to the input by dividing by the gain. Default 0. */
  readonly outputVoltageNoiseVoltsPerRootHz?: number;
}

/** Options of {@link inputNoiseDensity}. */
export interface InputNoiseOptions extends BridgeNoiseOptions {
  /** The amplifier's noise. Default: a noiseless amplifier (bridge thermal noise only). */
  readonly amplifier?: AmplifierNoiseOptions;
  /** Amplifier gain, in [1e-9, 1e9], to refer its output noise to the input. Default 1. */
  readonly gain?: number;
  /** Frequency in Hz, in [1e-9, 1e12], at which 1/f terms are evaluated. Default: the white floors (f → ∞). */
  readonly frequencyHertz?: number;
}

/** One input-referred noise term, with its spectrum (see {@link inputNoiseDensity}). */
export interface InputNoiseTerm extends NoiseShare {
  /** The term's white floor, input-referred, in V/√Hz. */
  readonly whiteVoltsPerRootHz: number;
  /** The term's 1/f corner in Hz (0 when white). */
  readonly cornerHertz: number;
}

/** Input-referred noise density of a bridge and amplifier, by source (see {@link inputNoiseDensity}). */
export interface InputNoiseDensity {
  /** Root-sum-square of the terms at the frequency asked for, in V/√Hz. */
  readonly totalVoltsPerRootHz: number;
  /**
   * `'bridge-thermal'`, `'amplifier-voltage'`, `'amplifier-current'` and `'amplifier-output'`,
   * each with its density at the frequency asked for (`value`, V/√Hz) and its share.
   */
  readonly terms: readonly InputNoiseTerm[];
  /** The bridge as a noise source (output resistance, transimpedances). */
  readonly bridge: BridgeNoiseSource;
}

/** @internal An input-referred spectrum term: white floor (V/√Hz) and corner (Hz). */
export interface SpectrumTerm {
  readonly name: string;
  readonly white: number;
  readonly corner: number;
}

/** @internal Validated amplifier noise. */
export interface CheckedAmplifierNoise {
  readonly voltage: { readonly white: number; readonly corner: number };
  readonly current: { readonly white: number; readonly corner: number };
  readonly output: number;
}

/** The keys of {@link AmplifierNoiseOptions}. */
export const amplifierNoiseKeys = [
  'inputVoltageNoiseVoltsPerRootHz',
  'voltageCornerHertz',
  'currentNoiseAmpsPerRootHz',
  'currentCornerHertz',
  'outputVoltageNoiseVoltsPerRootHz',
];

/**
 * @internal Validates amplifier noise options (param prefix e.g. `amplifier.`); `extraKeys` are the
 * other keys the caller's amplifier object may hold (a budget's topology and limits).
 */
export function checkAmplifierNoise(
  prefix: string,
  value: unknown,
  extraKeys: readonly string[] = [],
): CheckedAmplifierNoise {
  const o =
    value === undefined
      ? {}
      : checkOptions(prefix.replace(/\.$/, ''), value, { known: [...amplifierNoiseKeys, ...extraKeys] });
  return {
    voltage: checkSpectrum(prefix, o, 'inputVoltageNoiseVoltsPerRootHz', 'voltageCornerHertz'),
    current: checkSpectrum(prefix, o, 'currentNoiseAmpsPerRootHz', 'currentCornerHertz'),
    output:
      o['outputVoltageNoiseVoltsPerRootHz'] === undefined
        ? 0
        : checkDensity(`${prefix}outputVoltageNoiseVoltsPerRootHz`, o['outputVoltageNoiseVoltsPerRootHz']),
  };
}

/** @internal The four input-referred spectra of a bridge front end. */
export function frontEndSpectra(
  bridge: BridgeNoiseSource,
  amp: CheckedAmplifierNoise,
  gain: number,
): SpectrumTerm[] {
  return [
    { name: 'bridge-thermal', white: bridge.voltsPerRootHz, corner: 0 },
    { name: 'amplifier-voltage', white: amp.voltage.white, corner: amp.voltage.corner },
    {
      name: 'amplifier-current',
      white: amp.current.white * bridge.currentNoiseOhms,
      corner: amp.current.corner,
    },
    { name: 'amplifier-output', white: amp.output / gain, corner: 0 },
  ];
}

/**
 * The input-referred noise density of a bridge front end, by source: bridge thermal noise,
 * amplifier voltage noise, amplifier current noise through the bridge, and amplifier output noise.
 *
 * @remarks
 * Each source is uncorrelated with the others, so densities add in power (see
 * {@link combineNoise}):
 *
 *   e² = 4kT·R_out + e_n²(1 + f_ce/f) + i_n²(1 + f_ci/f)·(a² + b²) + (e_no/G)²
 *
 * with R_out, a and b from {@link bridgeNoiseSource} (for four equal arms R: R_out = R,
 * a² + b² = R²/2) and the 1/f terms evaluated at `frequencyHertz` (omitted: the white floors).
 * This is the standard input-referred noise model of an instrumentation amplifier driven by a
 * resistive source (e.g. Motchenbacher & Connelly, Low-Noise Electronic System Design — from
 * memory). Within a few ulps of the formula.
 *
 * @param options - Bridge, amplifier noise, gain and frequency.
 * @returns The total density and each term.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link bridgeNoiseSource}; `negative`,
 *   `not-finite`, `wrong-type` for a noise figure; `not-positive` for the gain or frequency;
 *   `out-of-range` for a density above 1 per √Hz, a corner above 1e12 Hz, a gain outside
 *   [1e-9, 1e9] or a frequency outside [1e-9, 1e12] Hz; `unknown-option` for a key it does not
 *   know, also inside `amplifier` (naming the closest: a misspelt amplifier field is refused, never
 *   dropped), `missing-option` without `armsOhms`.
 * @example
 * ```ts
 * inputNoiseDensity({
 *   armsOhms: [350, 350, 350, 350],
 *   amplifier: { inputVoltageNoiseVoltsPerRootHz: 10e-9, currentNoiseAmpsPerRootHz: 1e-12 },
 * }).totalVoltsPerRootHz; // 1.028709…e-8 (10.28709 nV/√Hz)
 * ```
 */
export function inputNoiseDensity(options: InputNoiseOptions): InputNoiseDensity {
  const o = checkOptions('options', options, {
    known: [...bridgeNoiseKeys, 'amplifier', 'gain', 'frequencyHertz'],
    required: ['armsOhms'],
  });
  const amp = checkAmplifierNoise('amplifier.', o['amplifier']);
  const gain = o['gain'] === undefined ? 1 : checkGain('gain', o['gain']);
  const f = o['frequencyHertz'] === undefined ? Infinity : checkHertz('frequencyHertz', o['frequencyHertz']);
  const { amplifier: _amplifier, gain: _gain, frequencyHertz: _frequency, ...bridgeOptions } = o;
  const bridge = bridgeNoiseSource(bridgeOptions as unknown as BridgeNoiseOptions);
  const spectra = frontEndSpectra(bridge, amp, gain);
  const combined = combineNoise(
    spectra.map((s) => ({
      name: s.name,
      value: s.corner === 0 ? s.white : s.white * Math.sqrt(1 + s.corner / f),
    })),
  );
  return {
    totalVoltsPerRootHz: combined.total,
    terms: combined.terms.map((t, i) => ({
      ...t,
      whiteVoltsPerRootHz: spectra[i]!.white,
      cornerHertz: spectra[i]!.corner,
    })),
    bridge,
  };
}
