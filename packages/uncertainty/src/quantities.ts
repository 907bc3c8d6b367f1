import {
  BridgeworkError,
  checkFinite,
  checkNonNegative,
  checkObject,
  checkOneOf,
  checkOptions,
  checkPositive,
  formatValue,
} from '@bridgework/core';
import type { SamplerSpec } from './internal/samplers.js';

/**
 * The probability distribution assigned to an input quantity (JCGM 101 6.4):
 * - `'normal'`: Gaussian, from a standard uncertainty or a certificate's expanded uncertainty;
 * - `'rectangular'`: uniform on value ± halfWidth;
 * - `'triangular'`: symmetric triangular on value ± halfWidth;
 * - `'arcsine'`: U-shaped on value ± halfWidth (a sinusoidally varying quantity);
 * - `'t'`: scaled and shifted Student-t (a Type A evaluation from few observations).
 */
export type Distribution = 'normal' | 'rectangular' | 'triangular' | 'arcsine' | 't';

/** Every {@link Distribution}, for option checks. */
export const distributions: readonly Distribution[] = ['normal', 'rectangular', 'triangular', 'arcsine', 't'];

/** A normally distributed input quantity given by its standard uncertainty. */
export interface NormalQuantity {
  /** The estimate x. */
  readonly value: number;
  /** The standard uncertainty u(x) (≥ 0), in the unit of `value`. */
  readonly standardUncertainty: number;
  /** May be given as `'normal'`; the default. */
  readonly distribution?: 'normal';
  /**
   * Degrees of freedom of u(x) (> 0, default `Infinity`: u(x) known exactly). The law of
   * propagation uses it in the Welch–Satterthwaite formula; the Monte Carlo method then samples a
   * scaled and shifted t-distribution t_ν(x, u²) (JCGM 101 6.4.9.7) instead of a Gaussian.
   */
  readonly degreesOfFreedom?: number;
}

/** A normally distributed input quantity from a certificate: expanded uncertainty and coverage factor. */
export interface CertificateQuantity {
  /** The estimate x, as certified. */
  readonly value: number;
  /** The expanded uncertainty U (≥ 0), in the unit of `value`. */
  readonly expandedUncertainty: number;
  /** The coverage factor k (> 0) stated with U; u(x) = U/k (JCGM 100 4.3.3). */
  readonly coverageFactor: number;
  /** May be given as `'normal'`; the default. */
  readonly distribution?: 'normal';
  /**
   * Effective degrees of freedom stated on the certificate (> 0, default `Infinity`). With a
   * finite value the Monte Carlo method samples t_ν(x, (U/k)²) (JCGM 101 6.4.9.7).
   */
  readonly degreesOfFreedom?: number;
}

/** An input quantity bounded by value ± halfWidth, with a rectangular, triangular or arcsine distribution. */
export interface BoundedQuantity {
  /** The estimate x, the midpoint of the interval. */
  readonly value: number;
  /** The distribution over [x − a, x + a]. */
  readonly distribution: 'rectangular' | 'triangular' | 'arcsine';
  /** The half-width a (≥ 0) of the interval, in the unit of `value`. */
  readonly halfWidth: number;
  /**
   * Degrees of freedom of u(x) for the Welch–Satterthwaite formula (> 0, default `Infinity`),
   * for example ν = ½(Δu/u)⁻² from the relative reliability of the bounds (JCGM 100 G.4.2).
   * Ignored by the Monte Carlo method.
   */
  readonly degreesOfFreedom?: number;
}

/** An input quantity with a scaled and shifted Student-t distribution (JCGM 101 6.4.9). */
export interface StudentTQuantity {
  /** The estimate x, the mean of n observations. */
  readonly value: number;
  /** `'t'`. */
  readonly distribution: 't';
  /** The scale s (≥ 0), for a Type A evaluation the experimental standard deviation of the mean s/√n. */
  readonly scale: number;
  /** The degrees of freedom ν (> 0), for a Type A evaluation n − 1. */
  readonly degreesOfFreedom: number;
}

/**
 * An input quantity: an estimate with the information that gives it a distribution (see
 * {@link distributions}).
 */
export type InputQuantity = NormalQuantity | CertificateQuantity | BoundedQuantity | StudentTQuantity;

/** Named input quantities; the model receives a record with the same names. */
export type InputQuantities = Readonly<Record<string, InputQuantity>>;

