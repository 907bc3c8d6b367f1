import { checkLength, checkOhms, checkVolts, differenceOfProducts } from '@bridgework/core';

/** The four arms as a tuple, R1…R4 in ring order. */
export type Arms = readonly [number, number, number, number];

/** Partner in the same half-bridge divider: 1↔2, 3↔4 (zero-based). */
export const PARTNER = [1, 0, 3, 2] as const;
/** Opposite arm: 1↔3, 2↔4 (zero-based). */
export const OPPOSITE = [2, 3, 0, 1] as const;
/** The remaining arm of the other divider (shares the excitation node with arm j): 1↔4, 2↔3. */
export const ACROSS = [3, 2, 1, 0] as const;
/** Sign of an arm's effect on the output: + for arms 1 and 3, − for arms 2 and 4. */
export const SIGN = [1, -1, 1, -1] as const;

/**
 * The polynomial building blocks of the exact bridge solution, for arms R1…R4:
 * M = R1·R3 − R2·R4, P = R1 + R2, Q = R3 + R4, S = P + Q, T = R1·R2·Q + R3·R4·P,
 * W = (R1 + R4)·(R2 + R3).
 */
export interface NetworkTerms {
  readonly m: number;
  readonly p: number;
  readonly q: number;
  readonly s: number;
  readonly t: number;
  readonly w: number;
}

export function networkTerms(r: Arms): NetworkTerms {
  const [r1, r2, r3, r4] = r;
  const p = r1 + r2;
  const q = r3 + r4;
  return {
    m: differenceOfProducts(r1, r3, r2, r4),
    p,
    q,
    s: p + q,
    t: r1 * r2 * q + r3 * r4 * p,
    w: (r1 + r4) * (r2 + r3),
  };
}

/** Validated source and meter of a bridge solve. */
export interface Circuit {
  readonly excitationVolts: number;
  readonly sourceOhms: number;
  readonly meterOhms: number;
}

/** Checks an excitation EMF: in `VOLTS_LIMITS` of the core package, [1e-9, 1e6] V. */
export function checkExcitation(param: string, value: unknown): number {
  return checkVolts(param, value);
}

export function checkCircuit(options: Record<string, unknown>): Circuit {
  return {
    excitationVolts: checkExcitation('excitationVolts', options['excitationVolts']),
    sourceOhms:
      options['sourceOhms'] === undefined ? 0 : checkOhms('sourceOhms', options['sourceOhms'], ZERO),
    meterOhms:
      options['meterOhms'] === undefined ? Infinity : checkOhms('meterOhms', options['meterOhms'], OPEN),
  };
}

const ZERO = { allowZero: true } as const;
const OPEN = { allowInfinity: true } as const;

export function checkArms(value: unknown, allowNull: boolean): (number | null)[] {
  const arms = checkLength<unknown>('armsOhms', value, 4);
  return arms.map((arm, i) => {
    if (allowNull && arm === null) return null;
    return checkOhms(`armsOhms[${i}]`, arm);
  });
}
