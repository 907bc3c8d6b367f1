import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkNonNegative,
  checkOneOf,
  checkOptions,
  checkPositive,
  formatValue,
} from '@bridgework/core';
import { evaluatorTypes, type EvaluatorType, type FirmwareChannel } from './emitOptions.js';
import type { ExactValue } from './exactValue.js';
import {
  firmwareCost,
  type FirmwareFixedMap,
  type FirmwareFloatMap,
  type FirmwareMap,
} from './firmwareCost.js';
import { buildFixedPiecewise } from './fixedPiecewiseMap.js';
import { fixedPointMap } from './fixedPointMap.js';
import { floatMap } from './floatMap.js';
import { buildFloatMobius, fitMobius } from './floatMobiusMap.js';
import { buildFloatPiecewise } from './floatPiecewiseMap.js';
import { BINARY64, roundToBinary, upperDouble } from './internal/binary.js';
import {
  callReference,
  checkBits,
  checkCodeRange,
  readOptions,
  resolveVerification,
  sampleCodes,
} from './internal/codes.js';
import { boundString } from './internal/decimal.js';
import { exactRational, rationalFromNumber } from './internal/exact.js';
import { fastEvaluator } from './internal/fast.js';
import { horner, probeCodes, remezLine } from './internal/fit.js';
import { add, div, mul, rat, sign, sub, type Rational } from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';
import {
  fitUnchecked,
  MAX_PIECEWISE_DEGREE,
  segmentCodesUnchecked,
  segmentation,
  type PiecewisePolynomial,
} from './piecewisePolynomial.js';
import { fixedPointRoundings, type FixedPointRounding } from './roundShift.js';
import type { ReferenceError, TestVector, TotalErrorBound } from './totalError.js';
import type { VerificationMode } from './verification.js';

/** Options of {@link designFirmwareConstants}. */
export interface DesignFirmwareConstantsOptions {
  /** The channel's name (any text; C identifiers are made from it). */
  readonly name: string;
  /**
   * The exact map: the quantity for a converter code. Called at every integer code of the range
   * (exhaustive verification) and at fractional codes inside it (fitting); it must return finite
   * numbers there.
   */
  readonly exact: (code: number) => number;
  /** The exact map's own error, added to every bound. Default: none stated (bound 0). */
  readonly referenceError?: ReferenceError;
  /** Lowest code the firmware converts, an integer in [−2^31, 2^31 − 1]. */
  readonly codeMin: number;
  /** Highest code the firmware converts, an integer in [codeMin, 2^31 − 1]. */
  readonly codeMax: number;
  /** The quantity's unit name for headers (e.g. `'°C'`). Default `''`. */
  readonly quantityUnit?: string;
  /** The total error each function must meet, quantity unit (> 0). */
  readonly targetError: number;
  /** The functions to design. Default every type: `['fixed', 'float32', 'float64']`. */
  readonly types?: readonly EvaluatorType[];
  /** The fixed-point output LSB, quantity unit (> 0, exact). Required when `'fixed'` is designed. */
  readonly outputUnit?: ExactValue;
  /** Width of fixed-point coefficient words, an integer in [8, 32]. Default 32. */
  readonly coefficientBits?: number;
  /**
   * Accumulator of the affine fixed-point form: 64 (int64_t; a 32 × 32 → 64-bit multiply, native
   * on Cortex-M3/M4/M7) or 32 (int32_t only, for cores without one). Piecewise fixed-point maps
   * always use 32-bit arithmetic. Default 64.
   */
  readonly accumulatorBits?: 32 | 64;
  /** Rounding of the affine fixed-point form. Default `'half-even'`. */
  readonly rounding?: FixedPointRounding;
  /** Whether the target divides in hardware: then the Möbius form is a float candidate. Default false. */
  readonly hardwareDivide?: boolean;
  /** Largest constant table of one function, bytes (≥ 16). Default 4096. */
  readonly maxTableBytes?: number;
  /** Highest polynomial degree tried, an integer in [1, 5]. Default 5 (float) and 4 (fixed). */
  readonly maxDegree?: number;
  /** `'auto'` (exhaustive up to 2^24 codes, default), `'exhaustive'` or `'sampled'`. */
  readonly verification?: VerificationMode;
}

/** A design: the map, its estimated total error and its cost. */
interface Candidate {
  readonly map: FirmwareMap;
  /** Quantity-unit function of the designed (unrounded) form. */
  readonly design: (code: number) => number;
  readonly arithmetic: number;
  readonly estimate: number;
  readonly cost: number;
  readonly description: string;
}

