import fc from 'fast-check';
import { inv } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { createMultiComponentModel, fitMultiComponent, type LoadingPoint } from '@bridgework/calibration';

/**
 * A multi-component model from stored coefficients: a hand-written three-component sensor (its
 * forward model written here) against mathjs's inverse and the forward model; and a fitted
 * calibration stored and read back, which must give the same figures bit for bit.
 */
const names = ['Fx', 'Fy', 'Mz'];
const bridges = ['A', 'B', 'C'];
const FS = [500, 800, 20];
// mV/V per N (N·m for Mz), with cross-talk; offsets in mV/V; two interaction terms.
const S = [
  [2.0e-3, 3.0e-5, -4.0e-4],
  [-2.5e-5, 1.25e-3, 6.0e-4],
  [1.0e-5, -2.0e-5, 5.0e-2],
];
const offsets = [0.012, -0.008, 0.003];
const qFxFy = [2e-9, -1e-9, 5e-10]; // mV/V per N²
const qMz2 = [-3e-7, 4e-7, 1.5e-5]; // mV/V per (N·m)²
const forward = (f: readonly number[]): number[] =>
  bridges.map(
    (_, i) =>
      offsets[i]! +
      S[i]![0]! * f[0]! +
      S[i]![1]! * f[1]! +
      S[i]![2]! * f[2]! +
      qFxFy[i]! * f[0]! * f[1]! +
      qMz2[i]! * f[2]! * f[2]!,
  );

const stored = {
  components: names,
  bridges,
  // The columns in an order of the file's choosing, ASCII names for the interaction terms.
  terms: ['Fx', 'Fy', 'Mz', '1', 'Fy*Fx', 'Mz^2'],
  coefficients: bridges.map((_, i) => [S[i]![0]!, S[i]![1]!, S[i]![2]!, offsets[i]!, qFxFy[i]!, qMz2[i]!]),
  fullScale: FS,
};

