export { createAxialMember, type AxialMember, type AxialMemberOptions } from './createAxialMember.js';
export {
  createMemberReduction,
  memberResultants,
  type MemberGauge,
  type MemberLoads,
  type MemberReduction,
  type MemberReductionOptions,
  type MemberReductionResult,
  type MemberResultant,
} from './createMemberReduction.js';
export { createBendingMember, type BendingMember, type BendingMemberOptions } from './createBendingMember.js';
export {
  createRosette,
  maxRosetteConditionNumber,
  type Rosette,
  type RosetteLegStrains,
  type RosetteOptions,
  type RosetteReduction,
} from './createRosette.js';
export { createShaft, type Shaft, type ShaftOptions } from './createShaft.js';
export {
  planeStress,
  type ElasticOptions,
  type PlaneStress,
  type PlaneStressFromPrincipalOptions,
  type PlaneStressFromStateOptions,
  type PlaneStressWithComponents,
} from './planeStress.js';
export { reduceRosette, type ReduceRosetteOptions } from './reduceRosette.js';
export {
  sectionProperties,
  type CircularSection,
  type RectangularSection,
  type Section,
  type SectionProperties,
} from './sectionProperties.js';
export type { PrincipalStrains } from './PrincipalStrains.js';
export { normalStrainAtAngle, principalStrainsFromState, type StrainState } from './strainState.js';
