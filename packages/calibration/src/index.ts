export type {
  BridgeArm,
  ShuntBridgeOptions,
  ShuntDefinition,
  ShuntOhmsForStrainOptions,
  ShuntPlacement,
  ShuntRatios,
  StrainFromShuntOptions,
} from './shuntOptions.js';
export { shuntOhmsForStrain, shuntRatios, strainFromShunt } from './shuntStrain.js';
