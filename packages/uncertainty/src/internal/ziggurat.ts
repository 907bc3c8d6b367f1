/**
 * Tables of a 1024-layer ziggurat for the standard normal distribution (the method of
 * G. Marsaglia and W. W. Tsang, "The ziggurat method for generating random variables", J. Stat.
 * Softw. 5(8), 2000, with 1024 layers instead of their 128 or 256, so that only 0.4 % of draws
 * leave the fast path), built once with the portable logarithm and exponential so they are
 * identical on every engine.
 *
 * The density is taken unnormalised, f(x) = exp(−x²/2). The area under it is cut into 1024 layers
 * of equal area V: layer 0 is the base strip [0, R] × [0, f(R)] plus the tail beyond R, and layer
 * i ≥ 1 is the rectangle [0, x_i] × [f(x_i), f(x_{i+1})], with x_1 = R > x_2 > … > x_1024 = 0 and
 * x_0 = V/f(R) (the width the base strip would have as a rectangle). R is the root of the
 * condition that the recursion x_{i+1} = f⁻¹(V/x_i + f(x_i)) closes at the top; R and V were
 * solved at 40 digits by test/fixtures/ziggurat/generate.ts, which the test suite checks.
 */
import { portableExp, portableLog } from './portableMath.js';

/** Number of layers. */
export const ZIGGURAT_LAYERS = 1024;
/** Start of the tail, R, for 1024 layers. */
export const ZIGGURAT_R = 4.038849846109504;
/** Area of each layer, V = R·f(R) + ∫_R^∞ f. */
export const ZIGGURAT_V = 0.0012263246463530897;

/** The tables of the ziggurat. */
export interface ZigguratTables {
  /** x_i for i = 0…1024 (x_0 = V/f(R), x_1 = R, x_1024 = 0). */
  readonly x: Float64Array;
  /** f(x_i) = exp(−x_i²/2) for i = 0…1024 (f_1024 = 1; f_0 is never used). */
  readonly f: Float64Array;
  /** x_{i+1}/x_i: a point u·x_i of layer i with |u| below this lies under the curve. */
  readonly ratio: Float64Array;
}

let tables: ZigguratTables | undefined;

/**
 * The tables, built on first use (about 2000 portable logarithms and exponentials, so a program
 * that draws no normal variate does not pay for them when it loads this package).
 */
export function zigguratTables(): ZigguratTables {
  tables ??= buildTables();
  return tables;
}

function buildTables(): ZigguratTables {
  const x = new Float64Array(ZIGGURAT_LAYERS + 1);
  const fx = new Float64Array(ZIGGURAT_LAYERS + 1);
  const ratio = new Float64Array(ZIGGURAT_LAYERS);
  const f = (v: number): number => portableExp(-0.5 * v * v);
  x[0] = ZIGGURAT_V / f(ZIGGURAT_R);
  x[1] = ZIGGURAT_R;
  for (let i = 2; i < ZIGGURAT_LAYERS; i++) {
    const prev = x[i - 1] as number;
    x[i] = Math.sqrt(-2 * portableLog(ZIGGURAT_V / prev + f(prev)));
  }
  x[ZIGGURAT_LAYERS] = 0;
  for (let i = 0; i <= ZIGGURAT_LAYERS; i++) fx[i] = f(x[i] as number);
  for (let i = 0; i < ZIGGURAT_LAYERS; i++) ratio[i] = (x[i + 1] as number) / (x[i] as number);
  return { x, f: fx, ratio };
}
