/**
 * The attack engine of the library fuzz test: attack values, the mutation of one field of a valid
 * call at a time, and the judgement of each outcome (a typed error with a code from the closed
 * list, or a finite result of the documented shape).
 *
 * Nothing here imports a package's `src/`: the engine knows the packages only through the table of
 * base calls (calls/*.ts), which uses their public exports.
 */
import { errorCodes, isBridgeworkError, type SpecIssue } from '@bridgework/core';

/** One valid call of a public function (or of a method of an evaluator a public function made). */
export interface BaseCall {
  /** `solveBridge`, or `createStrainBridge().ratioFromStrain` for a method. */
  readonly name: string;
  /** The package whose export is called. */
  readonly pkg: string;
  /** A short label of this variant, when a function has several base calls (`'quarter'`). */
  readonly variant?: string;
  /** Fresh, valid arguments (a new copy on every call, so no attack leaks into the next). */
  readonly args: () => unknown[];
  /** Calls the function with `args`. */
  readonly invoke: (args: unknown[]) => unknown;
  /**
   * Result paths where a non-finite number is the documented answer (`strainRange.max` of a
   * quarter bridge is +∞), as dotted patterns; `*` matches any one key or index, a leading `**.`
   * any prefix.
   */
  readonly nonFinite?: readonly string[];
  /**
   * Argument paths of records keyed by the user's own names (not options objects), which may
   * hold any key; `0.inputs` for the first argument's `inputs`.
   */
  readonly maps?: readonly string[];
  /** Argument paths not to mutate (with the reason beside them in the table). */
  readonly fixed?: readonly string[];
  /** The function returns one of its arguments unchanged (a check): that value may come back as it is. */
  readonly passThrough?: boolean;
  /**
   * The first argument is a spec (a channel spec): its problems are gathered, each as an issue
   * with its field path and code (an `invalid-spec` error, or `{ ok: false, issues }` from a
   * validator), instead of the first one thrown as `unknown-option`.
   */
  readonly spec?: boolean;
}

/** An attack: a value put in place of one field. */
export interface Attack {
  readonly label: string;
  readonly value: () => unknown;
  /** Used only where the base call has a function. */
  readonly forFunctions?: boolean;
}

/** Length of the long array attack. */
export const LONG_ARRAY_LENGTH = 100_000;

/** The attack values of issue 15, plus a model that returns NaN for function-valued fields. */
export const attacks: readonly Attack[] = [
  { label: 'NaN', value: () => Number.NaN },
  { label: 'Infinity', value: () => Infinity },
  { label: '-Infinity', value: () => -Infinity },
  { label: '-1', value: () => -1 },
  { label: '0', value: () => 0 },
  { label: '1e308', value: () => 1e308 },
  { label: '1e-308', value: () => 1e-308 },
  { label: "'20' (a string)", value: () => '20' },
  { label: 'null', value: () => null },
  { label: 'undefined', value: () => undefined },
  { label: '{}', value: () => ({}) },
  { label: '[]', value: () => [] },
  {
    label: `a long array (${LONG_ARRAY_LENGTH} ones)`,
    value: () => new Array<number>(LONG_ARRAY_LENGTH).fill(1),
  },
  { label: 'a function returning NaN', value: () => () => Number.NaN, forFunctions: true },
];

export type Path = readonly (string | number)[];

export function pathText(path: Path): string {
  return path.length === 0 ? '(arguments)' : path.map(String).join('.');
}

function isPlainObject(x: unknown): x is Record<string, unknown> {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) return false;
  const proto = Object.getPrototypeOf(x) as unknown;
  return proto === Object.prototype || proto === null;
}

/** An evaluator (an object with methods) is passed whole: it is replaced, never taken apart. */
function isEvaluator(x: Record<string, unknown>): boolean {
  return Object.values(x).some((v) => typeof v === 'function');
}

function matches(pattern: string, path: Path): boolean {
  if (pattern === '') return path.length === 0;
  // `**.key` matches `key` at any depth.
  if (pattern.startsWith('**.')) {
    const tail = pattern.slice(3).split('.');
    return path.length >= tail.length && matches(tail.join('.'), path.slice(path.length - tail.length));
  }
  const parts = pattern.split('.');
  return parts.length === path.length && parts.every((p, i) => p === '*' || p === String(path[i]));
}

function startsWithPattern(pattern: string, path: Path): boolean {
  const parts = pattern.split('.');
  return parts.length <= path.length && parts.every((p, i) => p === '*' || p === String(path[i]));
}

/** A field of the arguments that can be attacked, with the kind of value the base call has there. */
export interface Field {
  readonly path: Path;
  readonly base: unknown;
}

