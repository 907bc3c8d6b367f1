export {
  BUDGET_CAUTION,
  type BudgetOptions,
  type ChannelBudget,
  type ChannelBudgetLine,
  type ChannelNoiseTerm,
  type MonteCarloBudgetOptions,
} from './budget/createChannelBudget.js';
export {
  CHANNEL_MAP_RELATIVE_ACCURACY,
  channelConstants,
  type ChannelConstants,
  type ConstantsOptions,
} from './constants/channelConstants.js';
export {
  type ConversionResult,
  type ConversionStatus,
  type ConvertOptions,
} from './convert/ConversionStatus.js';
export { createChannel, type Channel, type CodeBuffer, type Interval } from './createChannel.js';
export {
  createInterleavedConverter,
  type InterleavedConversionResult,
  type InterleavedConverter,
  type InterleavedConvertOptions,
} from './createInterleavedConverter.js';
export type {
  AdcSpec,
  AmplifierLimitsSpec,
  AmplifierSpec,
  BridgeSpec,
  CableSpec,
  ChannelSpec,
  EnvironmentSpec,
  ExcitationSpec,
  OutputSpec,
  RtdSpec,
  SensorSpec,
  StrainGaugeSpec,
  ThermalOutputSpec,
  TolerancesSpec,
  TransducerSpec,
  ZeroSpec,
} from './spec/ChannelSpec.js';
export { type FieldRow, type UnitConverter } from './spec/schema.js';
export {
  channelSpecFields,
  channelSpecJsonSchema,
  validateChannelSpec,
  type ChannelSpecValidation,
  type InvalidSpec,
  type ValidSpec,
  type ValidateChannelSpecOptions,
} from './validateChannelSpec.js';