const DEGREE_NAMES = ['constant', 'linear', 'quadratic', 'cubic', 'quartic', 'quintic'];

/** Codes per estimate probe set for affine and Möbius forms. */
const GRID = 4096;

/**
 * Designs the firmware functions of one channel: for each requested type (fixed point, float32,
 * float64) the cheapest map whose total error against the exact map meets the target, verified
 * over every code.
 *
 * @remarks
 * Candidates, per type: the affine map (the best uniform line by Remez's exchange); for float
 * types with `hardwareDivide`, the Möbius map y = (b + a·x)/(1 + c·x) through three Chebyshev
 * points (exact in form for linear-fractional channels); piecewise polynomials of degree 1 to
 * `maxDegree` with 2^k segments indexed by a shift ({@link fitPiecewisePolynomial}), for each
 * degree the fewest segments whose estimated error meets the target within `maxTableBytes`. The
 * estimate is the approximation error on probe codes (both ends, a grid and the points between the
 * Chebyshev extrema of every segment) plus the analytic arithmetic bound of the type plus the
 * reference's error. Among the candidates that meet it, the cheapest ({@link FirmwareCost}: one
 * operation weighed like 32 bytes of table) is verified: every code of the range (up to 2^24, or
 * as `verification` says) is evaluated exactly as the firmware evaluates it and compared with the
 * exact map, and the total bound is the largest difference (with the margin of the binary64
 * subtraction) plus the reference's stated error. A candidate that misses the target on
 * verification is dropped and the next one verified. The affine map is tried first, so a linear
 * map is chosen whenever it meets the target.
 *
 * If no candidate of a type meets the target, nothing is returned: the error names the type, the
 * target and the best bound reached, with the form that reached it.
 *
 * @param options - The exact map and range, the target, the types and the target's limits.
 * @returns The channel's functions with their total error bounds and test vectors, ready for
 *   {@link emitCHeader}, {@link emitJson} and {@link emitTestProgram}.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `targetError`, `limit` the best
 *   bound reached) when a type cannot meet the target; `missing-option` without `outputUnit` for
 *   fixed point; `model-not-finite` when `exact` returns a non-finite value; `overflow` when the
 *   firmware's results would overflow; the option codes for bad options.
 * @example
 * ```ts
 * // A mildly nonlinear 16-bit map to 0.001 in every type.
 * const design = designFirmwareConstants({
 *   name: 'probe',
 *   exact: (code) => 100 * code / (70000 + code),
 *   codeMin: 0,
 *   codeMax: 65535,
 *   targetError: 0.001,
 *   outputUnit: '0.0001',
 * });
 * design.totals?.fixed?.bound; // ≤ 0.001, proved over all 65536 codes
 * ```
 */