/** An input quantity after checking: what propagation and sampling need. */
export interface NormalizedInput {
  readonly name: string;
  readonly value: number;
  /** u(x) as the law of propagation uses it. */
  readonly standardUncertainty: number;
  /** ν for the Welch–Satterthwaite formula (`Infinity` when exact). */
  readonly degreesOfFreedom: number;
  /** How the Monte Carlo method draws it. */
  readonly sampler: SamplerSpec;
  /** Whether the Monte Carlo method draws it from a Gaussian (so it may be correlated there). */
  readonly gaussian: boolean;
}

const keysOf: Record<string, readonly string[]> = {
  normal: ['value', 'standardUncertainty', 'distribution', 'degreesOfFreedom'],
  certificate: ['value', 'expandedUncertainty', 'coverageFactor', 'distribution', 'degreesOfFreedom'],
  bounded: ['value', 'distribution', 'halfWidth', 'degreesOfFreedom'],
  t: ['value', 'distribution', 'scale', 'degreesOfFreedom'],
};

const everyKey = [...new Set(Object.values(keysOf).flat())];

/** Rejects keys of another kind of quantity (`conflicting-options`); unknown keys are refused before. */
function rejectOtherKeys(
  path: string,
  q: Record<string, unknown>,
  allowed: readonly string[],
  kind: string,
): void {
  for (const key of Object.keys(q)) {
    if (!allowed.includes(key)) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`${path}.${key}\` must not be given for ${kind}; allowed: ${allowed.join(', ')}`,
        { param: `${path}.${key}`, value: q[key], limit: allowed },
      );
    }
  }
}

function required(path: string, q: Record<string, unknown>, key: string, why: string): unknown {
  const v = q[key];
  if (v === undefined) {
    throw new BridgeworkError('missing-option', `\`${path}.${key}\` must be given ${why}; got undefined`, {
      param: `${path}.${key}`,
      value: v,
    });
  }
  return v;
}

function degreesOfFreedomOf(path: string, q: Record<string, unknown>): number {
  const v = q['degreesOfFreedom'];
  return v === undefined ? Infinity : checkPositive(`${path}.degreesOfFreedom`, v, { allowInfinity: true });
}

/** Normal sampling: a Gaussian, or t_ν(x, u²) when ν is finite (JCGM 101 6.4.7, 6.4.9.7). */
function normalSampler(value: number, u: number, nu: number): SamplerSpec {
  if (u === 0) return { kind: 'constant', mean: value };
  return nu === Infinity
    ? { kind: 'normal', mean: value, scale: u }
    : { kind: 't', mean: value, scale: u, degreesOfFreedom: nu };
}

/**
 * Checks one input quantity and works out its standard uncertainty, degrees of freedom and
 * sampler. `path` names it in errors (`inputs.V`).
 */
export function normalizeQuantity(path: string, name: string, quantity: unknown): NormalizedInput {
  const q = checkOptions(path, quantity, { known: everyKey, required: ['value'] });
  const value = checkFinite(`${path}.value`, q['value']);
  const distribution =
    q['distribution'] === undefined
      ? 'normal'
      : checkOneOf(`${path}.distribution`, q['distribution'], distributions);
  if (distribution === 'normal') {
    const hasU = q['standardUncertainty'] !== undefined;
    const hasExpanded = q['expandedUncertainty'] !== undefined || q['coverageFactor'] !== undefined;
    if (hasU && hasExpanded) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`${path}\` must give either standardUncertainty or expandedUncertainty with coverageFactor, not both`,
        { param: `${path}.expandedUncertainty`, value: q['expandedUncertainty'] },
      );
    }
    const nu = degreesOfFreedomOf(path, q);
    if (hasExpanded) {
      rejectOtherKeys(path, q, keysOf['certificate'] as readonly string[], 'a certificate value');
      const expanded = checkNonNegative(
        `${path}.expandedUncertainty`,
        required(path, q, 'expandedUncertainty', 'with coverageFactor'),
      );
      const k = checkPositive(
        `${path}.coverageFactor`,
        required(path, q, 'coverageFactor', 'with expandedUncertainty'),
      );
      const u = expanded / k;
      if (!Number.isFinite(u)) {
        throw new BridgeworkError(
          'out-of-range',
          `\`${path}.coverageFactor\` must leave U/k within binary64; got U = ${formatValue(expanded)} and k = ${formatValue(k)}`,
          { param: `${path}.coverageFactor`, value: k },
        );
      }
      return {
        name,
        value,
        standardUncertainty: u,
        degreesOfFreedom: nu,
        sampler: normalSampler(value, u, nu),
        gaussian: nu === Infinity,
      };
    }
    rejectOtherKeys(path, q, keysOf['normal'] as readonly string[], 'a normal quantity');
    const u = checkNonNegative(
      `${path}.standardUncertainty`,
      required(
        path,
        q,
        'standardUncertainty',
        'for a normal quantity (or expandedUncertainty with coverageFactor)',
      ),
    );
    return {
      name,
      value,
      standardUncertainty: u,
      degreesOfFreedom: nu,
      sampler: normalSampler(value, u, nu),
      gaussian: nu === Infinity,
    };
  }
  if (distribution === 't') {
    rejectOtherKeys(path, q, keysOf['t'] as readonly string[], "a 't' quantity");
    const scale = checkNonNegative(`${path}.scale`, required(path, q, 'scale', "for a 't' quantity"));
    const nu = checkPositive(
      `${path}.degreesOfFreedom`,
      required(path, q, 'degreesOfFreedom', "for a 't' quantity"),
      {
        allowInfinity: true,
      },
    );
    const sampler: SamplerSpec =
      scale === 0
        ? { kind: 'constant', mean: value }
        : { kind: 't', mean: value, scale, degreesOfFreedom: nu };
    return { name, value, standardUncertainty: scale, degreesOfFreedom: nu, sampler, gaussian: false };
  }
  rejectOtherKeys(path, q, keysOf['bounded'] as readonly string[], `a ${distribution} quantity`);
  const a = checkNonNegative(
    `${path}.halfWidth`,
    required(path, q, 'halfWidth', `for a ${distribution} quantity`),
  );
  const nu = degreesOfFreedomOf(path, q);
  // u = a/√3, a/√6, a/√2 (JCGM 100 4.3.7, 4.3.9; JCGM 101 6.4.2, 6.4.5, 6.4.6).
  const divisor =
    distribution === 'rectangular' ? Math.sqrt(3) : distribution === 'triangular' ? Math.sqrt(6) : Math.SQRT2;
  const sampler: SamplerSpec =
    a === 0 ? { kind: 'constant', mean: value } : { kind: distribution, mean: value, halfWidth: a };
  return { name, value, standardUncertainty: a / divisor, degreesOfFreedom: nu, sampler, gaussian: false };
}

