export { cIdentifierFromName, C_NAME_MAX_LENGTH } from './cIdentifierFromName.js';
export { designFirmwareConstants, type DesignFirmwareConstantsOptions } from './designFirmwareConstants.js';
export { emitCHeader, FIRMWARE_CAUTION } from './emitCHeader.js';
export { emitJson } from './emitJson.js';
export { evaluatorTypes, type EmitOptions, type EvaluatorType, type FirmwareChannel } from './emitOptions.js';
export { emitTestProgram, type EmitTestProgramOptions } from './emitTestProgram.js';
export type { ExactValue } from './exactValue.js';
export {
  firmwareCost,
  type FirmwareCost,
  type FirmwareFixedMap,
  type FirmwareFloatMap,
  type FirmwareMap,
} from './firmwareCost.js';
export {
  fixedPiecewiseMap,
  type FixedPiecewiseMap,
  type FixedPiecewiseMapOptions,
  type FixedSegment,
} from './fixedPiecewiseMap.js';
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
export { floatMobiusMap, type FloatMobiusMap, type FloatMobiusMapOptions } from './floatMobiusMap.js';
export {
  floatPiecewiseMap,
  type FloatPiecewiseMap,
  type FloatPiecewiseMapOptions,
} from './floatPiecewiseMap.js';
export {
  fitPiecewisePolynomial,
  MAX_PIECEWISE_DEGREE,
  segmentCodes,
  type FitPiecewisePolynomialOptions,
  type PiecewisePolynomial,
  type SegmentCodes,
} from './piecewisePolynomial.js';
export { matrixMap, MAX_MATRIX_SIZE, type MatrixMap, type MatrixMapOptions } from './matrixMap.js';
export { fixedPointRoundings, roundShift, type FixedPointRounding } from './roundShift.js';
export type { ReferenceError, TestVector, TotalErrorBound, TotalErrors } from './totalError.js';
export {
  EXHAUSTIVE_CODE_LIMIT,
  verificationModes,
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
  type SqlPolynomialSegment,
} from './emitSql.js';