export function designFirmwareConstants(options: DesignFirmwareConstantsOptions): FirmwareChannel {
  const o = readOptions(options, {
    known: [
      'name',
      'exact',
      'referenceError',
      'codeMin',
      'codeMax',
      'quantityUnit',
      'targetError',
      'types',
      'outputUnit',
      'coefficientBits',
      'accumulatorBits',
      'rounding',
      'hardwareDivide',
      'maxTableBytes',
      'maxDegree',
      'verification',
    ],
    required: ['name', 'exact', 'codeMin', 'codeMax', 'targetError'],
  });
  const name = o['name'];
  if (typeof name !== 'string') {
    throw new BridgeworkError('wrong-type', `\`name\` must be a string; got ${formatValue(name)}`, {
      param: 'name',
      value: name,
    });
  }
  const exactIn = o['exact'];
  if (typeof exactIn !== 'function') {
    throw new BridgeworkError('wrong-type', '`exact` must be a function (code) => quantity', {
      param: 'exact',
      value: exactIn,
    });
  }
  const exact = exactIn as (code: number) => number;
  const reference = checkReferenceError(o['referenceError']);
  const range = checkCodeRange(o);
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  const target = checkPositive('targetError', o['targetError']);
  const types = checkTypes(o['types']);
  const outputUnit =
    o['outputUnit'] === undefined
      ? undefined
      : checkOutputUnit(exactRational('outputUnit', o['outputUnit']), o);
  if (types.includes('fixed') && outputUnit === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '`outputUnit` must be given to design a fixed-point function',
      {
        param: 'outputUnit',
      },
    );
  }
  const coefficientBits = checkBits('coefficientBits', o['coefficientBits'], 32, 8, 32);
  const accumulatorBits = checkAccumulatorBits(o['accumulatorBits']);
  const rounding =
    o['rounding'] === undefined ? 'half-even' : checkOneOf('rounding', o['rounding'], fixedPointRoundings);
  const hardwareDivide =
    o['hardwareDivide'] === undefined ? false : checkBoolean('hardwareDivide', o['hardwareDivide']);
  const maxTableBytes =
    o['maxTableBytes'] === undefined
      ? 4096
      : checkInteger('maxTableBytes', o['maxTableBytes'], { min: 16, max: 2 ** 24 });
  const maxDegree =
    o['maxDegree'] === undefined
      ? undefined
      : checkInteger('maxDegree', o['maxDegree'], { min: 1, max: MAX_PIECEWISE_DEGREE });
  const method = resolveVerification(o['verification'], range);

  const f = (code: number) => callReference(exact, code);
  const designer = createDesigner({
    f,
    codeMin: range.codeMin,
    codeMax: range.codeMax,
    quantityUnit,
    target,
    reference,
    outputUnit,
    coefficientBits,
    accumulatorBits,
    rounding,
    hardwareDivide,
    maxTableBytes,
    maxDegree,
  });

  // Candidates per type, cheapest first; verify the cheapest of every type in one pass.
  const queues = new Map<EvaluatorType, Candidate[]>();
  const best = new Map<EvaluatorType, BestBound>();
  for (const type of types) {
    const { candidates, bestEstimate } = designer.candidates(type);
    queues.set(type, candidates);
    if (bestEstimate !== undefined) best.set(type, bestEstimate);
  }
  const chosen = new Map<EvaluatorType, { candidate: Candidate; total: TotalErrorBound }>();
  const sampled =
    method === 'sampled' ? sampleCodes(range, [Math.floor((range.codeMin + range.codeMax) / 2)]) : undefined;
  for (let round = 0; chosen.size < types.length; round++) {
    const pending = types.filter((t) => !chosen.has(t));
    const trial = pending.map((t) => {
      const queue = queues.get(t) as Candidate[];
      const next = queue[0];
      if (next === undefined)
        throw targetNotMet(t, target, quantityUnit, best.get(t), { coefficientBits, outputUnit });
      return { type: t, candidate: next };
    });
    // A sampled check also covers every segment edge (where interpolation errors peak) and the
    // spread codes of the test vectors, so every vector code is among the codes checked.
    const codes =
      sampled === undefined
        ? undefined
        : [
            ...new Set([
              ...sampled,
              ...spreadCodes(range),
              ...trial.flatMap((x) => edgeCodes(x.candidate.map)),
            ]),
          ].sort((a, b) => a - b);
    const results = verify(
      f,
      range,
      codes,
      trial.map((x) => ({ type: x.type, candidate: x.candidate, outputUnit })),
    );
    trial.forEach((x, i) => {
      const r = results[i] as ScanTotals;
      const total = totalOf(
        r,
        x.candidate,
        x.type === 'fixed' ? outputUnit : undefined,
        reference,
        target,
        method,
      );
      const queue = queues.get(x.type) as Candidate[];
      queue.shift();
      const previous = best.get(x.type);
      if (previous === undefined || total.bound < previous.bound) {
        best.set(x.type, { bound: total.bound, description: `${x.candidate.description}, verified` });
      }
      if (total.bound <= target) chosen.set(x.type, { candidate: x.candidate, total });
    });
    if (round > 64)
      throw targetNotMet(
        pending[0] as EvaluatorType,
        target,
        quantityUnit,
        best.get(pending[0] as EvaluatorType),
        { coefficientBits, outputUnit },
      );
  }
  const get = (t: EvaluatorType) => chosen.get(t);
  const totals: { -readonly [K in EvaluatorType]?: TotalErrorBound } = {};
  for (const t of types) totals[t] = (get(t) as { total: TotalErrorBound }).total;
  const fixed = get('fixed')?.candidate.map as FirmwareFixedMap | undefined;
  const float32 = get('float32')?.candidate.map as FirmwareFloatMap | undefined;
  const float64 = get('float64')?.candidate.map as FirmwareFloatMap | undefined;
  const testVectors = chooseVectors(f, range, { fixed, float32, float64 }, totals);
  return Object.freeze({
    name,
    ...(fixed === undefined ? {} : { fixed }),
    ...(float32 === undefined ? {} : { float32 }),
    ...(float64 === undefined ? {} : { float64 }),
    totals: Object.freeze(totals),
    reference: Object.freeze({ ...reference }),
    targetError: target,
    testVectors,
  });
}

