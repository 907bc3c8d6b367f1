export type * from './spec/ChannelSpec.js';
export { channelSchema } from './spec/channelSchema.js';
export {
  INVALID,
  validate,
  type FieldRow,
  type SchemaNode,
  type UnitConverter,
} from './spec/schema.js';
