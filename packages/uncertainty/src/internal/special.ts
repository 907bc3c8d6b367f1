/**
 * Special functions for coverage factors: log-gamma, the complementary error function, the
 * regularized incomplete beta function, and the upper-tail quantiles of the normal and Student-t
 * distributions. Set-up code only (never per trial), so they use `Math` freely.
 */

const LN_SQRT_2PI = 0.9189385332046728; // ½·ln(2π)
const SQRT_PI = 1.7724538509055159;
const LN_SQRT_PI = 0.5723649429247001; // ln Γ(½)
const EPS = 2.220446049250313e-16;

/** Stirling's correction ln Γ(x) − [(x − ½)ln x − x + ½ln 2π] for x ≥ 10, to x⁻¹³. */
function stirlingCorrection(x: number): number {
  const inv = 1 / x;
  const inv2 = inv * inv;
  // B₂ₖ/(2k(2k − 1)): 1/12, −1/360, 1/1260, −1/1680, 1/1188, −691/360360, 1/156.
  return (
    inv *
    (1 / 12 +
      inv2 *
        (-1 / 360 +
          inv2 * (1 / 1260 + inv2 * (-1 / 1680 + inv2 * (1 / 1188 + inv2 * (-691 / 360360 + inv2 / 156))))))
  );
}

/**
 * ln Γ(x) for x > 0: Stirling's series with the Bernoulli-number terms up to x⁻¹³ for x ≥ 10, and
 * the recurrence Γ(x) = Γ(x + k)/(x(x + 1)…(x + k − 1)) below. Error below 4e-15 absolute for
 * x ≤ 10 and 1e-15 relative above.
 */
export function logGamma(x: number): number {
  let product = 1;
  while (x < 10) {
    product *= x;
    x += 1;
  }
  const stirling = (x - 0.5) * Math.log(x) - x + LN_SQRT_2PI + stirlingCorrection(x);
  return product === 1 ? stirling : stirling - Math.log(product);
}

/**
 * ln Γ(a) − ln Γ(a + ½) without the cancellation of the two large logarithms: for a ≥ 10 the
 * Stirling forms subtract to −½ln a + (½ − a·ln(1 + 1/(2a))) + S(a) − S(a + ½), every term small.
 */
export function logGammaRatioHalf(a: number): number {
  if (a < 10) return logGamma(a) - logGamma(a + 0.5);
  return (
    -0.5 * Math.log(a) + (0.5 - a * Math.log1p(0.5 / a)) + stirlingCorrection(a) - stirlingCorrection(a + 0.5)
  );
}

/** e^(−z²) with z² split so that the rounding of z·z does not enter the exponent (|error| ≈ 2 ulps). */
function expMinusSquare(z: number): number {
  const high = Math.floor(z * 1048576) / 1048576; // 20 fractional bits: high² is exact for z < 2^6
  return Math.exp(-high * high) * Math.exp(-(z - high) * (z + high));
}

/** Modified Lentz evaluation of a continued fraction b₀ + a₁/(b₁ + a₂/(b₂ + …)), given aₙ and bₙ for n ≥ 1. */
function lentz(b0: number, a: (n: number) => number, b: (n: number) => number, maxTerms = 2000): number {
  const tiny = 1e-300;
  let f = b0 === 0 ? tiny : b0;
  let c = f;
  let d = 0;
  for (let n = 1; n <= maxTerms; n++) {
    const an = a(n);
    const bn = b(n);
    d = bn + an * d;
    if (d === 0) d = tiny;
    c = bn + an / c;
    if (c === 0) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < EPS) return f;
  }
  return f;
}

/**
 * erfc(z) for 0 ≤ z < 64 (beyond, it underflows anyway): the series
 * erf(z) = (2/√π)·e^(−z²)·Σ 2ⁿz^(2n+1)/(1·3·…·(2n + 1)) of Abramowitz & Stegun 7.1.6 for z < 0.5, and the continued fraction of A&S 7.1.14,
 * erfc(z) = e^(−z²)/√π · 1/(z + (1/2)/(z + 1/(z + (3/2)/(z + …)))), for z ≥ 0.5. Relative error
 * below 4e-15 (tested); e^(−z²) is formed with z² split so that its rounding does not enter.
 */
export function erfc(z: number): number {
  if (z < 0.5) {
    let term = z;
    let sum = z;
    for (let n = 0; n < 200; n++) {
      term *= (2 * z * z) / (2 * n + 3);
      sum += term;
      if (term < EPS * sum) break;
    }
    return 1 - (2 / SQRT_PI) * Math.exp(-z * z) * sum;
  }
  const k = lentz(
    z,
    (n) => n / 2,
    () => z,
  );
  return expMinusSquare(z) / (SQRT_PI * k);
}

/** The upper tail of the standard normal distribution, Q(x) = P(Z > x) = ½·erfc(x/√2), x ≥ 0. */
export function normalUpperTail(x: number): number {
  return 0.5 * erfc(x / Math.SQRT2);
}

/**
 * The continued fraction 1/(1 + d₁/(1 + d₂/(1 + …))) of the incomplete beta function, with
 * d₂ₘ₊₁ = −(a + m)(a + b + m)x/((a + 2m)(a + 2m + 1)) and d₂ₘ = m(b − m)x/((a + 2m − 1)(a + 2m))
 * (Numerical Recipes, 2nd ed., eq. 6.4.5).
 */