function checkAccumulatorBits(value: unknown): 32 | 64 {
  if (value === undefined) return 64;
  if (value !== 32 && value !== 64) {
    throw new BridgeworkError(
      'invalid-option',
      `\`accumulatorBits\` must be 32 or 64; got ${formatValue(value)}`,
      {
        param: 'accumulatorBits',
        value,
        limit: [32, 64],
      },
    );
  }
  return value;
}

function checkBoolean(param: string, value: unknown): boolean {
  if (typeof value !== 'boolean') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be true or false; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  return value;
}

function checkReferenceError(value: unknown): ReferenceError {
  if (value === undefined) return { bound: 0, source: 'none stated' };
  const o = checkOptions('referenceError', value, {
    known: ['bound', 'source'],
    required: ['bound', 'source'],
  });
  const bound = checkNonNegative('referenceError.bound', checkFinite('referenceError.bound', o['bound']));
  if (typeof o['source'] !== 'string') {
    throw new BridgeworkError(
      'wrong-type',
      `\`referenceError.source\` must be a string; got ${formatValue(o['source'])}`,
      {
        param: 'referenceError.source',
        value: o['source'],
      },
    );
  }
  return { bound, source: o['source'] };
}

function checkTypes(value: unknown): readonly EvaluatorType[] {
  if (value === undefined) return evaluatorTypes;
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`types\` must be a non-empty array; got ${formatValue(value)}`,
      {
        param: 'types',
        value,
      },
    );
  }
  const list = value.map((t: unknown, i: number) => checkOneOf(`types[${i}]`, t, evaluatorTypes));
  if (new Set(list).size !== list.length) {
    throw new BridgeworkError('invalid-option', '`types` must not repeat a type', { param: 'types', value });
  }
  return evaluatorTypes.filter((t) => list.includes(t));
}

function checkOutputUnit(unit: Rational, o: Record<string, unknown>): Rational {
  if (sign(unit) <= 0) {
    throw new BridgeworkError(
      'not-positive',
      `\`outputUnit\` must be > 0; got ${formatValue(o['outputUnit'])}`,
      {
        param: 'outputUnit',
        value: o['outputUnit'],
        limit: 0,
      },
    );
  }
  return unit;
}

/** The best total bound a type reached (or, with `floor`, a bound no function of the type can beat). */
interface BestBound {
  readonly bound: number;
  readonly description: string;
  readonly floor?: boolean;
}

function targetNotMet(
  type: EvaluatorType,
  target: number,
  unit: string,
  best: BestBound | undefined,
  limits: { readonly coefficientBits: number; readonly outputUnit: Rational | undefined },
): BridgeworkError {
  const u = unit === '' ? '' : ` ${unit}`;
  const step =
    limits.outputUnit === undefined
      ? ''
      : ` at an output step of ${formatValue(roundToBinary(limits.outputUnit, BINARY64))}${u}`;
  const none = best === undefined || !Number.isFinite(best.bound);
  const reached = none
    ? type === 'fixed'
      ? `no candidate form fits ${limits.coefficientBits}-bit coefficients and int32 outputs${step}, so no bound was reached`
      : 'no candidate form can represent the map, so no bound was reached'
    : best.floor === true
      ? `no ${type} function can do better than ${boundString(rationalFromNumber(best.bound), 4)}${u} (${best.description})`
      : `the best bound reached is ${boundString(rationalFromNumber(best.bound), 4)}${u} (${best.description})`;
  const hint =
    type === 'float32'
      ? 'relax `targetError`, allow a larger table (`maxTableBytes`) or use float64'
      : type === 'float64'
        ? 'relax `targetError` or allow a larger table (`maxTableBytes`)'
        : best?.floor === true
          ? 'relax `targetError` or give a finer `outputUnit`'
          : none
            ? 'give a coarser `outputUnit` or wider coefficients (`coefficientBits`)'
            : 'relax `targetError`, allow a larger table (`maxTableBytes`), wider coefficients (`coefficientBits`) or a finer `outputUnit`';
  return new BridgeworkError(
    'out-of-range',
    `\`targetError\` ${target}${u} cannot be met by a ${type} function: ${reached}; ${hint}`,
    { param: 'targetError', value: target, limit: best?.bound ?? Infinity },
  );
}

