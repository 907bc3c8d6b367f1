import 'vitest';
import type { ErrorCode } from '@bridgework/core';
import type { Tolerance } from './near.js';

interface BridgeworkMatchers<R = unknown> {
  /** Numeric comparison with an explicit tolerance (abs, rel and/or ulps); arrays compare element-wise. */
  toBeNear(expected: number | ArrayLike<number>, tolerance: Tolerance): R;
  /** The function throws a BridgeworkError with this code (and param, when given). */
  toThrowBridgeworkError(code: ErrorCode, fields?: { param?: string }): R;
}

declare module 'vitest' {
  interface Matchers<T = any> extends BridgeworkMatchers<T> {}
}