function betaFraction(a: number, b: number, x: number): number {
  return (
    1 /
    lentz(
      1,
      (n) => {
        const m = Math.floor(n / 2);
        return n % 2 === 0
          ? (m * (b - m) * x) / ((a + 2 * m - 1) * (a + 2 * m))
          : -((a + m) * (a + b + m) * x) / ((a + 2 * m) * (a + 2 * m + 1));
      },
      () => 1,
    )
  );
}

/**
 * The upper tail of Student's t with ν degrees of freedom, P(T > t) = ½·I_{ν/(ν+t²)}(ν/2, ½), for
 * t ≥ 0, with the regularized incomplete beta function I evaluated by its continued fraction
 * (on whichever side converges). ln x and ln(1 − x) are formed without cancellation.
 */
export function studentUpperTail(t: number, nu: number): number {
  if (t === 0) return 0.5;
  const a = nu / 2;
  const b = 0.5;
  const lnX = -Math.log1p((t * t) / nu); // x = ν/(ν + t²)
  const ln1mX = 2 * Math.log(t) - Math.log(nu + t * t); // 1 − x = t²/(ν + t²)
  const lnBeta = logGammaRatioHalf(a) + LN_SQRT_PI; // B(a, ½) = Γ(a)Γ(½)/Γ(a + ½)
  const front = Math.exp(a * lnX + b * ln1mX - lnBeta);
  const x = Math.exp(lnX);
  const incomplete =
    x < (a + 1) / (a + b + 2)
      ? (front * betaFraction(a, b, x)) / a
      : 1 - (front * betaFraction(b, a, -Math.expm1(lnX))) / b;
  return 0.5 * incomplete;
}

/** The density of Student's t with ν degrees of freedom at t. */
export function studentDensity(t: number, nu: number): number {
  const lnC = -logGammaRatioHalf(nu / 2) - 0.5 * Math.log(nu * Math.PI);
  return Math.exp(lnC - ((nu + 1) / 2) * Math.log1p((t * t) / nu));
}

/**
 * Solves tail(x) = α for x ≥ 0, for a decreasing tail function with density = −tail′: Newton's
 * method on ln tail(x) − ln α (nearly linear far out, so deep tails converge in a few steps),
 * kept inside a bracket and falling back to bisection (geometric while the bracket spans more
 * than a factor of 4). Converged when a Newton correction is within 2 ulps.
 */
function solveTail(
  alpha: number,
  tail: (x: number) => number,
  density: (x: number) => number,
  guess: number,
): number {
  const lnAlpha = Math.log(alpha);
  let lo = 0;
  let hi = Math.max(2 * guess, 1);
  while (tail(hi) > alpha) {
    lo = hi;
    hi *= 4;
    if (hi > 1e300) return Infinity;
  }
  let x = guess > lo && guess < hi ? guess : 0.5 * (lo + hi);
  for (let iteration = 0; iteration < 300; iteration++) {
    const q = tail(x);
    const g = Math.log(q) - lnAlpha;
    if (g === 0) return x;
    if (g > 0) lo = x;
    else hi = x;
    const newton = x + (g * q) / density(x);
    if (Math.abs(newton - x) <= 2 * EPS * Math.abs(x)) return newton;
    if (newton > lo && newton < hi) x = newton;
    else {
      x = lo > 0 && hi / lo > 4 ? Math.sqrt(lo * hi) : 0.5 * (lo + hi);
      if (hi - lo <= 2 * EPS * hi) return x;
    }
  }
  return x;
}

/**
 * The upper-tail quantile z of the standard normal distribution, Q(z) = α, for 0 < α ≤ ½: Newton
 * on the erfc-based tail from the rational starting value of A&S 26.2.23.
 */
export function normalUpperQuantile(alpha: number): number {
  if (alpha === 0.5) return 0;
  const w = Math.sqrt(-2 * Math.log(alpha));
  const guess =
    w - (2.515517 + w * (0.802853 + w * 0.010328)) / (1 + w * (1.432788 + w * (0.189269 + w * 0.001308)));
  return solveTail(alpha, normalUpperTail, (x) => Math.exp(-0.5 * x * x) / (Math.SQRT2 * SQRT_PI), guess);
}

/**
 * The upper-tail quantile of Student's t with ν > 0 degrees of freedom, P(T > t) = α, for
 * 0 < α ≤ ½. Above 1000 degrees of freedom the Cornish–Fisher expansion of A&S 26.7.5 to ν⁻⁴
 * (error below 1e-13 there); otherwise Newton on the incomplete-beta tail.
 */
export function studentUpperQuantile(alpha: number, nu: number): number {
  if (alpha === 0.5) return 0;
  const z = normalUpperQuantile(alpha);
  if (nu === Infinity) return z;
  const z2 = z * z;
  const g1 = (z * (z2 + 1)) / 4;
  const g2 = (z * (3 + z2 * (16 + 5 * z2))) / 96;
  const g3 = (z * (-15 + z2 * (17 + z2 * (19 + 3 * z2)))) / 384;
  const g4 = (z * (-945 + z2 * (-1920 + z2 * (1482 + z2 * (776 + 79 * z2))))) / 92160;
  const expansion = z + (g1 + (g2 + (g3 + g4 / nu) / nu) / nu) / nu;
  if (nu > 1000) return expansion;
  if (nu === 1) return Math.tan(Math.PI * (0.5 - alpha)); // Cauchy, closed form
  if (nu === 2) return (1 - 2 * alpha) / Math.sqrt(2 * alpha * (1 - alpha)); // closed form
  const guess = nu >= 4 && expansion > 0 ? expansion : 0;
  return solveTail(
    alpha,
    (t) => studentUpperTail(t, nu),
    (t) => studentDensity(t, nu),
    guess,
  );
}