interface DesignerInput {
  readonly f: (code: number) => number;
  readonly codeMin: number;
  readonly codeMax: number;
  readonly quantityUnit: string;
  readonly target: number;
  readonly reference: ReferenceError;
  readonly outputUnit: Rational | undefined;
  readonly coefficientBits: number;
  readonly accumulatorBits: 32 | 64;
  readonly rounding: FixedPointRounding;
  readonly hardwareDivide: boolean;
  readonly maxTableBytes: number;
  readonly maxDegree: number | undefined;
}

/** The candidate search, with fits and approximation estimates shared between the types. */
function createDesigner(input: DesignerInput) {
  const { f, codeMin, codeMax, target, reference } = input;
  const n = codeMax - codeMin + 1;
  const allBits = Math.min(31, Math.max(1, Math.ceil(Math.log2(n))));
  const fits = new Map<string, { poly: PiecewisePolynomial; estimate: number }>();
  const fitAt = (degree: number, bits: number) => {
    const key = `${degree}/${bits}`;
    let entry = fits.get(key);
    if (entry === undefined) {
      const poly = fitUnchecked(f, codeMin, codeMax, bits, degree);
      entry = { poly, estimate: piecewiseEstimate(f, poly) };
      fits.set(key, entry);
    }
    return entry;
  };
  // The grid for the line and the Möbius form.
  let grid: { codes: number[]; values: number[] } | undefined;
  const gridValues = () => {
    if (grid === undefined) {
      const codes = [
        ...new Set([
          ...Array.from({ length: GRID + 1 }, (_, i) => codeMin + Math.round(((n - 1) * i) / GRID)),
        ]),
      ];
      grid = { codes, values: codes.map(f) };
    }
    return grid;
  };
  let line: { c0: number; c1: number; centre: number; estimate: number } | undefined;
  const lineFit = () => {
    if (line === undefined) {
      const { codes, values } = gridValues();
      const centre = Math.floor((codeMin + codeMax + 1) / 2);
      const { coefficients } = remezLine(codes, values, centre);
      const [c0, c1] = coefficients;
      const estimate = codes.reduce(
        (m, c, i) => Math.max(m, Math.abs(c0 + c1 * (c - centre) - (values[i] as number))),
        0,
      );
      line = { c0, c1, centre, estimate };
    }
    return line;
  };
  const budget = target - reference.bound;
  const meets = (estimate: number, arithmetic: number) => estimate * 1.05 + arithmetic <= budget;
  const lsb = input.outputUnit === undefined ? 1 : roundToBinary(input.outputUnit, BINARY64);

  function affineCandidate(type: EvaluatorType): Candidate | undefined {
    const l = lineFit();
    if (l.c1 === 0 || !Number.isFinite(l.c1)) return undefined;
    // y = c1·(code − offset) with offset = centre − c0/c1, passed exactly as a ratio.
    const c0 = rationalFromNumber(l.c0);
    const c1 = rationalFromNumber(l.c1);
    const offset = sub(rat(BigInt(l.centre)), div(c0, c1));
    const offsetText = `${offset.n}/${offset.d}`;
    const scaleText = `${c1.n}/${c1.d}`;
    const design = (code: number) => l.c0 + l.c1 * (code - l.centre);
    const description = 'affine';
    try {
      if (type === 'fixed') {
        const unit = input.outputUnit as Rational;
        const map = fixedPointMap({
          scale: scaleText,
          offset: offsetText,
          codeMin,
          codeMax,
          outputUnit: `${unit.n}/${unit.d}`,
          quantityUnit: input.quantityUnit,
          coefficientBits: input.coefficientBits,
          accumulatorBits: input.accumulatorBits,
          rounding: input.rounding,
          verification: 'sampled',
        });
        const arithmetic = upperDouble(mul(rationalFromNumber(map.errorBound), unit));
        return { map, design, arithmetic, estimate: l.estimate, cost: firmwareCost(map).cost, description };
      }
      const map = floatMap({
        kind: 'affine',
        scale: scaleText,
        offset: offsetText,
        precision: type,
        codeMin,
        codeMax,
        quantityUnit: input.quantityUnit,
        verification: 'sampled',
      });
      return {
        map,
        design,
        arithmetic: map.errorBound,
        estimate: l.estimate,
        cost: firmwareCost(map).cost,
        description,
      };
    } catch (e) {
      if (e instanceof BridgeworkError && e.code === 'overflow') return undefined;
      throw e;
    }
  }

  function mobiusCandidate(type: 'float32' | 'float64'): Candidate | undefined {
    if (n < 3) return undefined;
    const centre = Math.floor((codeMin + codeMax + 1) / 2);
    const fit = fitMobius(f, codeMin, codeMax, centre);
    if (fit === undefined) return undefined;
    const map = buildFloatMobius(
      rationalFromNumber(fit.a),
      rationalFromNumber(fit.b),
      rationalFromNumber(fit.c),
      centre,
      type,
      codeMin,
      codeMax,
      input.quantityUnit,
    );
    if (map === undefined) return undefined;
    const design = (code: number) => {
      const x = code - centre;
      return (fit.b + fit.a * x) / (1 + fit.c * x);
    };
    const { codes, values } = gridValues();
    const estimate = codes.reduce((m, c, i) => Math.max(m, Math.abs(design(c) - (values[i] as number))), 0);
    return {
      map,
      design,
      arithmetic: map.arithmeticBound,
      estimate,
      cost: firmwareCost(map).cost,
      description: 'Möbius',
    };
  }

  function piecewiseCandidate(type: EvaluatorType, degree: number, bits: number): Candidate | undefined {
    const { poly, estimate } = fitAt(degree, bits);
    const map =
      type === 'fixed'
        ? buildFixedPiecewise(poly, input.outputUnit as Rational, input.coefficientBits, input.quantityUnit)
        : buildFloatPiecewise(poly, type, input.quantityUnit);
    if (map === undefined) return undefined;
    const arithmetic =
      type === 'fixed'
        ? upperDouble(mul(rationalFromNumber(map.arithmeticBound), input.outputUnit as Rational))
        : map.arithmeticBound;
    const design = piecewiseDesign(poly);
    const segments =
      poly.segmentCount === 1 ? 'one segment' : `${poly.segmentCount} segments of 2^${bits} codes`;
    return {
      map,
      design,
      arithmetic,
      estimate,
      cost: firmwareCost(map).cost,
      description: `piecewise ${DEGREE_NAMES[degree] as string}, ${segments}`,
    };
  }

  /** Bytes of one segment's table for a type and degree. */
  function segmentBytes(type: EvaluatorType, degree: number): number {
    if (type === 'fixed')
      return (
        (degree + 1) * (input.coefficientBits <= 8 ? 1 : input.coefficientBits <= 16 ? 2 : 4) + degree + 1
      );
    return (degree + 1) * (type === 'float32' ? 4 : 8);
  }

  return {
    candidates(type: EvaluatorType): {
      candidates: Candidate[];
      bestEstimate: BestBound | undefined;
    } {
      const found: Candidate[] = [];
      let bestEstimate: BestBound | undefined;
      const consider = (c: Candidate | undefined) => {
        if (c === undefined) return false;
        const bound = c.estimate + c.arithmetic + reference.bound;
        if (bestEstimate === undefined || bound < bestEstimate.bound) {
          bestEstimate = {
            bound,
            description: `${c.description}, ${firmwareCost(c.map).tableBytes} bytes, estimated`,
          };
        }
        if (meets(c.estimate, c.arithmetic)) {
          found.push(c);
          return true;
        }
        return false;
      };
      // Fixed point cannot beat half an output step.
      if (type === 'fixed' && lsb / 2 > budget) {
        return {
          candidates: [],
          bestEstimate: {
            bound: lsb / 2 + reference.bound,
            description: `half the output step of ${formatValue(lsb)}${input.quantityUnit === '' ? '' : ` ${input.quantityUnit}`}`,
            floor: true,
          },
        };
      }
      consider(affineCandidate(type));
      if (type !== 'fixed' && input.hardwareDivide) consider(mobiusCandidate(type));
      const top = input.maxDegree ?? (type === 'fixed' ? 4 : MAX_PIECEWISE_DEGREE);
      for (let degree = 1; degree <= top; degree++) {
        // Operations grow with the degree: once a found form is cheaper than the operations of
        // this degree alone (no table), no higher degree can win.
        const cheapest = found.reduce((m, c) => Math.min(m, c.cost), Infinity);
        if (operationsOf(type, degree) >= cheapest) break;
        for (let bits = allBits; bits >= 1; bits--) {
          const { segmentCount } = segmentation(codeMin, codeMax, bits);
          if (segmentCount * segmentBytes(type, degree) > input.maxTableBytes) break;
          if (segmentCount > 1 && 2 ** bits < 2 * (degree + 1)) break;
          if (consider(piecewiseCandidate(type, degree, bits))) break;
        }
      }
      found.sort((a, b) => a.cost - b.cost);
      return { candidates: found, bestEstimate };
    },
  };
}

