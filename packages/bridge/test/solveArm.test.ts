import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveArm, solveBridge } from '@bridgework/bridge';
import { solveBridgeNetwork } from '../../../test/support/nodal.js';

const ohms = fc.double({ min: 0, max: 6, noNaN: true }).map((d) => 10 ** d);
const network = fc.record({
  armsOhms: fc.tuple(ohms, ohms, ohms, ohms),
  excitationVolts: fc.double({ min: 0.1, max: 20, noNaN: true }),
  sourceOhms: fc.oneof(
    fc.constant(0),
    fc.double({ min: -2, max: 4, noNaN: true }).map((d) => 10 ** d),
  ),
  meterOhms: fc.oneof(
    fc.constant(Infinity),
    fc.double({ min: 2, max: 9, noNaN: true }).map((d) => 10 ** d),
  ),
});

function withUnknown(
  arms: readonly number[],
  j: number,
): [number | null, number | null, number | null, number | null] {
  return arms.map((r, i) => (i === j ? null : r)) as [
    number | null,
    number | null,
    number | null,
    number | null,
  ];
}

describe('solveArm', () => {
  it('recovers 350.7 Ω from the 4.223022653 mV reading (issue #2 check value)', () => {
    const r = solveArm({
      armsOhms: [null, 350, 350, 350],
      excitationVolts: 10,
      outputVolts: 4.223022653e-3,
      sourceOhms: 50,
      meterOhms: 10_000,
    });
    // The reading is given to 10 significant digits, so the arm is known to about 1e-10 relative.
    expect(r).toBeNear(350.7, { rel: 1e-10 });
  });

  it('inverts solveBridge for every arm position (round trip, 4 × 500 random networks)', () => {
    for (let j = 0; j < 4; j++) {
      fc.assert(
        fc.property(network, (n) => {
          const { outputVolts } = solveBridge(n);
          const r = solveArm({ ...n, armsOhms: withUnknown(n.armsOhms, j), outputVolts });
          // Conditioning: the reading's sensitivity to the arm sets the attainable precision; a
          // relative 1e-9 bound holds over six decades of arm values.
          expect(r).toBeNear(n.armsOhms[j]!, { rel: 1e-9 });
        }),
        { numRuns: 500 },
      );
    }
  });

  it('solves a 40-digit nodal reading to full precision on well-conditioned bridges', () => {
    // Strain-gauge scale: arms near 350 Ω, where the reading depends strongly on every arm.
    const near = fc.double({ min: 300, max: 400, noNaN: true });
    fc.assert(
      fc.property(fc.tuple(near, near, near, near), fc.integer({ min: 0, max: 3 }), (arms, j) => {
        const n = { armsOhms: arms, excitationVolts: 5, sourceOhms: 20, meterOhms: 1e6 };
        const ref = solveBridgeNetwork(n);
        const r = solveArm({ ...n, armsOhms: withUnknown(arms, j), outputVolts: ref.outputVolts });
        expect(r).toBeNear(arms[j]!, { rel: 1e-13 });
      }),
      { numRuns: 200 },
    );
  });

  it('reports readings no positive arm can produce, with the reachable interval', () => {
    // With three 350 Ω arms and a stiff source, arm 1 from 0 to ∞ sweeps ratios (−1/2, 1/2).
    const attempt = () => solveArm({ armsOhms: [null, 350, 350, 350], excitationVolts: 10, outputVolts: 6 });
    expect(attempt).toThrowBridgeworkError('no-solution', { param: 'outputVolts' });
    try {
      attempt();
    } catch (e) {
      expect((e as { limit: number[] }).limit).toBeNear([-5, 5], { rel: 1e-15 });
    }
    // Exactly at an end of the interval: the arm would be 0 or infinite.
    expect(() =>
      solveArm({ armsOhms: [null, 350, 350, 350], excitationVolts: 10, outputVolts: -5 }),
    ).toThrowBridgeworkError('no-solution');
  });

  it('rejects the wrong number of unknown arms and bad readings', () => {
    const base = { excitationVolts: 5, outputVolts: 1e-3 };
    expect(() => solveArm({ ...base, armsOhms: [350, 350, 350, 350] })).toThrowBridgeworkError(
      'unknown-count',
      {
        param: 'armsOhms',
      },
    );
    expect(() => solveArm({ ...base, armsOhms: [null, null, 350, 350] })).toThrowBridgeworkError(
      'unknown-count',
    );
    expect(() => solveArm({ ...base, armsOhms: [null, 350, 350] as never })).toThrowBridgeworkError(
      'invalid-shape',
    );
    expect(() => solveArm({ ...base, armsOhms: [null, 350, 0, 350] })).toThrowBridgeworkError(
      'not-positive',
      {
        param: 'armsOhms[2]',
      },
    );
    const arms = [null, 350, 350, 350] as [null, number, number, number];
    expect(() => solveArm({ ...base, armsOhms: arms, outputVolts: Number.NaN })).toThrowBridgeworkError(
      'not-finite',
      {
        param: 'outputVolts',
      },
    );
    expect(() => solveArm({ ...base, armsOhms: arms, excitationVolts: 0 })).toThrowBridgeworkError(
      'not-positive',
      {
        param: 'excitationVolts',
      },
    );
    expect(() => solveArm({ ...base, armsOhms: arms, meterOhms: -1 })).toThrowBridgeworkError(
      'not-positive',
      {
        param: 'meterOhms',
      },
    );
  });
});
