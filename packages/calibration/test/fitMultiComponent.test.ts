import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitMultiComponent, type LoadingPoint } from '@bridgework/calibration';
import { decimalLeastSquares } from './support/decimalLeastSquares.js';

/**
 * An invented six-component sensor (a robot-wrist coupling): Fx, Fy ±500 N, Fz ±1000 N, Mx, My
 * ±20 N·m, Mz ±15 N·m, six bridges of about 1 mV/V at full scale with 0.5–3 % linear cross-talk
 * and second-order interactions of up to about 0.3 % of full-scale output. The forward model is
 * written here, independently of the library's term machinery.
 */
const names = ['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz'];
const bridges = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6'];
const FS = [500, 500, 1000, 20, 20, 15];

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
/** A standard normal variate (Box–Muller) from a uniform generator. */
function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

interface TrueSensor {
  readonly offsets: number[];
  readonly s: number[][];
  /** q[i]['j,k'] for j ≤ k. */
  readonly q: Record<string, number>[];
  readings(f: readonly number[]): number[];
}

function makeSensor(seed: number, nBridges: number, secondOrder: boolean): TrueSensor {
  const random = mulberry32(seed);
  const offsets = Array.from({ length: nBridges }, () => (random() - 0.5) * 4e-5);
  const s = Array.from({ length: nBridges }, (_, i) =>
    FS.map((fs, j) => {
      const primary = i % 6 === j;
      const size = primary
        ? 1e-3 * (0.9 + 0.2 * random())
        : 1e-3 * (0.005 + 0.025 * random()) * (random() < 0.5 ? -1 : 1);
      return (i >= 6 && primary ? 0.7 : 1) * (size / fs);
    }),
  );
  const q = Array.from({ length: nBridges }, () => {
    const row: Record<string, number> = {};
    if (!secondOrder) return row;
    for (let j = 0; j < 6; j++) {
      for (let k = j; k < 6; k++) row[`${j},${k}`] = ((random() - 0.5) * 6e-6) / (FS[j]! * FS[k]!);
    }
    return row;
  });
  return {
    offsets,
    s,
    q,
    readings(f) {
      return offsets.map((a, i) => {
        let r = a;
        for (let j = 0; j < 6; j++) r += s[i]![j]! * f[j]!;
        for (const [key, value] of Object.entries(q[i]!)) {
          const [j, k] = key.split(',').map(Number) as [number, number];
          r += value * f[j]! * f[k]!;
        }
        return r;
      });
    },
  };
}

/** A schedule: each component alone at nine levels up and down, then pairs at (±0.6, ±0.6)·FS. */
function schedule(sensor: TrueSensor, noise = 0, random = mulberry32(7), pairs = true): LoadingPoint[] {
  const points: LoadingPoint[] = [];
  const add = (f: number[], direction?: 'ascending' | 'descending'): void => {
    const r = sensor.readings(f).map((v) => v + noise * gaussian(random));
    points.push({ loads: f, readings: r, ...(direction === undefined ? {} : { direction }) });
  };
  const levels = [-1, -0.75, -0.5, -0.25, 0, 0.25, 0.5, 0.75, 1];
  for (let j = 0; j < 6; j++) {
    for (const l of levels)
      add(
        FS.map((fs, k) => (k === j ? l * fs : 0)),
        'ascending',
      );
    for (const l of [...levels].reverse().slice(1))
      add(
        FS.map((fs, k) => (k === j ? l * fs : 0)),
        'descending',
      );
  }
  if (pairs) {
    for (let j = 0; j < 6; j++) {
      for (let k = j + 1; k < 6; k++) {
        for (const [a, b] of [
          [1, 1],
          [1, -1],
          [-1, 1],
          [-1, -1],
        ] as const) {
          add(FS.map((fs, c) => (c === j ? 0.6 * a * fs : c === k ? 0.6 * b * fs : 0)));
        }
      }
    }
  }
  return points;
}

const trueCoefficient = (
  sensor: TrueSensor,
  i: number,
  kind: string,
  components: readonly number[],
): number =>
  kind === 'offset'
    ? sensor.offsets[i]!
    : kind === 'linear'
      ? sensor.s[i]![components[0]!]!
      : (sensor.q[i]![`${components[0]},${components[1]}`] ?? 0);