/** The weighted operations of a piecewise polynomial of a degree, without its table (firmwareCost). */
function operationsOf(type: EvaluatorType, degree: number): number {
  // fixed: n multiplies, n + 2 additions, n + 3 shifts, n + 1 comparisons; float: n, n + 2, 2 and
  // one conversion.
  return type === 'fixed' ? 4 * degree + 6 : 2 * degree + 5;
}

/** Ascending Horner of a piecewise polynomial in binary64 (the designed function). */
function piecewiseDesign(p: PiecewisePolynomial): (code: number) => number {
  const length = 2 ** p.segmentBits;
  const half = length / 2;
  return (code: number) => {
    const u = code - p.segmentBase;
    const i = Math.floor(u / length);
    return horner(p.coefficients[i] as readonly number[], u - i * length - half);
  };
}

/** The largest |polynomial − map| on every segment's probe codes. */
function piecewiseEstimate(f: (code: number) => number, p: PiecewisePolynomial): number {
  let worst = 0;
  for (let i = 0; i < p.segmentCount; i++) {
    const s = segmentCodesUnchecked(p, i);
    const a = p.coefficients[i] as readonly number[];
    for (const code of probeCodes(s.first, s.last, p.degree)) {
      const e = Math.abs(horner(a, code - s.centre) - f(code));
      if (e > worst) worst = e;
    }
  }
  return worst;
}

