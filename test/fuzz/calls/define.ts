import type { BaseCall } from '../harness.js';

type Extra = Pick<BaseCall, 'nonFinite' | 'maps' | 'fixed' | 'variant' | 'spec'>;
type Exports = Record<string, unknown>;

function exported(pkg: string, exports: Exports, name: string): (...args: unknown[]) => unknown {
  const f = exports[name];
  if (typeof f !== 'function') throw new Error(`@bridgework/${pkg} exports no function ${name}`);
  return f as (...args: unknown[]) => unknown;
}

/** A base call of an exported function. */
export function fn(
  pkg: string,
  exports: Exports,
  name: string,
  args: () => unknown[],
  extra: Extra = {},
): BaseCall {
  const f = exported(pkg, exports, name);
  return { name, pkg, args, invoke: (a) => f(...a), ...extra };
}

/**
 * A base call of a method of an evaluator made by an exported `create…` function: the evaluator
 * is made once, from valid options, and only the method's arguments are attacked.
 */
export function method(
  pkg: string,
  creator: string,
  make: () => unknown,
  name: string,
  args: () => unknown[],
  extra: Extra = {},
): BaseCall {
  let target: Record<string, unknown> | undefined;
  return {
    name: `${creator}().${name}`,
    pkg,
    args,
    invoke: (a) => {
      target ??= make() as Record<string, unknown>;
      const m = target[name];
      if (typeof m !== 'function') throw new Error(`${creator}() has no method ${name}`);
      return (m as (...args: unknown[]) => unknown).apply(target, a);
    },
    ...extra,
  };
}