describe('fitMultiComponent: recovers a known sensor (noise-free, independent forward model)', () => {
  it('linear model: S, offsets, C = S⁻¹ and the reverse fit to 1e-10 relative', () => {
    const sensor = makeSensor(11, 6, false);
    const cal = fitMultiComponent({
      components: names,
      bridges,
      points: schedule(sensor, 0, mulberry32(1), false),
    });
    expect(cal.terms.map((t) => t.name)).toEqual(['1', ...names]);
    expect(cal.rejectedTerms).toEqual([]);
    for (let i = 0; i < 6; i++) {
      expect(cal.offsets[i]!).toBeNear(sensor.offsets[i]!, { abs: 1e-10 * 1e-3 });
      for (let j = 0; j < 6; j++)
        expect(cal.sensitivity[i]![j]!).toBeNear(sensor.s[i]![j]!, {
          rel: 1e-10,
          abs: 1e-10 * (1e-3 / FS[j]!),
        });
    }
    // C·S = I (the relation of the two forms) and the reverse fit equals C noise-free.
    for (let j = 0; j < 6; j++) {
      for (let k = 0; k < 6; k++) {
        const cs = cal.loadMatrix[j]!.reduce((s, c, i) => s + c * sensor.s[i]![k]!, 0);
        expect(cs).toBeNear(j === k ? 1 : 0, { abs: 1e-10 * (FS[j]! / FS[k]!) });
      }
    }
    expect(cal.reverseFit.largestDifferenceFraction).toBeLessThan(1e-9);
    // Cross-talk by its definition S_ij·FS_j/(S_ii·FS_i): bridge i measures component i here.
    expect(cal.primaryComponents).toEqual([0, 1, 2, 3, 4, 5]);
    for (let i = 0; i < 6; i++) {
      for (let j = 0; j < 6; j++) {
        expect(cal.crossTalk[i]![j]!).toBeNear((sensor.s[i]![j]! * FS[j]!) / (sensor.s[i]![i]! * FS[i]!), {
          rel: 1e-9,
          abs: 1e-12,
        });
      }
    }
    expect(cal.condition).toBeGreaterThan(1);
    expect(cal.condition).toBeLessThan(10);
    expect(cal.hysteresisFractions.every((h) => h !== undefined && h < 1e-12)).toBe(true);
  });

  it('full second order: every interaction coefficient to 1e-10 of its full-scale share', () => {
    const sensor = makeSensor(23, 6, true);
    const cal = fitMultiComponent({
      components: names,
      bridges,
      points: schedule(sensor),
      interactions: 'second-order',
    });
    expect(cal.rank).toBe(28);
    expect(cal.rejectedTerms).toEqual([]);
    cal.terms.forEach((term, t) => {
      const scale = term.components.reduce((p, j) => p * FS[j]!, 1);
      for (let i = 0; i < 6; i++) {
        const truth = trueCoefficient(sensor, i, term.kind, term.components);
        // Relative to the coefficient, or 1e-10 of the bridge's full-scale output (~1e-3) for small ones.
        expect(cal.coefficients[i]![t]!, `${bridges[i]} ${term.name}`).toBeNear(truth, {
          rel: 1e-10,
          abs: (1e-10 * 1e-3) / scale,
        });
      }
    });
    // termFractions by definition: b·g(FS)/FSO.
    const t = cal.terms.findIndex((x) => x.name === 'Fx·Mz');
    expect(cal.termFractions[0]![t]!).toBeNear(
      (cal.coefficients[0]![t]! * FS[0]! * FS[5]!) / cal.fullScaleOutputs[0]!,
      { rel: 1e-14 },
    );
    expect(Math.max(...cal.largestLoadResidualFractions)).toBeLessThan(1e-11);
  });

  it('least-squares coefficients agree with 50-digit decimal.js normal equations on noisy data', () => {
    const sensor = makeSensor(5, 6, true);
    const points = schedule(sensor, 2e-7, mulberry32(99));
    const cal = fitMultiComponent({ components: names, bridges, points, interactions: 'second-order' });
    const rows = points.map((p) =>
      cal.terms.map((term) => term.components.reduce((v, j) => v * p.loads[j]!, 1)),
    );
    for (const i of [0, 3, 5]) {
      const ref = decimalLeastSquares(
        rows,
        points.map((p) => p.readings[i]!),
      );
      // QR in doubles on a design of condition ~10: agreement to about κ·ε relative per coefficient,
      // checked at 1e-9 of each coefficient or 1e-12 of the bridge output at full scale.
      cal.terms.forEach((term, t) => {
        const scale = term.components.reduce((p, j) => p * FS[j]!, 1);
        expect(cal.coefficients[i]![t]!).toBeNear(ref[t]!, { rel: 1e-9, abs: 1e-15 / scale });
      });
    }
  });
});