interface ScanTotals {
  /** Largest |result − reference| in the function's units (output LSB for fixed), before margins. */
  maxTotal: number;
  worstCode: number;
  /** Largest |design − reference| in quantity units. */
  maxApproximation: number;
  /** Largest |reference| in the function's units. */
  referenceMagnitude: number;
  count: number;
}

/**
 * Evaluates every code (or the sampled ones) once through the reference and through every
 * function: firmware result, designed function and reference side by side.
 */
function verify(
  f: (code: number) => number,
  range: { codeMin: number; codeMax: number },
  sampled: readonly number[] | undefined,
  jobs: readonly { type: EvaluatorType; candidate: Candidate; outputUnit: Rational | undefined }[],
): ScanTotals[] {
  const k = jobs.length;
  const evaluate = jobs.map((j) => fastEvaluator(j.candidate.map));
  const design = jobs.map((j) => j.candidate.design);
  const scale = jobs.map((j) =>
    j.type === 'fixed' ? 1 / roundToBinary(j.outputUnit as Rational, BINARY64) : 1,
  );
  const out: ScanTotals[] = jobs.map(() => ({
    maxTotal: 0,
    worstCode: range.codeMin,
    maxApproximation: 0,
    referenceMagnitude: 0,
    count: 0,
  }));
  const visit = (code: number) => {
    const q = f(code);
    for (let i = 0; i < k; i++) {
      const r = out[i] as ScanTotals;
      const s = scale[i] as number;
      const y = (evaluate[i] as (c: number) => number)(code);
      if (!Number.isFinite(y)) {
        throw new BridgeworkError(
          'overflow',
          `the ${(jobs[i] as { type: string }).type} result at code ${code} must be finite; it overflows`,
          {
            param: 'exact',
            value: code,
          },
        );
      }
      const ref = q * s;
      const e = Math.abs(y - ref);
      if (e > r.maxTotal) {
        r.maxTotal = e;
        r.worstCode = code;
      }
      const a = Math.abs((design[i] as (c: number) => number)(code) - q);
      if (a > r.maxApproximation) r.maxApproximation = a;
      const m = Math.abs(ref);
      if (m > r.referenceMagnitude) r.referenceMagnitude = m;
    }
  };
  if (sampled === undefined) {
    for (let code = range.codeMin; code <= range.codeMax; code++) visit(code);
  } else {
    for (const code of sampled) visit(code);
  }
  const count = sampled === undefined ? range.codeMax - range.codeMin + 1 : sampled.length;
  for (const r of out) r.count = count;
  return out;
}

