/**
 * Independent 40-digit references for channel conversions, from first principles (decimal.js).
 * Nothing here calls the bridgework packages: each stage is restated from its published source.
 *
 * - Converter coding: code = G·Vin/Vref·2^(N−1) (bipolar two's complement); ratiometric:
 *   Vref = Vexc, so the ratio is code/(G·2^(N−1)).
 * - Unloaded bridge with a series resistance Rs: Vout/E = (R1R3 − R2R4)/((R1+R2)(R3+R4) + Rs·ΣR)
 *   (the Wheatstone bridge with a source resistance; any circuit text).
 * - Quarter bridge, active arm 1: the ratio is a bilinear function of R1, solved exactly for it.
 * - Gauge: R = Rg(1 + GF·ε) (definition of the gauge factor).
 * - RTD: IEC 60751 Callendar–Van Dusen, inverted by bisection at 40 digits.
 * - Transducer: load = capacity·(ratio − zero)/rated output (certificate scaling, linear by
 *   definition); four-wire excitation leads scale the ratio by Rin/(Rin + 2RL).
 */
import { Decimal } from 'decimal.js';
import { exactDecimalString } from '@bridgework/core';

export const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
export type Dec = InstanceType<typeof D>;
export const X = (x: number): Dec => new D(exactDecimalString(x));

/** Ratio from a code (ratiometric, bipolar). */
export function ratioFromCodeRef(code: number, gain: number, bits: number): Dec {
  return X(code).div(X(gain).times(new D(2).pow(bits - 1)));
}

/**
 * Arm 1 of a quarter bridge for a ratio r: arms R1 (unknown), R2, R3, R4, series Rs.
 * r·((R1+R2)(R3+R4) + Rs(R1+R2+R3+R4)) = R1·R3 − R2·R4 is linear in R1:
 * R1·(R3 − r(R3+R4) − r·Rs) = R2·R4 + r(R2(R3+R4) + Rs(R2+R3+R4)).
 */
export function arm1Ref(r: Dec, r2: Dec, r3: Dec, r4: Dec, rs: Dec): Dec {
  const q = r3.plus(r4);
  const num = r2.times(r4).plus(r.times(r2.times(q).plus(rs.times(r2.plus(r3).plus(r4)))));
  const den = r3.minus(r.times(q)).minus(r.times(rs));
  return num.div(den);
}

/** Callendar–Van Dusen resistance at t (IEC 60751). */
export function cvdOhms(t: Dec, r0: Dec, a: Dec, b: Dec, c: Dec): Dec {
  let w = new D(1).plus(a.times(t)).plus(b.times(t).times(t));
  if (t.isNegative()) w = w.plus(c.times(t.minus(100)).times(t.pow(3)));
  return r0.times(w);
}

/** Temperature for a resistance by bisection on [−200, 850] °C to 1e-30 K. */
export function cvdTemperature(ohms: Dec, r0: Dec, a: Dec, b: Dec, c: Dec): Dec {
  let lo = new D(-200);
  let hi = new D(850);
  for (let i = 0; i < 120; i++) {
    const mid = lo.plus(hi).div(2);
    if (cvdOhms(mid, r0, a, b, c).lessThan(ohms)) lo = mid;
    else hi = mid;
  }
  return lo.plus(hi).div(2);
}