/** Every attackable field of a base call's arguments, depth first (containers before their fields). */
export function fieldsOf(call: BaseCall): Field[] {
  const out: Field[] = [];
  const fixed = call.fixed ?? [];
  function visit(value: unknown, path: Path, depth: number): void {
    if (path.length > 0) {
      if (fixed.some((p) => startsWithPattern(p, path))) return;
      out.push({ path, base: value });
    }
    if (depth >= 6) return;
    if (Array.isArray(value)) {
      const n = value.length;
      // Long data arrays: their first and last entries stand for the rest.
      const indices = n <= 16 ? [...Array(n).keys()] : [0, n - 1];
      for (const i of indices) visit(value[i], [...path, i], depth + 1);
    } else if (isPlainObject(value) && !isEvaluator(value)) {
      for (const key of Object.keys(value)) visit(value[key], [...path, key], depth + 1);
    }
  }
  visit(call.args(), [], 0);
  return out;
}

/** The plain objects of a call's arguments that must follow the options rule (not maps, not evaluators). */
export function optionObjectsOf(call: BaseCall): Field[] {
  const maps = call.maps ?? [];
  return fieldsOf(call).filter(
    (f) =>
      isPlainObject(f.base) &&
      !isEvaluator(f.base) &&
      Object.keys(f.base).length > 0 &&
      !maps.some((m) => matches(m, f.path)),
  );
}

/** A copy of `args` with the value at `path` replaced (`deleteKey`: removed from its object). */
export function withValue(args: unknown[], path: Path, value: unknown): unknown[] {
  const copy = (x: unknown): unknown =>
    Array.isArray(x) ? [...(x as unknown[])] : isPlainObject(x) ? { ...x } : x;
  const root = copy(args) as unknown[];
  let node: unknown = root;
  for (let i = 0; i < path.length - 1; i++) {
    const key = path[i] as string | number;
    const parent = node as Record<string | number, unknown>;
    parent[key] = copy(parent[key]);
    node = parent[key];
  }
  (node as Record<string | number, unknown>)[path[path.length - 1] as string | number] = value;
  return root;
}

/** A likely misspelling of a key: its last two letters swapped (or an `s` added). */
export function misspell(key: string): string {
  const n = key.length;
  if (n >= 2 && key[n - 1] !== key[n - 2]) return key.slice(0, n - 2) + key[n - 1] + key[n - 2];
  return `${key}s`;
}

/** What a call did. */
export type Outcome =
  | {
      readonly kind: 'typed';
      readonly code: string;
      readonly param: string | undefined;
      readonly message: string;
      /** The gathered problems of an `invalid-spec` error. */
      readonly issues?: readonly SpecIssue[];
    }
  | { readonly kind: 'result'; readonly value: unknown }
  | { readonly kind: 'untyped'; readonly error: string };

export function describeError(e: unknown): string {
  if (e instanceof Error) return `${e.name}: ${e.message.slice(0, 300)}`;
  return `thrown ${typeof e}: ${String(e).slice(0, 300)}`;
}

/** Runs one call, awaiting a promise; never throws. */
export async function run(call: BaseCall, args: unknown[]): Promise<Outcome> {
  try {
    let value = call.invoke(args);
    if (value instanceof Promise) value = await value;
    return { kind: 'result', value };
  } catch (e) {
    if (isBridgeworkError(e)) {
      const issues = e.issues;
      return {
        kind: 'typed',
        code: e.code,
        param: e.param,
        message: e.message,
        ...(issues.length === 0 ? {} : { issues }),
      };
    }
    return { kind: 'untyped', error: describeError(e) };
  }
}

const closedCodes = new Set<string>(errorCodes);

/**
 * The first path of a non-finite number (not documented as such) in a result, or of a value
 * whose type differs from the base call's result at the same place (a number become a string).
 */
function resultPath(path: Path): string {
  return ['result', ...path.map(String)].join('.');
}

