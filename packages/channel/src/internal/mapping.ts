/**
 * A channel's exact code ↔ quantity mapping at one gauge temperature, with its fast kernel.
 */
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import type { LinearFractionalKernel } from '../convert/kernel.js';
import { createModel, rejectCode, type ChannelModel, type ModelParameters } from './model.js';
import type { ResolvedChannel } from './resolve.js';

/** The exact maps at one parameter set, with the valid codes and the kernel. */
export interface Mapping {
  readonly model: ChannelModel;
  /** Open interval of codes that convert (inside the rails, ratio inside the sensor's range). */
  readonly lo: number;
  readonly hi: number;
  /** The Möbius kernel, or undefined when the map is not linear-fractional. */
  readonly kernel: LinearFractionalKernel | undefined;
  /** Exact quantity for a valid code; NaN for an invalid one (no throw: for kernels). */
  quantityOrNaN(code: number): number;
  /** Exact quantity for a code; throws `clipped` or `ratio-out-of-range`. */
  quantityFromCode(code: number): number;
}

/** Largest relative disagreement accepted between the kernel and the exact scalar map. */
export const KERNEL_TOLERANCE = 1e-12;

export function createMapping(resolved: ResolvedChannel, params: ModelParameters): Mapping {
  const model = createModel(resolved, params);
  const { adc } = model;
  // Valid codes: strictly inside the rails, and a ratio strictly inside the sensor's range. The
  // ratio is affine in the code, so the range maps to an interval of codes.
  const atMin = model.exactCodeFromRatio(model.ratioRange.min);
  const atMax = model.exactCodeFromRatio(model.ratioRange.max);
  const lo = Math.max(adc.codeMin, Math.min(atMin, atMax));
  const hi = Math.min(adc.codeMax, Math.max(atMin, atMax));

  const quantityOrNaN = (code: number): number => {
    if (!(code > lo && code < hi)) return Number.NaN;
    try {
      return model.quantityFromRatio(model.ratioFromCode(code));
    } catch (e) {
      if (isBridgeworkError(e)) return Number.NaN;
      throw e;
    }
  };
  const quantityFromCode = (code: number): number => {
    if (!(code > lo && code < hi)) rejectCode(code, adc, lo, hi);
    return model.quantityFromRatio(model.ratioFromCode(code));
  };
  const kernel = model.linearFractional ? fitKernel(quantityFromCode, lo, hi) : undefined;
  return { model, lo, hi, kernel, quantityOrNaN, quantityFromCode };
}

/**
 * The map is a Möbius function of the code, q = (a·x + b)/(c·x + d): it is fixed by three of its
 * values. With t = (x − x0)/h at t = −τ, 0, τ: β = q(0), γ = (q₋ + q₊ − 2β)/(τ(q₋ − q₊)),
 * α = (q₊ − β + γτq₊)/τ, and q = (αt + β)/(γt + 1). The fit is then checked against the exact
 * map at 65 codes; a kernel that disagrees by more than KERNEL_TOLERANCE (relative to the largest
 * quantity) is not used, and conversion falls back to the exact scalar map.
 */
function fitKernel(
  exact: (code: number) => number,
  lo: number,
  hi: number,
): LinearFractionalKernel | undefined {
  const first = Math.floor(lo) + 1;
  const last = Math.ceil(hi) - 1;
  if (!(last - first >= 4)) return undefined;
  const x0 = Math.round((first + last) / 2);
  const h = Math.min(x0 - first, last - x0);
  const tau = 0.9;
  const xm = x0 - Math.round(tau * h);
  const xp = x0 + Math.round(tau * h);
  const tm = (xm - x0) / h;
  const tp = (xp - x0) / h;
  const qm = exact(xm);
  const q0 = exact(x0);
  const qp = exact(xp);
  // Solve α·t + β − γ·t·q = q at t = tm and tp with β = q0 (Cramer's rule on the 2×2 system).
  const det = -tm * tp * qp + tp * tm * qm; // = tm·tp·(qm − qp)
  if (det === 0 || !Number.isFinite(det)) return undefined;
  const rm = qm - q0;
  const rp = qp - q0;
  const alpha = (rm * -tp * qp - -tm * qm * rp) / det;
  const gamma = (tm * rp - tp * rm) / det;
  // Back to code coordinates: q = (α(x − x0) + βh)/(γ(x − x0) + h).
  const kernel: LinearFractionalKernel = {
    a: alpha,
    b: q0 * h - alpha * x0,
    c: gamma,
    d: h - gamma * x0,
    lo,
    hi,
  };
  let scale = 0;
  let worst = 0;
  for (let i = 0; i <= 64; i++) {
    const x = Math.round(first + ((last - first) * i) / 64);
    const q = exact(x);
    const k = (kernel.a * x + kernel.b) / (kernel.c * x + kernel.d);
    scale = Math.max(scale, Math.abs(q));
    worst = Math.max(worst, Math.abs(k - q));
  }
  return worst <= KERNEL_TOLERANCE * scale ? kernel : undefined;
}

/** Wraps a failure of the component packages while building a channel as an `invalid-spec` error. */
export function asSpecError(name: string, error: unknown): never {
  if (isBridgeworkError(error) && error.code !== 'invalid-spec') {
    throw new BridgeworkError('invalid-spec', `channel '${name}': ${error.message}`, {
      issues: [{ path: error.param ?? '', message: error.message }],
      cause: error,
    });
  }
  throw error;
}
