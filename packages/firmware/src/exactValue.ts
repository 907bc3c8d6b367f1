/**
 * An exact real number given to a firmware map: a double (taken at its exact binary value), a
 * bigint, a decimal numeral, or a ratio of two decimal numerals.
 *
 * @remarks
 * Strings follow the grammar `decimal` or `decimal/decimal`, where `decimal` is an optional sign,
 * digits with an optional point, and an optional exponent (`'2.5e9'`, `'-0.0019876'`, `'.5'`),
 * with optional blanks around the `/`. Every form is read exactly, with no rounding: `'0.1'` is
 * one tenth, while the number `0.1` is the double nearest to it
 * (0.1000000000000000055511151231257827…), and `'30/2134169.2094464'` is that exact quotient. Use
 * strings (or ratios) for values that are exact in decimal, such as a rated output of 1.9876 mV/V
 * or an output step of 0.01 g, so that the constants derived from them carry no representation
 * error; the ratio form states quotients such as capacity/(rated output · counts per V/V)
 * exactly.
 *
 * @example
 * ```ts
 * const scale: ExactValue = '50/2147483.648'; // kg per count, exactly
 * const step: ExactValue = '0.00001'; // 0.01 g in kg, exactly
 * ```
 */
export type ExactValue = number | bigint | string;