export function resultDefect(call: BaseCall, value: unknown, base: unknown): string | undefined {
  const allowed = call.nonFinite ?? [];
  const seen = new Set<unknown>();
  function visit(x: unknown, b: unknown, path: Path, depth: number): string | undefined {
    // A documented optional figure may be absent (`undefined`) where the base call has one.
    if (typeof b === 'number' && typeof x !== 'number' && x !== undefined) {
      return `${resultPath(path)} is ${typeof x} where the base call gives a number`;
    }
    if (typeof x === 'number') {
      if (!Number.isFinite(x) && !allowed.some((p) => matches(p, path))) {
        return `${resultPath(path)} = ${String(x)}`;
      }
      return undefined;
    }
    if (typeof x !== 'object' || x === null || depth > 8 || seen.has(x)) return undefined;
    seen.add(x);
    if (ArrayBuffer.isView(x) && !(x instanceof DataView)) {
      const a = x as unknown as ArrayLike<number | bigint>;
      for (let i = 0; i < a.length; i++) {
        const v = a[i];
        if (typeof v === 'number' && !Number.isFinite(v) && !allowed.some((p) => matches(p, [...path, i]))) {
          return `${resultPath([...path, i])} = ${String(v)}`;
        }
      }
      return undefined;
    }
    if (Array.isArray(x)) {
      const n = Math.min(x.length, 4096);
      const bArr = Array.isArray(b) ? b : [];
      for (let i = 0; i < n; i++) {
        const d = visit(x[i], bArr[Math.min(i, bArr.length - 1)], [...path, i], depth + 1);
        if (d !== undefined) return d;
      }
      return undefined;
    }
    const bObj = typeof b === 'object' && b !== null ? (b as Record<string, unknown>) : {};
    for (const key of Object.keys(x)) {
      const d = visit((x as Record<string, unknown>)[key], bObj[key], [...path, key], depth + 1);
      if (d !== undefined) return d;
    }
    return undefined;
  }
  return visit(value, base, [], 0);
}

/** Why an outcome breaks the rule, or `undefined` when it keeps it. */
export function judge(
  call: BaseCall,
  outcome: Outcome,
  base: unknown,
  attacked?: unknown,
): string | undefined {
  switch (outcome.kind) {
    case 'untyped':
      return `untyped error: ${outcome.error}`;
    case 'typed':
      return closedCodes.has(outcome.code) ? undefined : `code '${outcome.code}' is not in the closed list`;
    case 'result': {
      if (call.passThrough === true && Object.is(outcome.value, attacked)) return undefined;
      const d = resultDefect(call, outcome.value, base);
      return d === undefined ? undefined : `accepted, but ${d}`;
    }
  }
}

/** A small seeded generator (SplitMix32-style mixing of a 32-bit counter), for the random extras. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x9e3779b9) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return ((z ^ (z >>> 16)) >>> 0) / 2 ** 32;
  };
}

/** A random value of a random kind: a double of any magnitude and sign, an integer, or an oddity. */
export function randomAttack(random: () => number): Attack {
  const r = random();
  if (r < 0.55) {
    const exponent = Math.floor(random() * 617) - 308; // 1e-308 … 1e308
    const x = (1 + random() * 9) * 10 ** exponent * (random() < 0.5 ? -1 : 1);
    return { label: String(x), value: () => x };
  }
  if (r < 0.75) {
    const k = Math.floor((random() - 0.5) * 2 ** (1 + Math.floor(random() * 40)));
    return { label: String(k), value: () => k };
  }
  const odd: Attack[] = [
    { label: '-0', value: () => -0 },
    { label: '5e-324', value: () => 5e-324 },
    { label: '-1e308', value: () => -1e308 },
    { label: '2**53 + 2', value: () => 2 ** 53 + 2 },
    { label: 'true', value: () => true },
    { label: "''", value: () => '' },
    { label: "'NaN'", value: () => 'NaN' },
    { label: '10n (a bigint)', value: () => 10n },
    { label: '[NaN]', value: () => [Number.NaN] },
    { label: '{ min: 1, max: 0 }', value: () => ({ min: 1, max: 0 }) },
  ];
  return odd[Math.floor(random() * odd.length)] as Attack;
}

/** One fuzz case: a base call with one field attacked. */
export interface FuzzCase {
  readonly call: BaseCall;
  readonly path: Path;
  readonly attack: Attack;
}

export function caseText(c: FuzzCase): string {
  return `${c.call.name}${c.call.variant === undefined ? '' : ` [${c.call.variant}]`}: ${pathText(c.path)} = ${c.attack.label}`;
}

/**
 * Every case for a list of base calls: each field set in turn to each attack, then `extra` seeded
 * random cases (a random field of a random call set to a random value).
 */
export function casesOf(calls: readonly BaseCall[], seed: number, extra: number): FuzzCase[] {
  const out: FuzzCase[] = [];
  const fields = calls.map(fieldsOf);
  calls.forEach((call, i) => {
    for (const field of fields[i] as Field[]) {
      for (const attack of attacks) {
        if (attack.forFunctions === true && typeof field.base !== 'function') continue;
        out.push({ call, path: field.path, attack });
      }
    }
  });
  const random = seededRandom(seed);
  for (let k = 0; k < extra; k++) {
    const i = Math.floor(random() * calls.length);
    const list = fields[i] as Field[];
    if (list.length === 0) continue;
    const field = list[Math.floor(random() * list.length)] as Field;
    out.push({ call: calls[i] as BaseCall, path: field.path, attack: randomAttack(random) });
  }
  return out;
}