describe('fitMultiComponent: term selection and refusal', () => {
  it('refuses a schedule in which a component is never loaded, naming it', () => {
    const sensor = makeSensor(3, 6, false);
    const points = schedule(sensor, 0, mulberry32(1), false).filter((p) => p.loads[4] === 0);
    expect(() => fitMultiComponent({ components: names, bridges, points })).toThrowBridgeworkError(
      'singular',
      { param: 'points' },
    );
    expect(() => fitMultiComponent({ components: names, bridges, points })).toThrow(
      /component My is never loaded/,
    );
  });

  it('refuses a component loaded only together with another', () => {
    const sensor = makeSensor(3, 6, false);
    const points = schedule(sensor, 0, mulberry32(1), false).map((p) => {
      const loads = [...p.loads];
      loads[1] = (loads[0]! / FS[0]!) * FS[1]!; // Fy always follows Fx
      return { loads, readings: sensor.readings(loads) };
    });
    expect(() => fitMultiComponent({ components: names, bridges, points })).toThrow(
      /component Fy is loaded only in fixed proportion/,
    );
  });

  it('rejects products a one-component-at-a-time schedule cannot determine, keeps the squares', () => {
    const sensor = makeSensor(3, 6, true);
    const points = schedule(sensor, 1e-7, mulberry32(3), false);
    const cal = fitMultiComponent({ components: names, bridges, points, interactions: 'second-order' });
    expect(cal.terms.filter((t) => t.kind === 'square')).toHaveLength(6);
    expect(cal.rejectedTerms).toHaveLength(15);
    expect(cal.rejectedTerms.every((r) => r.term.kind === 'product' && r.independence === 0)).toBe(true);
    expect(cal.rejectedTerms[0]!.reason).toMatch(/Fx and Fy are never loaded together/);
  });

  it('rejects squares of a component loaded at only two levels (collinear with the offset and linear term)', () => {
    const sensor = makeSensor(3, 6, false);
    const points = schedule(sensor, 0, mulberry32(1), false).filter(
      (p) => p.loads[2] === 0 || Math.abs(p.loads[2]!) === FS[2],
    );
    // Fz takes only 0 and ±FS: Fz² is not collinear (three levels); drop −FS too.
    const two = points.filter((p) => p.loads[2]! >= 0);
    const cal = fitMultiComponent({ components: names, bridges, points: two, interactions: 'squares' });
    const rejected = cal.rejectedTerms.map((r) => r.term.name);
    expect(rejected).toEqual(['Fz²']);
    expect(cal.rejectedTerms[0]!.reason).toMatch(/too few distinct values/);
  });
});

