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

/** x_i for i = 0…1024 (x_0 = V/f(R), x_1 = R, x_1024 = 0). */
export const zigguratX = new Float64Array(ZIGGURAT_LAYERS + 1);
/** f(x_i) = exp(−x_i²/2) for i = 0…1024 (f_1024 = 1; f_0 is never used). */
export const zigguratF = new Float64Array(ZIGGURAT_LAYERS + 1);
/** x_{i+1}/x_i: a point u·x_i of layer i with |u| below this lies under the curve. */
export const zigguratRatio = new Float64Array(ZIGGURAT_LAYERS);

const f = (x: number): number => portableExp(-0.5 * x * x);
zigguratX[0] = ZIGGURAT_V / f(ZIGGURAT_R);
zigguratX[1] = ZIGGURAT_R;
for (let i = 2; i < ZIGGURAT_LAYERS; i++) {
  const prev = zigguratX[i - 1] as number;
  zigguratX[i] = Math.sqrt(-2 * portableLog(ZIGGURAT_V / prev + f(prev)));
}
zigguratX[ZIGGURAT_LAYERS] = 0;
for (let i = 0; i <= ZIGGURAT_LAYERS; i++) zigguratF[i] = f(zigguratX[i] as number);
for (let i = 0; i < ZIGGURAT_LAYERS; i++) {
  zigguratRatio[i] = (zigguratX[i + 1] as number) / (zigguratX[i] as number);
}
