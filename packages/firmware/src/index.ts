export { cIdentifierFromName, C_NAME_MAX_LENGTH } from './cIdentifierFromName.js';
export { emitCHeader, FIRMWARE_CAUTION } from './emitCHeader.js';
export { emitJson } from './emitJson.js';
export { evaluatorTypes, type EmitOptions, type EvaluatorType, type FirmwareChannel } from './emitOptions.js';
export type { ExactValue } from './exactValue.js';
export {
  fixedPointMap,
  type BigIntRange,
  type FixedPointMap,
  type FixedPointMapOptions,
  type FixedPointSource,
  type QFormat,
} from './fixedPointMap.js';
export {
  floatMap,
  floatPrecisions,
  MAX_POLYNOMIAL_COEFFICIENTS,
  type AffineFloatMap,
  type FloatMap,
  type FloatMapBase,
  type FloatMapOptions,
  type FloatMapSource,
  type FloatPrecision,
  type PolynomialFloatMap,
} from './floatMap.js';
export { matrixMap, MAX_MATRIX_SIZE, type MatrixMap, type MatrixMapOptions } from './matrixMap.js';
export { fixedPointRoundings, roundShift, type FixedPointRounding } from './roundShift.js';
export {
  EXHAUSTIVE_CODE_LIMIT,
  verificationModes,
  type TotalError,
  type Verification,
  type VerificationMode,
} from './verification.js';
export { FIRMWARE_GENERATOR_VERSION } from './version.js';
export {
  emitSql,
  sqlDialects,
  sqlExpression,
  type EmitSqlOptions,
  type SqlChannel,
  type SqlDialect,
  type SqlMap,
} from './emitSql.js';
