export {
  arrangementTable,
  needsPoissonRatio,
  strainArrangements,
  type ArrangementInfo,
  type GaugePattern,
  type MeasuredStrain,
  type StrainArrangement,
} from './arrangements.js';
export {
  createStrainBridge,
  type StrainBridge,
  type StrainBridgeOptions,
  type StrainFromRatioOptions,
} from './createStrainBridge.js';
export {
  createStrainBridgeKernel,
  type StrainBridgeKernel,
  type StrainBridgeKernelOptions,
} from './createStrainBridgeKernel.js';
export { solveArm, type SolveArmOptions } from './solveArm.js';
export { solveBridge, type BridgeSolution, type SolveBridgeOptions } from './solveBridge.js';
