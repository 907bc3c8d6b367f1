/**
 * The version of this package, written into every generated header and JSON file.
 *
 * @remarks
 * Kept equal to `version` in the package's package.json by a test, so library code needs no file
 * access to know it.
 *
 * @example
 * ```ts
 * FIRMWARE_GENERATOR_VERSION; // '0.1.0'
 * ```
 */
export const FIRMWARE_GENERATOR_VERSION = '0.1.0';
