export type {
  Channel,
  ChannelCurve,
  ChannelInput,
  ChannelMap,
  CodeBuffer,
  ConversionTransformer,
  MobiusCoefficients,
} from './Channel.js';
export { createChannel } from './createChannel.js';
export { validateChannelSpec, type ChannelSpecValidation } from './validateChannelSpec.js';
export { channelSpecFields, channelSpecJsonSchema } from './channelSpecReference.js';
export type { SpecValidation, ValidateChannelSpecOptions } from './channelKit.js';
export type { ChannelSpec, ValidChannelSpec } from './spec/ChannelSpec.js';
export type { FieldRow, QuantityText } from './spec/schema.js';
export type { SensorCurve } from './kinds/SensorKind.js';
export {
  defaultOutputUnit,
  outputQuantities,
  outputQuantityTable,
  type DisplayUnit,
  type OutputQuantity,
  type OutputQuantityInfo,
} from './outputQuantities.js';
export {
  BUDGET_CAUTION,
  MAX_BUDGET_TRIALS,
  channelBudget,
  type ChannelBudget,
  type ChannelBudgetOptions,
  type ChannelNoiseTerm,
  type MonteCarloBudgetOptions,
} from './budget/channelBudget.js';
export type { ChannelBudgetLine } from './budget/ChannelBudgetLine.js';
export type { ChannelDesignCheck, DesignLimits } from './budget/designChecks.js';
export {
  CHANNEL_MAP_RELATIVE_ACCURACY,
  channelConstants,
  type ChannelConstants,
  type ConstantsOptions,
} from './constants/channelConstants.js';
export type { ConversionResult, ConversionStatus, ConvertOptions } from './convert/ConversionStatus.js';
export {
  createInterleavedConverter,
  type InterleavedConversionResult,
  type InterleavedConverter,
  type InterleavedConvertOptions,
} from './createInterleavedConverter.js';
export {
  createWasmConverter,
  type WasmConverter,
  type WasmConverterOptions,
  type WasmMemory,
} from './convert/wasm/createWasmConverter.js';
export { formatQuantity, parseQuantity } from './units/quantity.js';
export {
  dimensionTable,
  dimensions,
  type Dimension,
  type DimensionDefinition,
  type UnitDefinition,
} from './units/unitTable.js';