/**
 * Checks the named input quantities and returns them in the record's order.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` unless `inputs` is an object;
 *   `invalid-shape` when it is empty; the codes of {@link standardUncertaintyOf} for each quantity.
 */
export function normalizeInputs(inputs: unknown): NormalizedInput[] {
  const record = checkObject('inputs', inputs);
  const names = Object.keys(record);
  if (names.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      '`inputs` must name at least one input quantity; got an empty object',
      {
        param: 'inputs',
        value: inputs,
      },
    );
  }
  return names.map((name) => normalizeQuantity(`inputs.${name}`, name, record[name]));
}

/**
 * The standard uncertainty u(x) that the law of propagation assigns to an input quantity.
 *
 * @remarks
 * JCGM 100 (GUM) 4.3 and JCGM 101 6.4: u = standardUncertainty for a normal quantity; U/k for a
 * certificate value (4.3.3); a/√3 for a rectangular (4.3.7), a/√6 for a symmetric triangular
 * (4.3.9) and a/√2 for an arcsine distribution of half-width a; for a Student-t quantity the scale
 * s itself, as the GUM treats a Type A evaluation (u = s/√n with ν = n − 1, 4.2). The Monte Carlo
 * method samples the t-distribution, whose standard deviation s·√(ν/(ν − 2)) is larger (JCGM 101
 * 6.4.9.4): that difference between the two methods is real and shows in their comparison. For
 * ν ≤ 2 the t-distribution has no finite variance: the GUM's Type A u = s returned here still
 * holds for the law of propagation, but `monteCarlo` refuses such an input (`out-of-range`).
 *
 * @param quantity - The input quantity.
 * @returns u(x), in the unit of its value.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` or `not-finite` for a bad number;
 *   `negative` for a negative uncertainty, half-width or scale; `not-positive` for a coverage
 *   factor or degrees of freedom ≤ 0; `invalid-option` for an unknown distribution;
 *   `missing-option` when `value` or a field the distribution needs is absent; `unknown-option`
 *   for a field no quantity has (naming the closest); `conflicting-options` for a field of
 *   another kind.
 * @example
 * ```ts
 * standardUncertaintyOf({ value: 2.1, distribution: 'rectangular', halfWidth: 0.021 }); // 0.012124… (a/√3)
 * standardUncertaintyOf({ value: 10, expandedUncertainty: 0.02, coverageFactor: 2 }); // 0.01
 * ```
 */
export function standardUncertaintyOf(quantity: InputQuantity): number {
  return normalizeQuantity('quantity', 'quantity', quantity).standardUncertainty;
}
