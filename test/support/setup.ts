import fc from 'fast-check';
import { expect } from 'vitest';
import { BridgeworkError, type ErrorCode } from '@bridgework/core';
import { checkTolerance, describeDistance, isNear, type Tolerance } from './near.js';

function toArray(x: unknown): number[] | undefined {
  if (typeof x === 'number') return [x];
  if (ArrayBuffer.isView(x) && !(x instanceof DataView)) return Array.from(x as unknown as ArrayLike<number>);
  if (Array.isArray(x) && x.every((v) => typeof v === 'number')) return x as number[];
  return undefined;
}

// Property tests explore new random cases on every local run; under CI (or with FC_SEED set) the
// seed is fixed so a run can be repeated exactly. A failure prints its seed and counterexample.
if (process.env['FC_SEED'] !== undefined || process.env['CI'] !== undefined) {
  fc.configureGlobal({ seed: Number(process.env['FC_SEED'] ?? 20261201) });
}

expect.extend({
  toBeNear(received: unknown, expected: number | ArrayLike<number>, tolerance: Tolerance) {
    checkTolerance(tolerance);
    const a = toArray(received);
    const e = toArray(expected);
    const tol = JSON.stringify(tolerance);
    if (a === undefined || e === undefined) {
      return {
        pass: false,
        message: () => `toBeNear compares numbers or numeric arrays; got ${typeof received}`,
      };
    }
    if (a.length !== e.length) {
      return { pass: false, message: () => `expected length ${e.length}, got ${a.length}` };
    }
    for (let i = 0; i < a.length; i++) {
      const ai = a[i] as number;
      const ei = e[i] as number;
      if (!isNear(ai, ei, tolerance)) {
        const where = a.length > 1 ? ` at index ${i}` : '';
        return {
          pass: false,
          message: () =>
            `expected ${ai} to be near ${ei}${where} within ${tol} (${describeDistance(ai, ei)})`,
        };
      }
    }
    return {
      pass: true,
      message: () =>
        `expected ${JSON.stringify(received)} not to be near ${JSON.stringify(expected)} within ${tol}`,
    };
  },

  toThrowBridgeworkError(received: unknown, code: ErrorCode, fields: { param?: string } = {}) {
    if (typeof received !== 'function') {
      return { pass: false, message: () => 'toThrowBridgeworkError expects a function' };
    }
    try {
      (received as () => unknown)();
    } catch (error) {
      if (!(error instanceof BridgeworkError)) {
        return { pass: false, message: () => `expected a BridgeworkError '${code}', got ${String(error)}` };
      }
      if (error.code !== code) {
        return {
          pass: false,
          message: () => `expected code '${code}', got '${error.code}': ${error.message}`,
        };
      }
      if (fields.param !== undefined && error.param !== fields.param) {
        return {
          pass: false,
          message: () => `expected param '${fields.param}', got '${String(error.param)}'`,
        };
      }
      return {
        pass: true,
        message: () => `expected no BridgeworkError '${code}', got one: ${error.message}`,
      };
    }
    return { pass: false, message: () => `expected a BridgeworkError '${code}', but nothing was thrown` };
  },
});