describe('createMultiComponentModel: stored coefficients', () => {
  const model = createMultiComponentModel(stored);

  it('reads the terms in any order and either spelling, and states the linear parts', () => {
    expect(model.terms.map((t) => t.name)).toEqual(['Fx', 'Fy', 'Mz', '1', 'Fx·Fy', 'Mz²']);
    expect(model.offsets).toEqual(offsets);
    expect(model.sensitivity).toEqual(S);
    expect(model.uncertaintySource).toBe('none');
    expect(model.coefficientStandardUncertainties).toBeUndefined();
    expect(model.degreesOfFreedom).toBe(Infinity);
  });

  it('the load matrix is mathjs’s S⁻¹ and the inverse recovers the forward model’s loads (fast-check)', () => {
    const reference = inv(S) as number[][];
    model.loadMatrix.forEach((row, j) =>
      row.forEach((c, i) =>
        expect(c).toBeNear(reference[j]![i]!, { rel: 1e-12, abs: 1e-12 * Math.abs(reference[j]![j]!) }),
      ),
    );
    const inverse = model.createInverse();
    expect(inverse.method).toBe('fixed-point');
    fc.assert(
      fc.property(fc.tuple(...FS.map(() => fc.double({ min: -1, max: 1, noNaN: true }))), (u) => {
        const f = u.map((x, j) => x * FS[j]!);
        const back = inverse.loadsFromReadings(forward(f));
        // The iteration's tolerance is 2⁻⁴⁴ of full scale; 1e-12 of full scale on the state.
        f.forEach((v, j) => expect(back[j]!).toBeNear(v, { abs: 1e-12 * FS[j]! }));
      }),
      { numRuns: 200 },
    );
  });

  it('without a covariance only the reading noise enters the uncertainty: u = |C|·u_r at zero (linear there)', () => {
    const noise = [1e-4, 2e-4, 1e-4];
    const u = model.uncertaintyAt({ loads: [0, 0, 0], readingStandardUncertainties: noise });
    // At F = 0 the Jacobian is S (the interaction terms' derivatives vanish): u_j² = Σ C_ji²·u_i².
    model.loadMatrix.forEach((row, j) =>
      expect(u.standardUncertainties[j]!).toBeNear(
        Math.sqrt(row.reduce((s, c, i) => s + (c * noise[i]!) ** 2, 0)),
        { rel: 1e-12 },
      ),
    );
    u.calibrationCovariance.flat().forEach((v) => expect(v).toBe(0));
  });

  it('a fitted calibration stored and read back gives the same figures bit for bit', () => {
    let seed = 3;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 2 - 1;
    const points: LoadingPoint[] = [];
    for (const a of [-1, -0.5, 0, 0.5, 1])
      for (const b of [-1, 0, 1])
        for (const c of [-1, 0, 1]) {
          const f = [a * FS[0]!, b * FS[1]!, c * FS[2]!];
          points.push({ loads: f, readings: forward(f).map((r) => r + 1e-5 * random()) });
        }
    const fit = fitMultiComponent({
      components: names,
      bridges,
      points,
      interactions: 'second-order',
      fullScale: FS,
    });
    const back = createMultiComponentModel({
      components: names,
      bridges,
      terms: fit.terms.map((t) => t.name),
      coefficients: fit.coefficients,
      fullScale: fit.fullScale,
      covariance: {
        unitCovariance: fit.unitCovariance,
        readingCovariance: fit.readingCovariance,
        degreesOfFreedom: fit.degreesOfFreedom,
      },
    });
    expect(back.uncertaintySource).toBe('stored');
    expect(back.loadMatrix).toEqual(fit.loadMatrix);
    expect(back.crossTalk).toEqual(fit.crossTalk);
    expect(back.termFractions).toEqual(fit.termFractions);
    expect(back.coefficientStandardUncertainties).toEqual(fit.coefficientStandardUncertainties);
    const state = { loads: [120, -300, 7], readingStandardUncertainties: [1e-5, 1e-5, 2e-5] };
    expect(back.uncertaintyAt(state)).toEqual(fit.uncertaintyAt(state));
    const a = fit.createInverse();
    const b = back.createInverse();
    for (const p of points) {
      const x = a.loadsFromReadings(p.readings);
      const y = b.loadsFromReadings(p.readings);
      x.forEach((v, j) => expect(Object.is(v, y[j])).toBe(true));
    }
  });

  it('refuses what is not a model, with the reason', () => {
    expect(() =>
      createMultiComponentModel({ ...stored, terms: ['Fx', 'Fy', '1', 'Fx*Fy', 'Mz^2', 'Fy^2'] }),
    ).toThrowBridgeworkError('singular', { param: 'terms' });
    expect(() =>
      createMultiComponentModel({ ...stored, terms: ['Fx', 'Fy', 'Mz', '1', 'Fx*Fy', 'Fy·Fx'] }),
    ).toThrowBridgeworkError('invalid-option', { param: 'terms[5]' });
    expect(() =>
      createMultiComponentModel({ ...stored, terms: ['Fx', 'Fy', 'Mz', '1', 'Fx*Fz', 'Mz^2'] }),
    ).toThrowBridgeworkError('invalid-option', { param: 'terms[4]' });
    expect(() =>
      createMultiComponentModel({ ...stored, coefficients: stored.coefficients.slice(0, 2) }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'coefficients' });
    expect(() =>
      createMultiComponentModel({
        ...stored,
        coefficients: stored.coefficients.map((row, i) => (i === 1 ? row.slice(0, 5) : row)),
      }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'coefficients[1]' });
    // Two bridges that read the same combination: no inverse.
    expect(() =>
      createMultiComponentModel({
        ...stored,
        coefficients: stored.coefficients.map((row, i) => (i === 2 ? stored.coefficients[0]! : row)),
      }),
    ).toThrowBridgeworkError('singular', { param: 'coefficients' });
    const identity = (n: number) =>
      Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, k): number => (i === k ? 1 : 0)));
    const asymmetric = identity(6);
    asymmetric[0]![1] = 0.5;
    expect(() =>
      createMultiComponentModel({
        ...stored,
        covariance: { unitCovariance: asymmetric, readingCovariance: identity(3) },
      }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'covariance.unitCovariance[0][1]' });
    const negative = identity(3);
    negative[2]![2] = -1;
    expect(() =>
      createMultiComponentModel({
        ...stored,
        covariance: { unitCovariance: identity(6), readingCovariance: negative },
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'covariance.readingCovariance[2][2]' });
    expect(() => createMultiComponentModel({ ...stored, fullScale: [500, 0, 20] })).toThrowBridgeworkError(
      'not-positive',
      { param: 'fullScale[1]' },
    );
    expect(() => createMultiComponentModel({ ...stored, fullscale: FS } as never)).toThrowBridgeworkError(
      'unknown-option',
      { param: 'options.fullscale' },
    );
  });
});