describe('the inverse', () => {
  const sensor = makeSensor(41, 6, true);
  const cal = fitMultiComponent({
    components: names,
    bridges,
    points: schedule(sensor),
    interactions: 'second-order',
  });
  const inverse = cal.createInverse();
  const linearSensor = makeSensor(41, 6, false);
  const linear = fitMultiComponent({
    components: names,
    bridges,
    points: schedule(linearSensor, 0, mulberry32(1), false),
  });

  it('round trip through the independent forward model within 1e-12 of full scale (fast-check)', () => {
    const state = fc.tuple(...FS.map(() => fc.double({ min: -1.2, max: 1.2, noNaN: true })));
    const out = new Float64Array(6);
    fc.assert(
      fc.property(state, (u) => {
        const f = u.map((x, j) => x * FS[j]!);
        inverse.loadsFromReadings(sensor.readings(f), out);
        for (let j = 0; j < 6; j++) expect(out[j]!).toBeNear(f[j]!, { abs: 1e-12 * FS[j]! });
        const direct = linear.createInverse().loadsFromReadings(linearSensor.readings(f));
        for (let j = 0; j < 6; j++) expect(direct[j]!).toBeNear(f[j]!, { abs: 1e-12 * FS[j]! });
      }),
      { numRuns: 300 },
    );
    expect(inverse.method).toBe('fixed-point');
    expect(linear.createInverse().method).toBe('direct');
  });

  it('convert: interleaved samples, the same as one at a time', () => {
    const k = 50;
    const random = mulberry32(5);
    const readings = new Float64Array(k * 6);
    const loads: number[][] = [];
    for (let s = 0; s < k; s++) {
      const f = FS.map((fs) => (random() * 2 - 1) * fs);
      loads.push(f);
      readings.set(sensor.readings(f), s * 6);
    }
    const out = new Float64Array(k * 6);
    expect(inverse.convert(readings, out)).toBe(k);
    for (let s = 0; s < k; s++)
      for (let j = 0; j < 6; j++) expect(out[s * 6 + j]!).toBeNear(loads[s]![j]!, { abs: 1e-12 * FS[j]! });
  });

  it('more bridges than components: the weighted least-squares state, exact for consistent readings', () => {
    const sensor8 = makeSensor(8, 8, true);
    const cal8 = fitMultiComponent({
      components: names,
      bridges: [...bridges, 'b7', 'b8'],
      points: schedule(sensor8),
      interactions: 'second-order',
    });
    const f = [120, -300, 800, -5, 12, 7];
    const back = cal8.createInverse().loadsFromReadings(sensor8.readings(f));
    for (let j = 0; j < 6; j++) expect(back[j]!).toBeNear(f[j]!, { abs: 1e-12 * FS[j]! });
  });

  it('non-convergence is a typed error (readings no load state reaches)', () => {
    // One component, r = F − 0.5·F²/FS: the reading never exceeds FS/2 (at F = FS).
    const points = [-1, -0.5, 0, 0.25, 0.5, 0.75, 1].map((u) => ({
      loads: [u],
      readings: [u - 0.5 * u * u],
    }));
    const c = fitMultiComponent({ components: ['F'], bridges: ['b'], points, interactions: 'squares' });
    // The stated tolerance: 2⁻⁴⁴ ≈ 5.7e-14 of full scale (FS = 1 here).
    expect(c.createInverse().loadsFromReadings([0.3])[0]!).toBeNear(1 - Math.sqrt(1 - 0.6), { abs: 6e-14 });
    // Near the turning point the fixed-point steps contract by less than half (ρ ≈ F ≈ 0.86):
    // Newton steps take over and still meet the tolerance.
    expect(c.createInverse().loadsFromReadings([0.49])[0]!).toBeNear(1 - Math.sqrt(1 - 0.98), { abs: 6e-14 });
    expect(() => c.createInverse().loadsFromReadings([0.8])).toThrowBridgeworkError('not-converged', {
      param: 'readings',
    });
    expect(() => c.createInverse({ maxIterations: 1 }).loadsFromReadings([0.45])).toThrowBridgeworkError(
      'not-converged',
      {
        param: 'readings',
      },
    );
  });
});

