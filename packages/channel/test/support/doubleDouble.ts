/**
 * Double-double arithmetic (Dekker 1971, Knuth's two-sum; about 106 bits) for references that
 * must be evaluated at millions of codes, where decimal.js is too slow. Written for the tests,
 * independently of the package's kernel: a value is a pair [hi, lo] with |lo| ≤ ulp(hi)/2.
 *
 * `rtdExact` evaluates an RTD channel's composition code → R = (a·x + b)/(c·x + d) → IEC 60751
 * inverse → unit with other algebra than the kernel (division and square root in double-double,
 * the quadratic's root above 0 °C, Newton on the quartic below); the tests check it against
 * decimal.js at 40 digits.
 */
export type DD = readonly [number, number];

const SPLITTER = 134217729; // 2^27 + 1

function twoSum(a: number, b: number): DD {
  const s = a + b;
  const bb = s - a;
  return [s, a - (s - bb) + (b - bb)];
}

function twoProd(a: number, b: number): DD {
  const p = a * b;
  const ca = SPLITTER * a;
  const ah = ca - (ca - a);
  const al = a - ah;
  const cb = SPLITTER * b;
  const bh = cb - (cb - b);
  const bl = b - bh;
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}

function norm(s: number, e: number): DD {
  const h = s + e;
  return [h, e - (h - s)];
}

export function add(x: DD, y: DD): DD {
  const [s, e] = twoSum(x[0], y[0]);
  return norm(s, e + x[1] + y[1]);
}

export function neg(x: DD): DD {
  return [-x[0], -x[1]];
}

export function mul(x: DD, y: DD): DD {
  const [p, e] = twoProd(x[0], y[0]);
  return norm(p, e + x[0] * y[1] + x[1] * y[0]);
}

export function div(x: DD, y: DD): DD {
  const q1 = x[0] / y[0];
  const r = add(x, neg(mul([q1, 0], y)));
  const q2 = r[0] / y[0];
  const r2 = add(r, neg(mul([q2, 0], y)));
  const q3 = r2[0] / y[0];
  const [s, e] = twoSum(q1, q2);
  return norm(s, e + q3);
}

export function sqrt(x: DD): DD {
  if (x[0] === 0) return [0, 0];
  const s = Math.sqrt(x[0]);
  const r = add(x, neg(twoProd(s, s)));
  return norm(s, r[0] / (2 * s));
}

const d = (v: number): DD => [v, 0];

/**
 * The exact value (to about 1e-30 relative) of an RTD channel's composition at code x:
 * resistance (a·x + b)/(c·x + d), Callendar–Van Dusen inverse with R0, A, B, C, then °C, K or °F.
 */
export function rtdExact(
  x: number,
  resistance: { a: number; b: number; c: number; d: number },
  curve: { r0Ohms: number; a: number; b: number; c: number },
  unit: '°C' | 'K' | '°F',
): DD {
  const ohms = div(
    add(mul(d(resistance.a), d(x)), d(resistance.b)),
    add(mul(d(resistance.c), d(x)), d(resistance.d)),
  );
  const w = add(div(ohms, d(curve.r0Ohms)), d(-1));
  const A = d(curve.a);
  const B = d(curve.b);
  const C = d(curve.c);
  let t: DD;
  if (w[0] >= 0) {
    // t = 2w/(A + √(A² + 4Bw)) (above 0 °C the curve is the quadratic).
    t = div(mul(d(2), w), add(A, sqrt(add(mul(A, A), mul(mul(d(4), B), w)))));
  } else {
    // Newton on A·t + B·t² + C·(t − 100)·t³ = w from the quadratic's root, in double-double.
    const disc = curve.a * curve.a + 4 * curve.b * w[0];
    t = d((2 * w[0]) / (curve.a + Math.sqrt(disc)));
    for (let i = 0; i < 8; i++) {
      const t2 = mul(t, t);
      const f = add(add(add(mul(A, t), mul(B, t2)), mul(mul(C, add(t, d(-100))), mul(t2, t))), neg(w));
      const fp = add(add(A, mul(mul(d(2), B), t)), mul(mul(C, t2), add(mul(d(4), t), d(-300))));
      t = add(t, neg(div(f, fp)));
    }
  }
  if (unit === 'K') return add(t, d(273.15));
  if (unit === '°F') return add(div(mul(t, d(9)), d(5)), d(32));
  return t;
}

/** The spacing of doubles at |v| (v ≠ 0): 2^(⌊log₂|v|⌋ − 52). */
export function ulp(v: number): number {
  let e = Math.floor(Math.log2(Math.abs(v)));
  if (2 ** e > Math.abs(v)) e--;
  else if (2 ** (e + 1) <= Math.abs(v)) e++;
  return 2 ** (e - 52);
}