/** The total error record of a verified candidate. */
function totalOf(
  r: ScanTotals,
  c: Candidate,
  outputUnit: Rational | undefined,
  reference: ReferenceError,
  target: number,
  method: 'exhaustive' | 'sampled',
): TotalErrorBound {
  // |y − q·s| was measured in binary64: q·s carries at most 2.01u relative (s rounded, one
  // product; s = 1 for float functions), and the subtraction u of its result.
  const u = 2 ** -53;
  const measuredUnits = r.maxTotal * (1 + 2 * u) + 2.01 * u * r.referenceMagnitude * (1 + 2 * u);
  // Fixed-point errors were measured in output LSB: back to the quantity unit, exactly.
  const inUnits = rationalFromNumber(measuredUnits);
  const againstReference = outputUnit === undefined ? inUnits : mul(inUnits, outputUnit);
  // Sampled: the fit was also measured on every segment's probe codes (estimate); take the larger.
  const approximationMeasured =
    method === 'sampled' ? Math.max(r.maxApproximation, c.estimate) : r.maxApproximation;
  const approximation = upperDouble(rationalFromNumber(approximationMeasured * (1 + 4 * u)));
  const arithmetic = c.arithmetic;
  let bound: number;
  let against: number;
  if (method === 'exhaustive') {
    against = upperDouble(againstReference);
    bound = upperDouble(add(againstReference, rationalFromNumber(reference.bound)));
  } else {
    // Sampled: the measured approximation plus the analytic arithmetic bound (a measured figure).
    const sampledBound = add(rationalFromNumber(approximation), rationalFromNumber(arithmetic));
    against = upperDouble(againstReference);
    const stated = add(sampledBound, rationalFromNumber(reference.bound));
    const floor = add(againstReference, rationalFromNumber(reference.bound));
    bound = upperDouble(sign(sub(stated, floor)) >= 0 ? stated : floor);
  }
  return Object.freeze({
    bound,
    proved: method === 'exhaustive',
    method,
    codesChecked: r.count,
    worstCode: r.worstCode,
    againstReference: against,
    referenceError: reference.bound,
    referenceErrorSource: reference.source,
    approximation,
    arithmetic,
    target,
  });
}

/** 11 evenly spaced codes and 12 fixed-seed pseudo-random codes inside the range. */
function spreadCodes(range: { codeMin: number; codeMax: number }): number[] {
  const { codeMin, codeMax } = range;
  const span = codeMax - codeMin;
  const out: number[] = [];
  for (let i = 1; i < 12; i++) out.push(codeMin + Math.floor((span * i) / 12));
  let state = 0x1b873593;
  for (let i = 0; i < 12; i++) {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    out.push(codeMin + Math.floor(((state >>> 0) / 2 ** 32) * (span + 1)));
  }
  return out;
}

/** The first and last code of the segments of a piecewise map (of every segment, or of about `most`). */
function edgeCodes(map: FirmwareMap, most = Infinity): number[] {
  if (map.kind !== 'piecewise-polynomial') return [];
  const step = Math.max(1, Math.ceil(map.segmentCount / most));
  const out: number[] = [];
  for (let i = 0; i < map.segmentCount; i += step) {
    const s = segmentCodesUnchecked(map, i);
    out.push(s.first, s.last);
  }
  return out;
}

/**
 * Test vectors: both rails, segment edges (at most 24 per function), each function's worst code,
 * and a spread of 24 more (an even grid and fixed-seed pseudo-random codes).
 */
function chooseVectors(
  f: (code: number) => number,
  range: { codeMin: number; codeMax: number },
  maps: {
    fixed: FirmwareFixedMap | undefined;
    float32: FirmwareFloatMap | undefined;
    float64: FirmwareFloatMap | undefined;
  },
  totals: { readonly [K in EvaluatorType]?: TotalErrorBound },
): readonly TestVector[] {
  const { codeMin, codeMax } = range;
  const reasons = new Map<number, TestVector['reason']>();
  const add1 = (code: number, reason: TestVector['reason']) => {
    if (code >= codeMin && code <= codeMax && !reasons.has(code)) reasons.set(code, reason);
  };
  add1(codeMin, 'rail');
  add1(codeMax, 'rail');
  for (const t of evaluatorTypes) {
    const w = totals[t];
    if (w !== undefined) add1(w.worstCode, 'worst-error');
  }
  for (const m of [maps.fixed, maps.float32, maps.float64]) {
    if (m !== undefined) for (const code of edgeCodes(m, 12)) add1(code, 'segment-edge');
  }
  for (const code of spreadCodes(range)) add1(code, 'spread');
  const codes = [...reasons.keys()].sort((a, b) => a - b);
  return Object.freeze(
    codes.map((code) =>
      Object.freeze({
        code,
        reason: reasons.get(code) as TestVector['reason'],
        exact: f(code),
        ...(maps.fixed === undefined ? {} : { fixed: maps.fixed.evaluate(code) }),
        ...(maps.float32 === undefined ? {} : { float32: maps.float32.evaluate(code) }),
        ...(maps.float64 === undefined ? {} : { float64: maps.float64.evaluate(code) }),
      }),
    ),
  );
}