describe('uncertainty at a load state', () => {
  const noise = 2e-7; // V/V, about 0.02 % of full-scale output
  const f0 = [250, -100, 600, 8, -4, 6];

  it('GUM from the fit covariance covers the true loads at the stated rate (200 seeds)', () => {
    const sensor = makeSensor(17, 6, true);
    const exact = sensor.readings(f0);
    let covered = 0;
    let coefficientCovered = 0;
    let coefficientCount = 0;
    const seeds = 200;
    for (let seed = 0; seed < seeds; seed++) {
      const cal = fitMultiComponent({
        components: names,
        bridges,
        points: schedule(sensor, noise, mulberry32(1000 + seed)),
        interactions: 'second-order',
        readingStandardUncertainties: new Array(6).fill(noise),
      });
      // The error of the calibrated inverse at f0 for noise-free readings is the calibration error.
      const u = cal.uncertaintyAt({ loads: f0 });
      const back = cal.createInverse().loadsFromReadings(exact);
      if (Math.abs(back[2]! - f0[2]!) <= 1.96 * u.standardUncertainties[2]!) covered++;
      // The coefficients against the truth, at k = 1.96.
      cal.terms.forEach((term, t) => {
        const truth = trueCoefficient(sensor, 1, term.kind, term.components);
        coefficientCount++;
        if (Math.abs(cal.coefficients[1]![t]! - truth) <= 1.96 * cal.coefficientStandardUncertainties[1]![t]!)
          coefficientCovered++;
      });
    }
    // 95 % nominal: with 200 seeds the binomial standard deviation is 1.5 %; accept 89–99 %.
    expect(covered / seeds).toBeGreaterThan(0.89);
    expect(covered / seeds).toBeLessThan(0.995);
    expect(coefficientCovered / coefficientCount).toBeGreaterThan(0.93);
    expect(coefficientCovered / coefficientCount).toBeLessThan(0.97);
  });

  it('Monte Carlo through the exact inverse agrees with the law of propagation (JCGM 101 vs 100)', () => {
    const sensor = makeSensor(17, 6, true);
    const cal = fitMultiComponent({
      components: names,
      bridges,
      points: schedule(sensor, noise, mulberry32(4)),
      interactions: 'second-order',
    });
    const readingNoise = new Array(6).fill(5e-7);
    const gum = cal.uncertaintyAt({ loads: f0, readingStandardUncertainties: readingNoise });
    const mc = cal.monteCarloAt({ loads: f0, readingStandardUncertainties: readingNoise, trials: 20_000 });
    expect(mc).toHaveLength(6);
    mc.forEach((r, j) => {
      // 2·10⁴ trials: u from MC within ~1 % (its own sampling) plus the model's curvature; 4 %.
      expect(r.standardUncertainty).toBeNear(gum.standardUncertainties[j]!, { rel: 0.04 });
      expect(r.value).toBeNear(f0[j]!, {
        abs: (4 * gum.standardUncertainties[j]!) / Math.sqrt(20_000) + 1e-9 * FS[j]!,
      });
    });
    // Without the calibration, only the reading noise: K·diag(u²)·Kᵀ.
    const noiseOnly = cal.uncertaintyAt({
      loads: f0,
      readingStandardUncertainties: readingNoise,
      includeCalibration: false,
    });
    expect(noiseOnly.calibrationCovariance.flat().every((v) => v === 0)).toBe(true);
    expect(noiseOnly.standardUncertainties[0]!).toBeLessThan(gum.standardUncertainties[0]!);
  });
});

describe('options', () => {
  const sensor = makeSensor(3, 6, false);
  const points = schedule(sensor, 0, mulberry32(1), false);
  it.each([
    ['options.interaction', 'unknown-option', { components: names, bridges, points, interaction: 'squares' }],
    ['options.points', 'missing-option', { components: names, bridges }],
    [
      'points[2].lods',
      'unknown-option',
      {
        components: names,
        bridges,
        points: points.map((p, i) => (i === 2 ? { lods: p.loads, readings: p.readings } : p)),
      },
    ],
    [
      'points[0].loads',
      'invalid-shape',
      { components: names, bridges, points: [{ loads: [1], readings: [1, 2, 3, 4, 5, 6] }] },
    ],
    [
      'points[1].readings[2]',
      'not-finite',
      {
        components: names,
        bridges,
        points: points.map((p, i) => (i === 1 ? { ...p, readings: [0, 0, Number.NaN, 0, 0, 0] } : p)),
      },
    ],
    ['bridges', 'invalid-shape', { components: names, bridges: ['a', 'b'], points }],
    ['components', 'invalid-shape', { components: ['Fx', 'Fx'], bridges, points }],
    ['interactions', 'invalid-option', { components: names, bridges, points, interactions: 'cubic' }],
    [
      'points',
      'too-few-points',
      {
        components: names,
        bridges,
        points: Array.from({ length: 7 }, (_, i) => {
          const loads = FS.map((fs, j) => fs * Math.sin(1 + i * 7 + j * 3));
          return { loads, readings: sensor.readings(loads) };
        }),
      },
    ],
  ] as const)('%s → %s', (param, code, options) => {
    expect(() => fitMultiComponent(options as never)).toThrowBridgeworkError(code, { param });
  });
});
